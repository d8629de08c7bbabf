/**
 * Re-estimates a route's remaining stops from what really happened. Pure: the day sheet and the
 * dispatcher's board run the same arithmetic on the same marks.
 *
 * Model: every stop keeps its planned gaps (drive and any break or wait between the previous
 * departure and its arrival, the set-up offset, and the work time); the latest actual time shifts all
 * later stops by the same amount, early or late.
 */

export interface PlannedStop {
  id: number;
  arrivalMs: number;
  startMs: number;
  departureMs: number;
}

export interface StopMark {
  state: 'arrived' | 'done' | 'skipped';
  arrivedMs: number | null;
  departedMs: number | null;
}

export interface EstimatedStop {
  id: number;
  /** Expected (or actual) arrival and departure. */
  arrivalMs: number;
  departureMs: number;
  /** Expected minus planned arrival, seconds (positive = running late). */
  delaySec: number;
  /** 'actual' for marked times, 'estimate' for re-computed ones, 'plan' before any mark. */
  basis: 'actual' | 'estimate' | 'plan';
}

/** Estimates arrival and departure of every stop in order, given the marks made so far. */
export function reestimate(stops: PlannedStop[], marks: Map<number, StopMark>): EstimatedStop[] {
  const out: EstimatedStop[] = [];
  let prevPlannedDeparture: number | null = null;
  let prevDeparture: number | null = null;
  let anyActual = false;
  for (const s of stops) {
    const gap = prevPlannedDeparture === null ? 0 : s.arrivalMs - prevPlannedDeparture;
    const work = s.departureMs - s.arrivalMs;
    const expectedArrival: number = prevDeparture === null ? s.arrivalMs : prevDeparture + gap;
    const mark = marks.get(s.id);
    let arrival = expectedArrival;
    let departure: number = expectedArrival + work;
    let basis: EstimatedStop['basis'] = anyActual ? 'estimate' : 'plan';
    if (mark) {
      basis = 'actual';
      anyActual = true;
      if (mark.state === 'skipped') {
        // A skipped stop takes only the time until the farrier left it.
        arrival = mark.arrivedMs ?? mark.departedMs ?? expectedArrival;
        departure = mark.departedMs ?? arrival;
      } else {
        arrival = mark.arrivedMs ?? expectedArrival;
        departure = mark.departedMs ?? arrival + work;
      }
    }
    out.push({ id: s.id, arrivalMs: arrival, departureMs: departure, delaySec: Math.round((arrival - s.arrivalMs) / 1000), basis });
    prevPlannedDeparture = s.departureMs;
    prevDeparture = departure;
  }
  return out;
}
