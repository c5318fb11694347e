/** The datasheet store the app uses: local disk under DATA_DIR/datasheets (outside the web root). */
import path from 'node:path';
import { dataDirFromEnv } from '../config.ts';
import type { BlobStore } from './blob-store.ts';
import { LocalDiskStore } from './local-disk.ts';

let store: BlobStore | null = null;

export function datasheetStore(): BlobStore {
  store ??= new LocalDiskStore(path.resolve(dataDirFromEnv(), 'datasheets'));
  return store;
}

export type { BlobStore } from './blob-store.ts';
