import { addDays } from 'date-fns';
import { db } from './db.ts';
import { badRequest, conflict, HttpError } from './http.ts';
import { hashPassword, newToken, sha256Hex, type SessionUser } from './auth.ts';
import { existsInPractice } from '../db/records-lock.ts';
import { insertInvite, markInviteAccepted, openInviteForUpdate } from '../db/invites.ts';
import { findUserByEmail, insertUser } from '../db/users.ts';
import { audit } from '../db/audit.ts';
import { sendMail } from '../messaging/mail.ts';
import type { InviteInput } from '../../schemas/auth.ts';

export const INVITE_DAYS = 7;

/**
 * Creates an invitation and e-mails its one-time link. The token goes only into the e-mail; the
 * database keeps its SHA-256. An address that already has an account is refused with 409.
 */
export async function invite(lead: SessionUser, input: InviteInput, appUrl: string) {
  const knex = db();
  if (await findUserByEmail(knex, input.email)) throw conflict('That e-mail address already has an account');
  const farrierId = input.farrierId ?? null;
  if (farrierId !== null && !(await existsInPractice(knex, 'farriers', lead.practiceId, farrierId))) {
    throw badRequest('Unknown farrier', { farrierId: 'No such farrier in this practice' });
  }
  if (input.role === 'farrier' && farrierId === null) {
    throw badRequest('A farrier account needs its farrier', { farrierId: 'Choose the farrier this account belongs to' });
  }
  const token = newToken();
  const expiresAt = addDays(new Date(), INVITE_DAYS);
  const id = await knex.transaction(async (trx) => {
    const inviteId = await insertInvite(trx, {
      practiceId: lead.practiceId,
      email: input.email,
      name: input.name,
      role: input.role,
      farrierId,
      tokenHash: sha256Hex(token),
      expiresAt,
      createdBy: lead.id,
    });
    await audit(trx, { practiceId: lead.practiceId, userId: lead.id, action: 'invite.create', entity: 'invite', entityId: inviteId, detail: { email: input.email, role: input.role } });
    return inviteId;
  });
  const link = new URL(`/invite/${token}`, appUrl).toString();
  const mail = await sendMail(knex, {
    practiceId: lead.practiceId,
    to: input.email,
    subject: 'Your Roundsmith account',
    text: `Hello ${input.name},\n\n${lead.name} has invited you to Roundsmith as ${input.role}.\nSet your password here (the link works once, for ${INVITE_DAYS} days):\n\n${link}\n`,
  });
  return { id, email: input.email, role: input.role, expiresAt: expiresAt.toISOString(), mailSent: mail.sent };
}

/** Accepts an invite once: creates the account with the chosen password, in one transaction. */
export async function acceptInvite(token: string, password: string, name?: string) {
  const passwordHash = await hashPassword(password);
  return db().transaction(async (trx) => {
    const open = await openInviteForUpdate(trx, sha256Hex(token));
    if (!open) throw new HttpError(404, 'not_found', 'This invitation link is not valid any more');
    const userId = await insertUser(trx, {
      practiceId: open.practiceId,
      email: open.email,
      name: name ?? open.name,
      passwordHash,
      role: open.role,
      farrierId: open.farrierId,
    });
    await markInviteAccepted(trx, open.id);
    await audit(trx, { practiceId: open.practiceId, userId, action: 'invite.accept', entity: 'user', entityId: userId });
    return { userId, email: open.email };
  });
}
