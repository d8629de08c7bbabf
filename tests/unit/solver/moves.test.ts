import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../src/lib/solver/model';
import { localSearch, movesAround, movesBetweenDays, movesToEmpty, unplannedMoves, type MoveKind } from '../../../src/lib/solver/moves';
import { createRng } from '../../../src/lib/solver/random';
import { regretConstruct } from '../../../src/lib/solver/sisr';
import { State } from '../../../src/lib/solver/state';
import { checkSolution } from '../../../src/lib/solver/checker';
import { createProblem, type Problem } from '../../../src/lib/solver/problem';
import { bestRoutes, leaveOut, randomProblem } from './helpers';

/** The state as plain routes, costed by the independent checker. */
function checked(p: Problem, s: State) {
  return checkSolution(p, { routes: s.routes.map((seq, f) => ({ farrierId: p.farriers[f].id, jobIds: seq.map((j) => p.jobs[j].id) })) });
}

describe('local-search moves', () => {
  it('evaluate() equals the checker’s cost change after apply(), and Infinity exactly when apply() breaks a rule', () => {
    const seen = new Map<MoveKind, number>();
    let infeasible = 0;
    for (const seed of [1, 2, 3, 4]) {
      const p = randomProblem(seed, { jobs: 16, farriers: 3, breaks: seed % 2 === 0, pins: seed === 3, tight: seed >= 3 });
      const s = new State(buildModel(p));
      const rng = createRng(seed);
      regretConstruct(s, rng);
      // leave a few placeable jobs out so that moves with the unplanned list have something to do
      s.removeMany([...Array(p.jobs.length).keys()].filter((j) => s.routeOf[j] >= 0).slice(0, 3));
      const before = checked(p, s);
      expect(before.feasible).toBe(true);
      const assigned = [...Array(p.jobs.length).keys()].filter((j) => s.routeOf[j] >= 0);
      for (let t = 0; t < 60; t++) {
        const u = assigned[rng.int(assigned.length)], v = assigned[rng.int(assigned.length)];
        if (u === v) continue;
        const out = [...s.unassigned];
        const w = out.length ? out[rng.int(out.length)] : -1;
        const A = s.routeOf[u], B = s.routeOf[v];
        const days = A !== B ? movesBetweenDays(s, A, B) : [];
        for (const mv of [...movesAround(s, u, v), ...movesToEmpty(s, u), ...(w >= 0 ? unplannedMoves(s, w, v) : []), ...days]) {
          const d = mv.evaluate(s);
          const after = s.clone();
          mv.apply(after);
          const c = checked(p, after);
          if (d === Infinity) { expect(c.feasible).toBe(false); infeasible++; continue; }
          expect(c.violations).toEqual([]);
          // the change in route costs plus the change in leave-out charges (mandatory jobs carry the engine's constant)
          const leftOut = (x: State) => [...x.unassigned].reduce((a, j) => a + leaveOut(p, j), 0);
          const dLeft = leftOut(after) - leftOut(s);
          // a mandatory job's 1e13 charge would swamp the cents in floating point: compare those moves by route cost only
          const bigTerm = [...mv.enter, ...mv.leave].some((j) => !p.jobs[j].optional);
          if (!bigTerm) expect(d - dLeft).toBeCloseTo(c.costs.routesCents - before.costs.routesCents, 6);
          else expect(mv.evaluate(s) - dLeft).toBeCloseTo(c.costs.routesCents - before.costs.routesCents, 1);
          expect(mv.enter.every((j) => after.routeOf[j] >= 0 && !after.unassigned.has(j))).toBe(true);
          expect(mv.leave.every((j) => after.routeOf[j] < 0 && after.unassigned.has(j))).toBe(true);
          seen.set(mv.kind, (seen.get(mv.kind) ?? 0) + 1);
        }
      }
    }
    // every kind of move was exercised with a feasible outcome, and infeasible outcomes were met too
    for (const k of ['relocate', 'swap', 'two-opt-star', 'or-opt', 'cross-exchange', 'two-opt', 'insert-unplanned', 'exchange-unplanned', 'exchange-days'] as MoveKind[]) expect(seen.get(k) ?? 0).toBeGreaterThan(0);
    expect(infeasible).toBeGreaterThan(0);
  });

  it('does not change an optimal two-farrier plan (the optimum found by trying every split and order)', () => {
    let tested = 0;
    for (let seed = 300; seed < 340 && tested < 3; seed++) {
      const p = randomProblem(seed, { jobs: 7, farriers: 2 });
      const br = bestRoutes(p);
      const full = (1 << 7) - 1;
      let best = Infinity, bestS = -1;
      for (let s = 0; s <= full; s++) {
        const c = br.cost[0][s] + br.cost[1][full & ~s];
        if (c < best) { best = c; bestS = s; }
      }
      if (best === Infinity) continue; // not every job can be placed: not this test's subject
      const st = new State(buildModel(p));
      st.routes[0] = br.order[0][bestS].slice();
      st.routes[1] = br.order[1][full & ~bestS].slice();
      st.refreshAll();
      expect(st.cost).toBeCloseTo(best, 6);
      localSearch(st, createRng(seed));
      expect(st.cost).toBeCloseTo(best, 6);
      expect(checked(p, st).feasible).toBe(true);
      tested++;
    }
    expect(tested).toBe(3);
  });

  it('trades whole days when each farrier was given the area nearer the other’s home', () => {
    // two homes 40 min apart, a barn beside each, four 90-min jobs at each barn; no overtime allowed,
    // so neither farrier can take a fifth job, and any one-job or three-job trade still sends both
    // across the map: only trading the whole days lowers the cost
    const far = 2400, near = 120;
    const sec = [
      [0, far, near, far], // home west
      [far, 0, far, near], // home east
      [near, far, 0, far], // west barn
      [far, near, far, 0], // east barn
    ];
    const H = 3600;
    const farrier = (id: string, home: number) => ({
      id, startLocation: home, endLocation: home, shiftStartSec: 7 * H, shiftEndSec: 17 * H, breakSec: 0, breakWindow: null,
      normalWorkSec: 8 * H, maxOvertimeSec: 0, costPerDriveSec: 1, costPerMetre: 0.04, costPerOvertimeSec: 2, qualified: false, hasForge: true,
    });
    const p = createProblem({
      locations: 4, durationSec: sec, distanceM: sec.map((r) => r.map((t) => t * 20)),
      farriers: [farrier('west', 0), farrier('east', 1)],
      barns: [{ id: 'wb', location: 2, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 600 }, { id: 'eb', location: 3, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 600 }],
      jobs: Array.from({ length: 8 }, (_, j) => ({ id: `j${j + 1}`, barnId: j < 4 ? 'wb' : 'eb', durationSec: 5400, needsQualified: false, needsForge: false, priority: 1, optional: false, penalty: 0 })),
    });
    const s = new State(buildModel(p));
    s.routes[0] = [4, 5, 6, 7]; // the west farrier at the east barn
    s.routes[1] = [0, 1, 2, 3];
    s.refreshAll();
    expect(checked(p, s).feasible).toBe(true);
    const crossed = s.cost;
    localSearch(s, createRng(5));
    expect(s.routes[0].slice().sort()).toEqual([0, 1, 2, 3]);
    expect(s.routes[1].slice().sort()).toEqual([4, 5, 6, 7]);
    expect(s.cost).toBeLessThan(crossed);
    expect(checked(p, s).feasible).toBe(true);
  });

  it('never raises the cost of a plan it starts from', () => {
    for (const seed of [21, 22, 23]) {
      const p = randomProblem(seed, { jobs: 20, farriers: 3, breaks: true });
      const s = new State(buildModel(p));
      regretConstruct(s, createRng(seed));
      const c0 = s.cost;
      localSearch(s, createRng(seed));
      expect(s.cost).toBeLessThanOrEqual(c0 + 1e-9);
      expect(checked(p, s).feasible).toBe(true);
    }
  });
});
