import { describe, expect, it } from 'vitest';
import { solveInWorker, SolveCancelledError } from '../../../src/lib/solver/worker';
import { solve, type Progress } from '../../../src/lib/solver/solve';
import { checkSolution } from '../../../src/lib/solver/checker';
import type { Problem } from '../../../src/lib/solver/problem';
import { randomProblem } from './helpers';

const strip = (r: Awaited<ReturnType<typeof solveInWorker>>) => JSON.stringify({ ...r, statistics: { ...r.statistics, seconds: 0, firstFeasibleSeconds: 0 } });

describe('solveInWorker', () => {
  it('runs the search in a worker thread, streams progress and returns the same plan as solve() for the seed', async () => {
    const p = randomProblem(5, { jobs: 14, farriers: 3, breaks: true });
    const progress: Progress[] = [];
    const r = await solveInWorker(p, { seed: 9, stop: { maxIterations: 300 } }, { onProgress: (x) => progress.push(x) });
    expect(progress.length).toBeGreaterThanOrEqual(2);
    expect(progress[0].phase).toBe('construct');
    expect(strip(r)).toBe(strip(solve(p, { seed: 9, stop: { maxIterations: 300 } })));
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
