import { afterAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { APP_URL, call, sessionCookie } from './helpers/api.ts';
import { appDatabase } from './helpers/db.ts';

const db = appDatabase();
afterAll(() => db.destroy());

describe('sign-in, sessions and sign-out', () => {
  it('signs in with the right password and answers /api/me with the user and practice', async () => {
    const cookie = await sessionCookie('dispatcher@demo.test');
    const me = await call('GET', '/api/me', { cookie });
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ email: 'dispatcher@demo.test', role: 'dispatcher' });
    expect(me.body.practice).toMatchObject({ timeZone: 'America/New_York', units: 'miles' });
    expect(me.body.user.passwordHash).toBeUndefined();
  });

  it('accepts the e-mail address in any letter case', async () => {
    const cookie = await sessionCookie('Lead@Demo.TEST');
    expect((await call('GET', '/api/me', { cookie })).body.user.email).toBe('lead@demo.test');
  });

  it('answers a wrong password and an unknown account with the same 401, revealing nothing', async () => {
    const wrong = await call('POST', '/api/auth/sign-in', { body: { email: 'lead@demo.test', password: 'not-the-password' } });
    const unknown = await call('POST', '/api/auth/sign-in', { body: { email: 'nobody-here@demo.test', password: 'not-the-password' } });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.headers.get('set-cookie')).toBeNull();
  });

  it('stores only the SHA-256 of the session token, never the token itself', async () => {
    const cookie = await sessionCookie('farrier2@demo.test');
    const token = cookie.split('=')[1]!;
    expect(await db('user_sessions').where({ id: token }).first()).toBeUndefined();
    const hashed = createHash('sha256').update(token).digest('hex');
    expect(await db('user_sessions').where({ id: hashed }).first()).toBeDefined();
  });

  it('sets the cookie httpOnly and SameSite=Lax', async () => {
    const response = await call('POST', '/api/auth/sign-in', { body: { email: 'farrier3@demo.test', password: 'roundsmith-demo' } });
    const setCookie = response.headers.get('set-cookie') ?? '';
    expect(setCookie).toMatch(/HttpOnly/i);
    expect(setCookie).toMatch(/SameSite=Lax/i);
  });

  it('ends the session server-side on sign-out: the old cookie no longer works', async () => {
    const cookie = await sessionCookie('farrier4@demo.test');
    expect((await call('GET', '/api/me', { cookie })).status).toBe(200);
    expect((await call('POST', '/api/auth/sign-out', { cookie })).status).toBe(204);
    expect((await call('GET', '/api/me', { cookie })).status).toBe(401);
    const token = cookie.split('=')[1]!;
    const hashed = createHash('sha256').update(token).digest('hex');
    expect(await db('user_sessions').where({ id: hashed }).first()).toBeUndefined();
  });

  it('limits failed sign-ins to 10 per e-mail and address in 15 minutes, kept in the database', async () => {
    const email = `limit-${Date.now()}@demo.test`;
    for (let i = 0; i < 10; i += 1) {
      const r = await call('POST', '/api/auth/sign-in', { body: { email, password: `wrong-${i}` } });
      expect(r.status).toBe(401);
    }
    const blocked = await call('POST', '/api/auth/sign-in', { body: { email, password: 'wrong-again' } });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
    const rows = await db('sign_in_attempts').where({ email, succeeded: false }).count({ n: '*' });
    expect(Number(rows[0]!.n)).toBe(10);
    // Another account from the same address is not blocked by this one's failures.
    expect((await call('POST', '/api/auth/sign-in', { body: { email: 'farrier5@demo.test', password: 'roundsmith-demo' } })).status).toBe(200);
  });

  it('lets an expired session sign nobody in', async () => {
    const cookie = await sessionCookie('farrier6@demo.test');
    const hashed = createHash('sha256').update(cookie.split('=')[1]!).digest('hex');
    await db('user_sessions').where({ id: hashed }).update({ expires_at: new Date(Date.now() - 60_000) });
    expect((await call('GET', '/api/me', { cookie })).status).toBe(401);
  });

  it('refuses a cross-site form post (origin check), but accepts the same form from our own origin', async () => {
    const form = 'email=lead%40demo.test&password=roundsmith-demo';
    const headers = { 'content-type': 'application/x-www-form-urlencoded' };
    const cross = await fetch(`${APP_URL}/sign-in`, { method: 'POST', body: form, redirect: 'manual', headers: { ...headers, origin: 'http://elsewhere.invalid' } });
    expect(cross.status).toBe(403);
    expect(cross.headers.get('set-cookie')).toBeNull();
    const same = await fetch(`${APP_URL}/sign-in`, { method: 'POST', body: form, redirect: 'manual', headers: { ...headers, origin: APP_URL } });
    expect(same.status).toBe(303);
    expect(same.headers.get('set-cookie')).toMatch(/rs_session=/);
  });

  it('sends a signed-out visitor of a page to /sign-in and keeps where they were going', async () => {
    const r = await call('GET', '/settings');
    expect(r.status).toBe(302);
    expect(r.headers.get('location')).toBe('/sign-in?next=%2Fsettings');
  });

  it('sends a user to the home page with a notice when a page is not for their role', async () => {
    const cookie = await sessionCookie('farrier1@demo.test');
    const r = await call('GET', '/settings', { cookie });
    expect(r.status).toBe(302);
    expect(r.headers.get('location')).toMatch(/^\/\?denied=/);
  });
});
