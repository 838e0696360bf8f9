import { Inject, Injectable } from '@nestjs/common';
import { DataSource } from 'typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { StandbyService } from '../standby/standby.service';
import type { HealthResponse } from './dto/health-response.dto';

@Injectable()
export class HealthService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly standby: StandbyService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async report(): Promise<HealthResponse> {
    let database: HealthResponse['database'] = 'ok';
    let migrations: HealthResponse['migrations'] = 'unknown';
    try {
      await this.dataSource.query('SELECT 1');
      migrations = (await this.dataSource.showMigrations()) ? 'pending' : 'up to date';
    } catch {
      database = 'unreachable';
    }
    return {
      status: database === 'ok' && migrations === 'up to date' ? 'ok' : 'degraded',
      instance: this.config.instanceName,
      database,
      migrations,
      standby: await this.standby.status(),
      time: new Date().toISOString(),
    };
  }
}
