import { FakeSmtpService, type CapturedMail } from '../../src/mail/fake-smtp.service';
import type { TestApp } from './test-app';

/** The newest message the fake SMTP server received for an address (fails if there is none). */
export function lastMailTo(t: TestApp, address: string): CapturedMail {
  const mail = t.app.get(FakeSmtpService).to(address)[0];
  if (!mail) throw new Error(`no mail for ${address}`);
  return mail;
}

/** The first link in a message's text part that starts with `base`. */
export function linkIn(mail: CapturedMail, base: string): URL {
  const found = mail.text.match(/https?:\/\/\S+/g)?.find((u) => u.startsWith(base));
  if (!found) throw new Error(`no ${base} link in "${mail.subject}"`);
  return new URL(found);
}
