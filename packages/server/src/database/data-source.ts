import { DataSource, type DataSourceOptions } from 'typeorm';
import type { AppConfig } from '../config/app-config';
import { ENTITIES } from './entities';
import { MIGRATIONS } from './migrations';

/** TypeORM options shared by the app, the migration runner and the TypeORM CLI. Never synchronize. */
export function dataSourceOptions(config: AppConfig): DataSourceOptions {
  return {
    type: 'postgres',
    host: config.db.host,
    port: config.db.port,
    username: config.db.user,
    password: config.db.password,
    database: config.db.database,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    migrationsRun: false,
    logging: ['error'],
    extra: { max: 10, application_name: 'beadroll' },
  };
}

/** Creates (without initialising) a DataSource for the given configuration. */
export function createDataSource(config: AppConfig): DataSource {
  return new DataSource(dataSourceOptions(config));
}
