/**
 * How a snapped place enters and leaves the network: the seeds of a search from it, and the cheapest
 * arrival at another snapped place after a search. Matrix and directions share this arithmetic, so a
 * leg's directions add up to exactly its matrix entry.
 */
import { haversineM } from './geo';
import type { RoadGraph } from './graph';
import { reached, type SearchSpace, type Seed } from './search';
import type { SnappedPoint } from './snap';

/** Access stretch (place ↔ road) at the slow lane speed. */
export function accessCost(graph: RoadGraph, snap: SnappedPoint): { costMs: number; distMm: number } {
  const distMm = snap.distanceM * 1000;
  return { distMm, costMs: (distMm * 3.6) / graph.speeds.accessKmh };
}

export const canForward = (graph: RoadGraph, piece: number) => graph.pieceOneway[piece] !== -1;
export const canBackward = (graph: RoadGraph, piece: number) => graph.pieceOneway[piece] !== 1;

/** Seeds for leaving a snapped place: along its piece to whichever ends the one-way rules allow. */
export function seedsFrom(graph: RoadGraph, snap: SnappedPoint): Seed[] {
  const p = snap.piece;
  const acc = accessCost(graph, snap);
  const seeds: Seed[] = [];
  const dur = graph.pieceDurationMs[p]!;
  const len = graph.pieceDistanceMm[p]!;
  if (canForward(graph, p)) seeds.push({ node: graph.pieceTo[p]!, costMs: acc.costMs + (1 - snap.fraction) * dur, distMm: acc.distMm + (1 - snap.fraction) * len });
  if (canBackward(graph, p)) seeds.push({ node: graph.pieceFrom[p]!, costMs: acc.costMs + snap.fraction * dur, distMm: acc.distMm + snap.fraction * len });
  return seeds;
}

/** The end nodes through which a snapped place can be reached. */
export function entryNodes(graph: RoadGraph, snap: SnappedPoint): number[] {
  const p = snap.piece;
  const nodes: number[] = [];
  if (canForward(graph, p)) nodes.push(graph.pieceFrom[p]!);
  if (canBackward(graph, p)) nodes.push(graph.pieceTo[p]!);
  return nodes;
}

export interface Arrival {
  costMs: number;
  distMm: number;
  /** 'from': entered the target's piece at its from node; 'to': at its to node; 'direct': same piece. */
  via: 'from' | 'to' | 'direct';
}

/** Cheapest arrival at `to` after a search seeded from `from`; null when unreachable. */
export function arrival(graph: RoadGraph, space: SearchSpace, from: SnappedPoint, to: SnappedPoint): Arrival | null {
  const q = to.piece;
  const g = to.fraction;
  const dur = graph.pieceDurationMs[q]!;
  const len = graph.pieceDistanceMm[q]!;
  const accTo = accessCost(graph, to);
  let best: Arrival | null = null;
  const offer = (costMs: number, distMm: number, via: Arrival['via']) => {
    if (!best || costMs < best.costMs) best = { costMs, distMm, via };
  };
  if (from.piece === q) {
    const accFrom = accessCost(graph, from);
    const f = from.fraction;
    if (canForward(graph, q) && f <= g) offer(accFrom.costMs + (g - f) * dur + accTo.costMs, accFrom.distMm + (g - f) * len + accTo.distMm, 'direct');
    if (canBackward(graph, q) && f >= g) offer(accFrom.costMs + (f - g) * dur + accTo.costMs, accFrom.distMm + (f - g) * len + accTo.distMm, 'direct');
  }
  const a = graph.pieceFrom[q]!;
  const b = graph.pieceTo[q]!;
  if (canForward(graph, q) && reached(space, a)) offer(space.costMs[a]! + g * dur + accTo.costMs, space.distMm[a]! + g * len + accTo.distMm, 'from');
  if (canBackward(graph, q) && reached(space, b)) offer(space.costMs[b]! + (1 - g) * dur + accTo.costMs, space.distMm[b]! + (1 - g) * len + accTo.distMm, 'to');
  return best;
}

/** Great-circle × circuity estimate for places off the network. */
export function fallbackLeg(graph: RoadGraph, from: { lat: number; lon: number }, to: { lat: number; lon: number }): { durationSec: number; distanceM: number } {
  const distanceM = haversineM(from.lon, from.lat, to.lon, to.lat) * graph.speeds.circuity;
  return { distanceM: Math.round(distanceM), durationSec: Math.round((distanceM * 3.6) / graph.speeds.fallbackKmh) };
}
