/**
 * Vector tiles of the region, cut with @maplibre/geojson-vt and encoded with @maplibre/vt-pbf. The
 * slicing index is built once per change of the source files; encoded tiles are cached (encoding costs
 * far more than slicing), so a map pan mostly reads bytes from memory.
 *
 * Layers: water (polygons), waterway (lines), woods, landuse, boundary, roads, places. Minor roads are
 * left out of low zooms: each road group has its own index and joins tiles from its minimum zoom on.
 */
import { GeoJSONVT, type GeoJSONVTTile } from '@maplibre/geojson-vt';
import { fromGeojsonVt } from '@maplibre/vt-pbf';

export const TILE_MIN_ZOOM = 6;
export const TILE_MAX_ZOOM = 15;

/** Road classes by the zoom from which they appear. */
export const ROAD_GROUPS: { minZoom: number; classes: string[] }[] = [
  { minZoom: 6, classes: ['motorway', 'motorway_link', 'trunk', 'trunk_link', 'primary', 'primary_link', 'secondary', 'secondary_link'] },
  { minZoom: 9, classes: ['tertiary', 'tertiary_link'] },
  { minZoom: 11, classes: ['unclassified', 'residential', 'living_street', 'road'] },
  { minZoom: 13, classes: ['service', 'track'] },
];

/** The region's source collections, as read from tiles/source/. */
export interface RegionSources {
  roads: GeoJSON.FeatureCollection;
  water: GeoJSON.FeatureCollection;
  woods: GeoJSON.FeatureCollection;
  landuse: GeoJSON.FeatureCollection;
  boundary: GeoJSON.FeatureCollection;
  places: GeoJSON.FeatureCollection;
}

type Collection = GeoJSON.FeatureCollection;

function collection(features: GeoJSON.Feature[]): Collection {
  return { type: 'FeatureCollection', features };
}

const pickProps = (f: GeoJSON.Feature, keys: string[]): GeoJSON.Feature => {
  const props: Record<string, unknown> = {};
  for (const k of keys) {
    const v = f.properties?.[k];
    if (v !== undefined && v !== null && v !== '') props[k] = v;
  }
  return { type: 'Feature', geometry: f.geometry, properties: props };
};

/** A road's tile properties: its class, name and ref, and a label for road-name text. */
function roadFeature(f: GeoJSON.Feature): GeoJSON.Feature {
  const p = f.properties ?? {};
  const oneway = p.oneway === 'yes' || p.oneway === '1' || p.oneway === 'true' ? 1 : p.oneway === '-1' ? -1 : 0;
  const props: Record<string, unknown> = { class: p.highway, oneway };
  if (p.name) props.name = p.name;
  if (p.ref) props.ref = p.ref;
  return { type: 'Feature', geometry: f.geometry, properties: props };
}

interface LayerIndex {
  name: string;
  minZoom: number;
  index: GeoJSONVT;
}

/**
 * A tile set over one version of the sources. `tile(z, x, y)` returns the encoded bytes, or null for a
 * tile with nothing in it (served as 204 No Content).
 */
export class TileSet {
  private readonly layers: LayerIndex[] = [];
  private readonly cache = new Map<string, Uint8Array | null>();
  private readonly cacheLimit: number;
  /** Counters for the bench and for tests of the cache. */
  readonly stats = { encoded: 0, cached: 0 };

  constructor(sources: RegionSources, options: { cacheLimit?: number } = {}) {
    this.cacheLimit = options.cacheLimit ?? 20_000;
    const vt = (c: Collection) => new GeoJSONVT(c, { maxZoom: TILE_MAX_ZOOM, indexMaxZoom: 6, tolerance: 3, extent: 4096, buffer: 64 });
    const add = (name: string, minZoom: number, features: GeoJSON.Feature[]) => {
      if (features.length > 0) this.layers.push({ name, minZoom, index: vt(collection(features)) });
    };
    const polys = (f: GeoJSON.Feature) => f.geometry?.type === 'Polygon' || f.geometry?.type === 'MultiPolygon';
    const lines = (f: GeoJSON.Feature) => f.geometry?.type === 'LineString' || f.geometry?.type === 'MultiLineString';
    add('landuse', TILE_MIN_ZOOM, sources.landuse.features.filter(polys).map((f) => pickProps(f, ['landuse', 'name'])));
    add('woods', TILE_MIN_ZOOM, sources.woods.features.filter(polys).map((f) => pickProps(f, ['natural', 'landuse', 'name'])));
    add('water', TILE_MIN_ZOOM, sources.water.features.filter(polys).map((f) => pickProps(f, ['natural', 'water', 'name'])));
    add('waterway', 9, sources.water.features.filter(lines).map((f) => pickProps(f, ['waterway', 'name'])));
    add('boundary', TILE_MIN_ZOOM, sources.boundary.features.filter(lines).map((f) => pickProps(f, ['boundary', 'admin_level', 'name'])));
    for (const group of ROAD_GROUPS) {
      const classes = new Set(group.classes);
      add('roads', group.minZoom, sources.roads.features.filter((f) => lines(f) && classes.has(String(f.properties?.highway))).map(roadFeature));
    }
    add('places', TILE_MIN_ZOOM, sources.places.features.filter((f) => f.geometry?.type === 'Point').map((f) => pickProps(f, ['place', 'name', 'population'])));
  }

  /** Encoded tile bytes, or null when the tile is empty or outside the served zooms. */
  tile(z: number, x: number, y: number): Uint8Array | null {
    if (!Number.isInteger(z) || !Number.isInteger(x) || !Number.isInteger(y)) return null;
    if (z < TILE_MIN_ZOOM || z > TILE_MAX_ZOOM || x < 0 || y < 0 || x >= 2 ** z || y >= 2 ** z) return null;
    const key = `${z}/${x}/${y}`;
    const hit = this.cache.get(key);
    if (hit !== undefined) {
      this.stats.cached++;
      return hit;
    }
    const byName = new Map<string, GeoJSONVTTile>();
    for (const layer of this.layers) {
      if (z < layer.minZoom) continue;
      const t = layer.index.getTile(z, x, y);
      if (!t || t.features.length === 0) continue;
      const existing = byName.get(layer.name);
      if (existing) byName.set(layer.name, { ...existing, features: [...existing.features, ...t.features] });
      else byName.set(layer.name, t);
    }
    const bytes = byName.size === 0 ? null : fromGeojsonVt(Object.fromEntries(byName), { version: 2, extent: 4096 });
    this.stats.encoded++;
    if (this.cache.size >= this.cacheLimit) this.cache.delete(this.cache.keys().next().value!);
    this.cache.set(key, bytes);
    return bytes;
  }
}
