import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Problem } from './problem';
import type { Progress, SolveOptions, SolveResult } from './solve';

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
}

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

/**
 * Runs `solve` in a worker thread so that a long search never blocks a request or the event loop.
 * The entry file is resolved from the project root rather than this module's URL, because the Astro
 * build bundles this module into dist/ while the source tree (and tsx) stay in place. On Node 20 a
 * worker's `execArgv: ['--import', 'tsx']` does not reach the worker's module loader (it fails with
 * "Unknown file extension .ts"), so a two-line bootstrap registers tsx's ESM hooks inside the worker
 * and then imports the TypeScript entry. Cancellation is cooperative through a shared flag the search
 * polls, so a cancelled run still returns its best plan.
 */
export function solveInWorker(
  problem: Problem,
  opts: Omit<SolveOptions, 'onProgress' | 'shouldStop'>,
  w: WorkerSolveOptions = {},
): Promise<SolveResult> {
  if (w.signal?.aborted) return Promise.reject(new SolveCancelledError());
  const entry = w.entry ?? process.env.ROUNDSMITH_SOLVER_WORKER ?? path.join(process.cwd(), 'src', 'lib', 'solver', 'worker-entry.ts');
  const stopFlag = new Int32Array(new SharedArrayBuffer(4));
  return new Promise<SolveResult>((resolve, reject) => {
    let settled = false;
    let killTimer: NodeJS.Timeout | undefined;
    const workerData = { problem: JSON.parse(JSON.stringify(problem)), opts, stopFlag, wantProgress: !!w.onProgress };
    const worker = entry.endsWith('.ts') ? new Worker(bootstrap(entry), { eval: true, workerData }) : new Worker(entry, { workerData });
    const finish = (fn: () => void) => {
      if (settled) return;
      settled = true;
      if (killTimer) clearTimeout(killTimer);
      w.signal?.removeEventListener('abort', onAbort);
      fn();
      void worker.terminate();
    };
    const armKill = (sec: number) => {
      if (killTimer) clearTimeout(killTimer);
      killTimer = setTimeout(() => finish(() => reject(new SolveCancelledError('plan search did not answer in time'))), sec * 1000);
    };
    const onAbort = () => {
      Atomics.store(stopFlag, 0, 1);
      armKill(w.graceSeconds ?? 5);
    };
    w.signal?.addEventListener('abort', onAbort);
    if (opts.stop.maxSeconds !== undefined) armKill(opts.stop.maxSeconds + (w.graceSeconds ?? 10));
    worker.on('message', (msg: { type: string; progress?: Progress; result?: SolveResult; error?: { name: string; message: string } }) => {
      if (msg.type === 'progress' && msg.progress) w.onProgress?.(msg.progress);
      else if (msg.type === 'result') finish(() => resolve(msg.result!));
      else if (msg.type === 'error') finish(() => reject(Object.assign(new Error(msg.error!.message), { name: msg.error!.name })));
    });
    worker.on('error', (err) => finish(() => reject(err)));
    worker.on('exit', (code) => finish(() => reject(new Error(`plan worker exited with code ${code} before answering`))));
  });
}
