/**
 * Distance and mileage cost in the practice's units. Distances are stored in metres; the review shows
 * them in tenths of a mile or kilometre and charges the mileage rate on exactly the distance shown,
 * so "distance × rate" on the page always agrees with the cost beside it.
 */

/** Metres in one international mile (exactly 1,609.344 m by definition). */
export const METRES_PER_MILE = 1609.344;

export type Units = 'miles' | 'km';

/** The unit's short name, as every screen, sheet and message shows it. */
export function unitLabel(units: Units): 'mi' | 'km' {
  return units === 'miles' ? 'mi' : 'km';
}

/** Metres in one unit of the practice's distance. */
export function metresPerUnit(units: Units): number {
  return units === 'miles' ? METRES_PER_MILE : 1000;
}

/** Metres → whole tenths of the practice's unit (half a tenth rounds up). */
export function distanceTenths(distanceM: number, units: Units): number {
  return Math.round((distanceM / metresPerUnit(units)) * 10);
}

/**
 * Mileage cost in cents of a distance given in tenths of a unit, at a rate in currency per unit
 * (practices.mileage_rate holds four decimals, e.g. 0.7000). Integer arithmetic on ten-thousandths
 * of the rate, rounded once to the cent.
 */
export function mileageCostCents(tenths: number, ratePerUnit: number): number {
  const rateTenThousandths = Math.round(ratePerUnit * 10_000);
  // tenths/10 units × rate/10000 currency × 100 cents = tenths × rate / 1000 cents
  return Math.round((tenths * rateTenThousandths) / 1000);
}
