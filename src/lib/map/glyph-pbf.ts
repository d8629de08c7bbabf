/**
 * The MapLibre glyph protocol buffer (the `glyphs.proto` of the Mapbox/MapLibre font tooling):
 *   glyphs { repeated fontstack stacks = 1 }
 *   fontstack { string name = 1; string range = 2; repeated glyph glyphs = 3 }
 *   glyph { uint32 id = 1; bytes bitmap = 2; uint32 width = 3; uint32 height = 4; sint32 left = 5;
 *           sint32 top = 6; uint32 advance = 7 }
 * Written with pbf so the server can answer any range, including ranges our font has no glyphs for.
 */
import Pbf from 'pbf';

export interface GlyphRecord {
  id: number;
  bitmap: Uint8Array;
  width: number;
  height: number;
  left: number;
  top: number;
  advance: number;
}

/** Encodes one fontstack range; with no glyphs it is the valid empty answer MapLibre accepts. */
export function encodeGlyphRange(name: string, start: number, glyphs: readonly GlyphRecord[]): Uint8Array {
  const pbf = new Pbf();
  pbf.writeMessage(1, (_: unknown, p: Pbf) => {
    p.writeStringField(1, name);
    p.writeStringField(2, `${start}-${start + 255}`);
    for (const g of glyphs) {
      p.writeMessage(3, (__: unknown, q: Pbf) => {
        q.writeVarintField(1, g.id);
        if (g.bitmap.length > 0) q.writeBytesField(2, g.bitmap);
        q.writeVarintField(3, g.width);
        q.writeVarintField(4, g.height);
        q.writeSVarintField(5, g.left);
        q.writeSVarintField(6, g.top);
        q.writeVarintField(7, g.advance);
      }, null);
    }
  }, null);
  return pbf.finish();
}

/** Decodes a range back into records (tests and the glyph check use it). */
export function decodeGlyphRange(bytes: Uint8Array): { name: string; range: string; glyphs: GlyphRecord[] } {
  const pbf = new Pbf(bytes);
  const out = { name: '', range: '', glyphs: [] as GlyphRecord[] };
  pbf.readFields((tag, _r, p) => {
    if (tag !== 1 || !p) return;
    p.readMessage((t2, _r2, p2) => {
      if (!p2) return;
      if (t2 === 1) out.name = p2.readString();
      else if (t2 === 2) out.range = p2.readString();
      else if (t2 === 3) {
        const g: GlyphRecord = { id: 0, bitmap: new Uint8Array(0), width: 0, height: 0, left: 0, top: 0, advance: 0 };
        p2.readMessage((t3, _r3, p3) => {
          if (!p3) return;
          if (t3 === 1) g.id = p3.readVarint();
          else if (t3 === 2) g.bitmap = p3.readBytes();
          else if (t3 === 3) g.width = p3.readVarint();
          else if (t3 === 4) g.height = p3.readVarint();
          else if (t3 === 5) g.left = p3.readSVarint();
          else if (t3 === 6) g.top = p3.readSVarint();
          else if (t3 === 7) g.advance = p3.readVarint();
        }, g);
        out.glyphs.push(g);
      }
    }, out);
  }, out);
  return out;
}
