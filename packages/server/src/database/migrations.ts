import type { MigrationInterface } from 'typeorm';
import { CreateAccounts1767200000000 } from '../migrations/1767200000000-CreateAccounts';

// Every migration class, in order: add new ones at the end, never edit one that has landed.
export const MIGRATIONS: Array<new () => MigrationInterface> = [CreateAccounts1767200000000];
