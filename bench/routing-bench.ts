/**
 * Routing and tile benchmark on the demo region (prints figures; asserts nothing):
 *
 *   node --import tsx bench/routing-bench.ts
 *
 * - road graph build time from tiles/source/roads.geojson;
 * - tile throughput at zooms 8–14 over the whole region, cold (slice + encode) and cached;
 * - drive-time matrix time for 100 × 100 and 300 × 300 places (demo addresses, topped up with seeded
 *   points beside random roads), first run and median of 5.
 */
import { readFileSync } from 'node:fs';
import { buildMatrix, loadRoadGraph, type LatLon } from '../src/lib/routing/index';
import { readRegionSources, getRegionMeta } from '../src/lib/map/region';
import { TileSet } from '../src/lib/map/tiles';
import { Random } from '../src/lib/random.ts';

/** The project's seeded generator, so the point pairs are the same on every run. */
const mulberry32 = (seed: number) => {
  const random = new Random(seed);
  return () => random.next();
};
const ms = (t0: number) => performance.now() - t0;
const median = (xs: number[]) => xs.slice().sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

console.log(`node ${process.version}, ${new Date().toISOString()}`);

let t0 = performance.now();
const roads = JSON.parse(readFileSync('tiles/source/roads.geojson', 'utf8'));
const graph = loadRoadGraph(roads);
console.log(`graph: ${roads.features.length} road lines → ${graph.nodeCount} nodes, ${graph.pieceCount} pieces, ${graph.arcTarget.length} arcs; built in ${ms(t0).toFixed(1)} ms`);

// Tiles
const [west, south, east, north] = getRegionMeta().bounds;
const tileRange = (z: number) => {
  const tx = (lon: number) => Math.floor(((lon + 180) / 360) * 2 ** z);
  const ty = (lat: number) => {
    const r = (lat * Math.PI) / 180;
    return Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * 2 ** z);
  };
  const out: [number, number][] = [];
  for (let x = tx(west); x <= tx(east); x++) for (let y = ty(north); y <= ty(south); y++) out.push([x, y]);
  return out;
};
t0 = performance.now();
const tiles = new TileSet(readRegionSources());
console.log(`tile index (geojson-vt over all layers): ${ms(t0).toFixed(1)} ms`);
let coldTotal = 0;
let coldTime = 0;
let warmTime = 0;
let bytesTotal = 0;
console.log('zoom  tiles  non-empty   cold tiles/s   cached tiles/s   mean KiB');
for (let z = 8; z <= 14; z++) {
  const list = tileRange(z);
  let nonEmpty = 0;
  let bytes = 0;
  t0 = performance.now();
  for (const [x, y] of list) {
    const b = tiles.tile(z, x, y);
    if (b) {
      nonEmpty++;
      bytes += b.length;
    }
  }
  const cold = ms(t0);
  t0 = performance.now();
  const rounds = 20;
  for (let r = 0; r < rounds; r++) for (const [x, y] of list) tiles.tile(z, x, y);
  const warm = ms(t0) / rounds;
  coldTotal += list.length;
  coldTime += cold;
  warmTime += warm;
  bytesTotal += bytes;
  console.log(
    `${String(z).padStart(4)}  ${String(list.length).padStart(5)}  ${String(nonEmpty).padStart(9)}  ${(list.length / (cold / 1000)).toFixed(0).padStart(13)}  ${(list.length / (warm / 1000)).toFixed(0).padStart(15)}  ${(nonEmpty ? bytes / nonEmpty / 1024 : 0).toFixed(1).padStart(9)}`,
  );
}
console.log(`z8–14 all: ${coldTotal} tiles, cold ${(coldTotal / (coldTime / 1000)).toFixed(0)} tiles/s (${coldTime.toFixed(0)} ms), cached ${(coldTotal / (warmTime / 1000)).toFixed(0)} tiles/s; ${(bytesTotal / 1024).toFixed(0)} KiB encoded`);

// Matrices
const addresses: LatLon[] = JSON.parse(readFileSync('tiles/source/addresses.geojson', 'utf8')).features.map((f: { geometry: { coordinates: [number, number] } }) => ({
  lon: f.geometry.coordinates[0],
  lat: f.geometry.coordinates[1],
}));
const rand = mulberry32(300);
const extra: LatLon[] = [];
while (addresses.length + extra.length < 300) {
  const p = Math.floor(rand() * graph.pieceCount);
  const c = graph.pieceCoordStart[p]! + Math.floor(rand() * (graph.pieceCoordEnd[p]! - graph.pieceCoordStart[p]!));
  // 15 m north of a vertex of a random road piece: about the way a barn sits beside its road.
  extra.push({ lon: graph.coordLon[c]!, lat: graph.coordLat[c]! + 15 / 111_195 });
}
const places = [...addresses, ...extra];
for (const n of [100, 300]) {
  const pts = places.slice(0, n);
  const times: number[] = [];
  let fallbacks = 0;
  for (let r = 0; r < 5; r++) {
    t0 = performance.now();
    const m = buildMatrix(graph, pts);
    times.push(ms(t0));
    fallbacks = m.fallback.filter(Boolean).length;
  }
  console.log(`matrix ${n} × ${n}: first ${times[0]!.toFixed(1)} ms, median of 5 ${median(times).toFixed(1)} ms (${fallbacks} fallback places)`);
}
