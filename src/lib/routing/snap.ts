/**
 * Snapping a place (barn, home) to its nearest drivable road. Only roads in the graph's main strongly
 * connected component are candidates, so every snapped place can reach every other.
 */
import { haversineM, toPlaneX, toPlaneY, type LatLon } from './geo';
import type { RoadGraph } from './graph';

/** Where a place meets the road network. */
export interface SnappedPoint {
  /** The place as given. */
  place: LatLon;
  /** The nearest point on a road, or the place itself when no road exists at all. */
  lat: number;
  lon: number;
  /** Straight-line distance from the place to the road, metres (rounded); Infinity without roads. */
  distanceM: number;
  /** Piece of road snapped to, -1 without roads. */
  piece: number;
  /** Position along the piece from its `from` node, 0…1 by length. */
  fraction: number;
  /** Coordinate index of the segment's first vertex within graph.coordLon/coordLat. */
  segmentCoord: number;
  road: string;
  roadClass: string | null;
  /** True when the place is farther than speeds.maxSnapM from every road: estimates are used instead. */
  fallback: boolean;
}

function projectOnSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): { t: number; d2: number } {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  let t = len2 === 0 ? 0 : ((px - ax) * dx + (py - ay) * dy) / len2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const ex = ax + t * dx - px;
  const ey = ay + t * dy - py;
  return { t, d2: ex * ex + ey * ey };
}

/**
 * Nearest road point to a place: the flatbush k-nearest query on segment boxes gives a first answer, and
 * a box search of that radius makes it exact (a box can be nearer than its segment).
 */
export function snapPoint(graph: RoadGraph, place: LatLon): SnappedPoint {
  const index = graph.snapIndex;
  if (!index || !Number.isFinite(place.lat) || !Number.isFinite(place.lon)) {
    return { place, lat: place.lat, lon: place.lon, distanceM: Infinity, piece: -1, fraction: 0, segmentCoord: -1, road: 'no road', roadClass: null, fallback: true };
  }
  const { plane, coordLon, coordLat, snapSegCoord } = graph;
  const px = toPlaneX(plane, place.lon);
  const py = toPlaneY(plane, place.lat);
  let best = -1;
  let bestD2 = Infinity;
  let bestT = 0;
  const consider = (i: number) => {
    const c = snapSegCoord[i]!;
    const r = projectOnSegment(px, py, toPlaneX(plane, coordLon[c]!), toPlaneY(plane, coordLat[c]!), toPlaneX(plane, coordLon[c + 1]!), toPlaneY(plane, coordLat[c + 1]!));
    if (r.d2 < bestD2 || (r.d2 === bestD2 && i < best)) {
      best = i;
      bestD2 = r.d2;
      bestT = r.t;
    }
  };
  for (const i of index.neighbors(px, py, 4)) consider(i);
  const d = Math.sqrt(bestD2) + 1e-6;
  for (const i of index.search(px - d, py - d, px + d, py + d)) consider(i);

  const c = snapSegCoord[best]!;
  const piece = graph.snapSegPiece[best]!;
  const lon = coordLon[c]! + (coordLon[c + 1]! - coordLon[c]!) * bestT;
  const lat = coordLat[c]! + (coordLat[c + 1]! - coordLat[c]!) * bestT;
  const start = graph.pieceCoordStart[piece]!;
  const end = graph.pieceCoordEnd[piece]!;
  const along = graph.coordAlongM[c]! + (graph.coordAlongM[c + 1]! - graph.coordAlongM[c]!) * bestT;
  const total = graph.coordAlongM[end]! - graph.coordAlongM[start]!;
  const distanceM = Math.round(haversineM(place.lon, place.lat, lon, lat));
  const road = graph.roads[graph.pieceRoad[piece]!]!;
  return {
    place,
    lat,
    lon,
    distanceM,
    piece,
    fraction: total > 0 ? Math.min(1, Math.max(0, along / total)) : 0,
    segmentCoord: c,
    road: road.label,
    roadClass: road.highway,
    fallback: distanceM > graph.speeds.maxSnapM,
  };
}
