/**
 * Small spherical helpers shared by the road graph, snapping and directions. The mean Earth radius is the
 * IUGG value R1 = 6 371 008.8 m; on county-sized distances the sphere differs from the WGS84 ellipsoid by
 * well under 0.5 % (checked against GeographicLib in the tests).
 */
export const EARTH_RADIUS_M = 6_371_008.8;
const RAD = Math.PI / 180;

/** A place as the rest of Roundsmith stores it. */
export interface LatLon {
  lat: number;
  lon: number;
}

/** Great-circle distance in metres (haversine), the basis of every length in the graph. */
export function haversineM(lon1: number, lat1: number, lon2: number, lat2: number): number {
  const dLat = (lat2 - lat1) * RAD;
  const dLon = (lon2 - lon1) * RAD;
  const a = Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * RAD) * Math.cos(lat2 * RAD) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(a)));
}

/** Initial bearing in degrees clockwise from north, in [0, 360). Directions turn on bearing changes. */
export function bearingDeg(lon1: number, lat1: number, lon2: number, lat2: number): number {
  const φ1 = lat1 * RAD;
  const φ2 = lat2 * RAD;
  const Δλ = (lon2 - lon1) * RAD;
  const y = Math.sin(Δλ) * Math.cos(φ2);
  const x = Math.cos(φ1) * Math.sin(φ2) - Math.sin(φ1) * Math.cos(φ2) * Math.cos(Δλ);
  return ((Math.atan2(y, x) / RAD) % 360 + 360) % 360;
}

/** Signed change from bearing a to bearing b in (-180, 180]; positive turns right. */
export function turnAngleDeg(a: number, b: number): number {
  let d = (b - a) % 360;
  if (d <= -180) d += 360;
  if (d > 180) d -= 360;
  return d;
}

/**
 * A local equirectangular plane in metres around a reference latitude. Snapping ranks candidate road
 * segments in this plane (fast, and exact enough for ranking inside a region); reported distances use
 * haversine.
 */
export interface LocalPlane {
  lat0: number;
  lon0: number;
  mPerDegLon: number;
  mPerDegLat: number;
}

export function localPlane(lon0: number, lat0: number): LocalPlane {
  const mPerDegLat = RAD * EARTH_RADIUS_M;
  return { lat0, lon0, mPerDegLat, mPerDegLon: mPerDegLat * Math.cos(lat0 * RAD) };
}

export function toPlaneX(plane: LocalPlane, lon: number): number {
  return (lon - plane.lon0) * plane.mPerDegLon;
}

export function toPlaneY(plane: LocalPlane, lat: number): number {
  return (lat - plane.lat0) * plane.mPerDegLat;
}

/** Eight-point compass word for a bearing, used in "leave heading north". */
export function compassWord(bearing: number): string {
  const words = ['north', 'northeast', 'east', 'southeast', 'south', 'southwest', 'west', 'northwest'];
  return words[Math.round(((bearing % 360) + 360) % 360 / 45) % 8]!;
}
