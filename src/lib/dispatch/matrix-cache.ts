import { buildMatrix, getRoadGraph, type RoadGraph } from '../routing/index.ts';

/**
 * Drive times between the day's places, remembered pair by pair per road graph. Planning computes the
 * full matrix once; a hand edit a moment later needs a sub-matrix of the same places and is answered
 * from memory, which is what keeps a re-time inside the 150 ms the board wants. A shortest path between
 * two places does not depend on the other places, so a remembered pair equals a fresh one.
 */
const caches = new WeakMap<RoadGraph, Map<string, [number, number]>>();
const MAX_PAIRS = 400_000;

const keyOf = (p: { lat: number; lon: number }) => `${p.lat.toFixed(6)},${p.lon.toFixed(6)}`;

export interface DayMatrix {
  durationSec: number[][];
  distanceM: number[][];
  /** Places off the road network (estimated legs). */
  fallback: boolean[];
  /** True when every pair came from memory. */
  cached: boolean;
}

/** The matrix for `points`, in their order, from memory where possible. */
export function dayMatrix(points: readonly { lat: number; lon: number }[]): DayMatrix {
  const graph = getRoadGraph();
  let cache = caches.get(graph);
  if (!cache) caches.set(graph, (cache = new Map()));
  const keys = points.map(keyOf);
  const n = points.length;
  const durationSec = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const distanceM = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  let complete = true;
  for (let i = 0; i < n && complete; i++) {
    for (let j = 0; j < n; j++) {
      if (i === j || (points[i]!.lat === points[j]!.lat && points[i]!.lon === points[j]!.lon)) continue;
      const hit = cache.get(`${keys[i]}|${keys[j]}`);
      if (!hit) { complete = false; break; }
      durationSec[i]![j] = hit[0];
      distanceM[i]![j] = hit[1];
    }
  }
  const fallbackKey = (k: string) => cache!.get(`${k}|fallback`);
  if (complete) return { durationSec, distanceM, fallback: keys.map((k) => fallbackKey(k)?.[0] === 1), cached: true };
  // One search per distinct place: farriers sharing a yard, or barns at one address, are routed once.
  const slot = new Map<string, number>();
  const unique: { lat: number; lon: number }[] = [];
  const slotOf = points.map((p, i) => {
    const k = `${p.lat},${p.lon}`;
    let u = slot.get(k);
    if (u === undefined) {
      slot.set(k, (u = unique.length));
      unique.push(points[i]!);
    }
    return u;
  });
  const m = buildMatrix(graph, unique);
  if (cache.size > MAX_PAIRS) cache.clear();
  const fallback = slotOf.map((u) => m.fallback[u]!);
  for (let i = 0; i < n; i++) {
    const rowT = m.durationSec[slotOf[i]!]!;
    const rowD = m.distanceM[slotOf[i]!]!;
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      durationSec[i]![j] = rowT[slotOf[j]!]!;
      distanceM[i]![j] = rowD[slotOf[j]!]!;
    }
  }
  for (let i = 0; i < n; i++) {
    cache.set(`${keys[i]}|fallback`, [fallback[i] ? 1 : 0, 0]);
    for (let j = 0; j < n; j++) if (i !== j) cache.set(`${keys[i]}|${keys[j]}`, [durationSec[i]![j]!, distanceM[i]![j]!]);
  }
  return { durationSec, distanceM, fallback, cached: false };
}
