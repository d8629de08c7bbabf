/**
 * Many-to-many drive time and distance between the stops of a day: one early-stopping Dijkstra per
 * place, which on a county graph (hundreds to thousands of junctions) is faster than anything cleverer
 * needs to be (see bench/routing-bench.ts).
 */
import type { LatLon } from './geo';
import type { RoadGraph } from './graph';
import { accessCost, arrival, canBackward, canForward, entryNodes, fallbackLeg, seedsFrom } from './legs';
import { reached, searchFrom } from './search';
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

  // Per target, the two ways in (from its piece's `from` node driving forward, or from its `to` node
  // driving backward) with their remaining cost, precomputed once; the same arithmetic as legs.arrival.
  const NONE = -1;
  const viaFromNode = new Int32Array(n).fill(NONE);
  const viaToNode = new Int32Array(n).fill(NONE);
  const fromCostMs = new Float64Array(n);
  const fromDistMm = new Float64Array(n);
  const toCostMs = new Float64Array(n);
  const toDistMm = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const t = snapped[j]!;
    if (t.fallback) continue;
    const q = t.piece;
    const dur = graph.pieceDurationMs[q]!;
    const len = graph.pieceDistanceMm[q]!;
    const acc = accessCost(graph, t);
    if (canForward(graph, q)) {
      viaFromNode[j] = graph.pieceFrom[q]!;
      fromCostMs[j] = t.fraction * dur + acc.costMs;
      fromDistMm[j] = t.fraction * len + acc.distMm;
    }
    if (canBackward(graph, q)) {
      viaToNode[j] = graph.pieceTo[q]!;
      toCostMs[j] = (1 - t.fraction) * dur + acc.costMs;
      toDistMm[j] = (1 - t.fraction) * len + acc.distMm;
    }
  }

  for (let i = 0; i < n; i++) {
    const from = snapped[i]!;
    const space = fallback[i] ? null : searchFrom(graph, seedsFrom(graph, from), targets);
    const rowT = durationSec[i]!;
    const rowD = distanceM[i]!;
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      if (points[i]!.lat === points[j]!.lat && points[i]!.lon === points[j]!.lon) continue;
      let bestMs = Infinity;
      let bestMm = 0;
      if (space && !fallback[j]) {
        if (from.piece === snapped[j]!.piece) {
          const hit = arrival(graph, space, from, snapped[j]!);
          if (hit) {
            bestMs = hit.costMs;
            bestMm = hit.distMm;
          }
        } else {
          const a = viaFromNode[j]!;
          if (a !== NONE && reached(space, a)) {
            bestMs = space.costMs[a]! + fromCostMs[j]!;
            bestMm = space.distMm[a]! + fromDistMm[j]!;
          }
          const b = viaToNode[j]!;
          if (b !== NONE && reached(space, b) && space.costMs[b]! + toCostMs[j]! < bestMs) {
            bestMs = space.costMs[b]! + toCostMs[j]!;
            bestMm = space.distMm[b]! + toDistMm[j]!;
          }
        }
      }
      if (bestMs < Infinity) {
        rowT[j] = Math.round(bestMs / 1000);
        rowD[j] = Math.round(bestMm / 1000);
      } else {
        const est = fallbackLeg(graph, points[i]!, points[j]!);
        rowT[j] = est.durationSec;
        rowD[j] = est.distanceM;
      }
    }
  }
  return { durationSec, distanceM, fallback, snapped };
}
