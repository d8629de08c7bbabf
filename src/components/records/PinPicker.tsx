/**
 * A map for placing one pin (client:only="react"): click the map to place it, drag it to move it. Uses
 * the app's own style at /tiles/style.json, like the main map island, which has no placing pin.
 */
import { useEffect, useRef, useState } from 'react';
import Map, { Marker, NavigationControl, type MapLayerMouseEvent, type MapRef } from 'react-map-gl/maplibre';
import 'maplibre-gl/dist/maplibre-gl.css';

export interface Pin { lat: number; lon: number }

const round6 = (v: number) => Math.round(v * 1e6) / 1e6;

export default function PinPicker({ value, onChange, height = '320px', label = 'Pin' }: { value: Pin | null; onChange: (pin: Pin) => void; height?: string; label?: string }) {
  const mapRef = useRef<MapRef>(null);
  const [loaded, setLoaded] = useState(false);
  const styleUrl = `${window.location.origin}/tiles/style.json`;
  const lastFlown = useRef<string>('');

  // Follow a pin set from outside (an address picked from the look-up), without fighting a drag.
  useEffect(() => {
    if (!loaded || !value) return;
    const key = `${value.lat},${value.lon}`;
    if (lastFlown.current === key) return;
    lastFlown.current = key;
    mapRef.current?.easeTo({ center: [value.lon, value.lat], zoom: Math.max(mapRef.current.getZoom(), 13), duration: 0 });
  }, [loaded, value]);

  const place = (lat: number, lon: number) => {
    const pin = { lat: round6(lat), lon: round6(lon) };
    lastFlown.current = `${pin.lat},${pin.lon}`;
    onChange(pin);
  };

  return (
    <div className="relative overflow-hidden rounded-lg border border-slateblue-200" style={{ height }} data-map-ready={loaded ? 'true' : 'false'} data-pin={value ? `${value.lat},${value.lon}` : ''}>
      <Map
        ref={mapRef}
        mapStyle={styleUrl}
        initialViewState={value ? { longitude: value.lon, latitude: value.lat, zoom: 13 } : { longitude: -84.6, latitude: 38.2, zoom: 10 }}
        minZoom={8}
        maxZoom={17}
        onLoad={() => setLoaded(true)}
        onClick={(e: MapLayerMouseEvent) => place(e.lngLat.lat, e.lngLat.lng)}
        cursor="crosshair"
        style={{ width: '100%', height: '100%' }}
      >
        <NavigationControl position="top-right" showCompass={false} />
        {value && (
          <Marker longitude={value.lon} latitude={value.lat} anchor="bottom" draggable onDragEnd={(e) => place(e.lngLat.lat, e.lngLat.lng)}>
            <svg width="28" height="36" viewBox="0 0 28 36" aria-label={label} role="img">
              <path d="M14 1C7 1 2 6.3 2 13c0 8.6 12 22 12 22s12-13.4 12-22C26 6.3 21 1 14 1z" fill="#e53708" stroke="#fff" strokeWidth="2" />
              <circle cx="14" cy="13" r="4.5" fill="#fff" />
            </svg>
          </Marker>
        )}
      </Map>
      <p className="pointer-events-none absolute left-2 top-2 rounded bg-white/90 px-2 py-1 text-xs text-slateblue-800 shadow">
        {value ? <>Drag the pin to move it · <span className="font-mono">{value.lat.toFixed(5)}, {value.lon.toFixed(5)}</span></> : 'Click the map to place the pin'}
      </p>
    </div>
  );
}
