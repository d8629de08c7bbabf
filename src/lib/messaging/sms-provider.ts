/**
 * Sends one text through the twilio SDK. Against the local fake, an httpClient wrapper rewrites the
 * SDK's https://api.twilio.com addresses to the fake's; the rest of the SDK (form encoding, auth,
 * parsing) is the production code path.
 */
import twilio from 'twilio';
import { smsConfig, type SmsConfig } from './sms-config.ts';

type TwilioClient = ReturnType<typeof twilio>;
let cached: { key: string; client: TwilioClient } | null = null;

function clientFor(config: SmsConfig): TwilioClient {
  const key = `${config.accountSid}|${config.apiBase ?? ''}`;
  if (cached?.key === key) return cached.client;
  const base = new twilio.RequestClient();
  const apiBase = config.apiBase;
  const httpClient = apiBase
    ? ({
        request(opts: Parameters<typeof base.request>[0]) {
          return base.request({ ...opts, uri: opts.uri.replace(/^https:\/\/[a-z.-]*api\.twilio\.com/, apiBase) });
        },
      } as unknown as InstanceType<typeof twilio.RequestClient>)
    : base;
  const client = twilio(config.accountSid, config.authToken, { httpClient });
  cached = { key, client };
  return client;
}

export class SmsNotConfigured extends Error {
  constructor() {
    super('Texts are not set up: set TWILIO_ACCOUNT_SID, TWILIO_AUTH_TOKEN and TWILIO_FROM');
  }
}

/** Status callbacks come back here; null when the app's public address is unknown. */
export function statusCallbackUrl(config: SmsConfig): string | null {
  return config.appUrl ? `${config.appUrl}/api/sms/status` : null;
}

/** Sends a text and returns the provider's message id and first status. Throws on refusal. */
export async function sendSms(to: string, body: string): Promise<{ sid: string; status: string; from: string }> {
  const config = smsConfig();
  if (!config) throw new SmsNotConfigured();
  const callback = statusCallbackUrl(config);
  const message = await clientFor(config).messages.create({ to, from: config.from, body, ...(callback ? { statusCallback: callback } : {}) });
  return { sid: message.sid, status: message.status, from: config.from };
}
