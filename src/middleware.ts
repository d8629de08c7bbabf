import { defineMiddleware } from 'astro:middleware';
import { readSession, allows } from './lib/server/auth.ts';
import { getPractice } from './lib/db/practices.ts';
import { db } from './lib/server/db.ts';
import { screenFor } from './lib/navigation.ts';
import { ensureMessageTicker } from './lib/messaging/ticker.ts';

const PUBLIC_PAGES = ['/sign-in', '/invite/', '/tiles/', '/_astro/', '/favicon'];

// Astro's own origin check, kept for every route except the text provider's webhooks, which arrive as
// cross-site form posts and prove themselves with the provider's request signature instead.
const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];
const ORIGIN_EXEMPT = ['/api/sms/'];

function crossSiteForm(request: Request, url: URL): boolean {
  if (['GET', 'HEAD', 'OPTIONS'].includes(request.method)) return false;
  if (ORIGIN_EXEMPT.some((p) => url.pathname.startsWith(p))) return false;
  const type = (request.headers.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
  if (type && !FORM_TYPES.includes(type)) return false;
  return request.headers.get('origin') !== url.origin;
}

/**
 * Fills Astro.locals (user, session, practice) from the session cookie, and sends a signed-out
 * visitor of a page to /sign-in. API routes check their own rule and answer 401/403 as JSON.
 */
export const onRequest = defineMiddleware(async (ctx, next) => {
  if (crossSiteForm(ctx.request, ctx.url)) {
    return new Response(JSON.stringify({ error: { code: 'forbidden', message: 'Cross-site form submissions are refused' } }), {
      status: 403,
      headers: { 'content-type': 'application/json' },
    });
  }
  // Texts held back by quiet hours go out from a timer of this instance; started on first request.
  ensureMessageTicker();
  ctx.locals.user = null;
  ctx.locals.session = null;
  ctx.locals.practice = null;
  const path = ctx.url.pathname;
  if (path.startsWith('/_astro/') || path.startsWith('/tiles/')) return next();

  const found = await readSession(ctx.cookies);
  if (found) {
    const practice = await getPractice(db(), found.user.practiceId);
    if (practice) {
      ctx.locals.user = found.user;
      ctx.locals.session = found.session;
      ctx.locals.practice = practice;
    }
  }

  if (path.startsWith('/api/') || PUBLIC_PAGES.some((p) => path.startsWith(p))) return next();
  if (!ctx.locals.user) {
    const nextUrl = encodeURIComponent(path + ctx.url.search);
    return ctx.redirect(`/sign-in?next=${nextUrl}`, 302);
  }
  const screen = screenFor(path);
  if (screen && !allows(screen.rule, ctx.locals.user.role)) {
    return ctx.redirect(`/?denied=${encodeURIComponent(screen.label)}`, 302);
  }
  return next();
});
