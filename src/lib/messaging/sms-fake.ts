/**
 * A local fake of the messaging service, enough for the twilio SDK: it answers
 * POST /2010-04-01/Accounts/{sid}/Messages.json like the real API (form-encoded in, JSON out, Basic
 * auth), keeps every message, posts signed delivery reports (sent, then delivered) to the message's
 * StatusCallback, and can play an owner's reply into the app's webhook. Signatures are made with the
 * twilio library's own function and the account's auth token, so the app's check is the production one.
 *
 * Test API: GET /sms → {messages}; DELETE /sms; POST /sms/inbound {from, body, url, to?} → the app's
 * answer. Numbers ending in 0000 are reported undelivered, for tests of failure handling.
 */
import type { IncomingMessage, ServerResponse } from 'node:http';
import { randomBytes } from 'node:crypto';
import twilio from 'twilio';
import { FAKE_ACCOUNT_SID, FAKE_AUTH_TOKEN, FAKE_FROM } from './sms-config.ts';
import { countSegments } from './segments.ts';

export interface FakeSms {
  sid: string;
  direction: 'outbound-api' | 'inbound';
  from: string;
  to: string;
  body: string;
  status: string;
  numSegments: number;
  encoding: 'gsm7' | 'ucs2';
  statusCallback: string | null;
  dateCreated: string;
  /** Delivery reports posted to the app, with the app's answer status. */
  callbacks: { status: string; answer: number | string }[];
}

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    let data = '';
    req.setEncoding('utf8');
    req.on('data', (chunk: string) => {
      data += chunk;
      if (data.length > 1_000_000) reject(new Error('body too large'));
    });
    req.on('end', () => resolve(data));
    req.on('error', reject);
  });
}

const sid = (prefix: string) => prefix + randomBytes(16).toString('hex');

export function createSmsFake(options: { authToken?: string; delayMs?: number } = {}) {
  const messages: FakeSms[] = [];
  const tokens = new Map<string, string>();
  const defaultToken = options.authToken ?? process.env.TWILIO_AUTH_TOKEN ?? FAKE_AUTH_TOKEN;
  const delayMs = options.delayMs ?? 40;

  /** Posts a signed form to the app, as the real service posts webhooks. */
  async function postSigned(url: string, params: Record<string, string>, token: string): Promise<{ status: number; text: string }> {
    const signature = twilio.getExpectedTwilioSignature(token, url, params);
    // Astro's origin check refuses form posts without an Origin header of the app's own; the real
    // service sends none, see docs/day-sheet-and-texts.md. The fake names the app's origin.
    const response = await fetch(url, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-twilio-signature': signature, origin: new URL(url).origin },
      body: new URLSearchParams(params).toString(),
    });
    return { status: response.status, text: await response.text() };
  }

  async function report(message: FakeSms, accountSid: string, token: string) {
    const finals = message.to.endsWith('0000') ? ['sent', 'undelivered'] : ['sent', 'delivered'];
    for (const status of finals) {
      await new Promise((r) => setTimeout(r, delayMs));
      message.status = status;
      if (!message.statusCallback) continue;
      const params: Record<string, string> = {
        AccountSid: accountSid, MessageSid: message.sid, SmsSid: message.sid, MessageStatus: status, SmsStatus: status,
        From: message.from, To: message.to, ApiVersion: '2010-04-01',
        ...(status === 'undelivered' ? { ErrorCode: '30003' } : {}),
      };
      try {
        const answer = await postSigned(message.statusCallback, params, token);
        message.callbacks.push({ status, answer: answer.status });
      } catch (e) {
        message.callbacks.push({ status, answer: e instanceof Error ? e.message : 'unreachable' });
      }
    }
  }

  function resource(m: FakeSms, accountSid: string) {
    return {
      sid: m.sid, account_sid: accountSid, api_version: '2010-04-01', body: m.body, to: m.to, from: m.from,
      status: m.status, direction: m.direction, num_segments: String(m.numSegments), num_media: '0',
      date_created: new Date(m.dateCreated).toUTCString(), date_updated: new Date().toUTCString(), date_sent: null,
      error_code: null, error_message: null, price: null, price_unit: 'USD', messaging_service_sid: null,
      uri: `/2010-04-01/Accounts/${accountSid}/Messages/${m.sid}.json`, subresource_uris: {},
    };
  }

  /** Handles a request if it is one of the fake's; returns false for anything else. */
  async function handle(req: IncomingMessage, res: ServerResponse, url: URL): Promise<boolean> {
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { 'content-type': 'application/json' });
      res.end(JSON.stringify(body));
    };
    const create = /^\/2010-04-01\/Accounts\/(AC[0-9a-zA-Z]+)\/Messages\.json$/.exec(url.pathname);
    if (create && req.method === 'POST') {
      const accountSid = create[1]!;
      const auth = /^Basic (.+)$/.exec(req.headers.authorization ?? '');
      const [user, token] = auth ? Buffer.from(auth[1]!, 'base64').toString('utf8').split(':') : [];
      if (user !== accountSid || !token) {
        send(401, { code: 20003, message: 'Authenticate', more_info: 'local fake', status: 401 });
        return true;
      }
      tokens.set(accountSid, token);
      const form = new URLSearchParams(await readBody(req));
      const to = form.get('To') ?? '';
      const body = form.get('Body') ?? '';
      if (!/^\+[1-9]\d{6,14}$/.test(to) || !body) {
        send(400, { code: 21211, message: `The 'To' number ${to} is not a valid phone number, or the body is empty.`, more_info: 'local fake', status: 400 });
        return true;
      }
      const count = countSegments(body);
      const message: FakeSms = {
        sid: sid('SM'), direction: 'outbound-api', from: form.get('From') ?? FAKE_FROM, to, body, status: 'queued',
        numSegments: count.segments, encoding: count.encoding, statusCallback: form.get('StatusCallback'),
        dateCreated: new Date().toISOString(), callbacks: [],
      };
      messages.push(message);
      send(201, resource(message, accountSid));
      void report(message, accountSid, token);
      return true;
    }
    if (url.pathname === '/sms' && req.method === 'GET') {
      send(200, { messages });
      return true;
    }
    if (url.pathname === '/sms' && req.method === 'DELETE') {
      messages.length = 0;
      send(200, { messages: [] });
      return true;
    }
    if (url.pathname === '/sms/inbound' && req.method === 'POST') {
      let input: { from?: string; body?: string; url?: string; to?: string };
      try {
        input = JSON.parse(await readBody(req)) as typeof input;
      } catch {
        send(400, { error: { code: 'invalid_request', message: 'Send JSON {from, body, url}' } });
        return true;
      }
      if (!input.from || typeof input.body !== 'string' || !input.url) {
        send(400, { error: { code: 'invalid_request', message: 'Send JSON {from, body, url}' } });
        return true;
      }
      const accountSid = tokens.keys().next().value ?? FAKE_ACCOUNT_SID;
      const token = tokens.get(accountSid) ?? defaultToken;
      const message: FakeSms = {
        sid: sid('SM'), direction: 'inbound', from: input.from, to: input.to ?? FAKE_FROM, body: input.body, status: 'received',
        numSegments: countSegments(input.body).segments, encoding: countSegments(input.body).encoding, statusCallback: null,
        dateCreated: new Date().toISOString(), callbacks: [],
      };
      messages.push(message);
      const params = { AccountSid: accountSid, MessageSid: message.sid, SmsSid: message.sid, From: message.from, To: message.to, Body: message.body, NumMedia: '0', ApiVersion: '2010-04-01' };
      try {
        const answer = await postSigned(input.url, params, token);
        message.callbacks.push({ status: 'received', answer: answer.status });
        send(200, { sid: message.sid, appStatus: answer.status, appAnswer: answer.text });
      } catch (e) {
        send(502, { error: { code: 'unreachable', message: e instanceof Error ? e.message : 'app unreachable' } });
      }
      return true;
    }
    return false;
  }

  return { messages, handle };
}
