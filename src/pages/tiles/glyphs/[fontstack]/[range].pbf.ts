import type { APIRoute } from 'astro';
import { glyphRange } from '~/lib/map/glyphs';

export const prerender = false;

/**
 * GET /tiles/glyphs/{fontstack}/{range}.pbf — SDF label glyphs rendered from Inter (see
 * docs/map-and-roads.md). A range the font has no glyphs for is a valid empty range, not an error.
 */
export const GET = (async ({ params }) => {
  const bytes = glyphRange(params.fontstack ?? '', params.range ?? '');
  if (!bytes) {
    return new Response(JSON.stringify({ error: { code: 'not_found', message: 'no such font stack or range' } }), {
      status: 404,
      headers: { 'Content-Type': 'application/json' },
    });
  }
  return new Response(bytes as Uint8Array<ArrayBuffer>, { headers: { 'Content-Type': 'application/x-protobuf', 'Cache-Control': 'public, max-age=86400' } });
}) satisfies APIRoute;
