import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, sessionCookie } from './helpers/api.ts';
import { appDatabase } from './helpers/db.ts';

const db = appDatabase();
afterAll(() => db.destroy());

describe('practices cannot see or change each other’s records', () => {
  let otherDispatcher: string;
  let otherLead: string;
  beforeAll(async () => {
    otherDispatcher = await sessionCookie('dispatcher@other.test');
    otherLead = await sessionCookie('lead@other.test');
  });

  it('shows the second practice its own practice, not the demo one', async () => {
    const me = await call('GET', '/api/me', { cookie: otherDispatcher });
    expect(me.body.practice.name).toMatch(/Pellwick/);
    const settings = await call('GET', '/api/settings', { cookie: otherLead });
    expect(settings.body.settings.name).toMatch(/Pellwick/);
  });

  it('lists only its own users and invitations', async () => {
    const users = await call('GET', '/api/users', { cookie: otherLead });
    expect(users.status).toBe(200);
    expect(users.body.users.length).toBeGreaterThan(0);
    for (const u of users.body.users) expect(u.email).toMatch(/@other\.test$/);
    const invites = await call('GET', '/api/invites', { cookie: otherLead });
    for (const i of invites.body.invites) expect(i.email).not.toMatch(/@demo\.test$/);
  });

  it('answers 404 when changing a user of the demo practice, and changes nothing', async () => {
    const target = await db('users').where({ email: 'farrier2@demo.test' }).first('id', 'role', 'active');
    const r = await call('PATCH', `/api/users/${target.id}`, { cookie: otherLead, body: { active: false } });
    expect(r.status).toBe(404);
    expect(r.body.error.code).toBe('not_found');
    const after = await db('users').where({ id: target.id }).first('role', 'active');
    expect(after).toEqual({ role: target.role, active: target.active });
  });

  it('cannot invite a person tied to another practice’s farrier', async () => {
    const farrier = await db('farriers').where({ practice_id: 1 }).first('id');
    const r = await call('POST', '/api/invites', { cookie: otherLead, body: { email: `x-${Date.now()}@other.test`, name: 'X', role: 'farrier', farrierId: farrier.id } });
    expect(r.status).toBe(400);
    expect(r.body.error.fields.farrierId).toBeDefined();
  });
});
