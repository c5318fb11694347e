/**
 * Removing a datasheet while the S3 store is down: a second app server (the built app, as `npm start` runs
 * it) with STORAGE=s3 against this file's own fake S3 (s3rver on a fixed free port), with its background
 * outbox run every second and retries from 1 s (OUTBOX_INTERVAL_S, OUTBOX_RETRY_BASE_S). The fake is
 * stopped, the datasheet removed: the removal answers, the record is gone and nothing is served, the object
 * is recorded as still to be deleted (blob_deletions) with the store's error. The fake is started again on
 * the same folder: the object is still there (it was not lost track of), and the background run deletes it
 * and clears the record. Objects are listed beside the app (tests/helpers/datasheet-store.ts).
 */
import path from 'node:path';
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { appDb } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { storedKeys } from '../helpers/datasheet-store.ts';
import { startS3Fake, type Services } from '../../scripts/stack/services.ts';
import { spawnAppServer, stopAppServer } from '../../scripts/stack/app-process.ts';
import { freePort } from '../../scripts/stack/throwaway.ts';

const knex = appDb();
const dataDir = path.join(process.env.DATA_DIR ?? '.data', 'second-app-s3-deletions');
const s3Dir = path.join(dataDir, 's3');
const BUCKET = 'stallpoint-datasheets';
let fake: Services | null = null;
let s3Port = 0;
let child: ChildProcess | null = null;
let url = '';
let s3Env: NodeJS.ProcessEnv = {};
const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function makePdf(): Promise<Buffer> {
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  doc.addPage([595, 842]).drawText('CWN30L02-S3 N-channel MOSFET: removed while the store is down (invented test datasheet)', {
    x: 50,
    y: 780,
    size: 10,
    font,
  });
  return Buffer.from(await doc.save());
}

beforeAll(async () => {
  s3Port = await freePort();
  fake = await startS3Fake(s3Dir, BUCKET, s3Port);
  s3Env = { ...process.env, DATA_DIR: dataDir, STORAGE: 's3', S3_ENDPOINT: fake.env.S3_ENDPOINT, S3_BUCKET: BUCKET };
  const started = await spawnAppServer(
    process.cwd(),
    { ...s3Env, HOST: '127.0.0.1', PORT: String(await freePort()), OUTBOX_INTERVAL_S: '1', OUTBOX_RETRY_BASE_S: '1' },
    (c) => (child = c),
  );
  url = started.url;
}, 60_000);

afterAll(async () => {
  if (child) await stopAppServer(child, 5_000);
  await fake?.close();
  await knex.destroy();
});

describe('STORAGE=s3: removal while the store is down', () => {
  it('removes the record at once, keeps the deletion pending while S3 is down, and deletes the object once it is back', async () => {
    const librarian = await sessionCookie('librarian');
    const partId = (await knex('parts').where({ mpn: 'CWN30L02-S3' }).first('id')).id;
    const up = await request(url)
      .post(`/api/parts/${partId}/datasheets`)
      .set('Cookie', librarian)
      .set('Origin', url)
      .attach('file', await makePdf(), { filename: 'down.pdf', contentType: 'application/pdf' });
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    const key = (await knex('datasheets').where({ id: up.body.id }).first()).storage_key as string;
    expect(await storedKeys(s3Env)).toContain(key);

    await fake!.close();
    fake = null;
    const gone = await request(url)
      .delete(`/api/datasheets/${up.body.id}`)
      .set('Cookie', librarian)
      .set('Content-Type', 'application/json');
    expect(gone.status, gone.text).toBe(204);
    expect(await knex('datasheets').where({ id: up.body.id }).first()).toBeUndefined();
    const pending = await knex('blob_deletions').where({ store: 's3', storage_key: key }).first();
    expect(pending).toBeDefined();
    expect(pending.attempts).toBeGreaterThanOrEqual(1);
    expect(pending.last_error).toMatch(/not answering/);
    expect((await request(url).get(`/api/datasheets/${up.body.id}`).set('Cookie', librarian)).status).toBe(404);
    const audit = await knex('audit_events').where({ entity_type: 'part', entity_id: partId, action: 'datasheet.remove' });
    expect(audit).toHaveLength(1);

    // The store comes back with its files: the object is still there until the background run deletes it.
    fake = await startS3Fake(s3Dir, BUCKET, s3Port);
    expect(await storedKeys(s3Env)).toContain(key);
    for (let i = 0; i < 150 && (await knex('blob_deletions').where({ storage_key: key }).first()); i++) await pause(200);
    expect(await knex('blob_deletions').where({ storage_key: key }).first()).toBeUndefined();
    expect(await storedKeys(s3Env)).not.toContain(key);
  }, 90_000);
});
