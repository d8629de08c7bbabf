// Runs the local fakes of the hosted services Roundsmith talks to (e-mail and texts), each on
// 127.0.0.1, plus a small JSON API that the development pages and the tests read:
//   GET /mail → {mails: [...]}     DELETE /mail → empties the outbox
//   POST /2010-04-01/Accounts/{sid}/Messages.json → what the twilio SDK calls to send a text
//   GET /sms → {messages: [...]}   DELETE /sms → empties the inbox
//   POST /sms/inbound {from, body, url} → plays an owner's reply into the app's webhook at url
// Prints one line "fakes ready smtp=PORT http=PORT" when listening.
import http from 'node:http';
import { createSmtpFake } from '../src/lib/messaging/smtp-fake.ts';
import { createSmsFake } from '../src/lib/messaging/sms-fake.ts';

const smtpPort = Number(process.env.FAKE_SMTP_PORT ?? 0);
const httpPort = Number(process.env.FAKE_HTTP_PORT ?? 0);

const smtp = createSmtpFake();
const boundSmtp = await smtp.listen(smtpPort);
const sms = createSmsFake();

const api = http.createServer(async (req, res) => {
  const url = new URL(req.url ?? '/', 'http://127.0.0.1');
  const send = (status: number, body: unknown) => {
    res.writeHead(status, { 'content-type': 'application/json' });
    res.end(JSON.stringify(body));
  };
  try {
    if (await sms.handle(req, res, url)) return;
  } catch (e) {
    return send(500, { error: { code: 'internal', message: e instanceof Error ? e.message : 'fake failed' } });
  }
  if (url.pathname === '/mail' && req.method === 'GET') return send(200, { mails: smtp.mails });
  if (url.pathname === '/mail' && req.method === 'DELETE') {
    smtp.mails.length = 0;
    return send(200, { mails: [] });
  }
  return send(404, { error: { code: 'not_found', message: 'No such fake endpoint' } });
});
await new Promise<void>((resolve) => api.listen(httpPort, '127.0.0.1', resolve));
const address = api.address();
const boundHttp = typeof address === 'object' && address ? address.port : httpPort;
process.stdout.write(`fakes ready smtp=${boundSmtp} http=${boundHttp}\n`);

const shutdown = () => {
  api.close();
  void smtp.close().then(() => process.exit(0));
  setTimeout(() => process.exit(0), 1000).unref();
};
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
