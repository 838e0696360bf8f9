import type { AddressInfo } from 'node:net';
import { Inject, Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';

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

const KEEP = 500;

/**
 * A local SMTP server (development and tests only) that keeps what it receives in memory, so the
 * mailbox page and the tests can read it. Started only when the configuration asks for it.
 */
@Injectable()
export class FakeSmtpService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('fake-smtp');
  private server?: SMTPServer;
  private nextId = 1;
  readonly messages: CapturedMail[] = [];
  port = 0;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  get enabled(): boolean {
    return this.config.mail.fakeSmtp;
  }

  async onModuleInit(): Promise<void> {
    if (!this.enabled) return;
    this.server = new SMTPServer({
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
      this.server!.once('error', reject);
      this.server!.listen(this.config.mail.smtpPort, '127.0.0.1', () => resolve());
    });
    this.port = (this.server.server.address() as AddressInfo).port;
    this.logger.log(`fake SMTP server on 127.0.0.1:${this.port}`);
  }

  async onModuleDestroy(): Promise<void> {
    if (this.server) await new Promise<void>((resolve) => this.server!.close(() => resolve()));
  }

  /** Messages to an address, newest first. */
  to(address: string): CapturedMail[] {
    const want = address.toLowerCase();
    return this.messages.filter((m) => m.to.some((a) => a.toLowerCase() === want));
  }
}
