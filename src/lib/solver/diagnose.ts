import { earliestIn, type Model } from './model';
import { evalRoute } from './route-eval';

/**
 * Why a job is unplanned. Codes are stable API (documented in docs/solver.md):
 * - `no_farrier_working` — no farrier works this day at all;
 * - `pinned_farrier_unavailable` — pinned to a farrier who is not working this day;
 * - `pinned_farrier_unfit` — pinned to a farrier without the skill, forge or capacity the job needs;
 * - `no_qualified_farrier` / `no_forge_farrier` — nobody working has the skill / a forge;
 * - `no_qualified_forge_farrier` — both exist, but not on the same farrier;
 * - `over_capacity` — demand above every fitting farrier's capacity;
 * - `no_common_window` — the owner's or pin's times never overlap the barn's hours (or the work does
 *   not fit inside any access window);
 * - `longer_than_any_shift` — drive there, set-up, work and drive home exceed every fitting farrier's day;
 * - `barn_closed_during_shifts` — no fitting farrier can be at the barn while it is open;
 * - `no_feasible_route_alone` — even alone on a route it breaks a rule (break, overtime limit, position pin);
 * - `no_room` — could be done alone, but not within this plan at acceptable cost.
 */
export type UnplannedReason =
  | 'no_farrier_working'
  | 'pinned_farrier_unavailable'
  | 'pinned_farrier_unfit'
  | 'no_qualified_farrier'
  | 'no_forge_farrier'
  | 'no_qualified_forge_farrier'
  | 'over_capacity'
  | 'no_common_window'
  | 'longer_than_any_shift'
  | 'barn_closed_during_shifts'
  | 'no_feasible_route_alone'
  | 'no_room';

/** Reason a job cannot be planned at all, or null when it could be done alone by someone. */
export function impossibleReason(m: Model, j: number): UnplannedReason | null {
  const p = m.problem, job = p.jobs[j];
  const F = m.nFarriers;
  if (F === 0) return 'no_farrier_working';
  if (job.pin) {
    const f = p.farriers.findIndex((x) => x.id === job.pin!.farrierId);
    if (f < 0) return 'pinned_farrier_unavailable';
    if (!m.eligible[f * m.nJobs + j]) return 'pinned_farrier_unfit';
  } else {
    const q = p.farriers.some((f) => f.qualified), fo = p.farriers.some((f) => f.hasForge);
    if (job.needsQualified && !q) return 'no_qualified_farrier';
    if (job.needsForge && !fo) return 'no_forge_farrier';
    if (job.needsQualified && job.needsForge && !p.farriers.some((f) => f.qualified && f.hasForge)) return 'no_qualified_forge_farrier';
    let fits = false;
    for (let f = 0; f < F; f++) if (m.eligible[f * m.nJobs + j]) fits = true;
    if (!fits) return 'over_capacity';
  }
  const w = m.windows[j];
  if (w.length === 0) return 'no_common_window';
  let allLong = true, allClosedOrLong = true;
  for (let f = 0; f < F; f++) {
    if (!m.eligible[f * m.nJobs + j]) continue;
    if (evalRoute(m, f, [j]).feasible) return null;
    const far = p.farriers[f];
    const need = m.fromHomeArc[f][j] + m.serviceSec[j] + m.toHomeTravel[f][j];
    const long = need > m.endLimit[f] - m.shiftStart[f] || m.serviceSec[j] > far.normalWorkSec + far.maxOvertimeSec;
    if (!long) allLong = false;
    const s = earliestIn(w, m.shiftStart[f] + m.fromHomeArc[f][j]);
    const closed = s === Infinity || s + m.serviceSec[j] + m.toHomeTravel[f][j] > m.endLimit[f];
    if (!long && !closed) allClosedOrLong = false;
  }
  if (allLong) return 'longer_than_any_shift';
  if (allClosedOrLong) return 'barn_closed_during_shifts';
  return 'no_feasible_route_alone';
}
