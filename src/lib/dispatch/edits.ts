import type { Move } from '../../schemas/plans.ts';

/**
 * Hand edits as pure list operations on a plan's job order: the server applies the dispatcher's moves
 * here, then re-times the touched routes with the engine's checker. Nothing else moves: a job lands
 * exactly where it was dropped, and whatever that breaks is reported, not repaired.
 */

export interface EditStop {
  barnId: number;
  jobIds: number[];
}

/** Routes by farrier id, each an ordered list of stops. */
export type EditRoutes = Map<number, EditStop[]>;

export interface EditResult {
  routes: EditRoutes;
  /** Farriers whose routes changed. */
  touched: Set<number>;
  /** Jobs now off every route (taken off by a move). */
  removed: Set<number>;
  /** Jobs newly placed on a route. */
  added: Set<number>;
}

export function cloneRoutes(routes: EditRoutes): EditRoutes {
  return new Map([...routes].map(([f, stops]) => [f, stops.map((s) => ({ barnId: s.barnId, jobIds: [...s.jobIds] }))]));
}

/** Where a job is: farrier and 0-based stop index, or null when on no route. */
export function locate(routes: EditRoutes, jobId: number): { farrierId: number; stopIndex: number } | null {
  for (const [farrierId, stops] of routes) {
    const stopIndex = stops.findIndex((s) => s.jobIds.includes(jobId));
    if (stopIndex >= 0) return { farrierId, stopIndex };
  }
  return null;
}

/** Merges neighbouring stops at the same barn (one set-up for horses done in a row at one barn). */
function mergeNeighbours(stops: EditStop[]): EditStop[] {
  const out: EditStop[] = [];
  for (const s of stops) {
    const last = out[out.length - 1];
    if (last && last.barnId === s.barnId) last.jobIds.push(...s.jobIds);
    else out.push(s);
  }
  return out;
}

/**
 * Applies moves in order. A move to a farrier without `position` joins that route's stop at the job's
 * barn if there is one, else becomes a new last stop. With `position` (1-based) the job goes in front of
 * the stop now at that position, or joins it (last) when it is at the same barn; a position past the end
 * appends. Moving a whole stop is its jobs taken off, then placed: removals first keep positions exact.
 * `toFarrierId` null takes the job off the plan.
 */
export function applyMoves(start: EditRoutes, moves: readonly Move[], barnOf: (jobId: number) => number): EditResult {
  const routes = cloneRoutes(start);
  const touched = new Set<number>();
  const removed = new Set<number>();
  const added = new Set<number>();
  for (const move of moves) {
    const from = locate(routes, move.jobId);
    if (from) {
      const stops = routes.get(from.farrierId)!;
      const stop = stops[from.stopIndex]!;
      stop.jobIds = stop.jobIds.filter((id) => id !== move.jobId);
      if (stop.jobIds.length === 0) stops.splice(from.stopIndex, 1);
      routes.set(from.farrierId, mergeNeighbours(stops));
      touched.add(from.farrierId);
    } else {
      added.add(move.jobId);
    }
    if (move.toFarrierId === null) {
      removed.add(move.jobId);
      added.delete(move.jobId);
      continue;
    }
    removed.delete(move.jobId);
    const barnId = barnOf(move.jobId);
    const stops = routes.get(move.toFarrierId) ?? [];
    if (move.position === undefined) {
      const same = stops.find((s) => s.barnId === barnId);
      if (same) same.jobIds.push(move.jobId);
      else stops.push({ barnId, jobIds: [move.jobId] });
    } else {
      const at = Math.min(move.position - 1, stops.length);
      const there = stops[at];
      if (there && there.barnId === barnId) there.jobIds.push(move.jobId);
      else stops.splice(at, 0, { barnId, jobIds: [move.jobId] });
    }
    routes.set(move.toFarrierId, mergeNeighbours(stops));
    touched.add(move.toFarrierId);
  }
  return { routes, touched, removed, added };
}
