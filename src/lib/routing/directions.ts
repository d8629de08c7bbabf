/**
 * Turn-by-turn directions for one leg, in Roundsmith's own words. The route is the same fastest path the
 * matrix prices; steps come from bearing changes at junctions and changes of road name, with runs of the
 * same road merged into one step.
 */
import { bearingDeg, compassWord, haversineM, toPlaneX, toPlaneY, turnAngleDeg, type LatLon } from './geo';
import type { RoadGraph } from './graph';
import { accessCost, arrival, canForward, entryNodes, fallbackLeg, seedsFrom } from './legs';
import { searchFrom } from './search';
import { snapPoint, type SnappedPoint } from './snap';

export type StepKind = 'depart' | 'continue' | 'turn' | 'slight' | 'sharp' | 'keep' | 'arrive';
export type Units = 'miles' | 'km';

export interface DirectionStep {
  kind: StepKind;
  side?: 'left' | 'right';
  /** Road driven after this step ("unnamed lane" when the data has no name or ref). */
  road: string;
  /** Distance and time from this step to the next, integers. */
  distanceM: number;
  durationSec: number;
  text: string;
}

export interface Directions {
  steps: DirectionStep[];
  distanceM: number;
  durationSec: number;
  /** The leg's line for the map, place to place. */
  geometry: [number, number][];
  /** True when either end is off the network and the leg is a straight-line estimate. */
  fallback: boolean;
}

/** Thresholds in degrees (our own choice, tuned on the demo region): below STRAIGHT a bend is not a turn. */
const STRAIGHT = 20;
const SLIGHT = 50;
const SHARP = 135;

interface Stretch {
  /** Road index, or -1 for the access stretch between a place and its road. */
  road: number;
  coords: [number, number][];
  distMm: number;
  costMs: number;
  /** Node at the end of the stretch (-1 when it ends part-way along a piece). */
  endNode: number;
  /** Piece and direction of travel, for excluding the way back at a junction. */
  piece: number;
  backward: boolean;
}

function pieceCoords(graph: RoadGraph, piece: number, fromFrac: number, toFrac: number): [number, number][] {
  // Coordinates of a piece between two fractions, in travel order (fromFrac may be greater than toFrac).
  const start = graph.pieceCoordStart[piece]!;
  const end = graph.pieceCoordEnd[piece]!;
  const total = graph.coordAlongM[end]!;
  const at = (frac: number): [number, number] => {
    const target = frac * total;
    for (let c = start; c < end; c++) {
      const a = graph.coordAlongM[c]!;
      const b = graph.coordAlongM[c + 1]!;
      if (target <= b || c === end - 1) {
        const t = b > a ? Math.min(1, Math.max(0, (target - a) / (b - a))) : 0;
        return [graph.coordLon[c]! + (graph.coordLon[c + 1]! - graph.coordLon[c]!) * t, graph.coordLat[c]! + (graph.coordLat[c + 1]! - graph.coordLat[c]!) * t];
      }
    }
    return [graph.coordLon[end]!, graph.coordLat[end]!];
  };
  const lo = Math.min(fromFrac, toFrac) * total;
  const hi = Math.max(fromFrac, toFrac) * total;
  const out: [number, number][] = [at(Math.min(fromFrac, toFrac))];
  for (let c = start + 1; c < end; c++) {
    const along = graph.coordAlongM[c]!;
    if (along > lo && along < hi) out.push([graph.coordLon[c]!, graph.coordLat[c]!]);
  }
  out.push(at(Math.max(fromFrac, toFrac)));
  return fromFrac <= toFrac ? out : out.reverse();
}

function partial(graph: RoadGraph, piece: number, fromFrac: number, toFrac: number, endNode: number): Stretch {
  const share = Math.abs(toFrac - fromFrac);
  return {
    road: graph.pieceRoad[piece]!,
    coords: pieceCoords(graph, piece, fromFrac, toFrac),
    distMm: share * graph.pieceDistanceMm[piece]!,
    costMs: share * graph.pieceDurationMs[piece]!,
    endNode,
    piece,
    backward: toFrac < fromFrac,
  };
}

function access(graph: RoadGraph, snap: SnappedPoint, leaving: boolean): Stretch {
  const acc = accessCost(graph, snap);
  const place: [number, number] = [snap.place.lon, snap.place.lat];
  const road: [number, number] = [snap.lon, snap.lat];
  return { road: -1, coords: leaving ? [place, road] : [road, place], distMm: acc.distMm, costMs: acc.costMs, endNode: -1, piece: -1, backward: false };
}

/** Bearing of the first (or last) ~15 m of a line: short kinks at vertices do not make turns. */
function lineBearing(coords: [number, number][], atStart: boolean): number {
  const n = coords.length;
  if (atStart) {
    const [x0, y0] = coords[0]!;
    for (let i = 1; i < n; i++) {
      const [x, y] = coords[i]!;
      if (haversineM(x0, y0, x, y) >= 15 || i === n - 1) return bearingDeg(x0, y0, x, y);
    }
  } else {
    const [x1, y1] = coords[n - 1]!;
    for (let i = n - 2; i >= 0; i--) {
      const [x, y] = coords[i]!;
      if (haversineM(x, y, x1, y1) >= 15 || i === 0) return bearingDeg(x, y, x1, y1);
    }
  }
  return 0;
}

/** Formats a distance in the practice's units: feet under 0.1 mi, metres under 1 km. */
export function formatDistance(distanceM: number, units: Units): string {
  if (units === 'miles') {
    const miles = distanceM / 1609.344;
    if (miles < 0.1) return `${Math.max(50, Math.round((distanceM * 3.28084) / 50) * 50)} ft`;
    return miles < 10 ? `${miles.toFixed(1)} mi` : `${Math.round(miles)} mi`;
  }
  if (distanceM < 1000) return `${Math.max(10, Math.round(distanceM / 10) * 10)} m`;
  const km = distanceM / 1000;
  return km < 10 ? `${km.toFixed(1)} km` : `${Math.round(km)} km`;
}

function stepText(kind: StepKind, side: 'left' | 'right' | undefined, road: string, stay: boolean, heading: string, distance: string): string {
  switch (kind) {
    case 'depart':
      return `Set off ${heading} on ${road} and drive ${distance}`;
    case 'continue':
      return `Go straight on, onto ${road}, for ${distance}`;
    case 'turn':
      return stay ? `Turn ${side} to stay on ${road}, then ${distance}` : `Turn ${side} onto ${road}, then ${distance}`;
    case 'slight':
      return stay ? `Bear ${side} to stay on ${road}, then ${distance}` : `Bear ${side} onto ${road}, then ${distance}`;
    case 'sharp':
      return stay ? `Turn sharply ${side} to stay on ${road}, then ${distance}` : `Turn sharply ${side} onto ${road}, then ${distance}`;
    case 'keep':
      return stay ? `Keep ${side} at the fork to stay on ${road}, then ${distance}` : `Keep ${side} at the fork onto ${road}, then ${distance}`;
    case 'arrive':
      return side ? `Arrive: the destination is on your ${side}` : 'Arrive at the destination';
  }
}

/**
 * Directions from one place to another along the fastest route, with distances worded in `units`.
 * A leg with an end off the network is one straight-line estimate, flagged `fallback`.
 */
export function directions(graph: RoadGraph, from: LatLon, to: LatLon, units: Units): Directions {
  const a = snapPoint(graph, from);
  const b = snapPoint(graph, to);
  if (a.fallback || b.fallback) return straightLine(graph, from, to, units);
  const space = searchFrom(graph, seedsFrom(graph, a), entryNodes(graph, b));
  const hit = arrival(graph, space, a, b);
  if (!hit) return straightLine(graph, from, to, units);

  // Stretches in travel order.
  const stretches: Stretch[] = [access(graph, a, true)];
  if (hit.via === 'direct') {
    stretches.push(partial(graph, a.piece, a.fraction, b.fraction, -1));
  } else {
    const entry = hit.via === 'from' ? graph.pieceFrom[b.piece]! : graph.pieceTo[b.piece]!;
    const arcs: number[] = [];
    for (let n = entry; space.predArc[n] !== -1; ) {
      const arc = space.predArc[n]!;
      arcs.push(arc);
      const p = graph.arcPiece[arc]!;
      n = graph.arcBackward[arc] ? graph.pieceTo[p]! : graph.pieceFrom[p]!;
    }
    arcs.reverse();
    const firstNode = arcs.length ? (graph.arcBackward[arcs[0]!] ? graph.pieceTo[graph.arcPiece[arcs[0]!]!]! : graph.pieceFrom[graph.arcPiece[arcs[0]!]!]!) : entry;
    // seedsFrom lists the forward seed first whenever the piece can be driven forward.
    const leftForward = canForward(graph, a.piece) && space.seedOf[entry] === 0;
    stretches.push(partial(graph, a.piece, a.fraction, leftForward ? 1 : 0, firstNode));
    for (const arc of arcs) {
      const p = graph.arcPiece[arc]!;
      const back = graph.arcBackward[arc] === 1;
      stretches.push({
        road: graph.pieceRoad[p]!,
        coords: pieceCoords(graph, p, back ? 1 : 0, back ? 0 : 1),
        distMm: graph.arcDistanceMm[arc]!,
        costMs: graph.arcDurationMs[arc]!,
        endNode: graph.arcTarget[arc]!,
        piece: p,
        backward: back,
      });
    }
    stretches.push(partial(graph, b.piece, hit.via === 'from' ? 0 : 1, b.fraction, -1));
  }
  stretches.push(access(graph, b, false));

  // Maneuvers.
  interface Draft {
    kind: StepKind;
    side?: 'left' | 'right';
    road: number;
    stay: boolean;
    heading: string;
    distMm: number;
    costMs: number;
  }
  const drafts: Draft[] = [];
  const roadStretches = stretches.slice(1, -1).filter((s) => s.distMm > 0 || s.coords.length > 1);
  const first = roadStretches[0]!;
  drafts.push({ kind: 'depart', road: first.road, stay: false, heading: compassWord(lineBearing(first.coords, true)), distMm: stretches[0]!.distMm, costMs: stretches[0]!.costMs });
  for (let i = 0; i < roadStretches.length; i++) {
    const s = roadStretches[i]!;
    if (i > 0) {
      const prev = roadStretches[i - 1]!;
      const node = prev.endNode;
      const inBearing = lineBearing(prev.coords, false);
      const outBearing = lineBearing(s.coords, true);
      const angle = turnAngleDeg(inBearing, outBearing);
      const sameRoad = graph.roads[prev.road]!.label === graph.roads[s.road]!.label;
      // Other drivable ways out of this junction (not back the way we came, not the one we take).
      const others: number[] = [];
      if (node >= 0) {
        for (let arc = graph.arcStart[node]!; arc < graph.arcStart[node + 1]!; arc++) {
          const p = graph.arcPiece[arc]!;
          const back = graph.arcBackward[arc] === 1;
          if (p === s.piece && back === s.backward) continue;
          if (p === prev.piece && back !== prev.backward) continue;
          others.push(turnAngleDeg(inBearing, lineBearing(pieceCoords(graph, p, back ? 1 : 0, back ? 0 : 1), true)));
        }
      }
      const abs = Math.abs(angle);
      const side: 'left' | 'right' = angle < 0 ? 'left' : 'right';
      // A fork: another way out also runs within SLIGHT of straight on, near our branch. Staying on the
      // same road is a fork only when the other way is about as straight as ours; otherwise the road
      // simply goes on and needs no step.
      const rivals = abs < SLIGHT ? others.filter((o) => Math.abs(o) < SLIGHT && Math.abs(o - angle) < 75 && (!sameRoad || Math.abs(o) <= abs + 15)) : [];
      const fork = rivals.sort((x, y) => Math.abs(x - angle) - Math.abs(y - angle))[0];
      let kind: StepKind | null = null;
      if (fork !== undefined) kind = 'keep';
      else if (abs < STRAIGHT) kind = sameRoad ? null : 'continue';
      else if (abs < SLIGHT) kind = sameRoad && others.length === 0 ? null : 'slight';
      else if (abs < SHARP) kind = sameRoad && others.length === 0 ? null : 'turn';
      else kind = sameRoad && others.length === 0 ? null : 'sharp';
      if (kind === 'keep') {
        drafts.push({ kind, side: angle < fork! ? 'left' : 'right', road: s.road, stay: sameRoad, heading: '', distMm: 0, costMs: 0 });
      } else if (kind) {
        drafts.push({ kind, side: kind === 'continue' ? undefined : side, road: s.road, stay: sameRoad, heading: '', distMm: 0, costMs: 0 });
      } else if (!sameRoad) {
        // Name change along a bend without junction choices: report the new road plainly.
        drafts.push({ kind: 'continue', road: s.road, stay: false, heading: '', distMm: 0, costMs: 0 });
      }
    }
    const target = drafts[drafts.length - 1]!;
    target.distMm += s.distMm;
    target.costMs += s.costMs;
  }
  // Arrival side: which side of the direction of travel the place lies.
  const last = roadStretches[roadStretches.length - 1]!;
  const endAccess = stretches[stretches.length - 1]!;
  let arriveSide: 'left' | 'right' | undefined;
  if (b.distanceM >= 2 && last.coords.length >= 2) {
    const plane = graph.plane;
    const [x1, y1] = last.coords[last.coords.length - 1]!;
    const [x0, y0] = last.coords[Math.max(0, last.coords.length - 2)]!;
    const dx = toPlaneX(plane, x1) - toPlaneX(plane, x0);
    const dy = toPlaneY(plane, y1) - toPlaneY(plane, y0);
    const px = toPlaneX(plane, b.place.lon) - toPlaneX(plane, b.lon);
    const py = toPlaneY(plane, b.place.lat) - toPlaneY(plane, b.lat);
    arriveSide = dx * py - dy * px > 0 ? 'left' : 'right';
  }
  drafts.push({ kind: 'arrive', side: arriveSide, road: last.road, stay: false, heading: '', distMm: endAccess.distMm, costMs: endAccess.costMs });

  // Integer figures whose sums equal the rounded totals: round cumulative boundaries.
  const totalMm = drafts.reduce((s, d) => s + d.distMm, 0);
  const totalMs = drafts.reduce((s, d) => s + d.costMs, 0);
  let accMm = 0;
  let accMs = 0;
  let prevM = 0;
  let prevS = 0;
  const steps: DirectionStep[] = drafts.map((d) => {
    accMm += d.distMm;
    accMs += d.costMs;
    const m = Math.round(accMm / 1000);
    const sec = Math.round(accMs / 1000);
    const distanceM = m - prevM;
    const durationSec = sec - prevS;
    prevM = m;
    prevS = sec;
    const road = graph.roads[d.road]!.label;
    const step: DirectionStep = { kind: d.kind, road, distanceM, durationSec, text: stepText(d.kind, d.side, road, d.stay, d.heading, formatDistance(distanceM, units)) };
    if (d.side) step.side = d.side;
    return step;
  });
  const geometry: [number, number][] = [];
  for (const s of stretches) {
    for (const c of s.coords) {
      const prev = geometry[geometry.length - 1];
      if (!prev || prev[0] !== c[0] || prev[1] !== c[1]) geometry.push(c);
    }
  }
  return { steps, distanceM: Math.round(totalMm / 1000), durationSec: Math.round(totalMs / 1000), geometry, fallback: false };
}

function straightLine(graph: RoadGraph, from: LatLon, to: LatLon, units: Units): Directions {
  const est = fallbackLeg(graph, from, to);
  const heading = compassWord(bearingDeg(from.lon, from.lat, to.lon, to.lat));
  return {
    steps: [
      { kind: 'depart', road: 'no mapped road', distanceM: est.distanceM, durationSec: est.durationSec, text: `No mapped road nearby: head ${heading} towards the destination, about ${formatDistance(est.distanceM, units)} by road` },
      { kind: 'arrive', road: 'no mapped road', distanceM: 0, durationSec: 0, text: 'Arrive at the destination' },
    ],
    distanceM: est.distanceM,
    durationSec: est.durationSec,
    geometry: [
      [from.lon, from.lat],
      [to.lon, to.lat],
    ],
    fallback: true,
  };
}
