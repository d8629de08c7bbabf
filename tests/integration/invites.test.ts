import { afterAll, describe, expect, it } from 'vitest';
import { call, sessionCookie } from './helpers/api.ts';
import { appDatabase } from './helpers/db.ts';

const db = appDatabase();
const FAKES_URL = process.env.FAKES_URL ?? '';
afterAll(() => db.destroy());

async function mailTo(address: string): Promise<{ subject: string; text: string } | undefined> {
  const { mails } = (await (await fetch(`${FAKES_URL}/mail`)).json()) as { mails: { to: string[]; subject: string; text: string }[] };
  return mails.find((m) => m.to.includes(address));
}

describe('the lead invites people by e-mail', () => {
  it('sends a one-time link through SMTP to the local fake; the link sets a password once; the lead then changes the account', async () => {
    const lead = await sessionCookie('lead@demo.test');
    const email = `new-dispatcher-${Date.now()}@demo.test`;
    const created = await call('POST', '/api/invites', { cookie: lead, body: { email, name: 'Posy Fernleigh', role: 'dispatcher' } });
    expect(created.status).toBe(201);
    expect(created.body.invite.mailSent).toBe(true);

    const mail = await mailTo(email);
    expect(mail?.subject).toBe('Your Roundsmith account');
    const token = /\/invite\/([A-Za-z0-9_-]+)/.exec(mail!.text)![1]!;
    // Only the token's hash is stored.
    expect(await db('invites').where({ token_hash: token }).first()).toBeUndefined();

    const page = await call('GET', `/invite/${token}`);
    expect(page.status).toBe(200);
    const accepted = await call('POST', '/api/invites/accept', { body: { token, password: 'a-long-enough-password' } });
    expect(accepted.status).toBe(201);
    const again = await call('POST', '/api/invites/accept', { body: { token, password: 'another-long-password' } });
    expect(again.status).toBe(404);

    const session = await sessionCookie(email, 'a-long-enough-password');
    const me = await call('GET', '/api/me', { cookie: session });
    expect(me.body.user).toMatchObject({ email, role: 'dispatcher' });
    expect(me.body.practice.id).toBe(1);
    const log = await db('messages').where({ channel: 'email', to_address: email }).first();
    expect(log.state).toBe('sent');

    // A spent link's page says so instead of offering the form again.
    expect((await call('GET', `/invite/${token}`)).status).toBe(404);
    // The lead changes the new account's role, then deactivates it, which ends its sessions at once.
    const promoted = await call('PATCH', `/api/users/${me.body.user.id}`, { cookie: lead, body: { role: 'lead' } });
    expect(promoted.status).toBe(200);
    expect(promoted.body.user).toMatchObject({ id: me.body.user.id, role: 'lead', active: true });
    const off = await call('PATCH', `/api/users/${me.body.user.id}`, { cookie: lead, body: { active: false } });
    expect(off.body.user).toMatchObject({ role: 'lead', active: false });
    expect((await call('GET', '/api/me', { cookie: session })).status).toBe(401);
  });

  it('refuses an address that already has an account with 409', async () => {
    const lead = await sessionCookie('lead@demo.test');
    const r = await call('POST', '/api/invites', { cookie: lead, body: { email: 'farrier1@demo.test', name: 'Dup', role: 'dispatcher' } });
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('conflict');
  });

  it('links a farrier account to its farrier', async () => {
    const lead = await sessionCookie('lead@demo.test');
    const farrier = await db('farriers').where({ practice_id: 1 }).first('id');
    const email = `farrier-${Date.now()}@demo.test`;
    const created = await call('POST', '/api/invites', { cookie: lead, body: { email, name: 'Linked', role: 'farrier', farrierId: farrier.id } });
    expect(created.status).toBe(201);
    const row = await db('invites').where({ email }).first();
    expect(row.farrier_id).toBe(farrier.id);
  });
});
