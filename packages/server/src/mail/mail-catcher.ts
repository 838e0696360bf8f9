import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** One message the fake SMTP server received. */
export interface CapturedMail {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/** How many messages are kept, newest first. */
const KEEP = 500;

/**
 * A local SMTP server for development and tests that keeps what it receives in memory, newest
 * first. One runs inside a single server process; `npm run start:cluster` runs one for every
 * instance and serves its messages to their mailbox pages with {@link serveMessages}.
 */
export class MailCatcher {
  private server?: SMTPServer;
  private nextId = 1;
  readonly messages: CapturedMail[] = [];
  port = 0;

  /** Starts listening on 127.0.0.1:`port` (0 = any free port); resolves to the port. */
  async listen(port: number): Promise<number> {
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      size: 1024 * 1024,
      onData: (stream, _session, callback) => {
        simpleParser(stream)
          .then((mail) => {
            const to = ([] as Array<{ value: Array<{ address?: string }> }>)
              .concat(mail.to ?? [])
              .flatMap((a) => a.value.map((v) => v.address ?? ''));
            this.messages.unshift({
              id: this.nextId++,
              receivedAt: new Date().toISOString(),
              from: mail.from?.text ?? '',
              to,
              subject: mail.subject ?? '',
              text: mail.text ?? '',
              html: typeof mail.html === 'string' ? mail.html : '',
            });
            this.messages.splice(KEEP);
            callback();
          })
          .catch((err: Error) => callback(err));
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, '127.0.0.1', () => resolve());
    });
    this.server = server;
    this.port = (server.server.address() as AddressInfo).port;
    return this.port;
  }

  async close(): Promise<void> {
    const server = this.server;
    this.server = undefined;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  /** Messages to an address, newest first. */
  to(address: string): CapturedMail[] {
    const want = address.toLowerCase();
    return this.messages.filter((m) => m.to.some((a) => a.toLowerCase() === want));
  }
}

/**
 * Serves a catcher's messages as JSON (`GET /messages`, newest first) on 127.0.0.1:`port`, so
 * every instance's mailbox page (MAILBOX_URL) shows the one mailbox. Resolves to the server.
 */
export async function serveMessages(catcher: MailCatcher, port: number): Promise<Server> {
  const server = createServer((req, res) => {
    if (req.method === 'GET' && req.url === '/messages') {
      res.writeHead(200, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
      res.end(JSON.stringify(catcher.messages));
      return;
    }
    res.writeHead(404).end();
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  return server;
}
