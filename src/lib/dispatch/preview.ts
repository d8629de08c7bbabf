import type { Move, PlanJobView, PlanRouteView, PlanStopView, PlanView } from '../../schemas/plans.ts';
import { applyMoves, type EditRoutes } from './edits.ts';

/**
 * The board's answer to a drop before the server's: the same list operations the server applies
 * (`applyMoves`), run on the plan the board shows, so the moved work sits where it was dropped at once.
 * Times, figures and warnings stay as they were until the re-timed plan arrives (the touched lanes say
 * they are being re-timed); a refused edit (409) puts the previous plan back. Pure: no I/O, no React.
 */
export interface MovePreview {
  plan: PlanView;
  /** Farriers whose lanes changed and await re-timing. */
  touched: number[];
}

/**
 * Applies `moves` to `plan` as the server would order them, or returns null when the moves leave work
 * off the plan (its unplanned reason is the server's to give) or name a job or farrier the plan lacks.
 * Taking a stop's jobs off and placing them again in the same edit (how a whole stop moves) is fine.
 * Stops whose jobs are unchanged keep their object (memoised cards do not re-render); a stop that gains
 * or loses jobs is rebuilt from the stop its first job came from, under a provisional negative id.
 */
export function previewMoves(plan: PlanView, moves: readonly Move[]): MovePreview | null {
  if (moves.length === 0) return null;
  const jobs = new Map<number, { job: PlanJobView; barnId: number; stop: PlanStopView | null; barnName: string }>();
  const start: EditRoutes = new Map();
  for (const r of plan.routes) {
    start.set(r.farrierId, r.stops.map((s) => ({ barnId: s.barnId, jobIds: s.jobs.map((j) => j.id) })));
    for (const s of r.stops) for (const j of s.jobs) jobs.set(j.id, { job: j, barnId: s.barnId, stop: s, barnName: s.barnName });
  }
  for (const u of plan.unplanned) jobs.set(u.jobId, { job: u.job, barnId: u.barnId, stop: null, barnName: u.barnName });
  if (moves.some((m) => !jobs.has(m.jobId) || (m.toFarrierId !== null && !start.has(m.toFarrierId)))) return null;

  const { routes, touched, added, removed } = applyMoves(start, moves, (jobId) => jobs.get(jobId)!.barnId);
  if (removed.size > 0) return null;
  const pins = new Map<number, boolean>();
  for (const m of moves) if (m.pin !== undefined) pins.set(m.jobId, m.pin);
  const jobView = (id: number): PlanJobView => {
    const job = jobs.get(id)!.job;
    const pin = pins.get(id);
    return pin === undefined || pin === job.pinned ? job : { ...job, pinned: pin, pinnedPosition: pin ? job.pinnedPosition : null };
  };

  const nextRoutes: PlanRouteView[] = plan.routes.map((r) => {
    if (!touched.has(r.farrierId)) return r;
    const stops = routes.get(r.farrierId)!.map((edit, i): PlanStopView => {
      const first = jobs.get(edit.jobIds[0]!)!;
      const old = first.stop;
      const same = old !== null && old.jobs.length === edit.jobIds.length && old.jobs.every((j, k) => j.id === edit.jobIds[k] && !pins.has(j.id));
      if (same) return old.position === i + 1 ? old : { ...old, position: i + 1 };
      const stopJobs = edit.jobIds.map(jobView);
      const base = old ?? nearestStop(r, i);
      return {
        ...(base ?? emptyStop()),
        id: -edit.jobIds[0]!,
        position: i + 1,
        barnId: edit.barnId,
        barnName: first.barnName,
        jobs: stopJobs,
        minutes: stopJobs.reduce((n, j) => n + j.minutes, 0),
        warnings: [],
        progress: old?.progress ?? null,
        window: old?.window ?? null,
      };
    });
    return { ...r, stops, horses: stops.reduce((n, s) => n + s.jobs.length, 0) };
  });
  return {
    plan: { ...plan, routes: nextRoutes, unplanned: plan.unplanned.filter((u) => !added.has(u.jobId)) },
    touched: [...touched],
  };
}

/** For a job coming from the unplanned list: the stop now at its place, for times to show meanwhile. */
function nearestStop(route: PlanRouteView, index: number): PlanStopView | null {
  return route.stops[Math.min(index, route.stops.length - 1)] ?? null;
}

function emptyStop(): PlanStopView {
  return {
    id: 0, position: 0, barnId: 0, barnName: '', lat: 0, lon: 0, arrival: '', start: '', departure: '',
    legDriveMinutes: 0, legDistance: 0, window: null, minutes: 0, jobs: [], warnings: [], progress: null,
  };
}
