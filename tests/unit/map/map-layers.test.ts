// The island's overlay layers: valid MapLibre layers over the GeoJSON the island builds.
import { describe, expect, it } from 'vitest';
import { validateStyleMin } from '@maplibre/maplibre-gl-style-spec';
import {
  barnLabelsLayer,
  barnsCollection,
  barnsLayer,
  boundsOf,
  homesCollection,
  homesLayer,
  INTERACTIVE_LAYER_IDS,
  routeLayers,
  routesCasingLayer,
  routesCollection,
  routeSourcesData,
  routesLayer,
  type MapBarn,
  type MapRoute,
} from '../../../src/components/map/map-layers';

const barns: MapBarn[] = [
  { id: 1, name: 'North Barn', lat: 38.25, lon: -84.62, dueState: 'overdue', horses: 4 },
  { id: 2, name: 'South Barn', lat: 38.1, lon: -84.55, dueState: 'booked', horses: 1 },
];

describe('map overlay layers', () => {
  it('validate with the MapLibre style-spec validator over the sources the island adds', () => {
    // Reference: @maplibre/maplibre-gl-style-spec validateStyleMin.
    const style = {
      version: 8,
      glyphs: 'http://127.0.0.1:4321/tiles/glyphs/{fontstack}/{range}.pbf',
      sources: {
        'rs-barns': { type: 'geojson', data: barnsCollection(barns, 2) },
        'rs-homes': { type: 'geojson', data: homesCollection([{ id: 9, name: 'Home', lat: 38.2, lon: -84.6, colour: '#c2410c' }]) },
        'rs-routes': { type: 'geojson', data: routesCollection([{ farrierId: 9, colour: '#c2410c', coordinates: [[-84.6, 38.2], [-84.62, 38.25]] }]) },
      },
      layers: [routesCasingLayer, routesLayer, homesLayer, barnsLayer, barnLabelsLayer],
    };
    expect(validateStyleMin(style as never)).toEqual([]);
    expect(INTERACTIVE_LAYER_IDS).toEqual([barnsLayer.id, homesLayer.id]);
  });

  it('marks only the selected barn, drops routes with fewer than two points and frames every place', () => {
    const fc = barnsCollection(barns, '2');
    expect(fc.features.map((f) => f.properties!.selected)).toEqual([false, true]);
    expect(fc.features[0]!.geometry.coordinates).toEqual([-84.62, 38.25]);
    expect(routesCollection([{ farrierId: 1, colour: '#000000', coordinates: [[-84.6, 38.2]] }]).features).toEqual([]);
    expect(boundsOf(barns.map((b): [number, number] => [b.lon, b.lat]))).toEqual([-84.62, 38.1, -84.55, 38.25]);
    expect(boundsOf([])).toBeNull();
  });

  it('gives each farrier route its own valid source and layers, drawn under the shared (anchor) route layers in casing-then-line order', () => {
    const { casing, line } = routeLayers(9);
    const { beforeId: casingBefore, ...casingSpec } = casing;
    const { beforeId: lineBefore, ...lineSpec } = line;
    expect([casingBefore, lineBefore]).toEqual([routesCasingLayer.id, routesLayer.id]);
    expect([casing.source, line.source]).toEqual(['rs-route-9', 'rs-route-9']);
    expect([casing.paint, line.paint]).toEqual([routesCasingLayer.paint, routesLayer.paint]);
    const style = {
      version: 8,
      sources: {
        'rs-routes': { type: 'geojson', data: routesCollection([]) },
        'rs-route-9': { type: 'geojson', data: routesCollection([{ farrierId: 9, colour: '#c2410c', coordinates: [[-84.6, 38.2], [-84.62, 38.25]] }]) },
      },
      // The order maplibre ends up with after adding each route layer before its anchor.
      layers: [casingSpec, routesCasingLayer, lineSpec, routesLayer],
    };
    expect(validateStyleMin(style as never)).toEqual([]);
  });

  it('keeps the previous GeoJSON object of every route whose colour and points are unchanged, and makes a new one only for changed routes', () => {
    const a: MapRoute = { farrierId: 1, colour: '#c2410c', coordinates: [[-84.6, 38.2], [-84.62, 38.25]] };
    const b: MapRoute = { farrierId: 2, colour: '#2f7d4f', coordinates: [[-84.5, 38.1], [-84.52, 38.15]] };
    const first = routeSourcesData([a, b, { farrierId: 3, colour: '#000000', coordinates: [[-84.6, 38.2]] }], new Map());
    expect([...first.keys()]).toEqual(['1', '2']);
    // A re-timed plan answers with new arrays: route 1 with the same points, route 2 with one point moved.
    const second = routeSourcesData(
      [
        { ...a, coordinates: a.coordinates.map((p): [number, number] => [p[0], p[1]]) },
        { ...b, coordinates: [[-84.5, 38.1], [-84.53, 38.15]] },
      ],
      first,
    );
    expect(second.get('1')!.data).toBe(first.get('1')!.data);
    expect(second.get('2')!.data).not.toBe(first.get('2')!.data);
    expect(second.get('2')!.data.features[0]!.geometry.coordinates).toEqual([[-84.5, 38.1], [-84.53, 38.15]]);
    // A new colour alone is a change too; a route that is gone is dropped.
    const third = routeSourcesData([{ ...a, colour: '#123456' }], second);
    expect([...third.keys()]).toEqual(['1']);
    expect(third.get('1')!.data).not.toBe(second.get('1')!.data);
    expect(third.get('1')!.data.features[0]!.properties!.colour).toBe('#123456');
  });
});
