// Distances used by routing and the fallback estimate, checked against GeographicLib
// (geographiclib-geodesic, Karney's reference implementation of geodesics on the ellipsoid).
import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import * as turf from '@turf/turf';
import { haversineM, bearingDeg, turnAngleDeg } from '../../../src/lib/routing/geo';
import { Random } from '../../../src/lib/random.ts';

const WGS84 = geodesic.Geodesic.WGS84;

/** The project's seeded generator, so the point pairs are the same on every run. */
const mulberry32 = (seed: number) => {
  const random = new Random(seed);
  return () => random.next();
};

const rel = (a: number, b: number) => Math.abs(a - b) / b;

describe('great-circle distances against the ellipsoid', () => {
  it('reproduces the GeographicLib documentation example, and turf and our haversine stay within 0.5 % of it', () => {
    // Source: GeographicLib documentation, inverse problem example (WGS84):
    // (-41.32, 174.81) to (40.96, -5.50) is 19 959 679.267 m.
    const ref = 19_959_679.267;
    const g = WGS84.Inverse(-41.32, 174.81, 40.96, -5.5);
    expect(g.s12).toBeCloseTo(ref, 2);
    expect(rel(turf.distance([174.81, -41.32], [-5.5, 40.96], { units: 'meters' }), ref)).toBeLessThan(0.005);
    expect(rel(haversineM(174.81, -41.32, -5.5, 40.96), ref)).toBeLessThan(0.005);
  });

  it("reproduces Vincenty's test line (a) on the Bessel ellipsoid, and the sphere stays within 0.5 %", () => {
    // Source: Vincenty (1975), Survey Review 23(176), test line (a), Bessel 1841 ellipsoid
    // (a = 6 377 397.155 m, 1/f = 299.1528128): 55°45′N to 33°26′S, Δλ = 108°13′ → 14 110 526.170 m.
    const ref = 14_110_526.17;
    const bessel = new geodesic.Geodesic.Geodesic(6_377_397.155, 1 / 299.1528128);
    const lat2 = -(33 + 26 / 60);
    const lon2 = 108 + 13 / 60;
    expect(bessel.Inverse(55.75, 0, lat2, lon2).s12).toBeCloseTo(ref, 0);
    expect(rel(turf.distance([0, 55.75], [lon2, lat2], { units: 'meters' }), ref)).toBeLessThan(0.005);
    expect(rel(haversineM(0, 55.75, lon2, lat2), ref)).toBeLessThan(0.005);
  });

  it('matches haversine values computed with R = 6 371 008.8 m', () => {
    // Computed: R × Δλ in radians on the equator. 6 371 008.8 × π/180 = 111 195.08 m;
    // × 90 = 10 007 557.22 m (computed from the formula; R is the IUGG mean Earth radius).
    expect(haversineM(0, 0, 1, 0)).toBeCloseTo(111_195.08, 1);
    expect(haversineM(0, 0, 90, 0)).toBeCloseTo(10_007_557.22, 1);
    expect(turf.distance([0, 0], [1, 0], { units: 'meters' })).toBeCloseTo(111_195.08, 1);
    expect(turf.distance([0, 0], [90, 0], { units: 'meters' })).toBeCloseTo(10_007_557.22, 1);
  });

  it('keeps turf and our haversine within 0.5 % of GeographicLib for 200 seeded pairs, county-sized to continental', () => {
    const rand = mulberry32(42);
    let worstTurf = 0;
    let worstOurs = 0;
    for (let i = 0; i < 200; i++) {
      // Half the pairs inside a 30 km county near 38.2 N, 84.6 W; half anywhere up to ±70° latitude.
      const local = i % 2 === 0;
      const lat1 = local ? 38.07 + rand() * 0.27 : -70 + rand() * 140;
      const lon1 = local ? -84.77 + rand() * 0.34 : -180 + rand() * 360;
      const lat2 = local ? 38.07 + rand() * 0.27 : -70 + rand() * 140;
      const lon2 = local ? -84.77 + rand() * 0.34 : -180 + rand() * 360;
      const ref = WGS84.Inverse(lat1, lon1, lat2, lon2).s12!;
      if (ref < 100) continue;
      worstTurf = Math.max(worstTurf, rel(turf.distance([lon1, lat1], [lon2, lat2], { units: 'meters' }), ref));
      worstOurs = Math.max(worstOurs, rel(haversineM(lon1, lat1, lon2, lat2), ref));
    }
    expect(worstTurf).toBeLessThan(0.005);
    expect(worstOurs).toBeLessThan(0.005);
    // The sphere is not the ellipsoid: the worst case is clearly above zero (the check has teeth).
    expect(worstOurs).toBeGreaterThan(0.0005);
  });

  it('gives bearings and signed turn angles that agree with GeographicLib azimuths', () => {
    const rand = mulberry32(7);
    for (let i = 0; i < 50; i++) {
      const lat1 = 38.07 + rand() * 0.27;
      const lon1 = -84.77 + rand() * 0.34;
      const lat2 = 38.07 + rand() * 0.27;
      const lon2 = -84.77 + rand() * 0.34;
      const azi = (WGS84.Inverse(lat1, lon1, lat2, lon2).azi1! + 360) % 360;
      // Sphere against ellipsoid: azimuths differ by a fraction of a degree at this scale.
      expect(Math.abs(turnAngleDeg(azi, bearingDeg(lon1, lat1, lon2, lat2)))).toBeLessThan(0.5);
    }
    // Hand-checked: from heading east (90°) to heading south (180°) is a right turn of +90°;
    // from 350° to 10° is +20° (through north), from 10° to 350° is −20°.
    expect(turnAngleDeg(90, 180)).toBe(90);
    expect(turnAngleDeg(350, 10)).toBe(20);
    expect(turnAngleDeg(10, 350)).toBe(-20);
  });
});
