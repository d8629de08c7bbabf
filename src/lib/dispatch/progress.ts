import type { PlanProgressView } from '../../schemas/plans.ts';

/**
 * Planning runs in progress, per practice and date, so the board can poll how far the engine has got.
 * In memory: the app runs as one Node process and a run lasts seconds.
 */
interface Run extends PlanProgressView {
  startedAt: number;
}
const runs = new Map<string, Run>();
const key = (practiceId: number, date: string) => `${practiceId}|${date}`;

/** Marks a run as started; false when one is already running for the same practice and date. */
export function startRun(practiceId: number, date: string, budgetSeconds: number): boolean {
  const k = key(practiceId, date);
  if (runs.get(k)?.running) return false;
  runs.set(k, { running: true, seconds: 0, budgetSeconds, iterations: 0, unplanned: 0, farriersUsed: 0, phase: 'matrix', startedAt: Date.now() });
  return true;
}

export function updateRun(practiceId: number, date: string, change: Partial<PlanProgressView>): void {
  const run = runs.get(key(practiceId, date));
  if (run) Object.assign(run, change, { seconds: (Date.now() - run.startedAt) / 1000 });
}

export function finishRun(practiceId: number, date: string): void {
  const run = runs.get(key(practiceId, date));
  if (run) {
    run.running = false;
    run.phase = 'done';
    run.seconds = (Date.now() - run.startedAt) / 1000;
  }
}

/** The latest progress of a run, or an idle answer when none ran. */
export function runProgress(practiceId: number, date: string): PlanProgressView {
  const run = runs.get(key(practiceId, date));
  if (!run) return { running: false, seconds: 0, budgetSeconds: 0, iterations: 0, unplanned: 0, farriersUsed: 0, phase: 'idle' };
  const { startedAt: _s, ...view } = run;
  return run.running ? { ...view, seconds: (Date.now() - startedAt(run)) / 1000 } : view;
}
const startedAt = (r: Run) => r.startedAt;
