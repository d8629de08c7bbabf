// The tile endpoint and builder: what MapLibre receives for the demo region.
import { describe, expect, it } from 'vitest';
import type { APIContext } from 'astro';
import { VectorTile } from '@mapbox/vector-tile';
import Pbf from 'pbf';
import { GET } from '../../../src/pages/tiles/[z]/[x]/[y].pbf';
import { readRegionSources } from '../../../src/lib/map/region';
import { TileSet } from '../../../src/lib/map/tiles';

/** Web-mercator tile of a point (the slippy-map formula of the OSM wiki). */
function tileOf(lon: number, lat: number, z: number): [number, number] {
  const r = (lat * Math.PI) / 180;
  return [Math.floor(((lon + 180) / 360) * 2 ** z), Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * 2 ** z)];
}

const call = (z: string, x: string, y: string) => GET({ params: { z, x, y } } as unknown as APIContext);

function decode(bytes: Uint8Array): VectorTile {
  return new VectorTile(new Pbf(bytes));
}

function classes(tile: VectorTile): Set<string> {
  const out = new Set<string>();
  const layer = tile.layers.roads;
  if (!layer) return out;
  for (let i = 0; i < layer.length; i++) out.add(String(layer.feature(i).properties.class));
  return out;
}

describe('GET /tiles/{z}/{x}/{y}.pbf', () => {
  it('returns a vector tile that @mapbox/vector-tile decodes with roads, water, woods, landuse and places', async () => {
    const [x, y] = tileOf(-84.6, 38.2, 10);
    const res = await call('10', String(x), String(y));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/vnd.mapbox-vector-tile');
    expect(res.headers.get('content-encoding')).toBeNull();
    const tile = decode(new Uint8Array(await res.arrayBuffer()));
    for (const layer of ['roads', 'woods', 'landuse', 'places', 'waterway']) expect(Object.keys(tile.layers)).toContain(layer);
    const roads = tile.layers.roads!;
    const names = new Set<string>();
    for (let i = 0; i < roads.length; i++) names.add(String(roads.feature(i).properties.name));
    expect(names.has('Wrenmoor Pike')).toBe(true);
    expect(tile.layers.roads!.extent).toBe(4096);
  });

  it('drops minor roads at low zoom and shows farm drives from zoom 13', async () => {
    const [x8, y8] = tileOf(-84.6, 38.2, 8);
    const low = decode(new Uint8Array(await (await call('8', String(x8), String(y8))).arrayBuffer()));
    expect([...classes(low)].sort()).toEqual(['primary', 'secondary']);
    // Some zoom-13 tile inside the county has a farm drive (highway=service).
    let sawService = false;
    const [x0, y0] = tileOf(-84.77, 38.33, 13);
    const [x1, y1] = tileOf(-84.43, 38.07, 13);
    for (let x = x0; x <= x1 && !sawService; x++) for (let y = y0; y <= y1 && !sawService; y++) {
      const res = await call('13', String(x), String(y));
      if (res.status === 200 && classes(decode(new Uint8Array(await res.arrayBuffer()))).has('service')) sawService = true;
    }
    expect(sawService).toBe(true);
  });

  it('answers 204 for an empty tile or a zoom outside 6–15, and 400 for malformed coordinates', async () => {
    expect((await call('10', '0', '0')).status).toBe(204);
    expect((await call('5', '8', '12')).status).toBe(204);
    expect((await call('16', '17366', '25232')).status).toBe(204);
    const bad = await call('10', 'abc', '1');
    expect(bad.status).toBe(400);
    expect(await bad.json()).toMatchObject({ error: { code: 'invalid_request' } });
  });
});

describe('TileSet cache', () => {
  it('encodes a tile once and serves the same bytes from the cache afterwards', () => {
    const tiles = new TileSet(readRegionSources());
    const [x, y] = tileOf(-84.6, 38.2, 12);
    const first = tiles.tile(12, x, y);
    const second = tiles.tile(12, x, y);
    expect(first).not.toBeNull();
    expect(second).toBe(first);
    expect(tiles.stats).toEqual({ encoded: 1, cached: 1 });
  });
});
