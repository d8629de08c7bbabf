import nodemailer, { type Transporter } from 'nodemailer';
import type { Knex } from 'knex';
import { insertMail } from '../db/messages.ts';

let transport: Transporter | undefined;

/**
 * The SMTP transport from SMTP_URL. Development and tests point it at the local fake that the start
 * and test scripts run; production points it at the practice's mail service. Nothing else differs.
 */
function mailTransport(): Transporter {
  if (!transport) {
    const url = process.env.SMTP_URL;
    if (!url) throw new Error('SMTP_URL is not set');
    transport = nodemailer.createTransport(url);
  }
  return transport;
}

export const MAIL_FROM = process.env.MAIL_FROM ?? 'Roundsmith <no-reply@roundsmith.invalid>';

/**
 * Sends one e-mail and records it in the messages log (state sent or failed). Returns the log row id.
 * A send failure is recorded, not thrown, so the change that caused the mail is not lost with it.
 */
export async function sendMail(
  db: Knex,
  mail: { practiceId: number; to: string; subject: string; text: string; planId?: number | null },
): Promise<{ id: number; sent: boolean }> {
  let sent = true;
  let error: string | null = null;
  let providerId: string | null = null;
  try {
    const info = await mailTransport().sendMail({ from: MAIL_FROM, to: mail.to, subject: mail.subject, text: mail.text });
    providerId = String(info.messageId ?? '').slice(0, 64) || null;
  } catch (e) {
    sent = false;
    error = e instanceof Error ? e.message.slice(0, 250) : 'send failed';
  }
  const id = await insertMail(db, {
    practiceId: mail.practiceId,
    to: mail.to,
    from: MAIL_FROM,
    subject: mail.subject,
    body: mail.text,
    state: sent ? 'sent' : 'failed',
    planId: mail.planId ?? null,
    providerId,
    error,
  });
  return { id, sent };
}
