/**
 * Odometer readings from the day sheet. Farriers keep a mileage log for tax from the truck's odometer,
 * in whole miles or kilometres (the practice's units); the day's distance is the difference of the
 * "Back home" and "Start the day" readings, stored in metres like every other distance.
 */
import { metresPerUnit, type Units } from '../review/mileage.ts';

/**
 * The most a day's odometer difference may be, in the practice's units. A farrier's working day of
 * driving between barns stays far below it (common practice, no source); a larger difference is a
 * typing slip (an extra digit), not a day's driving.
 */
export const MAX_DAY_ODOMETER_UNITS = 1000;

/** Why a pair of readings gives no distance. */
export type OdometerProblem = 'backwards' | 'too_far';

/**
 * Metres driven between two odometer readings in whole units, rounded to the metre; null when either
 * reading is missing (the caller falls back to the planned distance).
 */
export function odometerDistanceM(startReading: number | null | undefined, endReading: number | null | undefined, units: Units): number | null {
  if (startReading == null || endReading == null) return null;
  return Math.round((endReading - startReading) * metresPerUnit(units));
}

/** Checks a pair of readings: the end may not be below the start, nor more than a day's driving above it. */
export function odometerProblem(startReading: number | null | undefined, endReading: number | null | undefined): OdometerProblem | null {
  if (startReading == null || endReading == null) return null;
  if (endReading < startReading) return 'backwards';
  if (endReading - startReading > MAX_DAY_ODOMETER_UNITS) return 'too_far';
  return null;
}
