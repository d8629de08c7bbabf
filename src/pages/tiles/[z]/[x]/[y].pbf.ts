import type { APIRoute } from 'astro';
import { getRegionTiles } from '~/lib/map/region';

export const prerender = false;

const INT = /^\d{1,7}$/;

/**
 * GET /tiles/{z}/{x}/{y}.pbf — public vector tiles of the region. Plain (uncompressed) protobuf bytes;
 * 204 for a tile with nothing in it, which MapLibre treats as empty.
 */
export const GET = (async ({ params }) => {
  const { z, x, y } = params;
  if (!z || !x || !y || !INT.test(z) || !INT.test(x) || !INT.test(y)) {
    return new Response(JSON.stringify({ error: { code: 'invalid_request', message: 'tile coordinates must be integers' } }), {
      status: 400,
      headers: { 'Content-Type': 'application/json' },
    });
  }
  const bytes = getRegionTiles().tile(Number(z), Number(x), Number(y));
  if (!bytes) return new Response(null, { status: 204, headers: { 'Cache-Control': 'public, max-age=3600' } });
  return new Response(bytes as Uint8Array<ArrayBuffer>, {
    headers: { 'Content-Type': 'application/vnd.mapbox-vector-tile', 'Cache-Control': 'public, max-age=3600', 'Content-Length': String(bytes.length) },
  });
}) satisfies APIRoute;
