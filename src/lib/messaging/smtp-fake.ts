import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

/** One e-mail the fake received, as the outbox page shows it. */
export interface FakeMail {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

/**
 * A local SMTP server that accepts every message and keeps it in memory. Development and tests send
 * real SMTP to it through nodemailer, so the sending code is the production code.
 */
export function createSmtpFake() {
  const mails: FakeMail[] = [];
  let nextId = 1;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = session.envelope.rcptTo.map((r) => r.address);
          mails.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to,
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  return {
    mails,
    listen(port: number, host = '127.0.0.1') {
      return new Promise<number>((resolve, reject) => {
        server.once('error', reject);
        server.listen(port, host, () => {
          const address = server.server.address();
          resolve(typeof address === 'object' && address ? address.port : port);
        });
      });
    },
    close() {
      return new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
