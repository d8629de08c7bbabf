/**
 * Serving label glyphs: the committed SDF ranges under tiles/glyphs/<stack>/<start>-<end>.pbf, or an
 * empty range for code points our font does not cover. Files are read once and kept in memory.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { regionDir } from '../routing/region-file';
import { encodeGlyphRange } from './glyph-pbf';
import { MAP_FONTS } from './fonts';

const cache = new Map<string, Uint8Array>();
const STACKS: ReadonlySet<string> = new Set(MAP_FONTS.map((f) => f.stack));

/**
 * Bytes for one glyph request, or null when the request names no font we ship or a malformed range.
 * A comma-separated stack ("Inter Regular,Other") is answered from its first font we have.
 */
export function glyphRange(fontstack: string, range: string): Uint8Array | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(fontstack);
  } catch {
    return null;
  }
  const stack = decoded.split(',').map((s) => s.trim()).find((s) => STACKS.has(s));
  const m = /^(\d{1,6})-(\d{1,6})$/.exec(range);
  if (!stack || !m) return null;
  const start = Number(m[1]);
  if (start % 256 !== 0 || Number(m[2]) !== start + 255 || start > 0xffff) return null;
  const key = `${stack}/${start}`;
  let bytes = cache.get(key);
  if (!bytes) {
    try {
      bytes = new Uint8Array(readFileSync(path.join(regionDir(), 'glyphs', stack, `${start}-${start + 255}.pbf`)));
    } catch {
      bytes = encodeGlyphRange(stack, start, []);
    }
    cache.set(key, bytes);
  }
  return bytes;
}
