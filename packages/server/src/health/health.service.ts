import { Inject, Injectable } from '@nestjs/common';
import { DataSource } from 'typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { StandbyService, type StandbyStatus } from '../standby/standby.service';

export interface HealthReport {
  status: 'ok' | 'degraded';
  /** This server process (INSTANCE_NAME). */
  instance: string;
  database: 'ok' | 'unreachable';
  migrations: 'up to date' | 'pending' | 'unknown';
  /** The hot standby public reads may use, and its replay lag. */
  standby: StandbyStatus;
  time: string;
}

@Injectable()
export class HealthService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly standby: StandbyService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async report(): Promise<HealthReport> {
    let database: HealthReport['database'] = 'ok';
    let migrations: HealthReport['migrations'] = 'unknown';
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
