/**
 * The datasheet storage contract, run against both stores the app can use: the local-disk store and the
 * S3 store (through @aws-sdk/client-s3) against the fake S3 that `npm start`/`npm test` run with
 * STORAGE=s3 (s3rver, started here by the same function on a free loopback port in a temp folder).
 * Expectations are the interface's own promises (src/server/storage/blob-store.ts), written out here:
 * bytes come back equal, an absent key reads as null / false, deleting twice is no error, keys outside
 * the pattern are refused before any request.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startS3Fake, type Services } from '../../scripts/stack/services.ts';
import { readConfig } from '../../src/server/config.ts';
import { storeFor, type BlobStore } from '../../src/server/storage/index.ts';
import { S3Store } from '../../src/server/storage/s3.ts';
import { ServiceError } from '../../src/server/services/errors.ts';

const tmp = mkdtempSync(path.join(os.tmpdir(), 'stallpoint-blob-'));
let fake: Services;
const stores: Record<'local' | 's3', BlobStore | null> = { local: null, s3: null };

beforeAll(async () => {
  fake = await startS3Fake(path.join(tmp, 's3'), 'stallpoint-datasheets');
  const dataDir = path.join(tmp, 'data');
  stores.local = storeFor(readConfig({ STORAGE: 'local', DATA_DIR: dataDir }).storage, dataDir);
  stores.s3 = storeFor(readConfig({ STORAGE: 's3', S3_ENDPOINT: fake.env.S3_ENDPOINT }).storage, dataDir);
});

afterAll(async () => {
  (stores.s3 as S3Store | null)?.close();
  await fake?.close();
  rmSync(tmp, { recursive: true, force: true });
});

describe.each(['local', 's3'] as const)('%s datasheet store', (kind) => {
  const store = (): BlobStore => stores[kind]!;

  it('is the kind the configuration names', () => {
    expect(store().constructor.name).toBe(kind === 'local' ? 'LocalDiskStore' : 'S3Store');
  });

  it('put then get returns the same bytes (a 1 MB random file and a 3-byte one), exists is true', async () => {
    const big = randomBytes(1024 * 1024);
    await store().put(`contract-big-${kind}.pdf`, big);
    await store().put(`contract-small-${kind}.pdf`, Uint8Array.from([0x25, 0x50, 0x44]));
    const back = await store().get(`contract-big-${kind}.pdf`);
    expect(back).not.toBeNull();
    expect(Buffer.compare(Buffer.from(back!), big)).toBe(0);
    expect(Array.from((await store().get(`contract-small-${kind}.pdf`))!)).toEqual([0x25, 0x50, 0x44]);
    expect(await store().exists(`contract-big-${kind}.pdf`)).toBe(true);
  });

  it('put on an existing key replaces its bytes', async () => {
    await store().put(`contract-over-${kind}.pdf`, Uint8Array.from([1, 2, 3]));
    await store().put(`contract-over-${kind}.pdf`, Uint8Array.from([9]));
    expect(Array.from((await store().get(`contract-over-${kind}.pdf`))!)).toEqual([9]);
  });

  it('a missing key reads as null and does not exist', async () => {
    expect(await store().get(`never-stored-${kind}.pdf`)).toBeNull();
    expect(await store().exists(`never-stored-${kind}.pdf`)).toBe(false);
  });

  it('delete removes the key; deleting it again (or a key never stored) is no error', async () => {
    await store().put(`contract-gone-${kind}.pdf`, Uint8Array.from([7, 7]));
    await store().delete(`contract-gone-${kind}.pdf`);
    expect(await store().get(`contract-gone-${kind}.pdf`)).toBeNull();
    expect(await store().exists(`contract-gone-${kind}.pdf`)).toBe(false);
    await expect(store().delete(`contract-gone-${kind}.pdf`)).resolves.toBeUndefined();
    await expect(store().delete(`never-stored-${kind}.pdf`)).resolves.toBeUndefined();
  });

  it.each(['../etc/passwd', 'UPPER-case.pdf', 'short.pdf', 'no-extension-here', 'a/b/c-d-e-f.pdf'])('refuses the key %s', async (key) => {
    await expect(store().put(key, Uint8Array.from([1]))).rejects.toThrow(/Refusing storage key/);
    await expect(store().get(key)).rejects.toThrow(/Refusing storage key/);
  });
});

describe('STORAGE=s3 configuration', () => {
  it('without S3_ENDPOINT (the scripts set it when they start the fake) says what is missing', () => {
    expect(() => storeFor(readConfig({ STORAGE: 's3' }).storage, tmp)).toThrow(/S3_ENDPOINT/);
  });

  it('a store that does not answer gives a 503 naming the datasheet store, not a hang (nothing listens on port 9, a 2 s bound)', async () => {
    const dead = new S3Store({
      endpoint: 'http://127.0.0.1:9',
      bucket: 'stallpoint-datasheets',
      region: 'us-east-1',
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
      timeoutMs: 2_000,
    });
    try {
      for (const attempt of [
        () => dead.get('contract-none-at-all.pdf'),
        () => dead.put('contract-none-at-all.pdf', Uint8Array.from([1])),
      ]) {
        const err = await attempt().then(
          () => null,
          (e: unknown) => e,
        );
        expect(err).toBeInstanceOf(ServiceError);
        expect((err as ServiceError).status).toBe(503);
        expect((err as ServiceError).message).toMatch(/datasheet store/);
        expect((err as ServiceError).headers['Retry-After']).toBe('5');
      }
    } finally {
      dead.close();
    }
  });
});
