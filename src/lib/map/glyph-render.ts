/**
 * Renders SDF glyph ranges for the map's labels from the Inter font that @fontsource/inter ships, with
 * @mapbox/tiny-sdf on a @napi-rs/canvas canvas. Run at generation time only (region:generate --glyphs);
 * the server just reads the committed files, so it needs no native canvas.
 *
 * Parameters match what MapLibre uses for its own local glyphs (24 px, buffer 3, radius 8, cutoff 0.25)
 * and its baseline adjustment (top − 27.5, left + 0.5), so labels line up the same way.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { createCanvas, GlobalFonts } from '@napi-rs/canvas';
import TinySDF from '@mapbox/tiny-sdf';
import { encodeGlyphRange, type GlyphRecord } from './glyph-pbf';
import { MAP_FONTS } from './fonts';

const require = createRequire(import.meta.url);

class CanvasTinySDF extends TinySDF {
  // tiny-sdf creates a DOM canvas by default; on the server it draws on @napi-rs/canvas instead.
  _createCanvas(size: number) {
    return createCanvas(size, size) as unknown as HTMLCanvasElement;
  }
}

function parseRanges(spec: string): number[] {
  const out: number[] = [];
  for (const part of spec.split(',')) {
    const m = /^U\+([0-9A-F]+)(?:-([0-9A-F]+))?$/i.exec(part.trim());
    if (!m) continue;
    const lo = parseInt(m[1]!, 16);
    const hi = m[2] ? parseInt(m[2], 16) : lo;
    for (let c = lo; c <= hi; c++) out.push(c);
  }
  return out;
}

/** Subsets drawn, in order of preference: a code point comes from the first subset that has it. */
const SUBSETS = ['latin', 'latin-ext'] as const;
/** Ranges worth shipping: Latin, Latin Extended-A/B and general punctuation (dashes, curly quotes). */
const RANGES = [0, 256, 8192];

/** Renders every shipped range of every map font: `{ '<stack>/<start>-<end>.pbf': bytes }`. */
export function renderGlyphFiles(): Map<string, Uint8Array> {
  const pkgDir = path.dirname(require.resolve('@fontsource/inter/package.json'));
  const unicode = JSON.parse(readFileSync(path.join(pkgDir, 'unicode.json'), 'utf8')) as Record<string, string>;
  const files = new Map<string, Uint8Array>();
  for (const font of MAP_FONTS) {
    const bySubset = SUBSETS.map((subset) => {
      const file = path.join(pkgDir, 'files', `inter-${subset}-${font.weight}-${font.style}.woff2`);
      const family = `RS Inter ${font.weight} ${font.style} ${subset}`;
      GlobalFonts.registerFromPath(file, family);
      const sdf = new CanvasTinySDF({ fontSize: 24, buffer: 3, radius: 8, cutoff: 0.25, fontFamily: `"${family}"`, fontWeight: String(font.weight), fontStyle: font.style });
      return { codes: new Set(parseRanges(unicode[subset]!)), sdf };
    });
    for (const start of RANGES) {
      const glyphs: GlyphRecord[] = [];
      for (let id = start; id < start + 256; id++) {
        const source = bySubset.find((s) => s.codes.has(id));
        if (!source || id < 32 || (id >= 0x7f && id < 0xa0)) continue;
        const g = source.sdf.draw(String.fromCodePoint(id));
        glyphs.push({
          id,
          bitmap: g.glyphWidth > 0 ? new Uint8Array(g.data) : new Uint8Array(0),
          width: g.glyphWidth,
          height: g.glyphHeight,
          left: Math.round(g.glyphLeft + 0.5),
          top: Math.round(g.glyphTop - 27.5),
          advance: Math.round(g.glyphAdvance),
        });
      }
      files.set(`${font.stack}/${start}-${start + 255}.pbf`, encodeGlyphRange(font.stack, start, glyphs));
    }
  }
  return files;
}
