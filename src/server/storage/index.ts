/**
 * The datasheet store the app uses, chosen by STORAGE: local disk under DATA_DIR/datasheets (outside the
 * web root), or an S3-compatible bucket (S3_* keys; under `npm start`/`npm test` a local fake when
 * S3_ENDPOINT is unset, started by scripts/stack/services.ts, which then sets S3_ENDPOINT).
 */
import path from 'node:path';
import { appConfig, type StorageConfig } from '../config.ts';
import type { BlobStore } from './blob-store.ts';
import { LocalDiskStore } from './local-disk.ts';
import { S3Store } from './s3.ts';

let store: BlobStore | null = null;

/** The store a configuration names (tests make one of each kind through here). */
export function storeFor(storage: StorageConfig, dataDir: string): BlobStore {
  if (storage.kind === 'local') return new LocalDiskStore(path.resolve(dataDir, 'datasheets'));
  if (!storage.s3.endpoint) throw new Error('STORAGE=s3 needs S3_ENDPOINT (npm start and npm test set it when they run the local fake).');
  return new S3Store({ ...storage.s3, endpoint: storage.s3.endpoint });
}

export function datasheetStore(): BlobStore {
  if (!store) {
    const config = appConfig();
    store = storeFor(config.storage, config.dataDir);
  }
  return store;
}

export type { BlobStore } from './blob-store.ts';
