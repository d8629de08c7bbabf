/** Mean Earth radius in metres (IUGG), the usual constant for the haversine formula. */
export const EARTH_RADIUS_M = 6_371_008.8;

/** Great-circle distance in metres between two points given in degrees (haversine). */
export function haversineM(a: { lat: number; lon: number }, b: { lat: number; lon: number }): number {
  const rad = Math.PI / 180;
  const dLat = (b.lat - a.lat) * rad;
  const dLon = (b.lon - a.lon) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * rad) * Math.cos(b.lat * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}

export const METRES_PER_MILE = 1609.344;
