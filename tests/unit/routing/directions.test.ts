// Directions on a small hand-built network whose right answer can be read off a sketch.
import { describe, expect, it } from 'vitest';
import { directions, formatDistance, loadRoadGraph, buildMatrix } from '../../../src/lib/routing/index';
import { EARTH_RADIUS_M } from '../../../src/lib/routing/geo';

// Local metres → lon/lat around 38.2 N, 84.6 W on the same sphere the graph measures with, so
// hand-added lengths hold to a few millimetres.
const LAT0 = 38.2;
const LON0 = -84.6;
const DEG = (180 / Math.PI) / EARTH_RADIUS_M;
const at = (x: number, y: number): [number, number] => [LON0 + (x * DEG) / Math.cos((LAT0 * Math.PI) / 180), LAT0 + y * DEG];
const place = (x: number, y: number) => {
  const [lon, lat] = at(x, y);
  return { lon, lat };
};
const road = (name: string, pts: [number, number][], extra: Record<string, string> = {}) => ({
  type: 'Feature',
  geometry: { type: 'LineString', coordinates: pts.map(([x, y]) => at(x, y)) },
  properties: { highway: 'residential', name, ...extra },
});

/*
 *   A(0,0) ── Main Street ── B(500,0) ── High Street ── C(1000,0)
 *                              │ Mill Lane, one-way south             │ Back Lane
 *   E(0,-400) ── Low Road ── D(500,-400) ── Low Road ────────────── F(1000,-400)
 *
 * P1 stands 15 m north of Main Street at x = 100; P2 stands 15 m south of Low Road at x = 900.
 */
const network = {
  type: 'FeatureCollection',
  features: [
    road('Main Street', [[0, 0], [250, 0], [500, 0]]),
    road('High Street', [[500, 0], [1000, 0]]),
    road('Mill Lane', [[500, 0], [500, -400]], { oneway: 'yes' }),
    road('Low Road', [[0, -400], [500, -400]]),
    road('Low Road', [[500, -400], [1000, -400]]),
    road('Back Lane', [[1000, 0], [1000, -400]]),
  ],
};
const graph = loadRoadGraph(network);
const P1 = place(100, 15);
const P2 = place(900, -415);

describe('directions on the hand-built network', () => {
  it('turns right down one-way Mill Lane and left onto Low Road, arriving on the right', () => {
    const d = directions(graph, P1, P2, 'km');
    expect(d.steps.map((s) => [s.kind, s.side ?? null, s.road])).toEqual([
      ['depart', null, 'Main Street'],
      ['turn', 'right', 'Mill Lane'],
      ['turn', 'left', 'Low Road'],
      ['arrive', 'right', 'Low Road'],
    ]);
    // Hand-added: 15 m access + 400 m Main Street (x 100→500) | 400 m Mill Lane | 400 m Low Road
    // (x 500→900) | 15 m access = 415 + 400 + 400 + 15 = 1230 m.
    expect(d.steps.map((s) => s.distanceM)).toEqual([415, 400, 400, 15]);
    expect(d.distanceM).toBe(1230);
    // Time: 1200 m of residential road at 40 km/h = 1200 × 3.6 / 40 = 108 s; 30 m of access at
    // 16 km/h = 30 × 3.6 / 16 = 6.75 s; total 114.75 s → 115 s.
    expect(d.durationSec).toBe(115);
    expect(d.steps[0]!.text).toBe('Set off east on Main Street and drive 420 m');
    expect(d.steps[1]!.text).toBe('Turn right onto Mill Lane, then 400 m');
    expect(d.steps[3]!.text).toBe('Arrive: the destination is on your right');
  });

  it('respects the one-way street on the way back: round by Back Lane, straight on from High Street into Main Street', () => {
    const d = directions(graph, P2, P1, 'km');
    expect(d.steps.map((s) => [s.kind, s.side ?? null, s.road])).toEqual([
      ['depart', null, 'Low Road'],
      ['turn', 'left', 'Back Lane'],
      ['turn', 'left', 'High Street'],
      ['continue', null, 'Main Street'],
      ['arrive', 'right', 'Main Street'],
    ]);
    expect(d.steps.some((s) => s.road === 'Mill Lane')).toBe(false);
    // Hand-added: 15 + 100 (x 900→1000) | 400 | 500 (x 1000→500) | 400 (x 500→100) | 15 = 1430 m.
    expect(d.steps.map((s) => s.distanceM)).toEqual([115, 400, 500, 400, 15]);
    expect(d.distanceM).toBe(1430);
  });

  it('merges the two Main Street pieces and the two Low Road features into single steps', () => {
    const d = directions(graph, place(20, 15), place(980, -415), 'miles');
    expect(d.steps.filter((s) => s.road === 'Main Street')).toHaveLength(1);
    expect(d.steps.filter((s) => s.road === 'Low Road').length).toBeLessThanOrEqual(2);
  });

  it('draws the leg from place to place along the roads', () => {
    const d = directions(graph, P1, P2, 'km');
    expect(d.geometry[0]).toEqual([P1.lon, P1.lat]);
    expect(d.geometry[d.geometry.length - 1]).toEqual([P2.lon, P2.lat]);
    // It passes through B and D, the corners of the Mill Lane route.
    const near = (p: [number, number], q: [number, number]) => Math.abs(p[0] - q[0]) < 2e-7 && Math.abs(p[1] - q[1]) < 2e-7;
    expect(d.geometry.some((p) => near(p, at(500, 0)))).toBe(true);
    expect(d.geometry.some((p) => near(p, at(500, -400)))).toBe(true);
  });

  it('prices the one-way asymmetry in the matrix: P2 → P1 is longer than P1 → P2', () => {
    const m = buildMatrix(graph, [P1, P2]);
    expect(m.distanceM[0]![1]).toBe(1230);
    expect(m.distanceM[1]![0]).toBe(1430);
  });

  it('words a bend onto a new road at a fork as keep, and a hairpin as sharp', () => {
    // G(0,0) → H(400,0), where the road forks: "Fork Left" bears 30° left, "Fork Right" 30° right;
    // and "Hairpin Lane" leaves the end of Fork Right due west: from heading 30° south of east to
    // west is a right turn of 180 − 30 = 150°, past the 135° sharp threshold.
    const r30 = (Math.PI / 180) * 30;
    const fork = loadRoadGraph({
      type: 'FeatureCollection',
      features: [
        road('Stem Road', [[0, 0], [400, 0]]),
        road('Fork Left', [[400, 0], [400 + 400 * Math.cos(r30), 400 * Math.sin(r30)]]),
        road('Fork Right', [[400, 0], [400 + 400 * Math.cos(r30), -400 * Math.sin(r30)]]),
        road('Hairpin Lane', [[400 + 400 * Math.cos(r30), -400 * Math.sin(r30)], [400 + 400 * Math.cos(r30) - 300, -400 * Math.sin(r30)]]),
      ],
    });
    const left = directions(fork, place(100, 15), place(400 + 300 * Math.cos(r30), 300 * Math.sin(r30) + 15), 'km');
    expect(left.steps.map((s) => [s.kind, s.side ?? null, s.road])).toEqual([
      ['depart', null, 'Stem Road'],
      ['keep', 'left', 'Fork Left'],
      ['arrive', 'left', 'Fork Left'],
    ]);
    // The place stands 15 m south of westbound Hairpin Lane: on the driver's left.
    const hairpin = directions(fork, place(100, 15), place(400 + 400 * Math.cos(r30) - 200, -400 * Math.sin(r30) - 15), 'km');
    expect(hairpin.steps.map((s) => [s.kind, s.side ?? null, s.road])).toEqual([
      ['depart', null, 'Stem Road'],
      ['keep', 'right', 'Fork Right'],
      ['sharp', 'right', 'Hairpin Lane'],
      ['arrive', 'left', 'Hairpin Lane'],
    ]);
  });
});

describe('distance wording', () => {
  it('uses feet below a tenth of a mile and metres below a kilometre', () => {
    // 100 m = 328.08 ft → nearest 50 ft = 350 ft; 1609.344 m = 1.0 mi; 950 m → "950 m"; 12 345 m → "12 km".
    expect(formatDistance(100, 'miles')).toBe('350 ft');
    expect(formatDistance(1609.344, 'miles')).toBe('1.0 mi');
    expect(formatDistance(950, 'km')).toBe('950 m');
    expect(formatDistance(12_345, 'km')).toBe('12 km');
  });
});
