import { getRoadGraph } from '../routing/index.ts';
import { warmSolverWorker } from '../solver/worker.ts';

let warmed = false;

/**
 * Gets the server ready to plan before anyone asks: loads the road graph (read and indexed once per
 * process) and starts a warm plan-engine worker. Called when the dispatch modules load, which happens
 * when the dispatch screen or the plans API is first used, so "Plan the day" spends its time on the
 * search rather than on start-up. Runs after the current request (a timer that never holds the
 * process open); a missing road file is left for the request that needs it to report.
 */
export function warmDispatch(): void {
  if (warmed) return;
  warmed = true;
  const timer = setTimeout(() => {
    warmSolverWorker();
    try {
      getRoadGraph();
    } catch {
      // The plan request reports a missing or broken region file in its own answer.
    }
  }, 0);
  timer.unref?.();
}
