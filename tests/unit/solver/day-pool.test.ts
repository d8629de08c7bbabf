import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../src/lib/solver/model';
import { createRng } from '../../../src/lib/solver/random';
import { DEFAULT_SISR, recreate, regretConstruct, ruin } from '../../../src/lib/solver/sisr';
import { DayRoutePool, endRouteLog, markPublished, routeExchangeBuffer, routeLogBuffer } from '../../../src/lib/solver/day-pool';
import { mandatoryLeftOut, solve } from '../../../src/lib/solver/solve';
import { State } from '../../../src/lib/solver/state';
import { localSearch } from '../../../src/lib/solver/moves';
import { checkSolution } from '../../../src/lib/solver/checker';
import { randomProblem } from './helpers';
import type { Problem } from '../../../src/lib/solver/problem';

function adopt(s: State, routes: number[][]): State {
  const next = s.clone();
  next.routes = routes;
  next.refreshAll();
  return next;
}

function expectSound(p: Problem, before: State, routes: number[][]) {
  const check = checkSolution(p, { routes: routes.map((seq, f) => ({ farrierId: p.farriers[f].id, jobIds: seq.map((j) => p.jobs[j].id) })) });
  expect(check.violations).toEqual([]);
  const jobs = routes.flat();
  expect(new Set(jobs).size).toBe(jobs.length);
  // every mandatory job the incumbent plans is planned again
  for (let j = 0; j < p.jobs.length; j++) if (!p.jobs[j].optional && before.routeOf[j] >= 0) expect(jobs).toContain(j);
}

describe('packing a day from pooled routes (DayRoutePool)', () => {
  it('puts together a cheaper plan whose routes it has met, and never returns a dearer or rule-breaking one', () => {
    let recovered = 0, adopted = 0;
    for (const seed of [61, 62, 63, 64, 65, 66]) {
      const p = randomProblem(seed, { jobs: 18, farriers: 3, breaks: true, tight: seed % 2 === 0 });
      const m = buildModel(p);
      const rng = createRng(seed);
      const good = new State(m);
      regretConstruct(good, rng);
      localSearch(good, rng);
      const pool = new DayRoutePool(m);
      pool.addPlan(good);
      // a dearer plan near the good one, and the routes of its ruin-and-recreate neighbours
      let poor = good;
      for (let t = 0; t < 60; t++) {
        const c = (t < 30 ? good : poor).clone();
        ruin(c, rng, DEFAULT_SISR);
        recreate(c, rng, { ...DEFAULT_SISR, blinkRate: 0.2 });
        pool.addPlan(c);
        if (c.cost > poor.cost) poor = c;
      }
      if (poor === good) continue;
      const routes = pool.recombine(poor);
      expect(routes).not.toBeNull();
      expectSound(p, poor, routes!);
      const next = adopt(poor, routes!);
      expect(next.cost).toBeLessThan(poor.cost);
      adopted++;
      // the good plan's routes are in the pool, so the packing is at least as good whenever the
      // good plan keeps every mandatory job the poor one plans
      const keeps = [...Array(m.nJobs).keys()].every((j) => !m.mandatory[j] || poor.routeOf[j] < 0 || good.routeOf[j] >= 0);
      if (keeps) { expect(next.cost).toBeLessThanOrEqual(good.cost + 1e-6); recovered++; }
    }
    expect(adopted).toBeGreaterThanOrEqual(4);
    expect(recovered).toBeGreaterThanOrEqual(3);
  });

  it('answers null when no pooled routes beat the plan, and keeps one route per job set (the cheaper order)', () => {
    const p = randomProblem(71, { jobs: 14, farriers: 3, breaks: true });
    const m = buildModel(p);
    const s = new State(m);
    regretConstruct(s, createRng(71));
    localSearch(s, createRng(72));
    const pool = new DayRoutePool(m);
    expect(pool.recombine(s)).toBeNull();
    const f = s.routes.findIndex((r) => r.length >= 2);
    const size = pool.size;
    pool.add(f, s.routes[f].slice().reverse(), s.evals[f].cost + 1000);
    expect(pool.size).toBe(size);
    expect(pool.recombine(s)).toBeNull();
  });

  it('hands its routes to another search through a shared buffer, which then packs both searches\' routes', () => {
    const p = randomProblem(81, { jobs: 14, farriers: 3, breaks: true });
    const m = buildModel(p);
    const a = new DayRoutePool(m), b = new DayRoutePool(m);
    const s = new State(m);
    regretConstruct(s, createRng(81));
    for (let t = 0; t < 20; t++) {
      const c = s.clone();
      ruin(c, createRng(100 + t), DEFAULT_SISR);
      a.addPlan(c);
    }
    const buf = routeExchangeBuffer(1 << 16);
    // nothing published yet: the wait ends empty-handed
    expect(b.collect(buf, 5)).toBe(0);
    a.publish(buf);
    expect(b.collect(buf, 5)).toBe(a.size);
    expect(b.size).toBe(a.size);
    const none = routeExchangeBuffer(1 << 10);
    markPublished(none, 0);
    expect(b.collect(none, 60000)).toBe(0);

    // a search that packs another's routes with its own ends no dearer than alone, and cheaper on some days
    let cheaper = 0;
    for (const seed of [91, 92, 93, 94, 95, 96]) {
      const day = randomProblem(seed, { jobs: 40, farriers: 4, breaks: true, tight: seed % 2 === 0 });
      const stop = { maxIterations: 400 };
      const shared = routeExchangeBuffer();
      solve(day, { seed: seed + 1, stop, routeExchange: { publish: shared } });
      const alone = solve(day, { seed, stop });
      const together = solve(day, { seed, stop, routeExchange: { collect: [shared] } });
      expect(mandatoryLeftOut(day, together)).toBeLessThanOrEqual(mandatoryLeftOut(day, alone));
      if (mandatoryLeftOut(day, together) === mandatoryLeftOut(day, alone)) expect(together.cost).toBeLessThanOrEqual(alone.cost + 1e-6);
      if (together.cost < alone.cost - 1e-6) cheaper++;
    }
    expect(cheaper).toBeGreaterThanOrEqual(2);
  });

  it('shares the routes it meets cycle by cycle through a log another search reads up to the same cycle', () => {
    const p = randomProblem(82, { jobs: 16, farriers: 3, breaks: true });
    const m = buildModel(p);
    const a = new DayRoutePool(m), b = new DayRoutePool(m), c = new DayRoutePool(m);
    a.logRoutes();
    b.logRoutes();
    const s = new State(m);
    regretConstruct(s, createRng(82));
    const ruined = (t: number) => { const x = s.clone(); ruin(x, createRng(200 + t), DEFAULT_SISR); recreate(x, createRng(300 + t), DEFAULT_SISR); return x; };
    const logA = routeLogBuffer(1 << 20), logB = routeLogBuffer(1 << 20);
    for (let t = 0; t < 10; t++) a.addPlan(ruined(t));
    const cycle0 = a.size;
    a.shareTo(logA, 0);
    for (let t = 10; t < 30; t++) a.addPlan(ruined(t));
    a.shareTo(logA, 1);
    expect(a.size).toBeGreaterThan(cycle0);
    // at its cycle 0, b reads a's routes up to a's cycle 0, though a has logged cycle 1 by now
    expect(b.takeFrom([logA], 0, 0)).toBe(cycle0);
    expect(b.size).toBe(cycle0);
    expect(b.takeFrom([logA], 1, 0)).toBe(a.size - cycle0);
    expect(b.size).toBe(a.size);
    // routes b took from a are not logged again: b's log holds only what b met itself
    b.shareTo(logB, 0);
    expect(c.takeFrom([logB], 0, 0)).toBe(0);
    for (let t = 100; t < 110; t++) b.addPlan(ruined(t));
    const own = b.size - a.size;
    b.shareTo(logB, 1);
    expect(own).toBeGreaterThan(0);
    expect(c.takeFrom([logB], 1, 0)).toBe(own);
    // waiting for a cycle not yet logged ends empty-handed after the wait; once the log has ended
    // the wait is over at once (a 60-s wait would outlast the test's time limit)
    const quiet = routeLogBuffer(1 << 16);
    expect(c.takeFrom([quiet], 0, 5)).toBe(0);
    endRouteLog(quiet);
    expect(c.takeFrom([quiet], 3, 60000)).toBe(0);
  });
});
