import { describe, expect, it } from 'vitest';
import { SEARCH_SEED_STEP, solveInWorker, SolveCancelledError } from '../../../src/lib/solver/worker';
import { endRouteLog, routeLogBuffer } from '../../../src/lib/solver/day-pool';
import { bestOf, solve, type Progress, type SolveResult } from '../../../src/lib/solver/solve';
import { checkSolution } from '../../../src/lib/solver/checker';
import type { Problem } from '../../../src/lib/solver/problem';
import { randomProblem } from './helpers';
import { warmUpEngine, warmUpProblem } from '../../../src/lib/solver/warm-up';

const strip = (r: Awaited<ReturnType<typeof solveInWorker>>) => JSON.stringify({ ...r, statistics: { ...r.statistics, seconds: 0, firstFeasibleSeconds: 0 } });

describe('bestOf', () => {
  const plan = (cost: number, unplanned: string[], seed: number) => ({
    routes: [], cost, unplanned: unplanned.map((jobId) => ({ jobId, reason: 'no_room' as const })),
    statistics: { iterations: 1, seconds: 0, firstFeasibleSeconds: 0, improvements: 0, farriersUsed: 0, stopReason: 'iterations' as const, seed },
  }) satisfies SolveResult;
  const p = { jobs: [{ id: 'must', optional: false }, { id: 'may', optional: true }] } as unknown as Problem;

  it('prefers fewer mandatory jobs left out over a lower cost, since a mandatory job left out is listed, not priced', () => {
    expect(bestOf(p, [plan(100, ['must'], 1), plan(500, ['may'], 2)]).statistics.seed).toBe(2);
  });

  it('then the lower cost, and the earlier plan on a tie', () => {
    expect(bestOf(p, [plan(300, ['may'], 1), plan(200, ['may'], 2)]).statistics.seed).toBe(2);
    expect(bestOf(p, [plan(200, [], 1), plan(200, [], 2)]).statistics.seed).toBe(1);
  });
});

describe('warming up a worker', () => {
  it('searches a made-up day of the usual kind (breaks, overtime, optional jobs) whose plan the checker accepts', () => {
    const p = warmUpProblem();
    expect(p.jobs.some((j) => j.optional) && p.farriers.every((f) => f.breakSec > 0)).toBe(true);
    expect(warmUpEngine(200)).toBe(200);
    const r = solve(p, { seed: 1, stop: { maxIterations: 200 } });
    expect(r.routes.filter((x) => x.stops.length).length).toBeGreaterThan(1);
    expect(checkSolution(p, r, { complete: true }).feasible).toBe(true);
  });
});

describe('solveInWorker', () => {
  it('runs the search in a worker thread, streams progress and returns the same plan as solve() for the seed', async () => {
    const p = randomProblem(5, { jobs: 14, farriers: 3, breaks: true });
    const progress: Progress[] = [];
    const r = await solveInWorker(p, { seed: 9, stop: { maxIterations: 300 } }, { onProgress: (x) => progress.push(x), searches: 1 });
    expect(progress.length).toBeGreaterThanOrEqual(2);
    expect(progress[0].phase).toBe('construct');
    expect(strip(r)).toBe(strip(solve(p, { seed: 9, stop: { maxIterations: 300 } })));
  });

  it('by default runs two searches side by side that share routes, the same plan in every run under an iteration limit', async () => {
    const p = randomProblem(16, { jobs: 40, farriers: 4, breaks: true });
    const stop = { maxIterations: 400 };
    const progress: Progress[] = [];
    const r = await solveInWorker(p, { seed: 1, stop }, { onProgress: (x) => progress.push(x) });
    expect(r.statistics.searches).toBe(2);
    expect([1, 1 + SEARCH_SEED_STEP]).toContain(r.statistics.seed);
    // each search packs the other's routes at every cycle end (cycles line up under an iteration
    // limit) and the first packs all of the second's at the end, so the result is reproducible
    const again = await solveInWorker(p, { seed: 1, stop });
    expect(strip(again)).toBe(strip(r));
    // the first search alone ends dearer on this day
    expect(r.cost).toBeLessThan(solve(p, { seed: 1, stop }).cost);
    // progress adds up the searches' iterations
    expect(Math.max(...progress.map((x) => x.iterations))).toBeGreaterThan(stop.maxIterations);
    expect(r.statistics.iterations).toBe(Math.max(...progress.map((x) => x.iterations)));
    expect(checkSolution(p, r, { complete: true }).feasible).toBe(true);
  });

  it('packs routes another search logged at each cycle end: a search reading a finished log reads up to its own cycle', () => {
    const p = randomProblem(16, { jobs: 40, farriers: 4, breaks: true });
    const stop = { maxIterations: 2000 };
    const other = routeLogBuffer(), mine = routeLogBuffer();
    const two = solve(p, { seed: 1 + SEARCH_SEED_STEP, stop, routeExchange: { share: { mine: other, others: [] } } });
    const one = solve(p, { seed: 1, stop, routeExchange: { share: { mine, others: [other] } } });
    const replay = solve(p, { seed: 1, stop, routeExchange: { share: { mine: routeLogBuffer(), others: [other] } } });
    expect(JSON.stringify(replay.routes)).toBe(JSON.stringify(one.routes));
    // the other's routes changed where the search went (without them it retraces the search alone)
    const alone = solve(p, { seed: 1, stop });
    expect(JSON.stringify(one.routes)).not.toBe(JSON.stringify(alone.routes));
    const empty = routeLogBuffer();
    endRouteLog(empty);
    expect(JSON.stringify(solve(p, { seed: 1, stop, routeExchange: { share: { mine: routeLogBuffer(), others: [empty] } } }).routes)).toBe(JSON.stringify(alone.routes));
    for (const x of [one, two]) expect(checkSolution(p, x, { complete: true }).feasible).toBe(true);
  });

  it('stops when cancelled and still returns its best plan, which passes the checker', async () => {
    const p = randomProblem(6, { jobs: 30, farriers: 4, breaks: true });
    const ctl = new AbortController();
    const r = await solveInWorker(p, { seed: 1, stop: { maxIterations: 1e9 } }, {
      signal: ctl.signal,
      onProgress: (x) => { if (x.phase === 'construct') ctl.abort(); },
    });
    expect(r.statistics.stopReason).toBe('cancelled');
    expect(r.statistics.iterations).toBeLessThan(1e9);
    expect(checkSolution(p, r, { complete: true }).feasible).toBe(true);
  });

  it('rejects at once when the signal was already aborted', async () => {
    const ctl = new AbortController();
    ctl.abort();
    await expect(solveInWorker(randomProblem(1, { jobs: 3, farriers: 1 }), { seed: 1, stop: { maxIterations: 10 } }, { signal: ctl.signal })).rejects.toBeInstanceOf(SolveCancelledError);
  });

  it('passes a validation failure inside the worker back as a ProblemError', async () => {
    const bad = { locations: 1, durationSec: [[0]], distanceM: [[0]], farriers: [], barns: [], jobs: [{ id: 'x', barnId: 'nowhere', durationSec: 1 }] } as unknown as Problem;
    await expect(solveInWorker(bad, { seed: 1, stop: { maxIterations: 10 } })).rejects.toMatchObject({ name: 'ProblemError' });
  });
});
