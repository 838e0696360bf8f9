import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { ThrottlerModule } from '@nestjs/throttler';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountRecordsModule } from '../accounts/account-records.module';
import { EmailToken } from './entities/email-token.entity';
import { RefreshToken, Session } from './entities/session.entity';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { AccessStrategy, JWT_SECRET } from './access.strategy';
import { AuthController } from './auth.controller';
import { AccessGuard } from './auth.guard';
import { AuthService } from './auth.service';
import { EmailTokensService } from './email-tokens.service';
import { JWT_ALGORITHM, loadJwtSecret } from './jwt-secret';
import { PasswordsService } from './passwords.service';
import { SessionsService } from './sessions.service';
import { PgThrottlerStorage } from './pg-throttler.storage';
import { DataSource } from 'typeorm';

/** Sessions, passwords and the global guard every route passes through. */
@Module({
  imports: [
    AccountRecordsModule,
    TypeOrmModule.forFeature([Session, RefreshToken, EmailToken]),
    PassportModule,
    ThrottlerModule.forRootAsync({
      inject: [APP_CONFIG, DataSource],
      useFactory: (config: AppConfig, dataSource: DataSource) => ({
        throttlers: [{ ttl: config.throttle.ttlMs, limit: config.throttle.limit }],
        storage: new PgThrottlerStorage(dataSource),
      }),
    }),
    JwtModule.registerAsync({
      inject: [JWT_SECRET, APP_CONFIG],
      extraProviders: [
        {
          provide: JWT_SECRET,
          inject: [APP_CONFIG],
          useFactory: (c: AppConfig) => loadJwtSecret(c.jwtSecretFile),
        },
      ],
      useFactory: (secret: string, config: AppConfig) => ({
        secret,
        signOptions: { algorithm: JWT_ALGORITHM, expiresIn: config.session.accessTtlSeconds },
        verifyOptions: { algorithms: [JWT_ALGORITHM] },
      }),
    }),
  ],
  controllers: [AuthController],
  providers: [
    {
      provide: JWT_SECRET,
      inject: [APP_CONFIG],
      useFactory: (c: AppConfig) => loadJwtSecret(c.jwtSecretFile),
    },
    PasswordsService,
    SessionsService,
    AuthService,
    EmailTokensService,
    AccessStrategy,
    { provide: APP_GUARD, useClass: AccessGuard },
  ],
  exports: [PasswordsService, SessionsService, AuthService, EmailTokensService, TypeOrmModule],
})
export class AuthModule {}
