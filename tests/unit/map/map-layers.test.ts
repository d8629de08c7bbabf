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
  routesCasingLayer,
  routesCollection,
  routesLayer,
  type MapBarn,
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
});
