import { defineMiddleware } from 'astro:middleware';
import { readSession, allows } from './lib/server/auth.ts';
import { getPractice } from './lib/db/practices.ts';
import { db } from './lib/server/db.ts';
import { screenFor } from './lib/navigation.ts';

const PUBLIC_PAGES = ['/sign-in', '/invite/', '/tiles/', '/_astro/', '/favicon'];

/**
 * Fills Astro.locals (user, session, practice) from the session cookie, and sends a signed-out
 * visitor of a page to /sign-in. API routes check their own rule and answer 401/403 as JSON.
 */
export const onRequest = defineMiddleware(async (ctx, next) => {
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
