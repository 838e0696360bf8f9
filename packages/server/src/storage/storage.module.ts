import { join } from 'node:path';
import { Global, Module } from '@nestjs/common';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { BLOB_STORE, type BlobStore } from './blob-store';
import { FsBlobStore } from './fs-blob-store';
import { S3BlobStore } from './s3-blob-store';

/** Builds the blob store the configuration names. */
export function createBlobStore(config: AppConfig): BlobStore {
  const { storage } = config;
  if (storage.driver === 's3')
    return new S3BlobStore({
      ...storage.s3,
      endpoint: storage.s3.endpoint || undefined,
      spoolDir: join(config.dataDir, 'tmp', 's3-spool'),
    });
  return new FsBlobStore(storage.dir);
}

/** Provides BLOB_STORE to every feature. */
@Global()
@Module({
  providers: [{ provide: BLOB_STORE, inject: [APP_CONFIG], useFactory: createBlobStore }],
  exports: [BLOB_STORE],
})
export class StorageModule {}
