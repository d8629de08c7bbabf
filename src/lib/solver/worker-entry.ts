/**
 * Worker-thread entry for `solveInWorker`: validates the problem again (it arrives as a plain
 * structured-clone copy), runs the search, streams progress, and polls the shared stop flag.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { createProblem } from './problem';
import { solve, type SolveOptions } from './solve';

const data = workerData as { problem: unknown; opts: Omit<SolveOptions, 'onProgress' | 'shouldStop'>; stopFlag: Int32Array; wantProgress: boolean };
try {
  const problem = createProblem(data.problem);
  const result = solve(problem, {
    ...data.opts,
    shouldStop: () => Atomics.load(data.stopFlag, 0) === 1,
    onProgress: data.wantProgress ? (progress) => parentPort!.postMessage({ type: 'progress', progress }) : undefined,
  });
  parentPort!.postMessage({ type: 'result', result });
} catch (e) {
  const err = e as Error;
  parentPort!.postMessage({ type: 'error', error: { name: err.name, message: err.message } });
}
