// The base map style and the label glyphs: valid, self-hosted, and with the layers the look needs.
import { describe, expect, it } from 'vitest';
import type { APIContext } from 'astro';
import { validateStyleMin } from '@maplibre/maplibre-gl-style-spec';
import { GET as getStyle } from '../../../src/pages/tiles/style.json';
import { GET as getGlyphs } from '../../../src/pages/tiles/glyphs/[fontstack]/[range].pbf';
import { decodeGlyphRange } from '../../../src/lib/map/glyph-pbf';
import { MAP_FONTS } from '../../../src/lib/map/fonts';

const ORIGIN = 'http://127.0.0.1:4567';

async function style(): Promise<Record<string, unknown> & { layers: { id: string; layout?: Record<string, unknown> }[] }> {
  const res = await getStyle({ url: new URL(`${ORIGIN}/tiles/style.json`) } as unknown as APIContext);
  expect(res.status).toBe(200);
  return res.json();
}

function strings(value: unknown, out: string[] = []): string[] {
  if (typeof value === 'string') out.push(value);
  else if (Array.isArray(value)) for (const v of value) strings(v, out);
  else if (value && typeof value === 'object') for (const v of Object.values(value)) strings(v, out);
  return out;
}

describe('GET /tiles/style.json', () => {
  it('passes the MapLibre style-spec validator with no errors', async () => {
    // Reference: @maplibre/maplibre-gl-style-spec validateStyleMin (the validator MapLibre itself ships).
    expect(validateStyleMin((await style()) as never)).toEqual([]);
  });

  it("puts every URL on the request's own origin, with absolute tile URLs", async () => {
    const s = await style();
    const urls = strings(s).filter((v) => /^[a-z]+:\/\//i.test(v) || v.startsWith('//'));
    expect(urls.length).toBeGreaterThanOrEqual(2);
    for (const u of urls) expect(u.startsWith(`${ORIGIN}/`)).toBe(true);
    expect((s.sources as { region: { tiles: string[] } }).region.tiles).toEqual([`${ORIGIN}/tiles/{z}/{x}/{y}.pbf`]);
    expect(s.glyphs).toBe(`${ORIGIN}/tiles/glyphs/{fontstack}/{range}.pbf`);
  });

  it('has land, water, woods, cased roads, road-name labels along lines and village labels, in fonts we ship', async () => {
    const s = await style();
    const ids = s.layers.map((l) => l.id);
    for (const id of ['land', 'water', 'woods', 'road-major-casing', 'road-major', 'road-minor-casing', 'road-label', 'road-label-minor', 'village-label']) expect(ids).toContain(id);
    for (const id of ['road-label', 'road-label-minor']) expect(s.layers.find((l) => l.id === id)!.layout!['symbol-placement']).toBe('line');
    const shipped = new Set<string>(MAP_FONTS.map((f) => f.stack));
    for (const l of s.layers) {
      const fonts = l.layout?.['text-font'] as string[] | undefined;
      if (fonts) for (const f of fonts) expect(shipped.has(f)).toBe(true);
    }
    expect(String(s.name)).toContain('fictional');
  });
});

describe('GET /tiles/glyphs/{fontstack}/{range}.pbf', () => {
  const glyphs = (fontstack: string, range: string) => getGlyphs({ params: { fontstack, range } } as unknown as APIContext);

  it('serves SDF glyphs for Latin letters in the MapLibre glyph format (24 px with a 3 px buffer)', async () => {
    const res = await glyphs('Inter Regular', '0-255');
    expect(res.status).toBe(200);
    const range = decodeGlyphRange(new Uint8Array(await res.arrayBuffer()));
    expect(range.name).toBe('Inter Regular');
    expect(range.range).toBe('0-255');
    const A = range.glyphs.find((g) => g.id === 65)!;
    // The bitmap holds (width + 2·3) × (height + 2·3) SDF bytes; a capital A at 24 px is about 15 × 17 px.
    expect(A.bitmap.length).toBe((A.width + 6) * (A.height + 6));
    expect(A.width).toBeGreaterThan(10);
    expect(A.advance).toBeGreaterThan(10);
    const space = range.glyphs.find((g) => g.id === 32)!;
    expect(space.width).toBe(0);
    expect(space.advance).toBeGreaterThan(3);
  });

  it('answers an uncovered range with a valid empty range, and an unknown font with 404', async () => {
    const cjk = await glyphs('Inter Regular', '19968-20223');
    expect(cjk.status).toBe(200);
    expect(decodeGlyphRange(new Uint8Array(await cjk.arrayBuffer()))).toMatchObject({ name: 'Inter Regular', range: '19968-20223', glyphs: [] });
    expect((await glyphs('Comic Sans MS', '0-255')).status).toBe(404);
    expect((await glyphs('Inter Regular', '1-256')).status).toBe(404);
    // A stack list is served from its first font we ship.
    expect((await glyphs('Other Font,Inter SemiBold', '0-255')).status).toBe(200);
  });
});
