import { Inject, Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { MailCatcher, type CapturedMail } from './mail-catcher';

export type { CapturedMail } from './mail-catcher';

/**
 * The local fake SMTP server (development and tests only), in this process, started only when
 * the configuration asks for it; and where the mailbox page reads mail from: this process's
 * catcher, or the one mailbox several instances share (MAILBOX_URL).
 */
@Injectable()
export class FakeSmtpService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('fake-smtp');
  private readonly catcher = new MailCatcher();

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  get enabled(): boolean {
    return this.config.mail.fakeSmtp;
  }

  /** Messages this process's fake SMTP server received, newest first. */
  get messages(): CapturedMail[] {
    return this.catcher.messages;
  }

  get port(): number {
    return this.catcher.port;
  }

  /** true when the mailbox page shows a mailbox several instances send to. */
  get shared(): boolean {
    return this.config.mail.mailboxUrl !== '';
  }

  async onModuleInit(): Promise<void> {
    if (!this.enabled) return;
    await this.catcher.listen(this.config.mail.smtpPort);
    this.logger.log(`fake SMTP server on 127.0.0.1:${this.catcher.port}`);
  }

  async onModuleDestroy(): Promise<void> {
    await this.catcher.close();
  }

  /** Messages to an address, newest first. */
  to(address: string): CapturedMail[] {
    return this.catcher.to(address);
  }

  /**
   * What the mailbox page shows, newest first: the shared mailbox's messages when there is one,
   * else this process's; null when neither exists (mail goes to a real server).
   */
  async mailbox(): Promise<CapturedMail[] | null> {
    if (this.shared) {
      const res = await fetch(new URL('messages', `${this.config.mail.mailboxUrl.replace(/\/$/, '')}/`));
      if (!res.ok) throw new Error(`the shared mailbox answered ${res.status}`);
      return (await res.json()) as CapturedMail[];
    }
    return this.enabled ? this.catcher.messages : null;
  }
}
