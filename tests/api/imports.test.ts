/**
 * CSV import: the data-samples file previews clean and commits once per Idempotency-Key; a file with a
 * bad row reports line and column and writes nothing; a 200-row commit sends at most 3 statements per
 * row and the parts read back through GET equal the file.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import Papa from 'papaparse';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { createPerson, sessionCookie as personCookie, uniqueEmail } from './auth-helpers.ts';

const knex = appDb();
const SAMPLE = readFileSync('data-samples/parts-import.csv', 'utf8');
const sampleRows = Papa.parse<Record<string, string>>(SAMPLE, { header: true, skipEmptyLines: true }).data;
let librarian = '';
beforeAll(async () => {
  librarian = await sessionCookie('librarian');
});
afterAll(() => knex.destroy());

const post = (mode: string, csv: string, key?: string, cookie = librarian) => {
  const req = request(appUrl()).post(`/api/imports?mode=${mode}`).set('Cookie', cookie).set('Content-Type', 'text/csv');
  if (key) req.set('Idempotency-Key', key);
  return req.send(csv);
};
const partCount = async (): Promise<number> => Number((await knex('parts').count({ n: '*' }).first())!.n);

/** Statements MariaDB has received from all clients (global status Questions: every client statement, BEGIN and COMMIT included). */
const questions = async (): Promise<number> => {
  const [rows] = (await knex.raw("SHOW GLOBAL STATUS LIKE 'Questions'")) as [{ Value: string }[]];
  return Number(rows[0].Value);
};

/** n rows cycled from the data-samples file, part numbers and SKUs made unique with the suffix. */
function cycled(n: number, suffix: string): Record<string, string>[] {
  return Array.from({ length: n }, (_, i) => {
    const r = sampleRows[i % sampleRows.length];
    return { ...r, mpn: `${r.mpn}-${suffix}${i}`, sku: r.sku ? `${r.sku}-${suffix}${i}` : r.sku };
  });
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
/** Cells equal as written, or as numbers when both are numbers (the export writes 0.5 for a file's 0.50). */
const sameCell = (a: string, b: string): boolean => a === b || (NUMBER.test(a) && NUMBER.test(b) && Number(a) === Number(b));

/** The sample with part numbers made unique for this test, so each test imports its own parts. */
function renamed(suffix: string): { csv: string; mpns: string[] } {
  const rows = sampleRows.map((r) => ({ ...r, mpn: `${r.mpn}-${suffix}`, sku: r.sku ? `${r.sku}${suffix}` : r.sku }));
  return { csv: Papa.unparse(rows), mpns: rows.map((r) => r.mpn) };
}

describe('POST /api/imports', () => {
  it('previews the data-samples file: every row ready, nothing written', async () => {
    const before = await partCount();
    const res = await post('preview', SAMPLE);
    expect(res.status, JSON.stringify(res.body.errors)).toBe(200);
    expect(res.body.errors).toEqual([]);
    expect(res.body.counts).toMatchObject({ rows: sampleRows.length, ready: sampleRows.length, invalid: 0 });
    expect(res.body.rows.map((r: { line: number }) => r.line)).toEqual(sampleRows.map((_, i) => i + 2));
    expect(await partCount()).toBe(before);
  });

  it('commits the data-samples file once: the same key again replays and imports nothing more', async () => {
    const before = await partCount();
    const key = `test-sample-${Date.now()}`;
    const first = await post('commit', SAMPLE, key);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.body.counts.created).toBe(sampleRows.length);
    expect(await partCount()).toBe(before + sampleRows.length);
    const imported = await knex('parts').whereIn(
      'mpn',
      sampleRows.map((r) => r.mpn),
    );
    expect(imported.map((p) => p.review_status)).toEqual(sampleRows.map(() => 'pending'));
    const again = await post('commit', SAMPLE, key);
    expect(again.status).toBe(200);
    expect(again.body.replayed).toBe(true);
    expect(again.body.counts.created).toBe(sampleRows.length);
    expect(await partCount()).toBe(before + sampleRows.length);
    const otherFile = await post('commit', renamed('K').csv, key);
    expect(otherFile.status).toBe(409);
    expect(await partCount()).toBe(before + sampleRows.length);
    // The imported MOSFET reads back with its RDS(on) lines and its source.
    const mosfet = sampleRows.find((r) => r.category === 'mosfet')!;
    const id = imported.find((p) => p.mpn === mosfet.mpn)!.id;
    const part = (await request(appUrl()).get(`/api/parts/${id}`).set('Cookie', librarian)).body;
    expect(part.params.rdsOn.map((r: { vgsV: number }) => r.vgsV)).toEqual(
      [1, 2, 3, 4]
        .map((i) => mosfet[`rdsOn${i}VgsV`])
        .filter(Boolean)
        .map(Number),
    );
    expect(part.sources[0].sku).toBe(mosfet.sku);
  });

  it('a file with bad rows reports line and column and writes nothing, also on commit', async () => {
    const { mpns } = renamed('B');
    const rows: Record<string, string>[] = sampleRows.map((r, i) => ({ ...r, mpn: mpns[i], sku: r.sku ? `${r.sku}B` : '' }));
    const mosfetIndex = rows.findIndex((r) => r.category === 'mosfet');
    const diodeIndex = rows.findIndex((r) => r.category === 'diode');
    rows[mosfetIndex] = { ...rows[mosfetIndex], vdsMaxV: 'forty' };
    rows[diodeIndex] = { ...rows[diodeIndex], vdsMaxV: '30' };
    const csv = Papa.unparse(rows);
    const before = await partCount();
    const preview = await post('preview', csv);
    expect(preview.status).toBe(200);
    expect(preview.body.errors).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ line: mosfetIndex + 2, column: 'vdsMaxV' }),
        expect.objectContaining({ line: diodeIndex + 2, column: 'vdsMaxV', message: expect.stringContaining('does not apply') }),
      ]),
    );
    expect(preview.body.counts.invalid).toBe(2);
    const commit = await post('commit', csv, `test-bad-${Date.now()}`);
    expect(commit.status).toBe(400);
    expect(commit.body.issues.length).toBeGreaterThan(0);
    expect(commit.body.errors).toEqual(preview.body.errors);
    expect(await partCount()).toBe(before);
    expect(await knex('parts').whereIn('mpn', mpns)).toEqual([]);
  });

  it('reports a missing required value and a duplicate inside the file', async () => {
    const { csv } = renamed('D');
    const rows = Papa.parse<Record<string, string>>(csv, { header: true }).data;
    const motor = rows.findIndex((r) => r.category === 'motor');
    rows[motor] = { ...rows[motor], stallCurrentA: '' };
    rows.push({ ...rows[0] });
    const res = await post('preview', Papa.unparse(rows));
    expect(res.body.errors).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ line: motor + 2, column: 'stallCurrentA' }),
        expect.objectContaining({ line: rows.length + 1, column: 'mpn', message: 'the same maker and part number as line 2' }),
      ]),
    );
  });

  it('refuses an unknown column (line 1), a commit without a key, a non-CSV body and a designer', async () => {
    const unknown = await post('preview', SAMPLE.replace('vdsMaxV', 'vdsMax'));
    expect(unknown.body.errors).toEqual(expect.arrayContaining([{ line: 1, column: 'vdsMax', message: 'unknown column' }]));
    const noKey = await post('commit', SAMPLE);
    expect(noKey.status).toBe(400);
    expect(noKey.body.issues.map((i: { path: string }) => i.path)).toContain('(headers).idempotency-key');
    const json = await request(appUrl())
      .post('/api/imports?mode=preview')
      .set('Cookie', librarian)
      .set('Content-Type', 'application/json')
      .send('{}');
    expect(json.status).toBe(415);
    const badMode = await post('apply', SAMPLE);
    expect(badMode.status).toBe(400);
    expect(badMode.body.issues.map((i: { path: string }) => i.path)).toContain('mode');
    expect((await post('preview', SAMPLE, undefined, await sessionCookie('designer'))).status).toBe(403);
  });

  it('another librarian can approve an imported part (four eyes) and a designer then finds it by parameters', async () => {
    const reviewerEmail = uniqueEmail('second.librarian');
    await createPerson(knex, { email: reviewerEmail, password: 'a long unused test password', roles: ['librarian'] });
    const reviewer = await personCookie(knex, reviewerEmail);
    const { csv, mpns } = renamed('R');
    const created = await post('commit', csv, `test-review-${Date.now()}`);
    expect(created.status).toBe(201);
    const diode = created.body.rows.find((r: { category: string }) => r.category === 'diode');
    const part = (await request(appUrl()).get(`/api/parts/${diode.partId}`).set('Cookie', librarian)).body;
    const approved = await request(appUrl())
      .post(`/api/parts/${part.id}/review`)
      .set('Cookie', reviewer)
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ decision: 'approve', version: part.version }));
    expect(approved.body.reviewStatus).toBe('approved');
    const found = await request(appUrl())
      .get('/api/parts')
      .set('Cookie', await sessionCookie('designer'))
      .query({ category: 'diode', vrrmMinV: part.params.vrrmV, kind: part.params.kind, reviewStatus: 'approved', pageSize: 200 });
    expect(found.body.items.map((p: { mpn: string }) => p.mpn)).toContain(part.mpn);
    expect(mpns).toContain(part.mpn);
  });

  it('commits 200 rows with at most 3 statements per row, and the parts read back through GET equal the file', async () => {
    const rows = cycled(200, `S${Date.now()}-`);
    const csv = Papa.unparse({ fields: Object.keys(sampleRows[0]), data: rows });
    // Hand count for one chunk (200 rows < 500 per multi-row INSERT): session lookup and role check (a
    // few), the key lookup, BEGIN, the key claim, one duplicate SELECT, the parts INSERT and the SELECT of
    // the new ids, one INSERT per parameter table the file fills (MOSFET parameters, RDS(on) lines, their
    // governing intervals, Zth points, driver, diode, motor: 7), sources INSERT + SELECT + price breaks
    // INSERT, the read-back of the new parts for the audit trail (9 SELECTs), one audit INSERT, the key's
    // UPDATE, COMMIT: about 35 for the file, whatever its length up to 500 rows. One part at a time it was
    // 13 per row (INSERTs per table, then a 9-SELECT read-back and an audit INSERT per part): 2,600 here.
    const before = await questions();
    const res = await post('commit', csv, `test-statements-${Date.now()}`);
    const statements = (await questions()) - before;
    console.info(`import of 200 rows: ${statements} statements (${(statements / 200).toFixed(2)} per row)`);
    expect(res.status, JSON.stringify(res.body.errors ?? res.body).slice(0, 1000)).toBe(201);
    expect(res.body.counts.created).toBe(200);
    expect(statements, `${statements} statements for 200 rows`).toBeLessThanOrEqual(3 * 200);

    // Second read, through the export (GET): every column of the file comes back as written.
    const exported = await request(appUrl())
      .get('/api/parts.csv?sort=mpn')
      .set('Cookie', librarian)
      .buffer(true)
      .parse((r, cb) => {
        let text = '';
        r.setEncoding('utf8');
        r.on('data', (c: string) => (text += c));
        r.on('end', () => cb(null, text));
      });
    expect(exported.status).toBe(200);
    const byMpn = new Map(
      Papa.parse<Record<string, string>>(exported.body as string, { header: true, skipEmptyLines: true, delimiter: ',' }).data.map((r) => [
        r.mpn,
        r,
      ]),
    );
    for (const row of rows) {
      const got = byMpn.get(row.mpn);
      expect(got, row.mpn).toBeDefined();
      const differing = Object.keys(row).filter((c) => !sameCell(row[c] ?? '', got![c] ?? ''));
      expect(
        differing.map((c) => `${c}: file ${row[c]}, read back ${got![c]}`),
        row.mpn,
      ).toEqual([]);
    }
  });

  it('reads MOQ and order multiple per source, defaults the multiple to 1 without the column, and names a bad one', async () => {
    // The data-samples file: CWP20L17-S3 is sold from 10 in multiples of 10, ORU15-200-MA in multiples of 5 (invented).
    const rows = cycled(sampleRows.length, `M${Date.now()}-`);
    const created = await post('commit', Papa.unparse({ fields: Object.keys(sampleRows[0]), data: rows }), `test-multiple-${Date.now()}`);
    expect(created.status, JSON.stringify(created.body.errors)).toBe(201);
    for (const [i, row] of rows.entries()) {
      const part = (await request(appUrl()).get(`/api/parts/${created.body.rows[i].partId}`).set('Cookie', librarian)).body;
      expect([part.sources[0].moq, part.sources[0].orderMultiple], row.mpn).toEqual([Number(row.moq), Number(row.orderMultiple)]);
    }
    expect(rows.map((r) => r.orderMultiple)).toEqual(expect.arrayContaining(['10', '5']));

    // A file in the format before the column existed still imports; its sources order in multiples of 1.
    const older = cycled(2, `O${Date.now()}-`).map(({ orderMultiple: _dropped, ...rest }) => rest);
    const olderRes = await post('commit', Papa.unparse(older), `test-no-multiple-${Date.now()}`);
    expect(olderRes.status, JSON.stringify(olderRes.body.errors)).toBe(201);
    const first = (await request(appUrl()).get(`/api/parts/${olderRes.body.rows[0].partId}`).set('Cookie', librarian)).body;
    expect(first.sources[0].orderMultiple).toBe(1);

    const bad = cycled(2, `X${Date.now()}-`);
    bad[0].orderMultiple = '0';
    bad[1].orderMultiple = 'ten';
    const preview = await post('preview', Papa.unparse(bad));
    expect(preview.body.errors).toEqual([
      expect.objectContaining({ line: 2, column: 'orderMultiple' }),
      expect.objectContaining({ line: 3, column: 'orderMultiple', message: expect.stringContaining('is not a number') }),
    ]);
  });
});
