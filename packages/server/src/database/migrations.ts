import type { MigrationInterface } from 'typeorm';

// Every migration class, in order: add new ones at the end, never edit one that has landed.
export const MIGRATIONS: Array<new () => MigrationInterface> = [];
