/**
 * Checks that a webhook call comes from the messaging service: the X-Twilio-Signature header must be
 * the HMAC the twilio library computes from the auth token, the URL the service called and the posted
 * form. The URL is rebuilt from APP_URL (the address the service was given), because behind a proxy
 * the request's own URL differs from it.
 */
import twilio from 'twilio';
import { HttpError } from '../server/http.ts';
import { smsConfig } from './sms-config.ts';

/** Reads a form-encoded webhook body and verifies its signature; throws 403 when it does not match. */
export async function readSignedForm(request: Request, url: URL): Promise<Record<string, string>> {
  const config = smsConfig();
  if (!config) throw new HttpError(403, 'forbidden', 'Texts are not set up on this server');
  const type = request.headers.get('content-type') ?? '';
  if (!type.includes('application/x-www-form-urlencoded')) throw new HttpError(400, 'invalid_request', 'Send the webhook form-encoded');
  const params = Object.fromEntries(new URLSearchParams(await request.text()));
  const signature = request.headers.get('x-twilio-signature') ?? '';
  const called = `${config.appUrl ?? url.origin}${url.pathname}${url.search}`;
  if (!signature || !twilio.validateRequest(config.authToken, signature, called, params)) {
    throw new HttpError(403, 'forbidden', 'The webhook signature does not match');
  }
  return params;
}

/** An empty TwiML answer: replies are sent through the API, not in the webhook's answer. */
export function emptyTwiml(): Response {
  return new Response('<?xml version="1.0" encoding="UTF-8"?><Response></Response>', { status: 200, headers: { 'content-type': 'text/xml; charset=utf-8' } });
}
