import { Inject, Injectable, Logger } from '@nestjs/common';
import { createTransport, type Transporter } from 'nodemailer';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { FakeSmtpService } from './fake-smtp.service';
import type { Letter } from './letters';

/** Sends e-mail through nodemailer; the transport comes from configuration (the fake SMTP server locally). */
@Injectable()
export class MailService {
  private readonly logger = new Logger('mail');
  private transport?: Transporter;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly fake: FakeSmtpService,
  ) {}

  private transporter(): Transporter {
    if (!this.transport) {
      const fake = this.fake.enabled;
      this.transport = createTransport({
        host: fake ? '127.0.0.1' : this.config.mail.smtpHost,
        port: fake ? this.fake.port : this.config.mail.smtpPort || 25,
        secure: false,
        ignoreTLS: fake,
      });
    }
    return this.transport;
  }

  /** Sends one letter; a failure is logged and reported as false, never thrown at the caller. */
  async send(to: string, letter: Letter): Promise<boolean> {
    try {
      await this.transporter().sendMail({
        from: this.config.mail.from,
        to,
        subject: letter.subject,
        text: letter.text,
        html: letter.html,
      });
      return true;
    } catch (err) {
      this.logger.error(`could not send "${letter.subject}": ${(err as Error).message}`);
      return false;
    }
  }
}
