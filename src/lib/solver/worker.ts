import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Problem } from './problem';
import { bestOf, betterPlan, packsRoutes, type Progress, type SolveOptions, type SolveResult } from './solve';
import { routeExchangeBuffer, routeLogBuffer } from './day-pool';

/** Options for running the engine off the main thread. */
export interface WorkerSolveOptions {
  /** Aborting stops the search; the promise then resolves with the best plan so far (stopReason `cancelled`). */
  signal?: AbortSignal;
  onProgress?: (p: Progress) => void;
  /**
   * Worker entry file; defaults to src/lib/solver/worker-entry.ts under the project root
   * (process.cwd(), or ROUNDSMITH_SOLVER_WORKER). A .ts entry is loaded through tsx; a .js/.mjs one directly.
   */
  entry?: string;
  /** Extra seconds past the time budget before the worker is terminated outright (default 10). */
  graceSeconds?: number;
  /**
   * Independent searches run side by side, one worker thread each (default 2, the cores of the
   * machines we run on); search k uses seed + 7919·k and the best plan wins (`bestOf`).
   */
  searches?: number;
}

/** Seed step between side-by-side searches (a prime, so their random streams share nothing obvious). */
export const SEARCH_SEED_STEP = 7919;

/** Worker source that loads tsx (resolved from the project root) and then the TypeScript entry. */
function bootstrap(entry: string): string {
  const report = `(e) => { require('node:worker_threads').parentPort.postMessage({ type: 'error', error: { name: e.name, message: 'plan worker failed to start: ' + e.message } }); }`;
  return `import('tsx/esm/api').then((m) => { m.register(); return import(${JSON.stringify(pathToFileURL(entry).href)}); }).catch(${report});`;
}

/** The worker was stopped before it could return any plan (aborted before start, or it did not answer in time). */
export class SolveCancelledError extends Error {
  readonly code = 'solve_cancelled';
  constructor(message = 'plan search was cancelled') {
    super(message);
    this.name = 'SolveCancelledError';
  }
}

/** The default entry: src/lib/solver/worker-entry.ts under the project root. */
function defaultEntry(): string {
  return path.join(process.cwd(), 'src', 'lib', 'solver', 'worker-entry.ts');
}

function startWorker(entry: string, workerData: unknown): Worker {
  return entry.endsWith('.ts') ? new Worker(bootstrap(entry), { eval: true, workerData }) : new Worker(entry, { workerData });
}

/**
 * Warm workers for the default entry, waiting for their next problem. Starting a worker means loading
 * tsx and compiling the engine inside it, which costs about a second on a busy machine; a persistent
 * worker pays that once, so a plan request spends its time on the search. At most two wait (one per
 * side-by-side search); a run that finds none starts its own worker, which is then kept or ended.
 */
const idle: Worker[] = [];
const MAX_IDLE = 2;
let runSeq = 0;

/** True when runs use the warm-worker pool: the default entry, not one chosen by option or environment. */
const pooled = (w: WorkerSolveOptions) => !w.entry && !process.env.ROUNDSMITH_SOLVER_WORKER;

function startPersistent(): Worker {
  const worker = startWorker(defaultEntry(), { persistent: true });
  const forget = () => {
    const i = idle.indexOf(worker);
    if (i >= 0) idle.splice(i, 1);
  };
  worker.on('error', forget);
  worker.on('exit', forget);
  return worker;
}

function park(worker: Worker): void {
  if (idle.length >= MAX_IDLE) {
    void worker.terminate();
    return;
  }
  // An idle worker never keeps the process alive (CLIs, tests and a shutting-down server exit as usual).
  worker.unref();
  idle.push(worker);
}

/**
 * Starts a warm worker now (if none waits), so the next `solveInWorker` with the default entry finds
 * the engine loaded. Cheap to call again; does nothing when an entry is chosen through the environment.
 */
export function warmSolverWorker(): void {
  if (process.env.ROUNDSMITH_SOLVER_WORKER) return;
  while (idle.length < MAX_IDLE) park(startPersistent());
}

/**
 * Runs the engine off the main thread: `searches` searches (default 2) side by side, each `solve` in
 * its own worker thread with its own seed, and returns the best plan. On a day with optional jobs a
 * single run sometimes settles on a plan that leaves out a different job than the best plan does,
 * and only a long run gets out of it; a second search started elsewhere often does not fall into
 * the same place, so two searches for 3 s on two cores come closer to a long run than one (figures
 * in docs/solver.md). On a day that packs its routes the searches share the routes they meet at
 * every annealing cycle end (`RouteShare`) and the first packs all of them at the end.
 * Deterministic for a seed and an iteration limit, like `solve`.
 * Progress reports the total iterations and the best cost so far; cancelling stops every search,
 * each returning its best plan. A failure in any search (a ProblemError, say) rejects the whole run
 * once every search has ended.
 */
export async function solveInWorker(
  problem: Problem,
  opts: Omit<SolveOptions, 'onProgress' | 'shouldStop'>,
  w: WorkerSolveOptions = {},
): Promise<SolveResult> {
  const n = Math.max(1, Math.floor(w.searches ?? 2));
  if (n === 1) return oneSearch(problem, opts, w);
  if (w.signal?.aborted) throw new SolveCancelledError();
  const latest: (Progress | undefined)[] = new Array(n).fill(undefined);
  const report = (k: number, p: Progress) => {
    latest[k] = p;
    let best = p;
    // judged as `bestOf` judges the final plans
    for (const q of latest) if (q && betterPlan(q.mandatoryUnplanned, q.bestCost, best.mandatoryUnplanned, best.bestCost)) best = q;
    let iterations = 0, seconds = 0;
    for (const q of latest) if (q) { iterations += q.iterations; seconds = Math.max(seconds, q.seconds); }
    w.onProgress!({ ...best, iterations, seconds });
  };
  // on a farrier day the first search packs every search's routes together at the end
  // and every search packs the others' routes with its own at each annealing cycle end
  const buffers = packsRoutes(problem) ? Array.from({ length: n - 1 }, () => routeExchangeBuffer()) : null;
  const logs = buffers ? Array.from({ length: n }, () => routeLogBuffer()) : null;
  const exchange = (k: number) => {
    if (!buffers || !logs) return {};
    const share = { mine: logs[k], others: logs.filter((_, i) => i !== k) };
    return { routeExchange: k === 0 ? { collect: buffers, share } : { publish: buffers[k - 1], share } };
  };
  const runs = await Promise.allSettled(Array.from({ length: n }, (_, k) =>
    oneSearch(problem, { ...opts, ...exchange(k), seed: opts.seed + SEARCH_SEED_STEP * k }, { ...w, onProgress: w.onProgress ? (p) => report(k, p) : undefined })));
  const failed = runs.find((r) => r.status === 'rejected');
  if (failed) throw (failed as PromiseRejectedResult).reason;
  const results = runs.map((r) => (r as PromiseFulfilledResult<SolveResult>).value);
  const best = bestOf(problem, results);
  return { ...best, statistics: { ...best.statistics, iterations: results.reduce((a, r) => a + r.statistics.iterations, 0), searches: n } };
}

/**
 * Runs `solve` in a worker thread so that a long search never blocks a request or the event loop.
 * The entry file is resolved from the project root rather than this module's URL, because the Astro
 * build bundles this module into dist/ while the source tree (and tsx) stay in place. On Node 20 a
 * worker's `execArgv: ['--import', 'tsx']` does not reach the worker's module loader (it fails with
 * "Unknown file extension .ts"), so a two-line bootstrap registers tsx's ESM hooks inside the worker
 * and then imports the TypeScript entry. Cancellation is cooperative through a shared flag the search
 * polls, so a cancelled run still returns its best plan. With the default entry the run goes to a warm
 * worker (see `warmSolverWorker`) that stays up for the next run; a worker that had to be terminated
 * (time limit passed) or failed is never reused.
 */
function oneSearch(
  problem: Problem,
  opts: Omit<SolveOptions, 'onProgress' | 'shouldStop'>,
  w: WorkerSolveOptions,
): Promise<SolveResult> {
  if (w.signal?.aborted) return Promise.reject(new SolveCancelledError());
  const stopFlag = new Int32Array(new SharedArrayBuffer(4));
  const job = { problem: JSON.parse(JSON.stringify(problem)), opts, stopFlag, wantProgress: !!w.onProgress };
  const warm = pooled(w);
  const runId = ++runSeq;
  let worker: Worker;
  if (warm) {
    worker = idle.shift() ?? startPersistent();
    worker.ref();
  } else {
    worker = startWorker(w.entry ?? process.env.ROUNDSMITH_SOLVER_WORKER ?? defaultEntry(), job);
  }
  return new Promise<SolveResult>((resolve, reject) => {
    let settled = false;
    let killTimer: NodeJS.Timeout | undefined;
    const finish = (fn: () => void, reusable: boolean) => {
      if (settled) return;
      settled = true;
      if (killTimer) clearTimeout(killTimer);
      w.signal?.removeEventListener('abort', onAbort);
      worker.off('message', onMessage);
      worker.off('error', onError);
      worker.off('exit', onExit);
      fn();
      if (warm && reusable) park(worker);
      else void worker.terminate();
    };
    const armKill = (sec: number) => {
      if (killTimer) clearTimeout(killTimer);
      killTimer = setTimeout(() => finish(() => reject(new SolveCancelledError('plan search did not answer in time')), false), sec * 1000);
    };
    const onAbort = () => {
      Atomics.store(stopFlag, 0, 1);
      armKill(w.graceSeconds ?? 5);
    };
    type Msg = { type: string; runId?: number; progress?: Progress; result?: SolveResult; error?: { name: string; message: string } };
    const onMessage = (msg: Msg) => {
      // A message without a run id is the bootstrap failing to start the worker at all.
      if (msg.runId !== undefined && msg.runId !== runId && warm) return;
      if (msg.type === 'progress' && msg.progress) w.onProgress?.(msg.progress);
      else if (msg.type === 'result') finish(() => resolve(msg.result!), true);
      else if (msg.type === 'error') finish(() => reject(Object.assign(new Error(msg.error!.message), { name: msg.error!.name })), msg.runId !== undefined);
    };
    const onError = (err: Error) => finish(() => reject(err), false);
    const onExit = (code: number) => finish(() => reject(new Error(`plan worker exited with code ${code} before answering`)), false);
    w.signal?.addEventListener('abort', onAbort);
    if (opts.stop.maxSeconds !== undefined) armKill(opts.stop.maxSeconds + (w.graceSeconds ?? 10));
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.on('exit', onExit);
    if (warm) worker.postMessage({ type: 'solve', runId, ...job });
  });
}
