/**
 * Arrival windows: the span an owner is told to expect the farrier. The planned arrival is rounded to
 * the nearest quarter hour and the window is centred on it; it starts at the practice's minimum width
 * and widens with each stop's place in the route, because every earlier stop can run long.
 */

export interface WindowSettings {
  /** Width of the first stop's window, minutes (default 60). */
  minMinutes: number;
  /** Added per later stop, minutes (default 15). */
  growthMinutes: number;
  /** Widest window, minutes (default 180). */
  maxMinutes: number;
}

export const DEFAULT_WINDOW: WindowSettings = { minMinutes: 60, growthMinutes: 15, maxMinutes: 180 };

const QUARTER_MS = 15 * 60_000;

export interface ArrivalWindow {
  startAt: Date;
  endAt: Date;
}

/** Rounds an instant to the nearest quarter hour (halfway rounds up). */
export function roundToQuarter(at: Date): Date {
  return new Date(Math.round(at.getTime() / QUARTER_MS) * QUARTER_MS);
}

/**
 * The window for a stop at 1-based `position` with the given planned arrival. The width is
 * min + growth × (position − 1), capped at max, then rounded up to a multiple of 30 minutes so that
 * both ends fall on quarter hours; the window is centred on the rounded arrival.
 */
export function arrivalWindow(plannedArrival: Date, position: number, settings: WindowSettings = DEFAULT_WINDOW): ArrivalWindow {
  const raw = Math.min(settings.maxMinutes, settings.minMinutes + settings.growthMinutes * Math.max(0, position - 1));
  const halfMinutes = Math.ceil(Math.max(raw, 30) / 30) * 15;
  const centre = roundToQuarter(plannedArrival).getTime();
  return { startAt: new Date(centre - halfMinutes * 60_000), endAt: new Date(centre + halfMinutes * 60_000) };
}

/**
 * Whether a new window differs from the one the owner was told by more than the threshold at either
 * end: only then is an update text worth sending.
 */
export function movedBeyond(told: ArrivalWindow, next: ArrivalWindow, thresholdMinutes: number): boolean {
  const limit = thresholdMinutes * 60_000;
  return (
    Math.abs(next.startAt.getTime() - told.startAt.getTime()) > limit ||
    Math.abs(next.endAt.getTime() - told.endAt.getTime()) > limit
  );
}
