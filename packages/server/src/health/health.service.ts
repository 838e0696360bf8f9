import { Injectable } from '@nestjs/common';
import { DataSource } from 'typeorm';

export interface HealthReport {
  status: 'ok' | 'degraded';
  database: 'ok' | 'unreachable';
  migrations: 'up to date' | 'pending' | 'unknown';
  time: string;
}

@Injectable()
export class HealthService {
  constructor(private readonly dataSource: DataSource) {}

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
      database,
      migrations,
      time: new Date().toISOString(),
    };
  }
}
