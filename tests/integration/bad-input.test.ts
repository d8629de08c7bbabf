import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, sessionCookie } from './helpers/api.ts';
import { appDatabase } from './helpers/db.ts';

const db = appDatabase();
afterAll(() => db.destroy());

/** [method, path, role, bad body, field the 400 must name] */
const CASES: [string, string, string, unknown, string][] = [
  ['POST', '/api/auth/sign-in', 'none', { email: 'not-an-email', password: 'x' }, 'email'],
  ['POST', '/api/auth/sign-in', 'none', { email: 'lead@demo.test' }, 'password'],
  ['POST', '/api/invites', 'lead', { email: 'new@demo.test', role: 'dispatcher' }, 'name'],
  ['POST', '/api/invites', 'lead', { email: 'new@demo.test', name: 'N', role: 'owner' }, 'role'],
  ['POST', '/api/invites', 'lead', { email: 'new@demo.test', name: 'N', role: 'farrier' }, 'farrierId'],
  ['POST', '/api/invites/accept', 'none', { token: 'abcdefghijkl', password: 'short' }, 'password'],
  ['PATCH', '/api/settings', 'lead', { timeZone: 'Mars/Olympus_Mons' }, 'timeZone'],
  ['PATCH', '/api/settings', 'lead', { units: 'furlongs' }, 'units'],
  ['PATCH', '/api/settings', 'lead', { mileageRate: -1 }, 'mileageRate'],
  ['PATCH', '/api/settings', 'lead', { overtimeDailyMinutes: 480, overtimeDailyMultiplier: null }, 'overtimeDailyMultiplier'],
  ['PATCH', '/api/settings', 'lead', { overtimeDailyMinutes: 600, overtimeDailyMultiplier: 1.5, overtimeDailyDoubleMinutes: 480 }, 'overtimeDailyDoubleMinutes'],
  ['PATCH', '/api/settings', 'lead', { contactPhone: '555-0100' }, 'contactPhone'],
  ['PATCH', '/api/users/2', 'lead', { role: 'owner' }, 'role'],
  ['PATCH', '/api/settings', 'lead', {}, '_'],
];

describe('bad input gets a 400 that names the field, and writes nothing', () => {
  const cookies: Record<string, string> = {};
  beforeAll(async () => {
    cookies.lead = await sessionCookie('lead@demo.test');
  });

  it.each(CASES)('%s %s (%s) → 400 naming %s', async (method, path, role, body, field) => {
    const auditBefore = await db('audit_log').where({ entity: 'practice' }).count({ n: '*' });
    const practiceBefore = await db('practices').where({ id: 1 }).first();
    const r = await call(method, path, { cookie: cookies[role], body });
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe('invalid_request');
    expect(Object.keys(r.body.error.fields)).toContain(field);
    expect(await db('audit_log').where({ entity: 'practice' }).count({ n: '*' })).toEqual(auditBefore);
    expect(await db('practices').where({ id: 1 }).first()).toEqual(practiceBefore);
  });

  it.each([
    ['POST', '/api/invites'],
    ['PATCH', '/api/settings'],
    ['POST', '/api/auth/sign-in'],
  ])('%s %s: malformed JSON and a non-JSON body are 400, never 500', async (method, path) => {
    const broken = await call(method, path, { cookie: cookies.lead, rawBody: '{"email": ' });
    expect(broken.status).toBe(400);
    expect(broken.body.error.message).toMatch(/JSON/);
    const form = await call(method, path, { cookie: cookies.lead, rawBody: '<a>b</a>', contentType: 'application/xml' });
    expect(form.status).toBe(400);
  });

  it('a malformed id in the path is a 404, not a 500', async () => {
    const r = await call('PATCH', '/api/users/abc', { cookie: cookies.lead, body: { active: true } });
    expect(r.status).toBe(404);
  });

  it('a valid settings change is written with one audit row, and can be changed back', async () => {
    const before = await call('GET', '/api/settings', { cookie: cookies.lead });
    const auditBefore = Number((await db('audit_log').count({ n: '*' }))[0]!.n);
    const r = await call('PATCH', '/api/settings', { cookie: cookies.lead, body: { mileageRate: 0.725, overtimeDailyMinutes: 480, overtimeDailyMultiplier: 1.5 } });
    expect(r.status).toBe(200);
    expect(r.body.settings).toMatchObject({ mileageRate: 0.725, overtimeDailyMinutes: 480, overtimeDailyMultiplier: 1.5 });
    expect(Number((await db('audit_log').count({ n: '*' }))[0]!.n)).toBe(auditBefore + 1);
    const s = before.body.settings;
    await call('PATCH', '/api/settings', { cookie: cookies.lead, body: { mileageRate: s.mileageRate, overtimeDailyMinutes: s.overtimeDailyMinutes, overtimeDailyMultiplier: s.overtimeDailyMultiplier } });
  });
});
