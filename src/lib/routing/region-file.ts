/**
 * The region on disk: tiles/source/*.geojson and tiles/region.json, written by the region generator or
 * the roads import. The server reads them through here; a change of the files' modification time (an
 * import while the server runs) rebuilds what was cached from them.
 */
import { readFileSync, statSync } from 'node:fs';
import path from 'node:path';

/** Folder holding region.json and source/. REGION_DIR overrides (tests, a practice's own data). */
export function regionDir(): string {
  return path.resolve(process.env.REGION_DIR ?? path.join(process.cwd(), 'tiles'));
}

export function sourcePath(name: string): string {
  return path.join(regionDir(), 'source', name);
}

/** Modification stamp of a source file, 0 when it does not exist. */
export function fileStamp(file: string): number {
  try {
    return statSync(file).mtimeMs;
  } catch {
    return 0;
  }
}

/** Reads a GeoJSON FeatureCollection; a missing file is an empty collection (an import may drop layers). */
export function readCollection(file: string): { type: 'FeatureCollection'; features: GeoJSON.Feature[] } {
  try {
    const parsed = JSON.parse(readFileSync(file, 'utf8')) as { features?: GeoJSON.Feature[] };
    return { type: 'FeatureCollection', features: Array.isArray(parsed.features) ? parsed.features : [] };
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { type: 'FeatureCollection', features: [] };
    throw err;
  }
}
