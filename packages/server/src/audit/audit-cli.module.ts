import { Module } from '@nestjs/common';
import { ScheduleModule } from '@nestjs/schedule';
import { TypeOrmModule } from '@nestjs/typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG, AppConfigModule } from '../config/config.module';
import { dataSourceOptions } from '../database/data-source';
import { NoLogJobsModule } from '../log/log-jobs';
import { MailModule } from '../mail/mail.module';
import { StorageModule } from '../storage/storage.module';
import { AuditModule } from './audit.module';

/**
 * Just the database and the audit, for the command-line audit (with the scheduler registry, mail
 * service and exhibit store the modules it reaches depend on). It only reads: it sends no mail,
 * and the log neither signs a checkpoint nor numbers entries while it runs.
 */
@Module({
  imports: [
    AppConfigModule,
    NoLogJobsModule,
    ScheduleModule.forRoot(),
    MailModule,
    StorageModule,
    TypeOrmModule.forRootAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => dataSourceOptions(config),
    }),
    AuditModule,
  ],
})
export class AuditCliModule {}
