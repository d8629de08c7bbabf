/**
 * Worker-thread entry for `solveInWorker`: validates the problem again (it arrives as a plain
 * structured-clone copy), runs the search, streams progress, and polls the shared stop flag.
 *
 * Two ways in. Started with a `problem` in workerData it solves that one problem (a one-off worker).
 * Started with `{ persistent: true }` it stays up and solves each `{ type: 'solve', runId, … }` message
 * in turn, so a warm worker (modules loaded, code compiled and optimised by a short search on a
 * made-up day) is ready before the dispatcher asks.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { createProblem } from './problem';
import { solve, type SolveOptions } from './solve';
import { warmUpEngine } from './warm-up';
import { endRouteLog, markPublished } from './day-pool';

interface SolveJob {
  problem: unknown;
  opts: Omit<SolveOptions, 'onProgress' | 'shouldStop'>;
  stopFlag: Int32Array;
  wantProgress: boolean;
}

function run(job: SolveJob, runId?: number): void {
  try {
    const problem = createProblem(job.problem);
    const result = solve(problem, {
      ...job.opts,
      shouldStop: () => Atomics.load(job.stopFlag, 0) === 1,
      onProgress: job.wantProgress ? (progress) => parentPort!.postMessage({ type: 'progress', runId, progress }) : undefined,
    });
    parentPort!.postMessage({ type: 'result', runId, result });
  } catch (e) {
    // the searches beside this one must not wait for its routes
    if (job.opts.routeExchange?.publish) markPublished(job.opts.routeExchange.publish, 0);
    if (job.opts.routeExchange?.share) endRouteLog(job.opts.routeExchange.share.mine);
    const err = e as Error;
    parentPort!.postMessage({ type: 'error', runId, error: { name: err.name, message: err.message } });
  }
}

const data = workerData as (SolveJob & { persistent?: false }) | { persistent: true };
if (data.persistent) {
  // a warm worker also warms the engine's code (a short search on a made-up day) before its first
  // plan; a plan asked for meanwhile waits in the message queue
  warmUpEngine();
  parentPort!.on('message', (msg: SolveJob & { type: string; runId: number }) => {
    if (msg.type === 'solve') run(msg, msg.runId);
  });
  parentPort!.postMessage({ type: 'ready' });
} else {
  run(data);
}
