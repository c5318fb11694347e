/**
 * The one CSV writer and the importer together: export → import → export gives the identical file for
 * 1, 2, 8 and 5,000 rows (no delimiter guessing, so short files import too); formula-leading text (OWASP
 * "CSV Injection": = + - @ tab CR) is written with a leading apostrophe and imported back as the text the
 * user typed; a BOM with a hand-entered motor label "=HYPERLINK(…)" comes out neutralised.
 * This file empties the parts table (the file starts from its own restored snapshot, tests/helpers/isolate-file.ts).
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import Papa from 'papaparse';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { MOTOR_M1 } from '../helpers/contract-examples.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';

const knex = appDb();
const SAMPLE = readFileSync('data-samples/parts-import.csv', 'utf8');
const sample = Papa.parse<Record<string, string>>(SAMPLE, { header: true, skipEmptyLines: true });
/** A description cell as written in a hand-made file, what is stored, and how the export writes it (OWASP CSV Injection). */
const FORMULA_CASES: [inFile: string, stored: string, exported: string][] = [
  ['=1+2', '=1+2', "'=1+2"],
  ['+SUM(A1:A3)', '+SUM(A1:A3)', "'+SUM(A1:A3)"],
  ['-2+3 V rail', '-2+3 V rail', "'-2+3 V rail"],
  ['@cmd', '@cmd', "'@cmd"],
  ["'=guarded once", '=guarded once', "'=guarded once"],
  ["''=guarded twice", "'=guarded twice", "''=guarded twice"],
];
const FORMULA_TEXTS = FORMULA_CASES.map(([inFile]) => inFile);
let librarian = '';
let designer = '';
let keyCounter = 0;

beforeAll(async () => {
  [librarian, designer] = await Promise.all([sessionCookie('librarian'), sessionCookie('designer')]);
});
afterAll(() => knex.destroy());

const textBody = (r: request.Request) =>
  r.buffer(true).parse((res, cb) => {
    let text = '';
    res.setEncoding('utf8');
    res.on('data', (c: string) => (text += c));
    res.on('end', () => cb(null, text));
  });

async function exportAll(): Promise<string> {
  const res = await textBody(request(appUrl()).get('/api/parts.csv?sort=mpn').set('Cookie', librarian));
  expect(res.status).toBe(200);
  return res.body as string;
}

async function importCommit(csv: string): Promise<number> {
  const res = await request(appUrl())
    .post('/api/imports?mode=commit')
    .set('Cookie', librarian)
    .set('Content-Type', 'text/csv')
    .set('Idempotency-Key', `roundtrip-${Date.now()}-${++keyCounter}`)
    .send(csv);
  expect(res.status, JSON.stringify(res.body.errors ?? res.body).slice(0, 2000)).toBe(201);
  return res.body.counts.created;
}

const emptyCatalogue = async (): Promise<void> => {
  await knex('parts').delete();
};

/** n rows cycled from the data-samples file, part numbers and SKUs made unique, some formula-leading descriptions. */
function generated(n: number, shortDescriptions: boolean): string {
  const rows = Array.from({ length: n }, (_, i) => {
    const r = sample.data[i % sample.data.length];
    const description = i < FORMULA_TEXTS.length ? FORMULA_TEXTS[i] : shortDescriptions ? `Round-trip row ${i}` : r.description;
    return { ...r, mpn: `${r.mpn}-R${i}`, sku: r.sku ? `${r.sku}-R${i}` : '', description };
  });
  return Papa.unparse({ fields: sample.meta.fields!, data: rows }, { newline: '\r\n' });
}

describe('bill of materials CSV', () => {
  it('a hand-entered motor label "=HYPERLINK(…)" comes out as text behind an apostrophe', async () => {
    const seeded = await knex('designs').first('id');
    const base = (await request(appUrl()).get(`/api/designs/${seeded.id}`).set('Cookie', designer)).body.input as DesignInput;
    const label = '=HYPERLINK("http://example.invalid/x","Open")';
    const input = { ...base, name: `Formula label ${Date.now()}`, motor: { source: 'manual', label, params: MOTOR_M1 } };
    const created = await request(appUrl()).post('/api/designs').set('Cookie', designer).set('Origin', appUrl()).send(input);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const res = await textBody(request(appUrl()).get(`/api/designs/${created.body.id}/bom.csv`).set('Cookie', designer));
    expect(res.status).toBe(200);
    const text = (res.body as string).replace(/^\uFEFF/, '');
    const rows = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true, delimiter: ',' }).data;
    expect(rows.find((r) => r['Reference designators'] === 'M1')?.['Part number']).toBe(`'${label}`);
    for (const row of rows) for (const cell of Object.values(row)) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
    expect(text.endsWith('\r\n')).toBe(true);
  });
});

describe('parts CSV: export → import → export is identical', () => {
  it.each([
    [1, false],
    [2, false],
    [8, false],
    [5000, true],
  ])(
    '%i row(s)',
    async (n, shortDescriptions) => {
      await emptyCatalogue();
      expect(await importCommit(generated(n, shortDescriptions))).toBe(n);
      const first = await exportAll();
      expect(first.split('\r\n').length).toBe(n + 2); // header, n rows, and the final line end
      await emptyCatalogue();
      expect(await importCommit(first)).toBe(n);
      const second = await exportAll();
      expect(second).toBe(first);
    },
    600_000,
  );

  it('formula-leading text is stored as typed and exported behind one apostrophe (OWASP CSV Injection)', async () => {
    await emptyCatalogue();
    await importCommit(generated(FORMULA_TEXTS.length, false));
    const stored = (await knex('parts').select('description')).map((r) => r.description).sort();
    expect(stored).toEqual(FORMULA_CASES.map(([, typed]) => typed).sort());
    const exported = await exportAll();
    const cells = Papa.parse<Record<string, string>>(exported, { header: true, skipEmptyLines: true, delimiter: ',' }).data.map(
      (r) => r.description,
    );
    expect(cells.sort()).toEqual(FORMULA_CASES.map(([, , exported]) => exported).sort());
    const plainNumber = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
    const all = Papa.parse<string[]>(exported, { delimiter: ',', skipEmptyLines: true }).data.flat();
    expect(all.filter((c) => /^[=+\-@\t\r]/.test(c) && !plainNumber.test(c))).toEqual([]);
  });
});
