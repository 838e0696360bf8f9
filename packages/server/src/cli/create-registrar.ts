// `npm run create-registrar -- EMAIL`: creates a registrar account (or finds it) and e-mails it a
// link to choose its password. There is no default password.
import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import { isEmail } from 'class-validator';
import { AppModule } from '../app.module';
import { AuthService } from '../auth/auth.service';
import { APP_CONFIG } from '../config/config.module';
import type { AppConfig } from '../config/app-config';

async function main(): Promise<void> {
  const email = process.argv[2];
  if (!email || !isEmail(email) || email.length > 254) {
    console.error('usage: npm run create-registrar -- EMAIL   (EMAIL must be an e-mail address)');
    process.exit(2);
  }
  const app = await NestFactory.createApplicationContext(AppModule, { logger: ['error', 'warn'] });
  try {
    const config = app.get<AppConfig>(APP_CONFIG);
    const { created, link } = await app.get(AuthService).createRegistrar(email);
    console.log(`${created ? 'created' : 'found'} registrar ${email}; a set-password link was e-mailed.`);
    if (config.mail.fakeSmtp) {
      // The fake SMTP server of this short-lived process keeps the message only until it exits.
      console.log(`fake SMTP is on, so here is the link (valid 72 hours, once): ${link}`);
    }
  } finally {
    await app.close();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
