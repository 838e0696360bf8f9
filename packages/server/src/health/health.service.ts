import { Inject, Injectable } from '@nestjs/common';
import { DataSource } from 'typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { CheckpointsService, REFUSAL_WORDS } from '../log/checkpoints.service';
import { StandbyService } from '../standby/standby.service';
import type { HealthResponse } from './dto/health-response.dto';

@Injectable()
export class HealthService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly standby: StandbyService,
    private readonly checkpoints: CheckpointsService,
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
    const refusal = this.checkpoints.standingRefusal();
    const reasons = [
      ...(database === 'ok' ? [] : ['the database cannot be reached']),
      ...(database === 'ok' && migrations !== 'up to date'
        ? ['the database’s migrations are not up to date']
        : []),
      ...(refusal ? [REFUSAL_WORDS[refusal]] : []),
    ];
    return {
      status: reasons.length ? 'degraded' : 'ok',
      instance: this.config.instanceName,
      database,
      migrations,
      log: refusal ? 'refusing' : 'ok',
      standby: await this.standby.status(),
      time: new Date().toISOString(),
      reasons,
    };
  }
}
