// Importing a practice's own OpenStreetMap roads: validate everything first, write all or nothing.
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { importRoads, planRoadsImport } from '../../../src/lib/map/roads-import';
import { loadRoadGraph } from '../../../src/lib/routing/graph';

const dirs: string[] = [];
function regionCopy(): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'roundsmith-region-'));
  dirs.push(dir);
  cpSync('tiles/region.json', path.join(dir, 'region.json'));
  cpSync('tiles/source', path.join(dir, 'source'), { recursive: true });
  return dir;
}
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

function snapshot(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    for (const name of readdirSync(d)) {
      const p = path.join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else out[path.relative(dir, p)] = readFileSync(p, 'utf8');
    }
  };
  walk(dir);
  return out;
}

const line = (coordinates: unknown, properties: Record<string, unknown>) => ({ type: 'Feature', geometry: { type: 'LineString', coordinates }, properties });

/** A tiny valid extract in the shape osmium/ogr2ogr exports produce: a T-junction, a one-way, a stream. */
const good = {
  type: 'FeatureCollection',
  features: [
    { ...line([[-84.60, 38.20], [-84.59, 38.20], [-84.58, 38.20]], { highway: 'secondary', name: 'Test Pike', ref: 'R 9', maxspeed: '45 mph' }), id: 'way/1' },
    { ...line([[-84.59, 38.20], [-84.59, 38.21]], { highway: 'residential', name: 'North Street', oneway: 'yes' }), id: 'way/2' },
    { ...line([[-84.59, 38.21], [-84.60, 38.21], [-84.60, 38.20]], { highway: 'unclassified', name: 'Loop Lane' }), id: 'way/3' },
    { ...line([[-84.595, 38.19], [-84.595, 38.22]], { highway: 'footway' }), id: 'way/4' },
    { ...line([[-84.61, 38.19], [-84.57, 38.215]], { waterway: 'stream', name: 'Test Run' }), id: 'way/5' },
    { type: 'Feature', geometry: { type: 'Point', coordinates: [-84.59, 38.205] }, properties: { place: 'village', name: 'Testville' }, id: 'node/6' },
  ],
};

describe('roads import', () => {
  it('lists every problem — bad geometry, missing or malformed tags — and writes nothing', () => {
    const dir = regionCopy();
    const before = snapshot(dir);
    const bad = {
      type: 'FeatureCollection',
      features: [
        line([[-84.6, 38.2]], { highway: 'residential' }),
        line([[-84.6, 38.2], [-84.59, 38.2]], { name: 'Nameonly Road' }),
        { type: 'Feature', geometry: { type: 'Point', coordinates: [-84.6, 38.2] }, properties: { highway: 'primary' } },
        line([[712000, 4230000], [712100, 4230000]], { highway: 'primary', oneway: 'sometimes', maxspeed: 'fast' }),
        line([[-84.6, 38.2], [-84.6, 38.2]], { highway: 'tertiary' }),
        line([[-84.6, 38.2], [-84.59, 38.2]], {}),
        { type: 'Feature', geometry: null, properties: { highway: 'service' } },
      ],
    };
    const result = importRoads(bad, { regionDir: dir, name: 'Broken' });
    expect(result.ok).toBe(false);
    expect(result.problems).toEqual([
      'feature 1: a line needs at least two distinct positions',
      'feature 2: line has no highway tag',
      'feature 3: a road (highway=primary) must be a LineString or MultiLineString, not Point',
      'feature 4: coordinates are outside longitude ±180 / latitude ±90 (projected data? export as WGS 84 longitude/latitude, EPSG:4326)',
      'feature 4: oneway="sometimes" is not one of yes, no, -1',
      'feature 4: maxspeed="fast" is not a speed such as "45 mph" or "70"',
      'feature 5: a line needs at least two distinct positions',
      'feature 6: a line without tags (a road needs at least highway=…)',
      'feature 7: a road (highway=service) must be a LineString or MultiLineString, not missing geometry',
    ]);
    expect(snapshot(dir)).toEqual(before);
  });

  it('rejects a file that is not a FeatureCollection, or has no roads at all', () => {
    expect(planRoadsImport({ type: 'Feature' }).problems).toEqual(['the file is not a GeoJSON FeatureCollection ({"type":"FeatureCollection","features":[…]})']);
    expect(planRoadsImport({ type: 'FeatureCollection', features: [good.features[4]] }).problems).toEqual([
      'the file has no roads: expected LineString features with a highway tag',
    ]);
  });

  it('accepts a good extract: replaces the roads, keeps water and villages, credits OpenStreetMap and frames the new bounds', () => {
    const dir = regionCopy();
    const addressesBefore = readFileSync(path.join(dir, 'source', 'addresses.geojson'), 'utf8');
    const result = importRoads(good, { regionDir: dir, name: 'Test extract' });
    expect(result.problems).toEqual([]);
    expect(result.ok).toBe(true);
    const roads = JSON.parse(readFileSync(path.join(dir, 'source', 'roads.geojson'), 'utf8'));
    // Three drivable roads; the footway is left out.
    expect(roads.features.map((f: { properties: { name: string } }) => f.properties.name)).toEqual(['Test Pike', 'North Street', 'Loop Lane']);
    expect(JSON.parse(readFileSync(path.join(dir, 'source', 'water.geojson'), 'utf8')).features).toHaveLength(1);
    expect(JSON.parse(readFileSync(path.join(dir, 'source', 'places.geojson'), 'utf8')).features[0].properties.name).toBe('Testville');
    expect(JSON.parse(readFileSync(path.join(dir, 'source', 'woods.geojson'), 'utf8')).features).toEqual([]);
    const region = JSON.parse(readFileSync(path.join(dir, 'region.json'), 'utf8'));
    expect(region).toMatchObject({ name: 'Test extract', fictional: false, source: 'imported', attribution: '© OpenStreetMap contributors', bounds: [-84.6, 38.2, -84.58, 38.21] });
    // Addresses are demo data, not part of a road import.
    expect(readFileSync(path.join(dir, 'source', 'addresses.geojson'), 'utf8')).toBe(addressesBefore);
    // The written roads build a graph of 4 nodes: the Pike's two ends, the T at -84.59 and the loop
    // corner at (-84.59, 38.21); North Street stays one-way and all 4 are mutually reachable.
    const graph = loadRoadGraph(roads);
    expect(graph.skipped).toEqual([]);
    expect(graph.nodeCount).toBe(4);
    expect(graph.mainComponentSize).toBe(4);
    expect(Array.from(graph.pieceOneway)).toContain(1);
    expect(readdirSync(path.join(dir, 'source')).some((n) => n.endsWith('.tmp'))).toBe(false);
  });
});
