import 'reflect-metadata';
import { Logger } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { AppModule } from './app.module';
import { configureApp } from './bootstrap';
import { ConfigError, loadConfig } from './config/app-config';

async function main(): Promise<void> {
  // Validate first so a bad variable stops the boot with one clear line.
  loadConfig();
  const app = await NestFactory.create<NestExpressApplication>(AppModule, { bufferLogs: false });
  app.enableShutdownHooks();
  const config = configureApp(app);
  await app.listen(config.port, config.host);
  Logger.log(`listening on http://${config.host}:${config.port}`, 'beadroll');
}

main().catch((err: unknown) => {
  if (err instanceof ConfigError) {
    console.error(err.message);
  } else if (err && typeof err === 'object' && 'code' in err && err.code === 'EADDRINUSE') {
    console.error('The HTTP port is already in use: stop whatever holds it or set PORT to another port.');
  } else {
    console.error(err instanceof Error ? (err.stack ?? err.message) : err);
  }
  process.exit(1);
});
