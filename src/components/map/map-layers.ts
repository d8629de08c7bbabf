/**
 * Overlay sources and layers of the map island: barns coloured by due state, farrier homes, and one
 * route line per farrier. Kept apart from MapView so that dispatch and the day sheet reuse the same
 * look, and so that the layer ids used for picking are defined once.
 */
import type { CircleLayerSpecification, LineLayerSpecification, SymbolLayerSpecification } from 'maplibre-gl';

export type DueState = 'overdue' | 'due_soon' | 'later' | 'booked';

export interface MapBarn {
  id: number | string;
  name: string;
  lat: number;
  lon: number;
  dueState: DueState;
  /** Horses kept at the barn. */
  horses: number;
  address?: string;
}

export interface MapHome {
  id: number | string;
  name: string;
  lat: number;
  lon: number;
  /** The farrier's colour (#rrggbb), shared with their route. */
  colour: string;
}

export interface MapRoute {
  farrierId: number | string;
  colour: string;
  coordinates: [number, number][];
}

/** Due-state colours and words, from Roundsmith's palette (ember, hay, slate) plus a field green. */
export const DUE_STATES: Record<DueState, { colour: string; label: string }> = {
  overdue: { colour: '#be2609', label: 'Overdue' },
  due_soon: { colour: '#d2a947', label: 'Due within a week' },
  later: { colour: '#748ca8', label: 'Due later' },
  booked: { colour: '#2f7d4f', label: 'Booked' },
};

/**
 * The base style's village names (src/lib/map/style.ts): our routes, homes and barns go under them,
 * so a home or barn at a village's centre never hides its name (the name has a halo and sits below
 * the point).
 */
export const PLACE_LABELS_LAYER = 'village-label';

export const LAYER_IDS = {
  routesCasing: 'rs-routes-casing',
  routes: 'rs-routes',
  homes: 'rs-homes',
  barns: 'rs-barns',
  barnLabels: 'rs-barn-labels',
} as const;

/** Layers that answer clicks. */
export const INTERACTIVE_LAYER_IDS = [LAYER_IDS.barns, LAYER_IDS.homes];

export const routesCasingLayer: LineLayerSpecification = {
  id: LAYER_IDS.routesCasing,
  type: 'line',
  source: 'rs-routes',
  layout: { 'line-cap': 'round', 'line-join': 'round' },
  paint: { 'line-color': '#ffffff', 'line-width': ['interpolate', ['linear'], ['zoom'], 9, 4, 14, 9], 'line-opacity': 0.9 },
};

export const routesLayer: LineLayerSpecification = {
  id: LAYER_IDS.routes,
  type: 'line',
  source: 'rs-routes',
  layout: { 'line-cap': 'round', 'line-join': 'round' },
  paint: { 'line-color': ['get', 'colour'], 'line-width': ['interpolate', ['linear'], ['zoom'], 9, 2, 14, 5] },
};

export const homesLayer: CircleLayerSpecification = {
  id: LAYER_IDS.homes,
  type: 'circle',
  source: 'rs-homes',
  paint: {
    'circle-radius': ['interpolate', ['linear'], ['zoom'], 9, 5, 14, 9],
    'circle-color': '#ffffff',
    'circle-stroke-color': ['get', 'colour'],
    'circle-stroke-width': ['interpolate', ['linear'], ['zoom'], 9, 3, 14, 5],
  },
};

export const barnsLayer: CircleLayerSpecification = {
  id: LAYER_IDS.barns,
  type: 'circle',
  source: 'rs-barns',
  paint: {
    // Bigger barns (more horses) draw a little larger; the selected barn gets a dark ring.
    'circle-radius': ['interpolate', ['linear'], ['zoom'], 9, ['+', 4, ['*', 0.25, ['min', ['get', 'horses'], 12]]], 14, ['+', 7, ['*', 0.5, ['min', ['get', 'horses'], 12]]]],
    'circle-color': ['match', ['get', 'dueState'], 'overdue', DUE_STATES.overdue.colour, 'due_soon', DUE_STATES.due_soon.colour, 'booked', DUE_STATES.booked.colour, DUE_STATES.later.colour],
    'circle-stroke-color': ['case', ['get', 'selected'], '#1f2833', '#ffffff'],
    'circle-stroke-width': ['case', ['get', 'selected'], 3, 1.5],
  },
};

export const barnLabelsLayer: SymbolLayerSpecification = {
  id: LAYER_IDS.barnLabels,
  type: 'symbol',
  source: 'rs-barns',
  minzoom: 13,
  layout: {
    'text-field': ['get', 'name'],
    'text-font': ['Inter SemiBold'],
    'text-size': 12,
    'text-offset': [0, 1.3],
    'text-anchor': 'top',
    'text-optional': true,
  },
  paint: { 'text-color': '#1f2833', 'text-halo-color': '#fbf8ef', 'text-halo-width': 1.5 },
};

/** GeoJSON for the barns source; `selected` drives the ring. */
export function barnsCollection(barns: readonly MapBarn[], selectedBarnId?: MapBarn['id'] | null): GeoJSON.FeatureCollection<GeoJSON.Point> {
  return {
    type: 'FeatureCollection',
    features: barns.map((b) => ({
      type: 'Feature',
      geometry: { type: 'Point', coordinates: [b.lon, b.lat] },
      properties: { id: String(b.id), name: b.name, dueState: b.dueState, horses: b.horses, selected: selectedBarnId != null && String(selectedBarnId) === String(b.id) },
    })),
  };
}

export function homesCollection(homes: readonly MapHome[]): GeoJSON.FeatureCollection<GeoJSON.Point> {
  return {
    type: 'FeatureCollection',
    features: homes.map((h) => ({ type: 'Feature', geometry: { type: 'Point', coordinates: [h.lon, h.lat] }, properties: { id: String(h.id), name: h.name, colour: h.colour } })),
  };
}

export function routesCollection(routes: readonly MapRoute[]): GeoJSON.FeatureCollection<GeoJSON.LineString> {
  return {
    type: 'FeatureCollection',
    features: routes
      .filter((r) => r.coordinates.length >= 2)
      .map((r) => ({ type: 'Feature', geometry: { type: 'LineString', coordinates: r.coordinates }, properties: { farrierId: String(r.farrierId), colour: r.colour } })),
  };
}

/** Source and layer ids of one farrier's route line (the map island gives each route its own source). */
export function routeIds(farrierId: MapRoute['farrierId']) {
  const key = String(farrierId);
  return { source: `rs-route-${key}`, casing: `rs-route-casing-${key}`, line: `rs-route-line-${key}` };
}

/**
 * One route's casing and line layers on its own source, drawn with the same paint as the shared route
 * layers. `beforeId` keeps every casing under every line: the casing goes below the (empty) shared casing
 * layer and the line below the (empty) shared line layer, which both stay in place as anchors.
 */
export function routeLayers(farrierId: MapRoute['farrierId']): { casing: LineLayerSpecification & { beforeId: string }; line: LineLayerSpecification & { beforeId: string } } {
  const ids = routeIds(farrierId);
  return {
    casing: { ...routesCasingLayer, id: ids.casing, source: ids.source, beforeId: LAYER_IDS.routesCasing },
    line: { ...routesLayer, id: ids.line, source: ids.source, beforeId: LAYER_IDS.routes },
  };
}

/** Whether two routes' lines have the same points (compared point by point). */
export function sameCoordinates(a: readonly [number, number][], b: readonly [number, number][]): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) {
    if (a[i]![0] !== b[i]![0] || a[i]![1] !== b[i]![1]) return false;
  }
  return true;
}

/**
 * The per-route GeoJSON for the map island, reusing the previous object of every route whose colour and
 * points did not change, so that only changed routes are sent to maplibre's worker again.
 */
export function routeSourcesData(
  routes: readonly MapRoute[],
  previous: ReadonlyMap<string, { route: MapRoute; data: GeoJSON.FeatureCollection<GeoJSON.LineString> }>,
): Map<string, { route: MapRoute; data: GeoJSON.FeatureCollection<GeoJSON.LineString> }> {
  const next = new Map<string, { route: MapRoute; data: GeoJSON.FeatureCollection<GeoJSON.LineString> }>();
  for (const r of routes) {
    if (r.coordinates.length < 2) continue;
    const key = String(r.farrierId);
    const old = previous.get(key);
    if (old && old.route.colour === r.colour && sameCoordinates(old.route.coordinates, r.coordinates)) next.set(key, old);
    else next.set(key, { route: r, data: routesCollection([r]) });
  }
  return next;
}

/** [west, south, east, north] around the given points, or null when there are none. */
export function boundsOf(points: Iterable<[number, number]>): [number, number, number, number] | null {
  let w = Infinity;
  let s = Infinity;
  let e = -Infinity;
  let n = -Infinity;
  for (const [lon, lat] of points) {
    if (!Number.isFinite(lon) || !Number.isFinite(lat)) continue;
    w = Math.min(w, lon);
    e = Math.max(e, lon);
    s = Math.min(s, lat);
    n = Math.max(n, lat);
  }
  return Number.isFinite(w) ? [w, s, e, n] : null;
}
