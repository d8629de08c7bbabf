/**
 * Roundsmith's base map style: hay-coloured land, blue water, green woods, roads by class with casing,
 * road names along the lines and village names. Every URL points at the app's own origin; with
 * maplibre-gl 5 tile URLs must be absolute, so the endpoint passes the request's origin in.
 */
import type { StyleSpecification, LayerSpecification, ExpressionSpecification } from '@maplibre/maplibre-gl-style-spec';
import type { RegionMeta } from './region';
import { TILE_MAX_ZOOM, TILE_MIN_ZOOM } from './tiles';

/** Colours of the base map; the island's overlay colours live beside MapView. */
export const BASE_COLOURS = {
  land: '#f5f0e1',
  landuse: '#ebe2d1',
  woods: '#cddfb9',
  woodsEdge: '#b3cd9b',
  water: '#a7cbe2',
  waterway: '#86b6d6',
  waterLabel: '#3f6f91',
  boundary: '#9c8fb5',
  roadLabel: '#2f3a46',
  roadHalo: '#fbf8ef',
  placeLabel: '#1f2833',
  woodsLabel: '#4d6b37',
  major: { fill: '#f4a261', casing: '#b5622c' },
  secondary: { fill: '#f7cd7f', casing: '#b38c45' },
  tertiary: { fill: '#ffffff', casing: '#9a907f' },
  minor: { fill: '#ffffff', casing: '#b9af9d' },
  service: { fill: '#fcfbf7', casing: '#cdc4b2' },
} as const;

const MAJOR = ['motorway', 'trunk', 'primary', 'motorway_link', 'trunk_link', 'primary_link'];
const SECONDARY = ['secondary', 'secondary_link'];
const TERTIARY = ['tertiary', 'tertiary_link'];
const MINOR = ['unclassified', 'residential', 'living_street', 'road'];
const SERVICE = ['service', 'track'];

const inClass = (classes: string[]): ExpressionSpecification => ['in', ['get', 'class'], ['literal', classes]];

/** Line width by zoom, in pixels: [zoom, width] pairs, exponential as roads widen with the map. */
const width = (stops: [number, number][]): ExpressionSpecification => ['interpolate', ['exponential', 1.5], ['zoom'], ...stops.flat()];

function roadPair(id: string, classes: string[], colours: { fill: string; casing: string }, minzoom: number, stops: [number, number][], casingExtra: number): LayerSpecification[] {
  return [
    {
      id: `road-${id}-casing`,
      type: 'line',
      source: 'region',
      'source-layer': 'roads',
      minzoom,
      filter: inClass(classes),
      layout: { 'line-cap': 'round', 'line-join': 'round' },
      paint: { 'line-color': colours.casing, 'line-width': width(stops.map(([z, w]) => [z, w + casingExtra])) },
    },
    {
      id: `road-${id}`,
      type: 'line',
      source: 'region',
      'source-layer': 'roads',
      minzoom,
      filter: inClass(classes),
      layout: { 'line-cap': 'round', 'line-join': 'round' },
      paint: { 'line-color': colours.fill, 'line-width': width(stops) },
    },
  ];
}

function roadLabel(id: string, classes: string[], minzoom: number, sizes: number[]): LayerSpecification {
  return {
    id,
    type: 'symbol',
    source: 'region',
    'source-layer': 'roads',
    minzoom,
    filter: ['all', inClass(classes), ['any', ['has', 'name'], ['has', 'ref']]],
    layout: {
      'symbol-placement': 'line',
      'symbol-spacing': 280,
      'text-field': ['coalesce', ['get', 'name'], ['get', 'ref']],
      'text-font': ['Inter Regular'],
      'text-size': ['interpolate', ['linear'], ['zoom'], ...sizes],
      'text-max-angle': 45,
      'text-padding': 4,
    },
    paint: { 'text-color': BASE_COLOURS.roadLabel, 'text-halo-color': BASE_COLOURS.roadHalo, 'text-halo-width': 1.4 },
  };
}

export interface StyleOptions {
  /** Origin of the request, e.g. "http://127.0.0.1:4321"; every URL in the style starts with it. */
  origin: string;
  region: RegionMeta;
}

/** Builds the style for one origin. Pure: the endpoint adds caching headers. */
export function buildStyle({ origin, region }: StyleOptions): StyleSpecification {
  const base = origin.replace(/\/+$/, '');
  const [west, south, east, north] = region.bounds;
  const C = BASE_COLOURS;
  const layers: LayerSpecification[] = [
    { id: 'land', type: 'background', paint: { 'background-color': C.land } },
    { id: 'landuse', type: 'fill', source: 'region', 'source-layer': 'landuse', paint: { 'fill-color': C.landuse } },
    { id: 'woods', type: 'fill', source: 'region', 'source-layer': 'woods', paint: { 'fill-color': C.woods, 'fill-outline-color': C.woodsEdge } },
    { id: 'water', type: 'fill', source: 'region', 'source-layer': 'water', paint: { 'fill-color': C.water } },
    {
      id: 'waterway',
      type: 'line',
      source: 'region',
      'source-layer': 'waterway',
      layout: { 'line-cap': 'round', 'line-join': 'round' },
      paint: { 'line-color': C.waterway, 'line-width': width([[9, 0.8], [13, 2], [16, 5]]) },
    },
    {
      id: 'boundary',
      type: 'line',
      source: 'region',
      'source-layer': 'boundary',
      paint: { 'line-color': C.boundary, 'line-width': 1.5, 'line-dasharray': [4, 2, 1, 2] },
    },
    ...roadPair('service', SERVICE, C.service, 13, [[13, 1], [15, 3], [17, 6]], 1.2),
    ...roadPair('minor', MINOR, C.minor, 11, [[11, 0.8], [13, 2.2], [15, 5], [17, 10]], 1.4),
    ...roadPair('tertiary', TERTIARY, C.tertiary, 9, [[9, 0.8], [12, 2.5], [15, 7], [17, 13]], 1.6),
    ...roadPair('secondary', SECONDARY, C.secondary, 6, [[6, 0.8], [10, 2], [13, 4.5], [15, 9], [17, 16]], 1.8),
    ...roadPair('major', MAJOR, C.major, 6, [[6, 1], [10, 2.6], [13, 5.5], [15, 10], [17, 18]], 2),
    {
      id: 'road-oneway',
      type: 'symbol',
      source: 'region',
      'source-layer': 'roads',
      minzoom: 15,
      filter: ['!=', ['get', 'oneway'], 0],
      layout: {
        'symbol-placement': 'line',
        'symbol-spacing': 90,
        'text-field': ['case', ['==', ['get', 'oneway'], -1], '‹', '›'],
        'text-font': ['Inter SemiBold'],
        'text-size': 16,
        'text-keep-upright': false,
      },
      paint: { 'text-color': '#7d7465' },
    },
    {
      id: 'waterway-label',
      type: 'symbol',
      source: 'region',
      'source-layer': 'waterway',
      minzoom: 12,
      layout: { 'symbol-placement': 'line', 'text-field': ['get', 'name'], 'text-font': ['Inter Italic'], 'text-size': 11, 'symbol-spacing': 400 },
      paint: { 'text-color': C.waterLabel, 'text-halo-color': C.roadHalo, 'text-halo-width': 1 },
    },
    {
      id: 'water-label',
      type: 'symbol',
      source: 'region',
      'source-layer': 'water',
      minzoom: 12,
      layout: { 'text-field': ['get', 'name'], 'text-font': ['Inter Italic'], 'text-size': 11 },
      paint: { 'text-color': C.waterLabel, 'text-halo-color': C.roadHalo, 'text-halo-width': 1 },
    },
    {
      id: 'woods-label',
      type: 'symbol',
      source: 'region',
      'source-layer': 'woods',
      minzoom: 13,
      filter: ['has', 'name'],
      layout: { 'text-field': ['get', 'name'], 'text-font': ['Inter Italic'], 'text-size': 11 },
      paint: { 'text-color': C.woodsLabel, 'text-halo-color': C.roadHalo, 'text-halo-width': 1 },
    },
    // Names of highways and county roads from zoom 10; lanes, streets and drives from zoom 13.
    roadLabel('road-label', [...MAJOR, ...SECONDARY, ...TERTIARY], 10, [10, 10, 13, 12, 17, 14]),
    roadLabel('road-label-minor', [...MINOR, ...SERVICE], 13, [13, 10, 15, 12, 17, 13]),
    {
      id: 'village-label',
      type: 'symbol',
      source: 'region',
      'source-layer': 'places',
      layout: {
        'text-field': ['get', 'name'],
        'text-font': ['Inter SemiBold'],
        'text-size': ['interpolate', ['linear'], ['zoom'], 8, 12, 12, 16, 15, 20],
        'text-letter-spacing': 0.04,
        'text-allow-overlap': false,
        // below the place's point, not on it: farrier homes and barns often sit at a village's centre
        'text-anchor': 'top',
        'text-offset': [0, 0.6],
      },
      paint: { 'text-color': C.placeLabel, 'text-halo-color': C.roadHalo, 'text-halo-width': 2 },
    },
  ];
  return {
    version: 8,
    name: `Roundsmith base map: ${region.name}${region.fictional ? ' (fictional demo region)' : ''}`,
    metadata: { 'roundsmith:fictional': region.fictional, 'roundsmith:source': region.source },
    center: region.center,
    zoom: 11,
    glyphs: `${base}/tiles/glyphs/{fontstack}/{range}.pbf`,
    sources: {
      region: {
        type: 'vector',
        tiles: [`${base}/tiles/{z}/{x}/{y}.pbf`],
        minzoom: TILE_MIN_ZOOM,
        maxzoom: TILE_MAX_ZOOM,
        bounds: [west, south, east, north],
        attribution: region.attribution,
      },
    },
    layers,
  };
}
