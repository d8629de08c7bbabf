/**
 * The map island (use with client:only="react"): Roundsmith's own base map from /tiles/style.json with
 * barns, farrier homes and routes as GeoJSON sources and layers. Clicks on barns and homes are picked
 * through interactiveLayerIds and open a popup; fitBounds goes through a MapRef.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import Map, { Layer, NavigationControl, Popup, ScaleControl, Source, type MapLayerMouseEvent, type MapRef } from 'react-map-gl/maplibre';
import 'maplibre-gl/dist/maplibre-gl.css';
import {
  barnLabelsLayer,
  barnsCollection,
  barnsLayer,
  boundsOf,
  DUE_STATES,
  homesCollection,
  homesLayer,
  INTERACTIVE_LAYER_IDS,
  LAYER_IDS,
  PLACE_LABELS_LAYER,
  routeIds,
  routeLayers,
  routesCasingLayer,
  routeSourcesData,
  routesLayer,
  type DueState,
  type MapBarn,
  type MapHome,
  type MapRoute,
} from './map-layers';

export interface MapViewProps {
  barns: MapBarn[];
  homes: MapHome[];
  routes?: MapRoute[];
  selectedBarnId?: MapBarn['id'] | null;
  onBarnClick?: (barn: MapBarn) => void;
  /** What to frame: 'all' (default) barns, homes and routes; 'routes'; or explicit [w, s, e, n]. */
  fitTo?: 'all' | 'routes' | [number, number, number, number];
  /** Scale bar units, the practice's. */
  units?: 'miles' | 'km';
  /** CSS height of the map; the width follows the container. */
  height?: string;
}

const EMPTY_LINES: GeoJSON.FeatureCollection<GeoJSON.LineString> = { type: 'FeatureCollection', features: [] };

type Picked = { kind: 'barn'; barn: MapBarn } | { kind: 'home'; home: MapHome };

/**
 * What the map shows, read back from maplibre whenever it settles rather than from the props, so that
 * people and tests alike see what was drawn: road names on screen, farriers whose route line is drawn,
 * the barn drawn as selected, and the visible bounds (west, south, east, north).
 */
interface Drawn {
  roadLabels: number;
  routeLines: number;
  selectedBarn: string;
  bounds: string;
}
const NOTHING_DRAWN: Drawn = { roadLabels: 0, routeLines: 0, selectedBarn: '', bounds: '' };

export default function MapView({ barns, homes, routes = [], selectedBarnId, onBarnClick, fitTo = 'all', units = 'miles', height = '70vh' }: MapViewProps) {
  const mapRef = useRef<MapRef>(null);
  const [picked, setPicked] = useState<Picked | null>(null);
  const [loaded, setLoaded] = useState(false);
  const [drawn, setDrawn] = useState<Drawn>(NOTHING_DRAWN);
  const [cursor, setCursor] = useState<string>('');
  const styleUrl = `${window.location.origin}/tiles/style.json`;

  const barnData = useMemo(() => barnsCollection(barns, selectedBarnId), [barns, selectedBarnId]);
  const homeData = useMemo(() => homesCollection(homes), [homes]);
  // One source per farrier's route: a re-timed plan sends maplibre's worker only the routes whose points
  // changed (react-map-gl calls setData only when a source's data changes), not every route of the day.
  const routeCache = useRef<ReturnType<typeof routeSourcesData>>(new globalThis.Map());
  const routeSources = useMemo(() => {
    routeCache.current = routeSourcesData(routes, routeCache.current);
    return [...routeCache.current.entries()];
  }, [routes]);
  const routeLineIds = useRef<string[]>([]);
  routeLineIds.current = routeSources.map(([key]) => routeIds(key).line);

  const bounds = useMemo(() => {
    if (Array.isArray(fitTo)) return fitTo;
    const routePoints = routes.flatMap((r) => r.coordinates);
    if (fitTo === 'routes' && routePoints.length > 0) return boundsOf(routePoints);
    return boundsOf([...barns.map((b): [number, number] => [b.lon, b.lat]), ...homes.map((h): [number, number] => [h.lon, h.lat]), ...routePoints]);
  }, [fitTo, barns, homes, routes]);

  // Re-frame only when the framed area changes, not on every render with new arrays of the same places.
  const boundsKey = bounds ? bounds.map((v) => v.toFixed(6)).join(',') : '';
  const latestBounds = useRef(bounds);
  latestBounds.current = bounds;
  const frame = useCallback((map: Pick<MapRef, 'fitBounds'> | null | undefined) => {
    const b = latestBounds.current;
    if (b) map?.fitBounds([[b[0], b[1]], [b[2], b[3]]], { padding: 48, duration: 0, maxZoom: 15 });
  }, []);
  useEffect(() => {
    if (loaded) frame(mapRef.current);
  }, [loaded, boundsKey, frame]);
  // Framed on load as well, before the first frame is drawn: waiting for the effect above would first
  // show the starting view for a frame, with route lines that arrived before the map had loaded.
  const onLoad = useCallback((event: { target: Pick<MapRef, 'fitBounds'> }) => {
    frame(event.target);
    setLoaded(true);
  }, [frame]);

  const onClick = useCallback(
    (event: MapLayerMouseEvent) => {
      const feature = event.features?.[0];
      if (!feature) {
        setPicked(null);
        return;
      }
      const id = String(feature.properties?.id);
      if (feature.layer.id === LAYER_IDS.barns) {
        const barn = barns.find((b) => String(b.id) === id);
        if (barn) {
          setPicked({ kind: 'barn', barn });
          onBarnClick?.(barn);
        }
      } else if (feature.layer.id === LAYER_IDS.homes) {
        const home = homes.find((h) => String(h.id) === id);
        if (home) setPicked({ kind: 'home', home });
      }
    },
    [barns, homes, onBarnClick],
  );

  const onIdle = useCallback(() => {
    const map = mapRef.current;
    if (!map) return;
    const lineIds = routeLineIds.current.filter((id) => map.getLayer(id));
    const farriers = new Set(lineIds.length ? map.queryRenderedFeatures(undefined, { layers: lineIds }).map((f) => String(f.properties?.farrierId)) : []);
    const selected = map.queryRenderedFeatures(undefined, { layers: [LAYER_IDS.barns], filter: ['get', 'selected'] });
    const next: Drawn = {
      roadLabels: map.queryRenderedFeatures(undefined, { layers: ['road-label', 'road-label-minor'] }).length,
      routeLines: farriers.size,
      selectedBarn: [...new Set(selected.map((f) => String(f.properties?.id)))].join(','),
      bounds: map.getBounds().toArray().flat().map((v) => v.toFixed(6)).join(','),
    };
    setDrawn((prev) => (Object.keys(next) as (keyof Drawn)[]).every((k) => prev[k] === next[k]) ? prev : next);
  }, []);

  const legendStates = Object.keys(DUE_STATES) as DueState[];

  return (
    <div
      className="relative overflow-hidden rounded-lg border border-slateblue-200"
      style={{ height }}
      data-map-ready={loaded ? 'true' : 'false'}
      data-road-labels={drawn.roadLabels}
      data-route-lines={drawn.routeLines}
      data-selected-barn={drawn.selectedBarn}
      data-bounds={drawn.bounds}
    >
      <Map
        ref={mapRef}
        mapStyle={styleUrl}
        initialViewState={{ longitude: -84.6, latitude: 38.2, zoom: 10 }}
        minZoom={8}
        maxZoom={17}
        interactiveLayerIds={INTERACTIVE_LAYER_IDS}
        onClick={onClick}
        onLoad={onLoad}
        onIdle={onIdle}
        onMouseEnter={() => setCursor('pointer')}
        onMouseLeave={() => setCursor('')}
        cursor={cursor}
        attributionControl={{ compact: false }}
        style={{ width: '100%', height: '100%' }}
      >
        <NavigationControl position="top-right" showCompass={false} />
        <ScaleControl position="bottom-left" unit={units === 'miles' ? 'imperial' : 'metric'} />
        {/* The shared route layers stay empty: they anchor the order (all casings, then all lines, under homes and barns). */}
        <Source id="rs-routes" type="geojson" data={EMPTY_LINES}>
          <Layer {...routesCasingLayer} beforeId={PLACE_LABELS_LAYER} />
          <Layer {...routesLayer} beforeId={PLACE_LABELS_LAYER} />
        </Source>
        {routeSources.map(([key, { data }]) => {
          const layers = routeLayers(key);
          return (
            <Source key={key} id={layers.casing.source} type="geojson" data={data}>
              <Layer {...layers.casing} />
              <Layer {...layers.line} />
            </Source>
          );
        })}
        <Source id="rs-homes" type="geojson" data={homeData}>
          <Layer {...homesLayer} beforeId={PLACE_LABELS_LAYER} />
        </Source>
        <Source id="rs-barns" type="geojson" data={barnData}>
          <Layer {...barnsLayer} beforeId={PLACE_LABELS_LAYER} />
          <Layer {...barnLabelsLayer} />
        </Source>
        {picked?.kind === 'barn' && (
          <Popup longitude={picked.barn.lon} latitude={picked.barn.lat} offset={12} onClose={() => setPicked(null)} closeOnClick={false} maxWidth="260px">
            <div className="text-sm text-slateblue-900">
              <p className="font-semibold">{picked.barn.name}</p>
              {picked.barn.address && <p className="text-xs text-slateblue-600">{picked.barn.address}</p>}
              <p className="mt-1">
                {picked.barn.horses} {picked.barn.horses === 1 ? 'horse' : 'horses'} ·{' '}
                <span style={{ color: DUE_STATES[picked.barn.dueState].colour }} className="font-semibold">
                  {DUE_STATES[picked.barn.dueState].label}
                </span>
              </p>
            </div>
          </Popup>
        )}
        {picked?.kind === 'home' && (
          <Popup longitude={picked.home.lon} latitude={picked.home.lat} offset={12} onClose={() => setPicked(null)} closeOnClick={false}>
            <div className="text-sm text-slateblue-900">
              <p className="font-semibold">{picked.home.name}</p>
              <p className="text-xs text-slateblue-600">Farrier's home base</p>
            </div>
          </Popup>
        )}
      </Map>
      <div className="pointer-events-none absolute left-2 top-2 rounded-md bg-white/90 px-3 py-2 text-xs text-slateblue-800 shadow">
        <ul className="space-y-1">
          {legendStates.map((s) => (
            <li key={s} className="flex items-center gap-2">
              <span className="inline-block h-3 w-3 rounded-full border border-white" style={{ background: DUE_STATES[s].colour }} />
              {DUE_STATES[s].label}
            </li>
          ))}
          {homes.length > 0 && (
            <li className="flex items-center gap-2">
              <span className="inline-block h-3 w-3 rounded-full border-[3px] border-slateblue-600 bg-white" />
              Farrier home
            </li>
          )}
        </ul>
      </div>
    </div>
  );
}
