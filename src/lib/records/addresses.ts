import { readFileSync } from 'node:fs';
import path from 'node:path';

/** One address point of the region (tiles/source/addresses.geojson). */
export interface AddressPoint {
  id: string;
  text: string;
  lat: number;
  lon: number;
}

let cache: AddressPoint[] | undefined;

/** The region's address points, read once; the same file the demo seed places barns on. */
export function addressPoints(): AddressPoint[] {
  if (!cache) {
    const file = path.resolve(process.env.ADDRESSES_FILE ?? 'tiles/source/addresses.geojson');
    const data = JSON.parse(readFileSync(file, 'utf8')) as {
      features: { geometry: { coordinates: [number, number] }; properties: { id: string; housenumber: string; street: string; village: string } }[];
    };
    cache = data.features.map((f) => ({
      id: f.properties.id,
      text: `${f.properties.housenumber} ${f.properties.street}, ${f.properties.village}`,
      lon: f.geometry.coordinates[0],
      lat: f.geometry.coordinates[1],
    }));
  }
  return cache;
}

const normalise = (s: string) => s.toLowerCase().replace(/[.,#]/g, ' ').replace(/\b(rd)\b/g, 'road').replace(/\b(ln)\b/g, 'lane').replace(/\b(dr)\b/g, 'drive').replace(/\s+/g, ' ').trim();

/**
 * Local address look-up (no outside geocoder): every word typed must start a word of the address,
 * so "12 hayrake" finds "12 Hayrake Farm Drive, Merrowdale". Best matches first: an exact house number,
 * then shorter addresses.
 */
export function searchAddresses(q: string, limit = 8): AddressPoint[] {
  const words = normalise(q).split(' ').filter(Boolean);
  if (words.length === 0) return [];
  const hits: { p: AddressPoint; score: number }[] = [];
  for (const p of addressPoints()) {
    const parts = normalise(p.text).split(' ');
    if (!words.every((w) => parts.some((part) => part.startsWith(w)))) continue;
    const score = (parts[0] === words[0] ? 0 : 10) + parts.length;
    hits.push({ p, score });
  }
  return hits.sort((a, b) => a.score - b.score || a.p.text.localeCompare(b.p.text)).slice(0, limit).map((h) => h.p);
}

/** The address point whose text matches exactly (case and punctuation aside), for the CSV import. */
export function findAddress(text: string): AddressPoint | null {
  const n = normalise(text);
  return addressPoints().find((p) => normalise(p.text) === n) ?? null;
}
