// The road graph built from the demo region: shortest paths, snapping, matrix and speed table.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DirectedGraph } from 'graphology';
import { bidirectional } from 'graphology-shortest-path/dijkstra';
import * as turf from '@turf/turf';
import {
  buildMatrix,
  DEFAULT_SPEEDS,
  directions,
  haversineM,
  loadRoadGraph,
  snapPoint,
  withSpeeds,
  parseMaxspeedKmh,
  resolveSpeeds,
} from '../../../src/lib/routing/index';
import { searchFrom } from '../../../src/lib/routing/search';
import { Random } from '../../../src/lib/random.ts';

const roads = JSON.parse(readFileSync('tiles/source/roads.geojson', 'utf8'));
const addresses: { lat: number; lon: number; id: string }[] = JSON.parse(readFileSync('tiles/source/addresses.geojson', 'utf8')).features.map(
  (f: { geometry: { coordinates: [number, number] }; properties: { id: string } }) => ({ lon: f.geometry.coordinates[0], lat: f.geometry.coordinates[1], id: f.properties.id }),
);
const graph = loadRoadGraph(roads);

/** The project's seeded generator, so the point pairs are the same on every run. */
const mulberry32 = (seed: number) => {
  const random = new Random(seed);
  return () => random.next();
};

describe('road graph of the demo region', () => {
  it('has junction nodes, one-way pieces and a main component holding nearly every node', () => {
    expect(graph.nodeCount).toBeGreaterThan(500);
    expect(graph.skipped).toEqual([]);
    expect(Array.from(graph.pieceOneway).filter((o) => o !== 0).length).toBeGreaterThan(0);
    expect(graph.mainComponentSize / graph.nodeCount).toBeGreaterThan(0.95);
  });

  it('finds node-to-node fastest durations equal to graphology-shortest-path Dijkstra for 200 seeded pairs', () => {
    // Independent reference: graphology-shortest-path's bidirectional Dijkstra on a graphology DirectedGraph
    // built from the same arcs (parallel arcs collapsed to the cheapest, which keeps shortest lengths).
    const ref = new DirectedGraph();
    for (let n = 0; n < graph.nodeCount; n++) ref.addNode(String(n));
    for (let v = 0; v < graph.nodeCount; v++) {
      for (let a = graph.arcStart[v]!; a < graph.arcStart[v + 1]!; a++) {
        const w = graph.arcTarget[a]!;
        if (w === v) continue;
        const weight = graph.arcDurationMs[a]!;
        const key = ref.edge(String(v), String(w));
        if (key === undefined) ref.addDirectedEdge(String(v), String(w), { weight });
        else if (ref.getEdgeAttribute(key, 'weight') > weight) ref.setEdgeAttribute(key, 'weight', weight);
      }
    }
    const rand = mulberry32(2026);
    let compared = 0;
    let unreachable = 0;
    for (let i = 0; i < 200; i++) {
      const s = Math.floor(rand() * graph.nodeCount);
      const t = Math.floor(rand() * graph.nodeCount);
      const space = searchFrom(graph, [{ node: s, costMs: 0, distMm: 0 }], [t]);
      const ours = space.settledStamp[t] === space.run ? space.costMs[t]! : null;
      const path = bidirectional(ref, String(s), String(t), 'weight') as string[] | null;
      let theirs: number | null = null;
      if (path) {
        theirs = 0;
        for (let k = 1; k < path.length; k++) theirs += ref.getEdgeAttribute(ref.edge(path[k - 1], path[k]), 'weight') as number;
      }
      expect(ours).toBe(theirs);
      if (ours === null) unreachable++;
      else compared++;
    }
    expect(compared).toBeGreaterThan(180);
    expect(compared + unreachable).toBe(200);
  });

  it('snaps every demo address to a road within 25 m (the generator places them 12–20 m beside one)', () => {
    for (const a of addresses) {
      const s = snapPoint(graph, a);
      expect(s.fallback).toBe(false);
      expect(s.distanceM).toBeLessThanOrEqual(25);
      // The snapped point lies on the road: its distance to the place is the reported distance (±1 m).
      expect(Math.abs(haversineM(a.lon, a.lat, s.lon, s.lat) - s.distanceM)).toBeLessThanOrEqual(1);
    }
  });

  it('snaps to the truly nearest road of the main network (brute force with turf over every piece)', () => {
    // Reference: turf.pointToLineDistance against every main-component piece as its own LineString.
    const pieces: GeoJSON.Feature<GeoJSON.LineString>[] = [];
    for (let p = 0; p < graph.pieceCount; p++) {
      if (!graph.inMainComponent[graph.pieceFrom[p]!] || !graph.inMainComponent[graph.pieceTo[p]!]) continue;
      const coords: [number, number][] = [];
      for (let c = graph.pieceCoordStart[p]!; c <= graph.pieceCoordEnd[p]!; c++) coords.push([graph.coordLon[c]!, graph.coordLat[c]!]);
      pieces.push(turf.lineString(coords));
    }
    const rand = mulberry32(99);
    for (let i = 0; i < 30; i++) {
      const p = { lat: 38.1 + rand() * 0.2, lon: -84.74 + rand() * 0.28 };
      const s = snapPoint(graph, p);
      let best = Infinity;
      for (const f of pieces) best = Math.min(best, turf.pointToLineDistance([p.lon, p.lat], f, { units: 'meters' }));
      // Our planar ranking against turf's spherical distance: equal to within a metre at these distances.
      expect(Math.abs(s.distanceM - best)).toBeLessThanOrEqual(1);
    }
  });
});

describe('drive-time matrix', () => {
  const points = addresses.slice(0, 30);
  const m = buildMatrix(graph, points);

  it('is square with integer entries, zero diagonal and positive off-diagonal values', () => {
    expect(m.durationSec).toHaveLength(30);
    for (let i = 0; i < 30; i++) {
      expect(m.durationSec[i]![i]).toBe(0);
      for (let j = 0; j < 30; j++) {
        expect(Number.isInteger(m.durationSec[i]![j])).toBe(true);
        expect(Number.isInteger(m.distanceM[i]![j])).toBe(true);
        if (i !== j) expect(m.durationSec[i]![j]).toBeGreaterThan(0);
      }
    }
    expect(m.fallback.every((f) => f === false)).toBe(true);
  });

  it('never reports a road distance shorter than the straight line between the places', () => {
    for (let i = 0; i < 30; i++) for (let j = 0; j < 30; j++) {
      if (i === j) continue;
      const straight = haversineM(points[i]!.lon, points[i]!.lat, points[j]!.lon, points[j]!.lat);
      expect(m.distanceM[i]![j]).toBeGreaterThanOrEqual(Math.floor(straight));
    }
  });

  it('agrees exactly with the totals of directions for the same legs', () => {
    for (const [i, j] of [[0, 1], [3, 17], [29, 2], [11, 12]] as const) {
      const d = directions(graph, points[i]!, points[j]!, 'km');
      expect(d.durationSec).toBe(m.durationSec[i]![j]);
      expect(d.distanceM).toBe(m.distanceM[i]![j]);
      expect(d.steps.reduce((s, st) => s + st.distanceM, 0)).toBe(d.distanceM);
      expect(d.steps.reduce((s, st) => s + st.durationSec, 0)).toBe(d.durationSec);
    }
  });

  it('falls back to great-circle × circuity at the fallback speed for a place far from every road, and says so', () => {
    // 10 km south of the county's southern edge (38.067 N): no road within maxSnapM = 1000 m.
    const far = { lat: 37.97, lon: -84.6 };
    const r = buildMatrix(graph, [points[0]!, far]);
    expect(r.fallback).toEqual([false, true]);
    const straight = haversineM(points[0]!.lon, points[0]!.lat, far.lon, far.lat);
    // Distance = straight × 1.3; time = distance ÷ (48 km/h ÷ 3.6) — defaults: circuity 1.3, 30 mph ≈ 48 km/h.
    expect(r.distanceM[0]![1]).toBe(Math.round(straight * 1.3));
    expect(r.durationSec[0]![1]).toBe(Math.round((straight * 1.3 * 3.6) / 48));
    expect(directions(graph, points[0]!, far, 'miles').fallback).toBe(true);
  });
});

describe('speed table', () => {
  it('starts from rural US defaults and lets a practice slow its lanes, which lengthens lane-heavy legs', () => {
    // Defaults, common practice [M]: 25 mph residential, 30 mph unclassified lanes, 12 mph farm drives.
    expect(DEFAULT_SPEEDS.classKmh.residential).toBe(40);
    expect(DEFAULT_SPEEDS.classKmh.unclassified).toBe(48);
    const slow = withSpeeds(graph, { classKmh: { unclassified: 24, service: 10 } });
    const a = buildMatrix(graph, addresses.slice(0, 10));
    const b = buildMatrix(slow, addresses.slice(0, 10));
    let longer = 0;
    for (let i = 0; i < 10; i++) for (let j = 0; j < 10; j++) {
      expect(b.durationSec[i]![j]).toBeGreaterThanOrEqual(a.durationSec[i]![j]!);
      if (b.durationSec[i]![j]! > a.durationSec[i]![j]!) longer++;
    }
    expect(longer).toBeGreaterThan(50);
  });

  it('parses OpenStreetMap maxspeed values and rejects nonsense speeds', () => {
    // 55 mph × 1.609344 = 88.51 km/h (exact mile definition).
    expect(parseMaxspeedKmh('55 mph')).toBeCloseTo(88.51, 2);
    expect(parseMaxspeedKmh('80')).toBe(80);
    expect(parseMaxspeedKmh('none')).toBeNull();
    expect(() => resolveSpeeds({ classKmh: { primary: 0 } })).toThrow(/positive/);
    expect(() => resolveSpeeds({ circuity: 0.9 })).toThrow(/circuity/);
  });
});
