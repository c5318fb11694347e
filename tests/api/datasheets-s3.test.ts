/**
 * Datasheets on the S3 store through the app: a second app server of the built app (the same process
 * `npm start` runs, scripts/stack/app-server.ts) with STORAGE=s3 against the fake S3 started here by the
 * stack's own function (s3rver on a free loopback port, its folder under this run's data dir), on the
 * suite's database. A real PDF goes up, the object is in the bucket (listed beside the app), nothing is
 * written to the disk store, it downloads back byte for byte, and a removal deletes the object.
 * Runs whatever STORAGE the rest of the suite uses, so `npm test` covers both stores.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync } from 'node:fs';
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
const dataDir = path.join(process.env.DATA_DIR ?? '.data', 'second-app-s3');
let fake: Services;
let child: ChildProcess | null = null;
let url = '';
let s3Env: NodeJS.ProcessEnv = {};

const diskKeys = (): string[] => {
  const dir = path.join(dataDir, 'datasheets');
  return existsSync(dir) ? readdirSync(dir) : [];
};

/** A sheet of the test part: its number and kind are in the text, so the attach check asks nothing. */
async function makePdf(title: string): Promise<Buffer> {
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  doc.addPage([595, 842]).drawText(`CWN30L02-S3 N-channel MOSFET: ${title} (invented test datasheet)`, { x: 50, y: 780, size: 12, font });
  doc.addPage([595, 842]);
  return Buffer.from(await doc.save());
}

beforeAll(async () => {
  fake = await startS3Fake(path.join(dataDir, 's3'), 'stallpoint-datasheets');
  s3Env = { ...process.env, DATA_DIR: dataDir, STORAGE: 's3', S3_ENDPOINT: fake.env.S3_ENDPOINT, S3_BUCKET: 'stallpoint-datasheets' };
  const started = await spawnAppServer(process.cwd(), { ...s3Env, HOST: '127.0.0.1', PORT: String(await freePort()) }, (c) => (child = c));
  url = started.url;
}, 60_000);

afterAll(async () => {
  if (child) await stopAppServer(child, 5_000);
  await fake?.close();
  await knex.destroy();
});

describe('STORAGE=s3: upload, download, remove through the app', () => {
  it('stores the PDF as an object in the bucket (not on disk), serves it back equal, and deletes the object on removal', async () => {
    const librarian = await sessionCookie('librarian');
    const partId = (await knex('parts').where({ mpn: 'CWN30L02-S3' }).first('id')).id;
    const pdf = await makePdf('stored in the bucket');
    const before = await storedKeys(s3Env);

    const up = await request(url)
      .post(`/api/parts/${partId}/datasheets`)
      .set('Cookie', librarian)
      .set('Origin', url)
      .attach('file', pdf, { filename: 'bucket.pdf', contentType: 'application/pdf' });
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    expect(up.body.sha256).toBe(createHash('sha256').update(pdf).digest('hex'));
    const key = (await knex('datasheets').where({ id: up.body.id }).first()).storage_key as string;
    expect(await storedKeys(s3Env)).toEqual([...before, key].sort());
    expect(diskKeys()).toEqual([]);

    const down = await request(url)
      .get(`/api/datasheets/${up.body.id}`)
      .set('Cookie', await sessionCookie('designer'))
      .buffer(true)
      .parse((r, cb) => {
        const c: Buffer[] = [];
        r.on('data', (d: Buffer) => c.push(d));
        r.on('end', () => cb(null, Buffer.concat(c)));
      });
    expect(down.status).toBe(200);
    expect(down.headers['content-type']).toBe('application/pdf');
    expect(Buffer.compare(down.body as Buffer, pdf)).toBe(0);

    const gone = await request(url)
      .delete(`/api/datasheets/${up.body.id}`)
      .set('Cookie', librarian)
      .set('Content-Type', 'application/json');
    expect(gone.status).toBe(204);
    expect(await storedKeys(s3Env)).toEqual(before);
    expect((await request(url).get(`/api/datasheets/${up.body.id}`).set('Cookie', librarian)).status).toBe(404);
  });

  it('a refused upload (text named .pdf → 415) leaves the bucket as it was', async () => {
    const librarian = await sessionCookie('librarian');
    const partId = (await knex('parts').where({ mpn: 'CWN30L02-S3' }).first('id')).id;
    const before = await storedKeys(s3Env);
    const res = await request(url)
      .post(`/api/parts/${partId}/datasheets`)
      .set('Cookie', librarian)
      .set('Origin', url)
      .attach('file', Buffer.from('plain words, not a PDF\n'), { filename: 'fake.pdf', contentType: 'application/pdf' });
    expect(res.status).toBe(415);
    expect(await storedKeys(s3Env)).toEqual(before);
  });
});
