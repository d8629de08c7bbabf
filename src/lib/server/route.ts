import type { APIContext, APIRoute } from 'astro';
import { handle } from './http.ts';
import { requireRole, type Rule, type SessionUser } from './auth.ts';

/** An endpoint with its access rule attached, so one table-driven test can check every route. */
export type RuledRoute = APIRoute & { rule: Rule };

/**
 * Declares an endpoint and its one access rule: 401 without a session, 403 for the wrong role, and
 * every error as JSON. The handler gets the signed-in user (null only for 'public').
 */
export function route<R extends Rule>(
  rule: R,
  fn: (ctx: APIContext, user: R extends 'public' ? SessionUser | null : SessionUser) => Promise<Response> | Response,
): RuledRoute {
  const wrapped = handle(async (ctx) => {
    const user = rule === 'public' ? (ctx.locals.user ?? null) : requireRole(ctx, rule);
    return fn(ctx, user as R extends 'public' ? SessionUser | null : SessionUser);
  }) as RuledRoute;
  wrapped.rule = rule;
  return wrapped;
}
