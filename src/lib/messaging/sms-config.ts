/**
 * Where texts go. Production reads TWILIO_ACCOUNT_SID, TWILIO_AUTH_TOKEN and TWILIO_FROM and talks to
 * the real service. Development and tests run the local fake (scripts/fakes.ts) and set only FAKES_URL:
 * then the account, token and sender default to the fake's and the SDK's requests are sent to it.
 */

/** The fake's account: any SID that starts with AC satisfies the SDK. */
export const FAKE_ACCOUNT_SID = 'AC00000000000000000000000000000000';
/** The fake signs its webhooks with this token, as the real service signs with the account's. */
export const FAKE_AUTH_TOKEN = 'roundsmith-local-fake-token';
/** A sender number in the 555-01xx block set aside for fiction. */
export const FAKE_FROM = '+18595550100';

export interface SmsConfig {
  accountSid: string;
  authToken: string;
  from: string;
  /** Base URL that replaces https://api.twilio.com (the fake), or null for the real service. */
  apiBase: string | null;
  /** Public base URL of this app for status callbacks and signature checks, or null. */
  appUrl: string | null;
}

/** The current configuration, or null when texts are not set up (they then stay queued). */
export function smsConfig(env: Record<string, string | undefined> = process.env): SmsConfig | null {
  const fakes = env.FAKES_URL || null;
  const accountSid = env.TWILIO_ACCOUNT_SID || (fakes ? FAKE_ACCOUNT_SID : '');
  const authToken = env.TWILIO_AUTH_TOKEN || (fakes ? FAKE_AUTH_TOKEN : '');
  const from = env.TWILIO_FROM || (fakes ? FAKE_FROM : '');
  if (!accountSid || !authToken || !from) return null;
  const apiBase = env.TWILIO_API_BASE || (fakes && !env.TWILIO_ACCOUNT_SID ? fakes : null);
  return { accountSid, authToken, from, apiBase: apiBase ? apiBase.replace(/\/$/, '') : null, appUrl: env.APP_URL ? env.APP_URL.replace(/\/$/, '') : null };
}
