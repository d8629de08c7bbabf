import type { AstroCookies } from 'astro';
import { db } from './db.ts';
import { HttpError } from './http.ts';
import { startSession, verifyPassword } from './auth.ts';
import { countRecentFailures, findUserByEmail, recordAttempt } from '../db/users.ts';
import type { SignInInput } from '../../schemas/auth.ts';

/** At most this many failed sign-ins per e-mail and address within the window. */
export const SIGN_IN_LIMIT = { failures: 10, windowMinutes: 15 } as const;

const WRONG = 'The e-mail address or password is not right';

/**
 * Checks e-mail and password and starts a session. The answer never says whether the account
 * exists: an unknown e-mail, a wrong password and a deactivated account all get the same 401.
 */
export async function signIn(cookies: AstroCookies, input: SignInInput, address: string) {
  const knex = db();
  const failures = await countRecentFailures(knex, input.email, address, SIGN_IN_LIMIT.windowMinutes);
  if (failures >= SIGN_IN_LIMIT.failures) {
    throw new HttpError(429, 'too_many_attempts', `Too many failed sign-ins: try again in ${SIGN_IN_LIMIT.windowMinutes} minutes`);
  }
  const user = await findUserByEmail(knex, input.email);
  const ok = await verifyPassword(user?.active ? user.passwordHash : null, input.password);
  await recordAttempt(knex, input.email, address, ok);
  if (!ok || !user) throw new HttpError(401, 'unauthenticated', WRONG);
  await startSession(cookies, user.id);
  return user;
}
