/**
 * The region as the map server sees it: its sources, its metadata (bounds, centre, attribution) and its
 * tile set, rebuilt when the files under tiles/ change (a roads import while the server runs).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileStamp, readCollection, regionDir, sourcePath } from '../routing/region-file';
import { TileSet, type RegionSources } from './tiles';

export const SOURCE_FILES = ['roads', 'water', 'woods', 'landuse', 'boundary', 'places'] as const;

/** tiles/region.json: what the style needs to frame and credit the map. */
export interface RegionMeta {
  name: string;
  fictional: boolean;
  description?: string;
  source: 'generated' | 'imported';
  bounds: [number, number, number, number];
  center: [number, number];
  attribution: string;
}

function stamp(): string {
  return [path.join(regionDir(), 'region.json'), ...SOURCE_FILES.map((n) => sourcePath(`${n}.geojson`))].map(fileStamp).join(':') + regionDir();
}

/** Reads the source collections; missing files are empty layers. */
export function readRegionSources(): RegionSources {
  const read = (n: string) => readCollection(sourcePath(`${n}.geojson`)) as GeoJSON.FeatureCollection;
  return { roads: read('roads'), water: read('water'), woods: read('woods'), landuse: read('landuse'), boundary: read('boundary'), places: read('places') };
}

let metaCache: { stamp: string; meta: RegionMeta } | null = null;
let tileCache: { stamp: string; tiles: TileSet } | null = null;

export function getRegionMeta(): RegionMeta {
  const s = stamp();
  if (!metaCache || metaCache.stamp !== s) {
    metaCache = { stamp: s, meta: JSON.parse(readFileSync(path.join(regionDir(), 'region.json'), 'utf8')) as RegionMeta };
  }
  return metaCache.meta;
}

/** The tile set for the current sources, built on first use and kept until the files change. */
export function getRegionTiles(): TileSet {
  const s = stamp();
  if (!tileCache || tileCache.stamp !== s) tileCache = { stamp: s, tiles: new TileSet(readRegionSources()) };
  return tileCache.tiles;
}
