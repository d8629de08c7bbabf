/**
 * The road graph: built from OpenStreetMap-style GeoJSON road lines, as the demo region and a practice's
 * own extract both provide. Nodes are the vertices shared by two or more lines, plus line ends (as in
 * OpenStreetMap, a crossing without a shared vertex is a bridge, not a junction). A "piece" is the stretch
 * of one line between two nodes; each drivable direction of a piece is an arc in compressed adjacency
 * (CSR) arrays with integer costs, so shortest-path sums are exact.
 */
import Flatbush from 'flatbush';
import { haversineM, localPlane, toPlaneX, toPlaneY, type LocalPlane } from './geo';
import { DRIVABLE_CLASSES, parseMaxspeedKmh, resolveSpeeds, type RoadClass, type RoutingSpeeds, type SpeedOverrides } from './speeds';

/** One source road line after filtering: what directions name and how fast it is driven. */
export interface RoadInfo {
  /** Index of the feature in the source collection. */
  feature: number;
  highway: RoadClass;
  name: string | null;
  ref: string | null;
  /** The name a driver reads: "Wrenmoor Pike (R 12)", "R 12", or "unnamed lane". */
  label: string;
  maxspeedKmh: number | null;
  /** Effective speed under the graph's speed table, km/h. */
  speedKmh: number;
}

/** Why a source feature is not part of the graph (footways, bad geometry, closed roads …). */
export interface SkippedFeature {
  feature: number;
  reason: string;
}

/**
 * Immutable road graph with typed arrays. Build with {@link loadRoadGraph}; re-time with
 * {@link withSpeeds} (topology is shared, only costs change).
 */
export interface RoadGraph {
  readonly speeds: RoutingSpeeds;
  readonly nodeCount: number;
  readonly nodeLon: Float64Array;
  readonly nodeLat: Float64Array;
  readonly pieceCount: number;
  readonly pieceFrom: Int32Array;
  readonly pieceTo: Int32Array;
  /** First and last coordinate index (inclusive) of each piece in coordLon/coordLat. */
  readonly pieceCoordStart: Int32Array;
  readonly pieceCoordEnd: Int32Array;
  /** 0: both directions; 1: from→to only; -1: to→from only. */
  readonly pieceOneway: Int8Array;
  readonly pieceRoad: Int32Array;
  /** Integer length and duration of the whole piece; partial pieces use a fraction of these. */
  readonly pieceDistanceMm: Int32Array;
  readonly pieceDurationMs: Int32Array;
  readonly coordLon: Float64Array;
  readonly coordLat: Float64Array;
  /** Haversine length from the piece's first coordinate to this one, metres. */
  readonly coordAlongM: Float64Array;
  readonly roads: readonly RoadInfo[];
  /** Outgoing arcs of node n are arcStart[n] … arcStart[n+1]-1. */
  readonly arcStart: Int32Array;
  readonly arcTarget: Int32Array;
  readonly arcPiece: Int32Array;
  /** 1 when the arc drives its piece from `to` to `from`. */
  readonly arcBackward: Uint8Array;
  readonly arcDurationMs: Int32Array;
  readonly arcDistanceMm: Int32Array;
  /** 1 for nodes of the largest strongly connected component; places snap only to roads inside it. */
  readonly inMainComponent: Uint8Array;
  readonly mainComponentSize: number;
  /** Spatial index of the segments of main-component pieces, in `plane` metres. */
  readonly snapIndex: Flatbush | null;
  readonly snapSegCoord: Int32Array;
  readonly snapSegPiece: Int32Array;
  readonly plane: LocalPlane;
  /** [west, south, east, north] of the roads used. */
  readonly bounds: [number, number, number, number];
  readonly skipped: readonly SkippedFeature[];
}

interface LineInput {
  road: number;
  lon: number[];
  lat: number[];
  oneway: -1 | 0 | 1;
}

type Props = Record<string, unknown>;

const YES = new Set(['yes', 'true', '1']);
const REVERSE = new Set(['-1', 'reverse']);
const CLOSED = new Set(['no', 'private_no']);

function str(v: unknown): string | null {
  return typeof v === 'string' && v.trim() !== '' ? v.trim() : typeof v === 'number' ? String(v) : null;
}

const CLASS_NOUN: Partial<Record<RoadClass, string>> = {
  service: 'drive',
  track: 'track',
  residential: 'street',
  living_street: 'street',
  unclassified: 'lane',
};

/** The label drivers see in directions. */
export function roadLabel(highway: RoadClass, name: string | null, ref: string | null): string {
  if (name && ref) return `${name} (${ref})`;
  if (name) return name;
  if (ref) return ref;
  return `unnamed ${CLASS_NOUN[highway] ?? 'road'}`;
}

function effectiveSpeedKmh(speeds: RoutingSpeeds, highway: RoadClass, maxspeedKmh: number | null): number {
  const classKmh = speeds.classKmh[highway];
  return maxspeedKmh === null ? classKmh : Math.min(classKmh, maxspeedKmh * speeds.maxspeedFactor);
}

function pieceDuration(distanceMm: number, speedKmh: number): number {
  // metres ÷ (km/h ÷ 3.6) = seconds; × 1000 for ms; distance is in mm: mm × 3.6 ÷ km/h = ms.
  return Math.max(1, Math.round((distanceMm * 3.6) / speedKmh));
}

/**
 * Builds the graph from a GeoJSON FeatureCollection of road lines with OpenStreetMap tags (highway,
 * name, ref, oneway, maxspeed, junction, access). Non-drivable or malformed features are listed in
 * `skipped` rather than thrown, so a real extract with footpaths still loads; the import command
 * validates strictly before anything reaches this function.
 */
export function loadRoadGraph(geojson: unknown, overrides?: SpeedOverrides): RoadGraph {
  const speeds = resolveSpeeds(overrides);
  const features = (geojson as { features?: unknown[] } | null)?.features;
  if (!Array.isArray(features)) throw new TypeError('road data must be a GeoJSON FeatureCollection');

  const roads: RoadInfo[] = [];
  const lines: LineInput[] = [];
  const skipped: SkippedFeature[] = [];
  const drivable = new Set<string>(DRIVABLE_CLASSES);

  features.forEach((raw, fi) => {
    const f = raw as { geometry?: { type?: string; coordinates?: unknown }; properties?: Props | null };
    const p = f.properties ?? {};
    const highway = str(p.highway);
    if (!highway || !drivable.has(highway)) {
      skipped.push({ feature: fi, reason: highway ? `highway=${highway} is not driven` : 'no highway tag' });
      return;
    }
    const access = str(p.access) ?? str(p.motor_vehicle) ?? str(p.motorcar);
    if (access && CLOSED.has(access)) {
      skipped.push({ feature: fi, reason: `access=${access}` });
      return;
    }
    const onewayTag = (str(p.oneway) ?? '').toLowerCase();
    if (onewayTag === 'reversible' || onewayTag === 'alternating') {
      skipped.push({ feature: fi, reason: `oneway=${onewayTag} cannot be planned` });
      return;
    }
    const junction = (str(p.junction) ?? '').toLowerCase();
    let oneway: -1 | 0 | 1 = 0;
    if (YES.has(onewayTag)) oneway = 1;
    else if (REVERSE.has(onewayTag)) oneway = -1;
    else if (onewayTag === '' && (junction === 'roundabout' || junction === 'circular' || highway === 'motorway')) oneway = 1;

    const geom = f.geometry;
    const parts: unknown[] =
      geom?.type === 'LineString' ? [geom.coordinates] : geom?.type === 'MultiLineString' && Array.isArray(geom.coordinates) ? geom.coordinates : [];
    if (parts.length === 0) {
      skipped.push({ feature: fi, reason: `geometry ${geom?.type ?? 'missing'} is not a line` });
      return;
    }
    const cls = highway as RoadClass;
    const name = str(p.name);
    const ref = str(p.ref);
    const maxspeedKmh = parseMaxspeedKmh(p.maxspeed);
    const roadIndex = roads.length;
    let used = false;
    for (const part of parts) {
      if (!Array.isArray(part)) continue;
      const lon: number[] = [];
      const lat: number[] = [];
      for (const c of part) {
        if (!Array.isArray(c) || !Number.isFinite(c[0]) || !Number.isFinite(c[1])) continue;
        const x = Math.round((c[0] as number) * 1e7) / 1e7;
        const y = Math.round((c[1] as number) * 1e7) / 1e7;
        if (lon.length > 0 && lon[lon.length - 1] === x && lat[lat.length - 1] === y) continue;
        lon.push(x);
        lat.push(y);
      }
      if (lon.length >= 2) {
        lines.push({ road: roadIndex, lon, lat, oneway });
        used = true;
      }
    }
    if (!used) {
      skipped.push({ feature: fi, reason: 'line has fewer than two distinct positions' });
      return;
    }
    roads.push({
      feature: fi,
      highway: cls,
      name,
      ref,
      label: roadLabel(cls, name, ref),
      maxspeedKmh,
      speedKmh: effectiveSpeedKmh(speeds, cls, maxspeedKmh),
    });
  });

  // Junctions: a vertex used twice or more (anywhere), and every line end.
  const key = (x: number, y: number) => `${x},${y}`;
  const uses = new Map<string, number>();
  for (const l of lines) {
    for (let i = 0; i < l.lon.length; i++) {
      const k = key(l.lon[i]!, l.lat[i]!);
      uses.set(k, (uses.get(k) ?? 0) + (i === 0 || i === l.lon.length - 1 ? 2 : 1));
    }
  }
  const nodeIds = new Map<string, number>();
  const nodeLonList: number[] = [];
  const nodeLatList: number[] = [];
  const nodeOf = (x: number, y: number): number => {
    const k = key(x, y);
    let id = nodeIds.get(k);
    if (id === undefined) {
      id = nodeLonList.length;
      nodeIds.set(k, id);
      nodeLonList.push(x);
      nodeLatList.push(y);
    }
    return id;
  };

  const pFrom: number[] = [];
  const pTo: number[] = [];
  const pStart: number[] = [];
  const pEnd: number[] = [];
  const pOneway: number[] = [];
  const pRoad: number[] = [];
  const pMm: number[] = [];
  const cLon: number[] = [];
  const cLat: number[] = [];
  const cAlong: number[] = [];
  let west = Infinity;
  let south = Infinity;
  let east = -Infinity;
  let north = -Infinity;

  for (const l of lines) {
    let startNode = nodeOf(l.lon[0]!, l.lat[0]!);
    let coordStart = cLon.length;
    let along = 0;
    cLon.push(l.lon[0]!);
    cLat.push(l.lat[0]!);
    cAlong.push(0);
    for (let i = 1; i < l.lon.length; i++) {
      const x = l.lon[i]!;
      const y = l.lat[i]!;
      west = Math.min(west, x);
      east = Math.max(east, x);
      south = Math.min(south, y);
      north = Math.max(north, y);
      along += haversineM(l.lon[i - 1]!, l.lat[i - 1]!, x, y);
      cLon.push(x);
      cLat.push(y);
      cAlong.push(along);
      if ((uses.get(key(x, y)) ?? 0) >= 2) {
        const endNode = nodeOf(x, y);
        pFrom.push(startNode);
        pTo.push(endNode);
        pStart.push(coordStart);
        pEnd.push(cLon.length - 1);
        pOneway.push(l.oneway);
        pRoad.push(l.road);
        pMm.push(Math.max(1, Math.round(along * 1000)));
        if (i < l.lon.length - 1) {
          startNode = endNode;
          coordStart = cLon.length;
          along = 0;
          cLon.push(x);
          cLat.push(y);
          cAlong.push(0);
        }
      }
    }
    west = Math.min(west, l.lon[0]!);
    east = Math.max(east, l.lon[0]!);
    south = Math.min(south, l.lat[0]!);
    north = Math.max(north, l.lat[0]!);
  }

  const nodeCount = nodeLonList.length;
  const pieceCount = pFrom.length;
  const pieceDistanceMm = Int32Array.from(pMm);
  const pieceRoad = Int32Array.from(pRoad);
  const pieceDurationMs = new Int32Array(pieceCount);
  for (let p = 0; p < pieceCount; p++) pieceDurationMs[p] = pieceDuration(pieceDistanceMm[p]!, roads[pieceRoad[p]!]!.speedKmh);
  const pieceFrom = Int32Array.from(pFrom);
  const pieceTo = Int32Array.from(pTo);
  const pieceOneway = Int8Array.from(pOneway);

  // Arcs in CSR order.
  const degree = new Int32Array(nodeCount + 1);
  for (let p = 0; p < pieceCount; p++) {
    if (pieceOneway[p] !== -1) degree[pieceFrom[p]!]!++;
    if (pieceOneway[p] !== 1) degree[pieceTo[p]!]!++;
  }
  const arcStart = new Int32Array(nodeCount + 1);
  for (let n = 0; n < nodeCount; n++) arcStart[n + 1] = arcStart[n]! + degree[n]!;
  const arcCount = arcStart[nodeCount]!;
  const arcTarget = new Int32Array(arcCount);
  const arcPiece = new Int32Array(arcCount);
  const arcBackward = new Uint8Array(arcCount);
  const fill = arcStart.slice(0, nodeCount);
  for (let p = 0; p < pieceCount; p++) {
    if (pieceOneway[p] !== -1) {
      const a = fill[pieceFrom[p]!]!++;
      arcTarget[a] = pieceTo[p]!;
      arcPiece[a] = p;
    }
    if (pieceOneway[p] !== 1) {
      const a = fill[pieceTo[p]!]!++;
      arcTarget[a] = pieceFrom[p]!;
      arcPiece[a] = p;
      arcBackward[a] = 1;
    }
  }
  const arcDistanceMm = new Int32Array(arcCount);
  const arcDurationMs = new Int32Array(arcCount);
  for (let a = 0; a < arcCount; a++) {
    arcDistanceMm[a] = pieceDistanceMm[arcPiece[a]!]!;
    arcDurationMs[a] = pieceDurationMs[arcPiece[a]!]!;
  }

  const { inMain, size } = largestStrongComponent(nodeCount, arcStart, arcTarget);

  const plane = localPlane(pieceCount ? (west + east) / 2 : 0, pieceCount ? (south + north) / 2 : 0);
  const coordLon = Float64Array.from(cLon);
  const coordLat = Float64Array.from(cLat);
  const pieceCoordStart = Int32Array.from(pStart);
  const pieceCoordEnd = Int32Array.from(pEnd);
  const segCoord: number[] = [];
  const segPiece: number[] = [];
  for (let p = 0; p < pieceCount; p++) {
    if (!inMain[pieceFrom[p]!] || !inMain[pieceTo[p]!]) continue;
    for (let c = pieceCoordStart[p]!; c < pieceCoordEnd[p]!; c++) {
      segCoord.push(c);
      segPiece.push(p);
    }
  }
  let snapIndex: Flatbush | null = null;
  if (segCoord.length > 0) {
    snapIndex = new Flatbush(segCoord.length);
    for (const c of segCoord) {
      const x0 = toPlaneX(plane, coordLon[c]!);
      const x1 = toPlaneX(plane, coordLon[c + 1]!);
      const y0 = toPlaneY(plane, coordLat[c]!);
      const y1 = toPlaneY(plane, coordLat[c + 1]!);
      snapIndex.add(Math.min(x0, x1), Math.min(y0, y1), Math.max(x0, x1), Math.max(y0, y1));
    }
    snapIndex.finish();
  }

  return {
    speeds,
    nodeCount,
    nodeLon: Float64Array.from(nodeLonList),
    nodeLat: Float64Array.from(nodeLatList),
    pieceCount,
    pieceFrom,
    pieceTo,
    pieceCoordStart,
    pieceCoordEnd,
    pieceOneway,
    pieceRoad,
    pieceDistanceMm,
    pieceDurationMs,
    coordLon,
    coordLat,
    coordAlongM: Float64Array.from(cAlong),
    roads,
    arcStart,
    arcTarget,
    arcPiece,
    arcBackward,
    arcDurationMs,
    arcDistanceMm,
    inMainComponent: inMain,
    mainComponentSize: size,
    snapIndex,
    snapSegCoord: Int32Array.from(segCoord),
    snapSegPiece: Int32Array.from(segPiece),
    plane,
    bounds: pieceCount ? [west, south, east, north] : [0, 0, 0, 0],
    skipped,
  };
}

/**
 * The same graph under another speed table (a practice's adjustment): topology, geometry and the spatial
 * index are shared; only speeds and integer durations are recomputed.
 */
export function withSpeeds(graph: RoadGraph, overrides?: SpeedOverrides): RoadGraph {
  const speeds = resolveSpeeds(overrides);
  const roads = graph.roads.map((r) => ({ ...r, speedKmh: effectiveSpeedKmh(speeds, r.highway, r.maxspeedKmh) }));
  const pieceDurationMs = new Int32Array(graph.pieceCount);
  for (let p = 0; p < graph.pieceCount; p++) pieceDurationMs[p] = pieceDuration(graph.pieceDistanceMm[p]!, roads[graph.pieceRoad[p]!]!.speedKmh);
  const arcDurationMs = new Int32Array(graph.arcTarget.length);
  for (let a = 0; a < arcDurationMs.length; a++) arcDurationMs[a] = pieceDurationMs[graph.arcPiece[a]!]!;
  return { ...graph, speeds, roads, pieceDurationMs, arcDurationMs };
}

/** Iterative Tarjan: marks the nodes of the largest strongly connected component. */
function largestStrongComponent(n: number, arcStart: Int32Array, arcTarget: Int32Array): { inMain: Uint8Array; size: number } {
  const index = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const onStack = new Uint8Array(n);
  const comp = new Int32Array(n).fill(-1);
  const stack: number[] = [];
  const callNode: number[] = [];
  const callArc: number[] = [];
  let counter = 0;
  let compCount = 0;
  const sizes: number[] = [];
  for (let root = 0; root < n; root++) {
    if (index[root] !== -1) continue;
    callNode.push(root);
    callArc.push(arcStart[root]!);
    index[root] = low[root] = counter++;
    stack.push(root);
    onStack[root] = 1;
    while (callNode.length > 0) {
      const v = callNode[callNode.length - 1]!;
      const a = callArc[callArc.length - 1]!;
      if (a < arcStart[v + 1]!) {
        callArc[callArc.length - 1] = a + 1;
        const w = arcTarget[a]!;
        if (index[w] === -1) {
          index[w] = low[w] = counter++;
          stack.push(w);
          onStack[w] = 1;
          callNode.push(w);
          callArc.push(arcStart[w]!);
        } else if (onStack[w]) {
          low[v] = Math.min(low[v]!, index[w]!);
        }
        continue;
      }
      callNode.pop();
      callArc.pop();
      if (callNode.length > 0) {
        const parent = callNode[callNode.length - 1]!;
        low[parent] = Math.min(low[parent]!, low[v]!);
      }
      if (low[v] === index[v]) {
        let size = 0;
        let w: number;
        do {
          w = stack.pop()!;
          onStack[w] = 0;
          comp[w] = compCount;
          size++;
        } while (w !== v);
        sizes.push(size);
        compCount++;
      }
    }
  }
  let best = -1;
  let bestSize = 0;
  sizes.forEach((s, c) => {
    if (s > bestSize) {
      bestSize = s;
      best = c;
    }
  });
  const inMain = new Uint8Array(n);
  for (let v = 0; v < n; v++) if (comp[v] === best) inMain[v] = 1;
  return { inMain, size: bestSize };
}
