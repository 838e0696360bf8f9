import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG, AppConfigModule } from '../config/config.module';
import { dataSourceOptions } from '../database/data-source';
import { AuditModule } from './audit.module';

/** Just the database and the audit, for the command-line audit. */
@Module({
  imports: [
    AppConfigModule,
    TypeOrmModule.forRootAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => dataSourceOptions(config),
    }),
    AuditModule,
  ],
})
export class AuditCliModule {}
