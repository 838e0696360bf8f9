import { Module } from '@nestjs/common';
import { LogModule } from '../log/log.module';
import { HealthController } from './health.controller';
import { HealthService } from './health.service';

@Module({ imports: [LogModule], controllers: [HealthController], providers: [HealthService] })
export class HealthModule {}
