/** BlobStore on the local disk: one folder, generated names, atomic writes (temp file then rename). */
import { mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { assertBlobKey, type BlobStore } from './blob-store.ts';

export class LocalDiskStore implements BlobStore {
  constructor(private readonly dir: string) {}

  private file(key: string): string {
    assertBlobKey(key);
    return path.join(this.dir, key);
  }

  async put(key: string, bytes: Uint8Array): Promise<void> {
    const target = this.file(key);
    await mkdir(this.dir, { recursive: true });
    const temp = path.join(this.dir, `.incoming-${randomUUID()}`);
    await writeFile(temp, bytes, { flag: 'wx', mode: 0o640 });
    await rename(temp, target);
  }

  async get(key: string): Promise<Uint8Array | null> {
    try {
      return await readFile(this.file(key));
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw err;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.file(key), { force: true });
  }

  async exists(key: string): Promise<boolean> {
    try {
      return (await stat(this.file(key))).isFile();
    } catch {
      return false;
    }
  }
}
