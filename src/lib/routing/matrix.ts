/**
 * Many-to-many drive time and distance between the stops of a day: one early-stopping Dijkstra per
 * place, which on a county graph (hundreds to thousands of junctions) is faster than anything cleverer
 * needs to be (see bench/routing-bench.ts).
 */
import type { LatLon } from './geo';
import type { RoadGraph } from './graph';
import { arrival, entryNodes, fallbackLeg, seedsFrom } from './legs';
import { searchFrom } from './search';
import { snapPoint, type SnappedPoint } from './snap';

export interface DriveMatrix {
  /** durationSec[i][j]: seconds from place i to place j (integers; 0 on the diagonal). */
  durationSec: number[][];
  /** distanceM[i][j]: metres along the fastest route (integers). */
  distanceM: number[][];
  /**
   * Per place: true when it is farther than speeds.maxSnapM from every road, so its row and column are
   * great-circle distance × speeds.circuity at speeds.fallbackKmh instead of road routes.
   */
  fallback: boolean[];
  /** The snap of each place, for callers that show how far a barn is from its road. */
  snapped: SnappedPoint[];
}

/** Builds the full matrix for `points`, in their order. */
export function buildMatrix(graph: RoadGraph, points: readonly LatLon[]): DriveMatrix {
  const n = points.length;
  const snapped = points.map((p) => snapPoint(graph, p));
  const fallback = snapped.map((s) => s.fallback);
  const durationSec = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const distanceM = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const targets: number[] = [];
  for (let j = 0; j < n; j++) if (!fallback[j]) targets.push(...entryNodes(graph, snapped[j]!));

  for (let i = 0; i < n; i++) {
    const from = snapped[i]!;
    const space = fallback[i] ? null : searchFrom(graph, seedsFrom(graph, from), targets);
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      const to = snapped[j]!;
      if (points[i]!.lat === points[j]!.lat && points[i]!.lon === points[j]!.lon) continue;
      const hit = space && !fallback[j] ? arrival(graph, space, from, to) : null;
      if (hit) {
        durationSec[i]![j] = Math.round(hit.costMs / 1000);
        distanceM[i]![j] = Math.round(hit.distMm / 1000);
      } else {
        const est = fallbackLeg(graph, points[i]!, points[j]!);
        durationSec[i]![j] = est.durationSec;
        distanceM[i]![j] = est.distanceM;
      }
    }
  }
  return { durationSec, distanceM, fallback, snapped };
}
