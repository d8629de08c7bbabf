import { describe, expect, it } from 'vitest';
import { buildModel, scaleOptionalLeaveOut } from '../../../src/lib/solver/model';
import { createRng } from '../../../src/lib/solver/random';
import { evalRoute } from '../../../src/lib/solver/route-eval';
import { regretConstruct, regretRecreate, DEFAULT_SISR, ruinAround, leftOutCandidates, putBack, ejectFor, randomLeftOut } from '../../../src/lib/solver/sisr';
import { materialize, State } from '../../../src/lib/solver/state';
import { checkSolution } from '../../../src/lib/solver/checker';
import { leaveOut, randomProblem } from './helpers';
import { createProblem } from '../../../src/lib/solver/problem';
import { farrierDay } from '../../../src/lib/solver/invented-day';

describe('piece evaluation (State.costOf)', () => {
  it('gives the same cost as re-timing the built sequence from scratch, and Infinity exactly when that breaks a rule', () => {
    let compared = 0, infeasible = 0, merged = 0;
    for (const seed of [11, 12, 13, 14, 15, 16]) {
      const p = randomProblem(seed, { jobs: 18, farriers: 3, breaks: seed % 2 === 0, pins: seed === 15, tight: seed >= 14 });
      const m = buildModel(p);
      const s = new State(m);
      const rng = createRng(seed);
      regretConstruct(s, rng);
      for (let t = 0; t < 400; t++) {
        const f = rng.int(m.nFarriers);
        const own = s.routes[f];
        // pieces: usually the route's own head, then random pieces from any route or single jobs, usually its own tail
        const P: number[] = [];
        const cut = rng.int(own.length + 1), tail = cut + rng.int(own.length - cut + 1);
        if (rng.next() < 0.8) P.push(f, 0, cut, 0);
        for (let k = rng.int(3); k > 0; k--) {
          if (rng.next() < 0.5) P.push(-1, rng.int(m.nJobs), 0, 0);
          else {
            const g = rng.int(m.nFarriers), r = s.routes[g];
            const a = rng.int(r.length + 1), b = a + rng.int(r.length - a + 1);
            P.push(g, a, b, rng.next() < 0.3 ? 1 : 0);
          }
        }
        if (rng.next() < 0.8) P.push(f, tail, own.length, 0);
        const seq = materialize(s.routes, P);
        const e = evalRoute(m, f, seq);
        const c = s.costOf(f, P);
        if (!e.feasible) { expect(c).toBe(Infinity); infeasible++; }
        else { expect(c).toBeCloseTo(e.cost, 6); compared++; if (P[0] === f && P[P.length - 4] === f) merged++; }
      }
    }
    // both outcomes, and pieces keeping a route's head and tail, were exercised
    expect(compared).toBeGreaterThan(200);
    expect(infeasible).toBeGreaterThan(50);
    expect(merged).toBeGreaterThan(50);
  });
});

describe('regret recreate', () => {
  it('puts ruined jobs back into a plan the independent checker accepts, with its cost kept in step with its routes', () => {
    for (const seed of [31, 32, 33]) {
      const p = randomProblem(seed, { jobs: 20, farriers: 3, breaks: true, tight: seed === 33 });
      const s = new State(buildModel(p));
      const rng = createRng(seed);
      regretConstruct(s, rng);
      for (let t = 0; t < 30; t++) {
        const c = s.clone();
        const { removed } = ruinAround(c, rng, DEFAULT_SISR);
        regretRecreate(c, rng, { ...DEFAULT_SISR, blinkRate: 0 }, removed);
        const check = checkSolution(p, { routes: c.routes.map((seq, f) => ({ farrierId: p.farriers[f].id, jobIds: seq.map((j) => p.jobs[j].id) })) });
        expect(check.violations).toEqual([]);
        // the incremental cost equals a recount over the routes and the left-out list
        const incremental = c.cost;
        expect(incremental).toBeCloseTo(c.recomputeCost(), 6);
        expect(removed.every((j) => c.routeOf[j] >= 0 || c.unassigned.has(j))).toBe(true);
      }
    }
  });
});

describe('putting jobs back after a ruin', () => {
  it('offers only jobs left out before the ruin, and never lets an optional one take the place of a removed job or of a mandatory one', () => {
    let stepsWithLeftOut = 0, leftOutPlaced = 0;
    for (const seed of [41, 42, 43, 44]) {
      // a tight day: some jobs are left out for good, so both kinds of job compete for the room
      const p = randomProblem(seed, { jobs: 24, farriers: 3, breaks: true, tight: true });
      const m = buildModel(p);
      const s = new State(m);
      const rng = createRng(seed);
      regretConstruct(s, rng);
      const none = new Uint8Array(m.nJobs);
      for (let t = 0; t < 40; t++) {
        const before = new Set(s.unassigned);
        const c = s.clone();
        const { removed, seed: around } = ruinAround(c, rng, DEFAULT_SISR);
        const leftOut = leftOutCandidates(c, rng, removed, around, none);
        expect(leftOut.filter((j) => removed.includes(j) || !before.has(j))).toEqual([]);
        // with few left out, every one of them is offered
        expect([...leftOut].sort((a, b) => a - b)).toEqual([...before].sort((a, b) => a - b));
        if (!leftOut.length) continue;
        stepsWithLeftOut++;
        // the same step without the optional left-out jobs, from the same random draws
        const regret = t % 2 === 0;
        const first = removed.concat(leftOut.filter((j) => m.mandatory[j]));
        const alone = c.clone();
        const ruined = new Set(c.touched);
        const draws = rng.int(1 << 30);
        putBack(alone, createRng(draws), { ...DEFAULT_SISR, blinkRate: 0 }, first, [], regret);
        putBack(c, createRng(draws), { ...DEFAULT_SISR, blinkRate: 0 }, removed, leftOut, regret);
        // every job the step without them placed is placed in the full step too, in the same route
        for (const j of first) if (alone.routeOf[j] >= 0) expect(c.routeOf[j]).toBe(alone.routeOf[j]);
        // an optional left-out job only goes to a route the step changed (ruined, or given a job back)
        for (const j of leftOut) if (!m.mandatory[j] && c.routeOf[j] >= 0) expect(ruined.has(c.routeOf[j]) || alone.touched.has(c.routeOf[j])).toBe(true);
        leftOutPlaced += leftOut.filter((j) => c.routeOf[j] >= 0).length;
        expect(c.cost).toBeLessThanOrEqual(alone.cost + 1e-6);
      }
    }
    // the case this guards was exercised: left-out jobs were offered, and some found room
    expect(stepsWithLeftOut).toBeGreaterThan(40);
    expect(leftOutPlaced).toBeGreaterThan(0);
  });
});

describe('an optional job left out', () => {
  it('is offered only the routes the step changed, not an untouched one with room', () => {
    // two farriers with room; the optional job is out, a ruin empties farrier 1's route only
    const H = 3600;
    const farrier = (id: string) => ({ id, startLocation: 0, endLocation: 0, shiftStartSec: 8 * H, shiftEndSec: 17 * H, breakSec: 0, breakWindow: null, normalWorkSec: 8 * H, maxOvertimeSec: 0, costPerDriveSec: 1, costPerMetre: 0.04, costPerOvertimeSec: 2, qualified: false, hasForge: true });
    const p = createProblem({
      locations: 3,
      durationSec: [[0, 600, 900], [600, 0, 600], [900, 600, 0]],
      distanceM: [[0, 9000, 13000], [9000, 0, 9000], [13000, 9000, 0]],
      farriers: [farrier('f1'), farrier('f2')],
      barns: [{ id: 'b1', location: 1, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 300 }, { id: 'b2', location: 2, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 300 }],
      jobs: [
        { id: 'planned', barnId: 'b1', durationSec: H },
        { id: 'optional', barnId: 'b2', durationSec: H, optional: true, penalty: 1e9 },
      ],
    });
    for (const regret of [false, true]) {
      const s = new State(buildModel(p));
      s.insert(0, 0, 0);
      s.recomputeCost();
      const c = s.clone();
      c.removeMany([0]);
      // the ruin touched farrier 1 only: the job goes back there or to farrier 2, and the optional
      // job, however dear to leave out, is offered farrier 1's route (and whichever route took the job)
      putBack(c, createRng(3), { ...DEFAULT_SISR, blinkRate: 0 }, [0], [1], regret);
      expect(c.routeOf[1]).toBe(c.routeOf[0]);
      // offered nothing the step changed, it stays out even with farrier 2 free
      const d = s.clone();
      d.touched.clear();
      putBack(d, createRng(3), { ...DEFAULT_SISR, blinkRate: 0 }, [], [1], regret);
      expect(d.routeOf[1]).toBe(-1);
      expect(d.routes[1]).toEqual([]);
    }
  });
});

describe('a mandatory job left out', () => {
  it('gets the room a ruin frees before the optional job the ruin removed', () => {
    // one farrier whose shift holds one of two hour-long jobs: the optional one is planned, the
    // mandatory one is still out; a ruin removes the optional one
    const H = 3600;
    const p = createProblem({
      locations: 3,
      durationSec: [[0, 600, 600], [600, 0, 600], [600, 600, 0]],
      distanceM: [[0, 9000, 9000], [9000, 0, 9000], [9000, 9000, 0]],
      farriers: [{ id: 'f1', startLocation: 0, endLocation: 0, shiftStartSec: 8 * H, shiftEndSec: 10 * H, breakSec: 0, breakWindow: null, normalWorkSec: 2 * H, maxOvertimeSec: 0, costPerDriveSec: 1, costPerMetre: 0.04, costPerOvertimeSec: 2, qualified: false, hasForge: true }],
      barns: [{ id: 'b1', location: 1, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 300 }, { id: 'b2', location: 2, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 300 }],
      jobs: [
        { id: 'optional', barnId: 'b1', durationSec: H, optional: true, penalty: 5000 },
        { id: 'mandatory', barnId: 'b2', durationSec: H },
      ],
    });
    for (const regret of [false, true]) {
      const s = new State(buildModel(p));
      s.insert(0, 0, 0);
      s.recomputeCost();
      expect(s.unassigned.has(1)).toBe(true);
      s.removeMany([0]);
      putBack(s, createRng(7), { ...DEFAULT_SISR, blinkRate: 0 }, [0], [1], regret);
      expect(s.routes[0]).toEqual([1]);
      expect([...s.unassigned]).toEqual([0]);
    }
  });
});

describe('a mandatory job with no room anywhere', () => {
  // one farrier whose three-hour shift holds two of the hour-long jobs: two optional ones are planned
  const H = 3600;
  const day = (mandatorySec: number) => createProblem({
    locations: 4,
    durationSec: [[0, 600, 600, 600], [600, 0, 600, 600], [600, 600, 0, 600], [600, 600, 600, 0]],
    distanceM: [[0, 9000, 9000, 9000], [9000, 0, 9000, 9000], [9000, 9000, 0, 9000], [9000, 9000, 9000, 0]],
    farriers: [{ id: 'f1', startLocation: 0, endLocation: 0, shiftStartSec: 8 * H, shiftEndSec: 11 * H, breakSec: 0, breakWindow: null, normalWorkSec: 3 * H, maxOvertimeSec: 0, costPerDriveSec: 1, costPerMetre: 0.04, costPerOvertimeSec: 2, qualified: false, hasForge: true }],
    barns: [1, 2, 3].map((l) => ({ id: `b${l}`, location: l, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 300 })),
    jobs: [
      { id: 'dear', barnId: 'b1', durationSec: H, optional: true, penalty: 9000 },
      { id: 'cheap', barnId: 'b2', durationSec: H, optional: true, penalty: 5000 },
      { id: 'mandatory', barnId: 'b3', durationSec: mandatorySec },
    ],
  });
  const planned = (mandatorySec: number) => {
    const s = new State(buildModel(day(mandatorySec)));
    s.insert(0, 0, 0);
    s.insert(1, 0, 1);
    s.recomputeCost();
    return s;
  };

  it('takes the place of the planned optional job that is cheapest to leave out', () => {
    for (const regret of [false, true]) {
      const s = planned(H);
      // nothing was ruined: the step only offers the mandatory job, which does not fit beside both
      expect(s.bestPosition(2, 0, 0, createRng(1).next).delta).toBe(Infinity);
      putBack(s, createRng(5), { ...DEFAULT_SISR, blinkRate: 0 }, [], [2], regret);
      expect(s.routeOf[2]).toBe(0);
      expect(s.routeOf[0]).toBe(0);
      expect([...s.unassigned]).toEqual([1]);
      expect(evalRoute(s.m, 0, s.routes[0]).feasible).toBe(true);
    }
  });

  it('stays out, and the plan is unchanged, when no exchange makes room for it', () => {
    const s = planned(2.5 * H);
    const before = s.routes[0].slice();
    expect(ejectFor(s, 2)).toBe(-1);
    putBack(s, createRng(5), { ...DEFAULT_SISR, blinkRate: 0 }, [], [2], false);
    expect(s.routes[0]).toEqual(before);
    expect([...s.unassigned]).toEqual([2]);
  });
});

describe('a ruin around a left-out job', () => {
  it('picks only left-out jobs some farrier could do, each of them in turn', () => {
    const p = randomProblem(51, { jobs: 24, farriers: 3, breaks: true, tight: true });
    const m = buildModel(p);
    const s = new State(m);
    regretConstruct(s, createRng(51));
    const out = [...s.unassigned];
    expect(out.length).toBeGreaterThan(2);
    // the first left-out job counts as one no farrier could do
    const hopeless = new Uint8Array(m.nJobs);
    hopeless[out[0]] = 1;
    const rng = createRng(7), picked = new Set<number>();
    for (let t = 0; t < 200; t++) picked.add(randomLeftOut(s, rng, hopeless));
    expect([...picked].sort((a, b) => a - b)).toEqual(out.slice(1).sort((a, b) => a - b));
    // with only hopeless jobs out there is nothing to pick
    for (const j of out.slice(1)) hopeless[j] = 1;
    expect(randomLeftOut(s, rng, hopeless)).toBe(-1);
  });

  it('ruins the route of its nearest planned job first and leaves the job itself out for the recreate', () => {
    let steps = 0;
    for (const seed of [52, 53, 54]) {
      const p = randomProblem(seed, { jobs: 24, farriers: 3, breaks: true, tight: true });
      const m = buildModel(p);
      const s = new State(m);
      const rng = createRng(seed);
      regretConstruct(s, rng);
      for (const u of s.unassigned) {
        const nearest = [...m.neighbours[u]].find((j) => s.routeOf[j] >= 0);
        if (nearest === undefined) continue;
        const c = s.clone();
        const { removed, seed: around } = ruinAround(c, rng, DEFAULT_SISR, u);
        expect(around).toBe(u);
        expect(removed).not.toContain(u);
        expect(c.routeOf[u]).toBe(-1);
        // the nearest planned job's route lost a string (a string around that job itself)
        const f = s.routeOf[nearest];
        expect(c.routes[f].length).toBeLessThan(s.routes[f].length);
        expect(removed.every((j) => s.routeOf[j] >= 0 && c.routeOf[j] === -1)).toBe(true);
        steps++;
      }
    }
    expect(steps).toBeGreaterThan(5);
  });
});

describe('insertion memo and shared route arrays', () => {
  /** A state with the same routes built from scratch: no remembered insertions, no shared arrays. */
  const rebuilt = (s: State) => {
    const t = new State(s.m);
    t.routes = s.routes.map((r) => r.slice());
    t.refreshAll();
    return t;
  };

  it('answers every insertion query as a fresh scan of the current routes does, through clones, ruins and recreates', () => {
    let compared = 0, found = 0, remembered = 0;
    for (const seed of [41, 42, 43]) {
      const p = randomProblem(seed, { jobs: 20, farriers: 3, breaks: true, tight: seed === 43 });
      let s = new State(buildModel(p));
      const rng = createRng(seed);
      regretConstruct(s, rng);
      for (let t = 0; t < 40; t++) {
        const c = s.clone();
        // either side of the clone changes afterwards; the other keeps its routes' arrays
        const work = rng.next() < 0.5 ? c : s;
        const { removed } = ruinAround(work, rng, DEFAULT_SISR);
        regretRecreate(work, rng, { ...DEFAULT_SISR, blinkRate: 0 }, removed);
        for (const st of [s, c]) {
          const fresh = rebuilt(st);
          for (let f = 0; f < st.m.nFarriers; f++) expect(st.evals[f].cost).toBeCloseTo(fresh.evals[f].cost, 6);
          for (let j = 0; j < st.m.nJobs; j++) for (let f = 0; f < st.m.nFarriers; f++) {
            const bound = rng.next() < 0.3 ? st.m.leaveOutCost[j] : Infinity;
            const twice = st.bestPosition(j, f, 0, rng.next, bound);
            const again = st.bestPosition(j, f, 0, rng.next, bound);
            const want = fresh.bestPosition(j, f, 0, rng.next, bound);
            expect(again).toEqual(twice);
            expect(twice.pos).toBe(want.pos);
            if (want.pos >= 0) { expect(twice.delta).toBeCloseTo(want.delta, 6); found++; }
            compared++;
          }
          remembered++;
        }
        if (rng.next() < 0.5) s = c;
      }
    }
    expect(compared).toBeGreaterThan(5000);
    expect(found).toBeGreaterThan(1000);
    expect(remembered).toBe(240);
  });

  it('still skips the remembered best position when it blinks', () => {
    const p = randomProblem(44, { jobs: 12, farriers: 2 });
    const s = new State(buildModel(p));
    regretConstruct(s, createRng(44));
    // half the jobs out again, so that most queries find a position
    s.removeMany(Array.from({ length: s.m.nJobs }, (_, j) => j).filter((j) => j % 2 === 0));
    let checked = 0;
    for (let j = 0; j < s.m.nJobs; j++) for (let f = 0; f < s.m.nFarriers; f++) {
      const best = s.bestPosition(j, f, 0, () => 0.9);
      if (best.pos < 0) continue;
      // every position blinks: nothing is left to choose, remembered or not
      expect(s.bestPosition(j, f, 1, () => 0).pos).toBe(-1);
      // only the first draw blinks: the remembered best is skipped, the next best is taken
      let draws = 0;
      const other = s.bestPosition(j, f, 0.5, () => (draws++ === 0 ? 0 : 0.9));
      expect(other.pos).not.toBe(best.pos);
      if (other.pos >= 0) expect(other.delta).toBeGreaterThanOrEqual(best.delta - 1e-9);
      expect(s.bestPosition(j, f, 0.5, () => 0.9)).toEqual(best);
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
  });
});

describe('a plan priced under other leave-out costs (scaleOptionalLeaveOut, State.rebase, State.costUnder)', () => {
  it('scales only optional jobs, and prices the same routes and left-out jobs under either model', () => {
    // a mandatory job left out costs about 1e13, so a recount in another order agrees to a relative
    // 1e-12, not to cents; the engine's own prices of one plan agree exactly
    const near = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(b)));
    let leftOutOptional = 0;
    for (const seed of [61, 62, 63]) {
      // a tight day, so that some optional jobs are left out
      const p = randomProblem(seed, { jobs: 22, farriers: 3, breaks: true, tight: true });
      const m = buildModel(p);
      const k = 0.8;
      const scaled = scaleOptionalLeaveOut(m, k);
      for (let j = 0; j < m.nJobs; j++) expect(scaled.leaveOutCost[j]).toBeCloseTo(p.jobs[j].optional ? k * leaveOut(p, j) : leaveOut(p, j), 6);
      const s = new State(m);
      regretConstruct(s, createRng(seed));
      const r = s.rebase(scaled);
      // recount from the routes (exact evaluator) and the problem's penalties
      let routes = 0, leftOut = 0;
      s.routes.forEach((seq, f) => { routes += evalRoute(m, f, seq).cost; });
      for (const j of s.unassigned) leftOut += (p.jobs[j].optional ? k : 1) * leaveOut(p, j);
      for (const j of s.unassigned) if (p.jobs[j].optional) leftOutOptional++;
      expect(r.m).toBe(scaled);
      expect(r.routes).toEqual(s.routes);
      near(r.cost, routes + leftOut);
      expect(r.costUnder(scaled)).toBe(r.cost);
      expect(r.costUnder(m)).toBe(s.cost);
      expect(s.costUnder(scaled)).toBe(r.cost);
      // the source keeps its own model and cost
      expect(s.m).toBe(m);
      near(s.cost, s.recomputeCost());
      expect(() => s.rebase(buildModel(randomProblem(seed + 100, { jobs: 12, farriers: 2 })))).toThrow(/same day/);
    }
    expect(leftOutOptional).toBeGreaterThan(0);
  });
});

describe('the price of a plan with mandatory jobs left out', () => {
  it('does not depend on the order in which its jobs went out', () => {
    // a tight day with mandatory work left out: each one costs 1e13 (× priority), thousands of times a
    // day's routes, where a double resolves about 0.002 cents
    let mixed = 0;
    for (const seed of [19, 27, 71]) {
      // the invented farrier days: drive and distance prices in fractions of a cent
      const m = buildModel(farrierDay({ seed, farriers: 3, jobs: 60, barns: 40, sideM: 40000 }));
      const s = new State(m);
      regretConstruct(s, createRng(seed));
      const out = [...s.unassigned];
      if (!out.some((j) => m.mandatory[j]) || !out.some((j) => !m.mandatory[j])) continue;
      mixed++;
      // the same plan, its left-out jobs listed in every rotation and reversed
      const orders = out.map((_, k) => [...out.slice(k), ...out.slice(0, k)]);
      orders.push([...out].reverse());
      // under full leave-out costs every term is whole cents but the routes; the cycles that search
      // at lower leave-out costs (× 0.8) price optional jobs in fractions of a cent
      const scaled = scaleOptionalLeaveOut(m, 0.8);
      const ref = s.rebase(scaled);
      for (const order of orders) {
        const t = s.clone();
        t.unassigned = new Set(order);
        expect(t.recomputeCost()).toBe(s.cost);
        const r = t.rebase(scaled);
        expect(r.cost).toBe(ref.cost);
        expect(r.costUnder(m)).toBe(s.cost);
        expect(t.costUnder(scaled)).toBe(ref.cost);
      }
    }
    expect(mixed).toBeGreaterThan(2);
  });
});
