import { Lucia, TimeSpan, type Session } from 'lucia';
import { Mysql2Adapter } from '@lucia-auth/adapter-mysql';
import { hash, verify } from '@node-rs/argon2';
import { createPool, type Pool } from 'mysql2/promise';
import { createHash, randomBytes } from 'node:crypto';
import type { APIContext, AstroCookies } from 'astro';
import { HttpError } from './http.ts';

/** The three roles; a lead may do everything a dispatcher may. */
export type Role = 'lead' | 'dispatcher' | 'farrier';

/** Who may call a route: anyone, any signed-in user, dispatcher-or-lead, or the lead alone. */
export type Rule = 'public' | 'signed-in' | 'dispatcher' | 'lead';

/** The signed-in user as the rest of the app sees it. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  practiceId: number;
  farrierId: number | null;
}

interface DatabaseUserAttributes {
  email: string;
  name: string;
  role: Role;
  practice_id: number;
  farrier_id: number | null;
  active: number;
}

declare module 'lucia' {
  interface Register {
    Lucia: typeof lucia;
    UserId: number;
    DatabaseUserAttributes: DatabaseUserAttributes;
  }
}

let pool: Pool | undefined;
function sessionPool(): Pool {
  if (!pool) {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error('DATABASE_URL is not set');
    pool = createPool({ uri: url, timezone: 'Z', connectionLimit: 10 });
  }
  return pool;
}

// The adapter is given a lazy proxy so that importing this module does not open a connection.
const lazyConnection = {
  query: (sql: string, args: unknown[]) => sessionPool().query(sql, args),
  execute: (sql: string, args: unknown[]) => sessionPool().execute(sql, args as never),
};

export const lucia = new Lucia(new Mysql2Adapter(lazyConnection as unknown as Pool, { user: 'users', session: 'user_sessions' }), {
  sessionExpiresIn: new TimeSpan(14, 'd'),
  sessionCookie: {
    name: 'rs_session',
    attributes: { secure: process.env.NODE_ENV === 'production' && !process.env.APP_URL?.startsWith('http:'), sameSite: 'lax' },
  },
  getUserAttributes: (a) => ({
    email: a.email,
    name: a.name,
    role: a.role,
    practiceId: a.practice_id,
    farrierId: a.farrier_id,
    active: Boolean(a.active),
  }),
});

/** SHA-256 in hex: how a session token or an invite token is stored. */
export function sha256Hex(value: string): string {
  return createHash('sha256').update(value).digest('hex');
}

/** A new random token for a cookie or a link (160 bits, base32-like alphabet). */
export function newToken(): string {
  return randomBytes(20).toString('base64url');
}

// Memory-hard argon2id with the OWASP-recommended minimum (19 MiB, 2 passes).
const HASH_OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, HASH_OPTIONS);
}

// A hash of a random string, verified when the account does not exist so that timing says nothing.
let dummyHash: Promise<string> | undefined;
export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  if (!passwordHash) {
    dummyHash ??= hashPassword(newToken());
    await verify(await dummyHash, password).catch(() => false);
    return false;
  }
  return verify(passwordHash, password).catch(() => false);
}

/**
 * Starts a session and sets its cookie. The cookie carries a random token; the database keeps only
 * the token's SHA-256 as the session id, so a leaked sessions table signs nobody in.
 */
export async function startSession(cookies: AstroCookies, userId: number): Promise<void> {
  const token = newToken();
  await lucia.createSession(userId, {}, { sessionId: sha256Hex(token) });
  const cookie = lucia.createSessionCookie(token);
  cookies.set(cookie.name, cookie.value, cookie.attributes);
}

/** Validates the cookie's token; refreshes the cookie when lucia extended the session. */
export async function readSession(cookies: AstroCookies): Promise<{ session: Session; user: SessionUser } | null> {
  const token = cookies.get(lucia.sessionCookieName)?.value;
  if (!token) return null;
  const { session, user } = await lucia.validateSession(sha256Hex(token));
  if (!session || !user || !user.active) {
    const blank = lucia.createBlankSessionCookie();
    cookies.set(blank.name, blank.value, blank.attributes);
    return null;
  }
  if (session.fresh) {
    const cookie = lucia.createSessionCookie(token);
    cookies.set(cookie.name, cookie.value, cookie.attributes);
  }
  return {
    session,
    user: {
      id: user.id,
      email: user.email,
      name: user.name,
      role: user.role,
      practiceId: user.practiceId,
      farrierId: user.farrierId,
    },
  };
}

/** Ends the session server-side and clears the cookie. */
export async function endSession(cookies: AstroCookies, session: Session | null): Promise<void> {
  if (session) await lucia.invalidateSession(session.id);
  const blank = lucia.createBlankSessionCookie();
  cookies.set(blank.name, blank.value, blank.attributes);
}

/** Whether a role satisfies a rule. */
export function allows(rule: Rule, role: Role | undefined): boolean {
  if (rule === 'public') return true;
  if (!role) return false;
  if (rule === 'signed-in') return true;
  if (rule === 'dispatcher') return role === 'dispatcher' || role === 'lead';
  return role === 'lead';
}

/** The signed-in user, or a 401. */
export function requireUser(ctx: Pick<APIContext, 'locals'>): SessionUser {
  const user = ctx.locals.user;
  if (!user) throw new HttpError(401, 'unauthenticated', 'Sign in first');
  return user;
}

/** The signed-in user if their role satisfies the rule: 401 without a session, 403 otherwise. */
export function requireRole(ctx: Pick<APIContext, 'locals'>, rule: Exclude<Rule, 'public'>): SessionUser {
  const user = requireUser(ctx);
  if (!allows(rule, user.role)) throw new HttpError(403, 'forbidden', 'Your role may not do this');
  return user;
}
