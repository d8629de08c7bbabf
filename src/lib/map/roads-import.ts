/**
 * Import of a practice's own road data: a GeoJSON FeatureCollection of OpenStreetMap features (the
 * usual export of an OpenStreetMap extract), validated in full before anything is written. Roads are
 * LineStrings with a `highway` tag; water, woods, village points and residential areas come along when
 * the file has them. On success the region's source files and region.json are replaced together, and
 * the running server rebuilds its tiles and road graph when it sees the new files.
 */
import { mkdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';
import { loadRoadGraph } from '../routing/graph';
import { DRIVABLE_CLASSES, parseMaxspeedKmh } from '../routing/speeds';
import { TileSet, TILE_MAX_ZOOM, TILE_MIN_ZOOM, type RegionSources } from './tiles';
import type { RegionMeta } from './region';

/** highway values that are real but not driven; skipped without complaint. */
const NOT_DRIVEN = new Set([
  'footway', 'path', 'cycleway', 'bridleway', 'steps', 'pedestrian', 'corridor', 'platform', 'bus_stop', 'elevator',
  'construction', 'proposed', 'abandoned', 'disused', 'razed', 'raceway', 'busway', 'bus_guideway', 'escape', 'rest_area',
  'services', 'emergency_bay', 'via_ferrata', 'crossing', 'traffic_signals', 'stop', 'give_way', 'turning_circle',
  'turning_loop', 'mini_roundabout', 'motorway_junction', 'street_lamp', 'speed_camera', 'milestone', 'passing_place',
]);
const ONEWAY_VALUES = new Set(['yes', 'no', '1', '0', '-1', 'true', 'false', 'reverse', 'reversible', 'alternating']);
const MAXSPEED_SYMBOLS = /^(none|signals|walk|variable|implicit|[A-Z]{2}(-[A-Z0-9]+)?:[a-z_ ]+)$/;
const PLACE_VALUES = new Set(['city', 'town', 'village', 'hamlet', 'suburb', 'neighbourhood', 'locality', 'isolated_dwelling']);

const position = z.tuple([z.number(), z.number()]).rest(z.number());
const featureShape = z.object({
  type: z.literal('Feature'),
  geometry: z.object({ type: z.string(), coordinates: z.unknown() }).nullable(),
  properties: z.record(z.unknown()).nullable(),
  id: z.union([z.string(), z.number()]).optional(),
});
const collectionShape = z.object({ type: z.literal('FeatureCollection'), features: z.array(z.unknown()) });

export interface ImportPlan {
  problems: string[];
  warnings: string[];
  sources: RegionSources;
  counts: { roads: number; water: number; woods: number; places: number; landuse: number; skipped: number };
  bounds: [number, number, number, number] | null;
}

function describe(i: number, f: { id?: unknown; properties?: Record<string, unknown> | null }): string {
  const osmId = f.id ?? f.properties?.['@id'] ?? f.properties?.osm_id ?? f.properties?.id;
  return `feature ${i + 1}${osmId !== undefined ? ` (${String(osmId)})` : ''}`;
}

/** Problems with one line's coordinates, or none. */
function lineProblems(coords: unknown): string | null {
  const parsed = z.array(position).safeParse(coords);
  if (!parsed.success) return 'coordinates are not a list of [longitude, latitude] positions';
  const line = parsed.data;
  if (line.some((p) => !Number.isFinite(p[0]) || !Number.isFinite(p[1]))) return 'a coordinate is not a finite number';
  if (line.some((p) => Math.abs(p[0]) > 180 || Math.abs(p[1]) > 90)) {
    return 'coordinates are outside longitude ±180 / latitude ±90 (projected data? export as WGS 84 longitude/latitude, EPSG:4326)';
  }
  const distinct = new Set(line.map((p) => `${p[0]},${p[1]}`));
  if (distinct.size < 2) return 'a line needs at least two distinct positions';
  return null;
}

function polygonProblems(type: string, coords: unknown): string | null {
  const rings = type === 'Polygon' ? z.array(z.array(position)).safeParse(coords) : z.array(z.array(z.array(position))).safeParse(coords);
  if (!rings.success) return 'polygon coordinates are malformed';
  const flat = (type === 'Polygon' ? [rings.data] : rings.data) as number[][][][];
  for (const poly of flat) for (const ring of poly) {
    if (ring.length < 4) return 'a polygon ring needs at least four positions';
    if (ring.some((p) => !Number.isFinite(p[0]!) || !Number.isFinite(p[1]!) || Math.abs(p[0]!) > 180 || Math.abs(p[1]!) > 90)) return 'polygon coordinates are outside longitude/latitude range';
  }
  return null;
}

/**
 * Validates a parsed GeoJSON document and sorts its features into the region's layers. Writes nothing:
 * `problems` empty means the file can be imported.
 */
export function planRoadsImport(doc: unknown): ImportPlan {
  const problems: string[] = [];
  const warnings: string[] = [];
  const empty = (): GeoJSON.FeatureCollection => ({ type: 'FeatureCollection', features: [] });
  const sources: RegionSources = { roads: empty(), water: empty(), woods: empty(), landuse: empty(), boundary: empty(), places: empty() };
  const counts = { roads: 0, water: 0, woods: 0, places: 0, landuse: 0, skipped: 0 };
  const top = collectionShape.safeParse(doc);
  if (!top.success) {
    return { problems: ['the file is not a GeoJSON FeatureCollection ({"type":"FeatureCollection","features":[…]})'], warnings, sources, counts, bounds: null };
  }
  const drivable = new Set<string>(DRIVABLE_CLASSES);
  let west = Infinity;
  let south = Infinity;
  let east = -Infinity;
  let north = -Infinity;

  top.data.features.forEach((raw, i) => {
    const parsed = featureShape.safeParse(raw);
    if (!parsed.success) {
      problems.push(`feature ${i + 1}: not a GeoJSON Feature with geometry and properties`);
      return;
    }
    const f = parsed.data;
    const props = f.properties ?? {};
    const where = describe(i, f);
    const geom = f.geometry;
    const highway = props.highway;
    const isLine = geom?.type === 'LineString' || geom?.type === 'MultiLineString';
    const isPolygon = geom?.type === 'Polygon' || geom?.type === 'MultiPolygon';

    if (highway !== undefined) {
      if (typeof highway !== 'string' || highway.trim() === '') {
        problems.push(`${where}: highway must be a text value such as "residential"`);
        return;
      }
      if (NOT_DRIVEN.has(highway)) {
        counts.skipped++;
        return;
      }
      if (!drivable.has(highway)) {
        warnings.push(`${where}: highway=${highway} is not a road class Roundsmith drives on; left out`);
        counts.skipped++;
        return;
      }
      if (!geom || !isLine) {
        problems.push(`${where}: a road (highway=${highway}) must be a LineString or MultiLineString, not ${geom?.type ?? 'missing geometry'}`);
        return;
      }
      // Every problem of a road is listed, not just the first.
      const found: string[] = [];
      const lines = geom.type === 'LineString' ? [geom.coordinates] : Array.isArray(geom.coordinates) ? geom.coordinates : [null];
      for (const line of lines) {
        const bad = lineProblems(line);
        if (bad) {
          found.push(bad);
          break;
        }
        for (const p of line as number[][]) {
          west = Math.min(west, p[0]!);
          east = Math.max(east, p[0]!);
          south = Math.min(south, p[1]!);
          north = Math.max(north, p[1]!);
        }
      }
      const oneway = props.oneway;
      if (oneway !== undefined && (typeof oneway !== 'string' || !ONEWAY_VALUES.has(oneway.toLowerCase()))) found.push(`oneway=${JSON.stringify(oneway)} is not one of yes, no, -1`);
      const maxspeed = props.maxspeed;
      if (maxspeed !== undefined && parseMaxspeedKmh(maxspeed) === null && !(typeof maxspeed === 'string' && MAXSPEED_SYMBOLS.test(maxspeed))) {
        found.push(`maxspeed=${JSON.stringify(maxspeed)} is not a speed such as "45 mph" or "70"`);
      }
      for (const key of ['name', 'ref'] as const) if (props[key] !== undefined && typeof props[key] !== 'string') found.push(`${key} must be text`);
      if (found.length > 0) {
        for (const f of found) problems.push(`${where}: ${f}`);
        return;
      }
      sources.roads.features.push({ type: 'Feature', geometry: geom as GeoJSON.Geometry, properties: props as GeoJSON.GeoJsonProperties });
      counts.roads++;
      return;
    }

    // Other features come along when they are well formed; anything else is left out.
    const bad = !geom ? 'no geometry' : isLine ? lineProblems(geom.type === 'LineString' ? geom.coordinates : (geom.coordinates as unknown[])[0]) : isPolygon ? polygonProblems(geom.type, geom.coordinates) : null;
    const keep = (layer: keyof RegionSources, countKey: keyof typeof counts) => {
      if (bad) {
        problems.push(`${where}: ${bad}`);
        return;
      }
      sources[layer].features.push({ type: 'Feature', geometry: geom as GeoJSON.Geometry, properties: props as GeoJSON.GeoJsonProperties });
      counts[countKey]++;
    };
    if (props.waterway !== undefined && isLine) keep('water', 'water');
    else if ((props.natural === 'water' || props.water !== undefined || props.landuse === 'reservoir' || props.landuse === 'basin') && isPolygon) keep('water', 'water');
    else if ((props.natural === 'wood' || props.landuse === 'forest') && isPolygon) keep('woods', 'woods');
    else if (props.landuse === 'residential' && isPolygon) keep('landuse', 'landuse');
    else if (typeof props.place === 'string' && PLACE_VALUES.has(props.place) && geom?.type === 'Point') {
      const c = geom.coordinates as unknown;
      if (!position.safeParse(c).success) problems.push(`${where}: point coordinates are malformed`);
      else {
        sources.places.features.push({ type: 'Feature', geometry: geom as GeoJSON.Geometry, properties: props as GeoJSON.GeoJsonProperties });
        counts.places++;
      }
    } else if (geom?.type === 'LineString' && Object.keys(props).length === 0) {
      problems.push(`${where}: a line without tags (a road needs at least highway=…)`);
    } else if (isLine && props.highway === undefined && props.waterway === undefined && props.railway === undefined && props.boundary === undefined && props.barrier === undefined && props.power === undefined) {
      problems.push(`${where}: line has no highway tag`);
    } else counts.skipped++;
  });

  if (problems.length === 0 && counts.roads === 0) problems.push('the file has no roads: expected LineString features with a highway tag');
  const bounds: [number, number, number, number] | null = Number.isFinite(west) ? [west, south, east, north] : null;
  if (bounds && (bounds[2] - bounds[0] > 3 || bounds[3] - bounds[1] > 3)) {
    warnings.push(`the roads cover ${(bounds[2] - bounds[0]).toFixed(1)}° × ${(bounds[3] - bounds[1]).toFixed(1)}°; a practice's area is usually much smaller (tiles are built in memory)`);
  }
  return { problems, warnings, sources, counts, bounds };
}

export interface ImportOptions {
  /** Folder with region.json and source/ (normally tiles/). */
  regionDir: string;
  name: string;
  /** Credit shown on the map; OpenStreetMap data requires "© OpenStreetMap contributors". */
  attribution?: string;
}

export interface ImportResult {
  ok: boolean;
  problems: string[];
  warnings: string[];
  summary?: string;
}

/**
 * Validates, then replaces the region's sources and region.json. Files are written beside their targets
 * and renamed into place only after every one was written, so a failure leaves the old region intact.
 */
export function importRoads(doc: unknown, options: ImportOptions): ImportResult {
  const plan = planRoadsImport(doc);
  if (plan.problems.length > 0) return { ok: false, problems: plan.problems, warnings: plan.warnings };

  // Rebuild before writing: the graph and a column of tiles must build from the new data.
  const graph = loadRoadGraph(plan.sources.roads);
  const share = graph.nodeCount ? graph.mainComponentSize / graph.nodeCount : 0;
  if (share < 0.5) plan.warnings.push(`only ${(share * 100).toFixed(0)} % of junctions are mutually reachable; places snap to the largest connected part`);
  const tiles = new TileSet(plan.sources);
  const [west, south, east, north] = plan.bounds!;
  const centre: [number, number] = [(west + east) / 2, (south + north) / 2];
  let tileCount = 0;
  for (let zoom = TILE_MIN_ZOOM; zoom <= TILE_MAX_ZOOM; zoom++) {
    const x = Math.floor(((centre[0] + 180) / 360) * 2 ** zoom);
    const r = (centre[1] * Math.PI) / 180;
    const y = Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * 2 ** zoom);
    if (tiles.tile(zoom, x, y)) tileCount++;
  }

  const meta: RegionMeta = {
    name: options.name,
    fictional: false,
    source: 'imported',
    bounds: plan.bounds!,
    center: centre,
    attribution: options.attribution ?? '© OpenStreetMap contributors',
  };
  const sourceDir = path.join(options.regionDir, 'source');
  mkdirSync(sourceDir, { recursive: true });
  const writes: [string, string][] = [
    ...(['roads', 'water', 'woods', 'landuse', 'boundary', 'places'] as const).map((layer): [string, string] => [path.join(sourceDir, `${layer}.geojson`), `${JSON.stringify({ type: 'FeatureCollection', name: layer, features: plan.sources[layer].features })}\n`]),
    [path.join(options.regionDir, 'region.json'), `${JSON.stringify(meta, null, 2)}\n`],
  ];
  const stamp = `${process.pid}-${Date.now()}`;
  try {
    for (const [file, text] of writes) writeFileSync(`${file}.${stamp}.tmp`, text);
  } catch (err) {
    for (const [file] of writes) rmSync(`${file}.${stamp}.tmp`, { force: true });
    throw err;
  }
  for (const [file] of writes) renameSync(`${file}.${stamp}.tmp`, file);

  const c = plan.counts;
  return {
    ok: true,
    problems: [],
    warnings: plan.warnings,
    summary:
      `Imported ${c.roads} roads (${graph.nodeCount} junctions, ${(share * 100).toFixed(1)} % in the main network), ${c.water} water, ${c.woods} woods, ` +
      `${c.places} places, ${c.landuse} residential areas; ${c.skipped} other features left out; ${tileCount} sample tiles built. ` +
      `Bounds ${plan.bounds!.map((v) => v.toFixed(4)).join(', ')}.`,
  };
}
