import { beforeAll, describe, expect, it } from 'vitest';
import { call, sessionCookie } from './helpers/api.ts';
import type { Rule } from '../../src/lib/server/auth.ts';

// Every API module, found the way Astro finds them, so a new route is covered without editing this test.
const modules = import.meta.glob<Record<string, unknown>>('../../src/pages/api/**/*.ts', { eager: true });
const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

interface RouteCase { path: string; method: (typeof METHODS)[number]; rule: Rule | undefined }

const cases: RouteCase[] = Object.entries(modules).flatMap(([file, mod]) => {
  const template = file
    .replace(/^.*\/src\/pages/, '')
    .replace(/\.ts$/, '')
    .replace(/\/index$/, '');
  return METHODS.filter((m) => typeof mod[m] === 'function').map((method) => ({
    // Ids no record has: an allowed role's request reaches the handler but can change nothing real.
    path: template.replace(/\[[^\]]+\]/g, '999999999'),
    method,
    rule: (mod[method] as { rule?: Rule }).rule,
  }));
});

const ALLOWED: Record<Exclude<Rule, 'public'>, string[]> = {
  'signed-in': ['farrier', 'dispatcher', 'lead'],
  dispatcher: ['dispatcher', 'lead'],
  lead: ['lead'],
};

describe('the access rule of every API route', () => {
  const cookies: Record<string, string> = {};
  beforeAll(async () => {
    cookies.farrier = await sessionCookie('farrier1@demo.test');
    cookies.dispatcher = await sessionCookie('dispatcher@demo.test');
    cookies.lead = await sessionCookie('lead@demo.test');
  });

  it('finds the routes and each declares exactly one rule', () => {
    expect(cases.length).toBeGreaterThanOrEqual(8);
    for (const c of cases) expect(c.rule, `${c.method} ${c.path}`).toMatch(/^(public|signed-in|dispatcher|lead)$/);
  });

  it.each(cases.filter((c) => c.rule !== 'public').map((c) => [`${c.method} ${c.path}`, c] as const))(
    '%s: 401 without a session, 403 for roles below its rule, through for the rest',
    async (_name, c) => {
      const body = c.method === 'GET' ? undefined : {};
      const anonymous = await call(c.method, c.path, { body });
      expect(anonymous.status).toBe(401);
      expect(anonymous.body.error.code).toBe('unauthenticated');
      for (const role of ['farrier', 'dispatcher', 'lead']) {
        // Signing out would end the shared session: use a session of its own for that route.
        const cookie = c.path === '/api/auth/sign-out' ? await sessionCookie(`${role === 'farrier' ? 'farrier1' : role}@demo.test`) : cookies[role]!;
        const answer = await call(c.method, c.path, { cookie, body });
        if (ALLOWED[c.rule as Exclude<Rule, 'public'>].includes(role)) {
          expect([401, 403, 500], `${role} ${c.method} ${c.path} → ${answer.status}`).not.toContain(answer.status);
        } else {
          expect(answer.status, `${role} ${c.method} ${c.path}`).toBe(403);
          expect(answer.body.error.code).toBe('forbidden');
        }
      }
    },
  );
});
