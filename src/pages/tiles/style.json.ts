import type { APIRoute } from 'astro';
import { getRegionMeta } from '~/lib/map/region';
import { buildStyle } from '~/lib/map/style';

export const prerender = false;

/**
 * GET /tiles/style.json — public (the region is not secret). Tile and glyph URLs are absolute on the
 * request's own origin, which maplibre-gl 5 needs and which keeps every map request on this server.
 */
export const GET = (async ({ url }) => {
  const style = buildStyle({ origin: url.origin, region: getRegionMeta() });
  return new Response(JSON.stringify(style), {
    headers: { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'public, max-age=300' },
  });
}) satisfies APIRoute;
