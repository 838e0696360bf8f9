import { type MiddlewareConsumer, Module, type NestModule } from '@nestjs/common';
import { APP_FILTER } from '@nestjs/core';
import { ScheduleModule } from '@nestjs/schedule';
import { TypeOrmModule } from '@nestjs/typeorm';
import type { AppConfig } from './config/app-config';
import { APP_CONFIG, AppConfigModule } from './config/config.module';
import { AuthModule } from './auth/auth.module';
import { ErrorFilter } from './common/error.filter';
import { RequestIdMiddleware } from './common/request-id.middleware';
import { dataSourceOptions } from './database/data-source';
import { AuditModule } from './audit/audit.module';
import { HealthModule } from './health/health.module';
import { MailModule } from './mail/mail.module';
import { AccountsModule } from './accounts/accounts.module';
import { LedgerModule } from './ledger/ledger.module';
import { LotsModule } from './lots/lots.module';
import { LotImportsModule } from './lot-imports/lot-imports.module';
import { TransfersModule } from './transfers/transfers.module';
import { RegistryToolsModule } from './registry/registry.module';
import { OpinionsModule } from './opinions/opinions.module';
import { LineageModule } from './lineage/lineage.module';
import { ExhibitsModule } from './exhibits/exhibits.module';
import { StockModule } from './stock/stock.module';
import { TagsModule } from './tags/tags.module';
import { LogModule } from './log/log.module';
import { IdempotencyModule } from './idempotency/idempotency.module';
import { VerifyPageModule } from './verify-page/verify-page.module';
import { StandbyModule } from './standby/standby.module';

@Module({
  imports: [
    AppConfigModule,
    ScheduleModule.forRoot(),
    TypeOrmModule.forRootAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => dataSourceOptions(config),
    }),
    StandbyModule,
    IdempotencyModule,
    HealthModule,
    MailModule,
    AuthModule,
    AccountsModule,
    LedgerModule,
    LotsModule,
    LotImportsModule,
    OpinionsModule,
    LineageModule,
    ExhibitsModule,
    AuditModule,
    TransfersModule,
    RegistryToolsModule,
    TagsModule,
    VerifyPageModule,
    LogModule,
    StockModule,
  ],
  providers: [{ provide: APP_FILTER, useClass: ErrorFilter }],
})
export class AppModule implements NestModule {
  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(RequestIdMiddleware).forRoutes('*path');
  }
}
