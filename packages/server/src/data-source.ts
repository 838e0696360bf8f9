// Entry point for the TypeORM CLI (`npm run migration:generate -w @beadroll/server -- src/migrations/Name`).
import 'reflect-metadata';
import { loadConfig } from './config/app-config';
import { createDataSource } from './database/data-source';

export default createDataSource(loadConfig());
