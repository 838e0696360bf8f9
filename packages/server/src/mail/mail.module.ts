import { Global, Module } from '@nestjs/common';
import { FakeSmtpService } from './fake-smtp.service';
import { MailboxController } from './mailbox.controller';
import { MailService } from './mail.service';

/** E-mail for every feature: MailService, and locally the fake SMTP server with its mailbox page. */
@Global()
@Module({
  controllers: [MailboxController],
  providers: [FakeSmtpService, MailService],
  exports: [MailService, FakeSmtpService],
})
export class MailModule {}
