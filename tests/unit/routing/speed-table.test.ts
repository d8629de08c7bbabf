import { afterEach, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { buildMatrix, getRoadGraph, readSpeedTable, speedTableSchema } from '../../../src/lib/routing/index.ts';

const dirs: string[] = [];
const savedRegion = process.env.REGION_DIR;
afterEach(() => {
  if (savedRegion === undefined) delete process.env.REGION_DIR;
  else process.env.REGION_DIR = savedRegion;
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

/** A region folder with one straight county road (tertiary) about 3 km long, and an optional speed table. */
function region(speeds?: unknown): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'roundsmith-speeds-'));
  dirs.push(dir);
  mkdirSync(path.join(dir, 'source'));
  const road = { type: 'Feature', properties: { highway: 'tertiary', name: 'Test Road' }, geometry: { type: 'LineString', coordinates: [[-84.6, 38.2], [-84.6, 38.227]] } };
  writeFileSync(path.join(dir, 'source', 'roads.geojson'), JSON.stringify({ type: 'FeatureCollection', features: [road] }));
  if (speeds !== undefined) writeFileSync(path.join(dir, 'source', 'speeds.json'), JSON.stringify(speeds));
  return dir;
}

const ends = [{ lat: 38.2, lon: -84.6 }, { lat: 38.227, lon: -84.6 }];

describe('the practice speed table', () => {
  it('drives the road at the table speed: 30 mph takes twice as long as 60 mph (1 mph = 1.609344 km/h exactly)', () => {
    process.env.REGION_DIR = region({ units: 'mph', classes: { tertiary: 30 } });
    const slow = buildMatrix(getRoadGraph(), ends);
    process.env.REGION_DIR = region({ units: 'mph', classes: { tertiary: 60 } });
    const fast = buildMatrix(getRoadGraph(), ends);
    expect(slow.distanceM[0]![1]).toBe(fast.distanceM[0]![1]);
    // time = distance ÷ speed; 30 mph = 13.4112 m/s.
    expect(Math.abs(slow.durationSec[0]![1]! - slow.distanceM[0]![1]! / 13.4112)).toBeLessThanOrEqual(1);
    expect(Math.abs(slow.durationSec[0]![1]! - 2 * fast.durationSec[0]![1]!)).toBeLessThanOrEqual(1);
  });

  it('keeps the defaults without a table, and reads km/h tables as km/h', () => {
    process.env.REGION_DIR = region();
    const plain = buildMatrix(getRoadGraph(), ends);
    process.env.REGION_DIR = region({ units: 'km/h', classes: { tertiary: 50 } });
    const kmh = buildMatrix(getRoadGraph(), ends);
    // 50 km/h = 13.888… m/s.
    expect(Math.abs(kmh.durationSec[0]![1]! - kmh.distanceM[0]![1]! / (50 / 3.6))).toBeLessThanOrEqual(1);
    expect(plain.durationSec[0]![1]).not.toBe(kmh.durationSec[0]![1]);
  });

  it('refuses a table with an unknown road class, a zero speed or bad JSON, naming the entry', () => {
    expect(speedTableSchema.safeParse({ units: 'mph', classes: { gravel: 20 } }).success).toBe(false);
    expect(speedTableSchema.safeParse({ units: 'mph', classes: { track: 0 } }).success).toBe(false);
    expect(speedTableSchema.safeParse({ units: 'furlongs', classes: {} }).success).toBe(false);
    const dir = region({ units: 'mph', classes: { gravel: 20 } });
    expect(() => readSpeedTable(path.join(dir, 'source', 'speeds.json'))).toThrow(/classes\.gravel/);
    writeFileSync(path.join(dir, 'source', 'speeds.json'), '{"units": ');
    expect(() => readSpeedTable(path.join(dir, 'source', 'speeds.json'))).toThrow(/not valid JSON/);
    expect(readSpeedTable(path.join(dir, 'source', 'missing.json'))).toBeUndefined();
  });
});
