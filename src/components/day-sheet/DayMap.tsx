/**
 * The day sheet's small route map (client:only="react"): the day's line from home through every stop
 * and back, numbered stops coloured by progress. Reuses the map island's route and home layers so the
 * farrier sees the same look as the dispatcher.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import Map, { Layer, Source, type MapRef } from 'react-map-gl/maplibre';
import type { CircleLayerSpecification, SymbolLayerSpecification } from 'maplibre-gl';
import 'maplibre-gl/dist/maplibre-gl.css';
import { boundsOf, homesCollection, homesLayer, PLACE_LABELS_LAYER, routesCasingLayer, routesCollection, routesLayer } from '../map/map-layers';

export interface DayMapStop {
  id: number;
  position: number;
  lat: number;
  lon: number;
  state: 'arrived' | 'done' | 'skipped' | null;
}

interface Props {
  colour: string;
  home: { lat: number; lon: number; name: string };
  stops: DayMapStop[];
  line: [number, number][];
}

const stopsLayer: CircleLayerSpecification = {
  id: 'ds-stops',
  type: 'circle',
  source: 'ds-stops',
  paint: {
    'circle-radius': 11,
    'circle-color': ['match', ['get', 'state'], 'done', '#2f7d4f', 'skipped', '#748ca8', 'arrived', '#d2a947', '#e53708'],
    'circle-stroke-color': '#ffffff',
    'circle-stroke-width': 2,
  },
};

const numbersLayer: SymbolLayerSpecification = {
  id: 'ds-stop-numbers',
  type: 'symbol',
  source: 'ds-stops',
  layout: { 'text-field': ['get', 'label'], 'text-font': ['Inter SemiBold'], 'text-size': 12, 'text-allow-overlap': true, 'text-ignore-placement': true },
  paint: { 'text-color': '#ffffff' },
};

export default function DayMap({ colour, home, stops, line }: Props) {
  const ref = useRef<MapRef>(null);
  const [loaded, setLoaded] = useState(false);
  const routeData = useMemo(() => routesCollection([{ farrierId: 'day', colour, coordinates: line }]), [colour, line]);
  const homeData = useMemo(() => homesCollection([{ id: 'home', name: home.name, lat: home.lat, lon: home.lon, colour }]), [home, colour]);
  const stopData = useMemo<GeoJSON.FeatureCollection<GeoJSON.Point>>(
    () => ({
      type: 'FeatureCollection',
      features: stops.map((s) => ({ type: 'Feature', geometry: { type: 'Point', coordinates: [s.lon, s.lat] }, properties: { id: String(s.id), label: String(s.position), state: s.state ?? 'ahead' } })),
    }),
    [stops],
  );
  const bounds = useMemo(() => boundsOf([...line, [home.lon, home.lat], ...stops.map((s): [number, number] => [s.lon, s.lat])]), [line, home, stops]);
  useEffect(() => {
    if (loaded && bounds) ref.current?.fitBounds([[bounds[0], bounds[1]], [bounds[2], bounds[3]]], { padding: 28, duration: 0, maxZoom: 14 });
  }, [loaded, bounds]);
  return (
    <div className="day-map relative h-56 overflow-hidden rounded-xl border border-slateblue-200" data-map-ready={loaded ? 'true' : 'false'}>
      <Map
        ref={ref}
        mapStyle={`${window.location.origin}/tiles/style.json`}
        initialViewState={{ longitude: home.lon, latitude: home.lat, zoom: 10 }}
        minZoom={8}
        maxZoom={17}
        onLoad={() => setLoaded(true)}
        attributionControl={false}
        style={{ width: '100%', height: '100%' }}
      >
        <Source id="rs-routes" type="geojson" data={routeData}>
          <Layer {...routesCasingLayer} beforeId={PLACE_LABELS_LAYER} />
          <Layer {...routesLayer} beforeId={PLACE_LABELS_LAYER} />
        </Source>
        <Source id="rs-homes" type="geojson" data={homeData}>
          <Layer {...homesLayer} beforeId={PLACE_LABELS_LAYER} />
        </Source>
        <Source id="ds-stops" type="geojson" data={stopData}>
          <Layer {...stopsLayer} beforeId={PLACE_LABELS_LAYER} />
          <Layer {...numbersLayer} />
        </Source>
      </Map>
      <p className="pointer-events-none absolute bottom-1 right-2 rounded bg-white/80 px-1 text-[10px] text-slateblue-600">Map data: the practice region · Roundsmith</p>
    </div>
  );
}
