import { describe, expect, it } from 'vitest';
import { SEARCH_SEED_STEP, solveInWorker, SolveCancelledError } from '../../../src/lib/solver/worker';
import { routeExchangeBuffer } from '../../../src/lib/solver/day-pool';
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

  it('by default runs two searches side by side and keeps the better plan, as solve() with both seeds would', async () => {
    const p = randomProblem(16, { jobs: 40, farriers: 4, breaks: true });
    const stop = { maxIterations: 400 };
    const progress: Progress[] = [];
    const r = await solveInWorker(p, { seed: 1, stop }, { onProgress: (x) => progress.push(x) });
    // the second search hands its routes to the first, which packs them with its own at the end
    const buf = routeExchangeBuffer();
    const two = solve(p, { seed: 1 + SEARCH_SEED_STEP, stop, routeExchange: { publish: buf } });
    const one = solve(p, { seed: 1, stop, routeExchange: { collect: [buf] } });
    const winner = bestOf(p, [one, two]);
    // packing both searches' routes made the first search's plan cheaper than it finds alone
    expect(one.cost).toBeLessThan(solve(p, { seed: 1, stop }).cost);
    expect(r.statistics.searches).toBe(2);
    expect(r.statistics.iterations).toBe(one.statistics.iterations + two.statistics.iterations);
    expect(r.statistics.seed).toBe(winner.statistics.seed);
    expect(r.cost).toBe(Math.min(one.cost, two.cost));
    expect(JSON.stringify(r.routes)).toBe(JSON.stringify(winner.routes));
    // progress adds up the searches' iterations
    expect(Math.max(...progress.map((x) => x.iterations))).toBeGreaterThan(stop.maxIterations);
    expect(checkSolution(p, r, { complete: true }).feasible).toBe(true);
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
