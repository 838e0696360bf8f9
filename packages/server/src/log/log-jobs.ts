import { Global, Module } from '@nestjs/common';

/**
 * Injection token, provided only by {@link NoLogJobsModule}: this process starts none of the
 * log's timed jobs (no checkpoint signing, no numbering of entries).
 */
export const NO_LOG_JOBS = Symbol('NO_LOG_JOBS');

/**
 * For a command that only reads (the command-line audit): the log's services are there for
 * what it reads, but nothing signs or numbers while it runs.
 */
@Global()
@Module({ providers: [{ provide: NO_LOG_JOBS, useValue: true }], exports: [NO_LOG_JOBS] })
export class NoLogJobsModule {}
