/**
 * Datasheet uploads: a real PDF made here with pdf-lib is accepted and downloads back byte for byte;
 * a text file named .pdf, an oversized file (also streamed without a length), an empty file and a
 * name with ../ are refused or sanitised, and nothing is stored for a refused upload.
 * The text check on attach: a sheet without the part's number, one that names another kind of part, or
 * one with no text answers 409 asking for confirmation (nothing stored); sent again with confirm=true it
 * is attached and the audit says it was confirmed. The demo's sample datasheets attach without a question.
 */
import { createHash } from 'node:crypto';
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { numberBomb, spaceBomb } from '../helpers/pdf-bombs.ts';
import { storedKeys } from '../helpers/datasheet-store.ts';
import { pdfWithCMapFont } from '../helpers/pdf-cmap-font.ts';
import { makeDatasheetPdf, sampleDatasheetParts } from '../../scripts/make-sample-datasheets.ts';

const knex = appDb();
let librarian = '';
let partId = 0;
/** The part the uploads go to: an invented N-channel MOSFET of the demo catalogue. */
const MPN = 'CWN30L02-S3';

/** A datasheet of the test part: its part number and kind on every page, then the title. */
async function makePdf(title: string, pages = 2, heading = `${MPN} N-channel MOSFET`): Promise<Buffer> {
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  for (let i = 0; i < pages; i++) {
    const page = doc.addPage([595, 842]);
    page.drawText(heading, { x: 50, y: 800, size: 14, font });
    page.drawText(`${title} page ${i + 1} (invented test datasheet)`, { x: 50, y: 780, size: 12, font });
  }
  return Buffer.from(await doc.save());
}
/** What the app's store holds (the disk folder, or the bucket when the suite runs with STORAGE=s3). */
const files = (): Promise<string[]> => storedKeys();
const rows = async (): Promise<number> => Number((await knex('datasheets').count({ n: '*' }).first())!.n);

function upload(bytes: Buffer | Uint8Array, filename: string, cookie = librarian, revision?: string, confirm?: string, toPart = partId) {
  const req = request(appUrl()).post(`/api/parts/${toPart}/datasheets`).set('Cookie', cookie).set('Origin', appUrl());
  if (revision !== undefined) req.field('revision', revision);
  if (confirm !== undefined) req.field('confirm', confirm);
  return req.attach('file', Buffer.from(bytes), { filename, contentType: 'application/pdf' });
}

/** Streams a multipart body in chunks without Content-Length; resolves with the status as soon as it arrives. */
function streamUpload(totalBytes: number, cookie: string): Promise<number> {
  const boundary = '----stallpoint-test-boundary';
  const url = new URL(`/api/parts/${partId}/datasheets`, appUrl());
  return new Promise((resolve, reject) => {
    const req = http.request(url, {
      method: 'POST',
      headers: {
        'Content-Type': `multipart/form-data; boundary=${boundary}`,
        'Transfer-Encoding': 'chunked',
        Cookie: cookie,
        Origin: appUrl(),
      },
    });
    req.on('response', (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
    });
    req.on('error', (err) =>
      (err as NodeJS.ErrnoException).code === 'EPIPE' || (err as NodeJS.ErrnoException).code === 'ECONNRESET' ? undefined : reject(err),
    );
    req.write(
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="huge.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.7\n`,
    );
    const chunk = Buffer.alloc(1024 * 1024, 0x20);
    let sent = 0;
    const pump = (): void => {
      while (sent < totalBytes) {
        sent += chunk.length;
        if (!req.write(chunk)) return void req.once('drain', pump);
      }
      req.end(`\r\n--${boundary}--\r\n`);
    };
    pump();
  });
}

beforeAll(async () => {
  librarian = await sessionCookie('librarian');
  partId = (await knex('parts').where({ mpn: MPN }).first('id')).id;
});
afterAll(() => knex.destroy());

describe('POST /api/parts/:id/datasheets', () => {
  it('accepts a real PDF: page count, SHA-256 and revision recorded, file stored under a generated name, downloads back equal', async () => {
    const pdf = await makePdf('CWN30L02-S3 rev B', 3);
    const res = await upload(pdf, 'CWN30L02-S3 rev B.pdf', librarian, 'Rev. B');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      originalName: 'CWN30L02-S3 rev B.pdf',
      pages: 3,
      bytes: pdf.length,
      revision: 'Rev. B',
      sha256: createHash('sha256').update(pdf).digest('hex'),
    });
    const row = await knex('datasheets').where({ id: res.body.id }).first();
    expect(row.storage_key).toMatch(/^[0-9a-f-]{36}\.pdf$/);
    expect(await files()).toContain(row.storage_key);
    const audit = await knex('audit_events')
      .where({ entity_type: 'part', entity_id: partId, action: 'datasheet.add' })
      .orderBy('id', 'desc')
      .first();
    expect(JSON.parse(audit.after_json).datasheet.id).toBe(res.body.id);

    const down = await request(appUrl())
      .get(`/api/datasheets/${res.body.id}`)
      .set('Cookie', await sessionCookie('designer'))
      .buffer(true)
      .parse((r, cb) => {
        const c: Buffer[] = [];
        r.on('data', (d: Buffer) => c.push(d));
        r.on('end', () => cb(null, Buffer.concat(c)));
      });
    expect(down.status).toBe(200);
    expect(down.headers['content-type']).toBe('application/pdf');
    expect(down.headers['content-disposition']).toMatch(/^attachment; filename="CWN30L02-S3 rev B\.pdf"/);
    expect(down.headers['x-content-type-options']).toBe('nosniff');
    expect(Buffer.compare(down.body as Buffer, pdf)).toBe(0);

    const again = await upload(pdf, 'copy.pdf');
    expect(again.status).toBe(409);
    expect(again.body.issues[0].path).toBe('file');
  });

  it('sanitises a file name with ../ and never uses it as a path', async () => {
    const res = await upload(await makePdf('traversal'), '../../../etc/cron.d/evil.pdf');
    expect(res.status).toBe(201);
    expect(res.body.originalName).toBe('evil.pdf');
    const row = await knex('datasheets').where({ id: res.body.id }).first();
    expect(row.storage_key).not.toContain('evil');
    expect(await files()).toContain(row.storage_key);
    const odd = await upload(await makePdf('odd'), '..\\..\\windows\\..pdf');
    expect(odd.status).toBe(201);
    expect(odd.body.originalName).toBe('pdf.pdf'); // base name "..pdf": leading dots dropped, extension added
  });

  describe('refusals store nothing', () => {
    let before: { rows: number; files: string[] };
    beforeAll(async () => {
      before = { rows: await rows(), files: await files() };
    });
    const unchanged = async () => {
      expect(await rows()).toBe(before.rows);
      expect(await files()).toEqual(before.files);
    };

    it('a text file named .pdf → 415', async () => {
      const res = await upload(Buffer.from('Just some text pretending to be a datasheet.\n'), 'fake.pdf');
      expect(res.status).toBe(415);
      expect(res.body.issues[0].path).toBe('file');
      await unchanged();
    });

    it('a file that starts like a PDF but does not parse → 415', async () => {
      const res = await upload(Buffer.from('%PDF-1.7\nthis is not really a PDF body\n'), 'broken.pdf');
      expect(res.status).toBe(415);
      await unchanged();
    });

    it('a PDF whose object stream unpacks to 64 MB → 413 naming the file, and the server still works', async () => {
      const bomb = spaceBomb();
      expect(bomb.length).toBeLessThan(100 * 1024);
      const res = await upload(bomb, 'bomb.pdf');
      expect(res.status, JSON.stringify(res.body)).toBe(413);
      expect(res.body.issues[0].path).toBe('file');
      expect(res.body.issues[0].message).toMatch(/unpack/);
      await unchanged();
    });

    it('a PDF that needs more memory to read than the inspection may use → 413, and a normal upload still works after', async () => {
      const res = await upload(numberBomb(), 'many-objects.pdf');
      expect(res.status, JSON.stringify(res.body)).toBe(413);
      expect(res.body.issues[0].path).toBe('file');
      await unchanged();
      const health = await request(appUrl()).get('/api/health');
      expect(health.status).toBe(200);
      const normal = await upload(await makePdf('after the bomb', 2), 'after.pdf');
      expect(normal.status, JSON.stringify(normal.body)).toBe(201);
      expect(normal.body.pages).toBe(2);
      await request(appUrl()).delete(`/api/datasheets/${normal.body.id}`).set('Cookie', librarian).set('Content-Type', 'application/json');
    });

    it('a duplicate is refused before any parsing: a bomb whose SHA-256 is already on record answers 409, not 413', async () => {
      const bomb = spaceBomb();
      const sha256 = createHash('sha256').update(bomb).digest('hex');
      const [id] = await knex('datasheets').insert({
        part_id: partId,
        original_name: 'on-record.pdf',
        storage_key: 'not-a-stored-file.pdf',
        sha256,
        bytes: bomb.length,
        pages: 1,
      });
      try {
        const res = await upload(bomb, 'again.pdf');
        expect(res.status, JSON.stringify(res.body)).toBe(409);
        expect(res.body.issues[0]).toMatchObject({ path: 'file', message: `same SHA-256 as datasheet ${id}` });
      } finally {
        await knex('datasheets').where({ id }).delete();
      }
    });

    it('an empty file → 400', async () => {
      const res = await upload(Buffer.alloc(0), 'empty.pdf');
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('file');
      await unchanged();
    });

    it('an oversized file with a declared length → 413', async () => {
      const big = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(20 * 1024 * 1024 + 1, 0x20)]);
      // The server may answer 413 and close before the client has sent everything: then supertest reports
      // the answer on the error (err.response); an upload that fails without any answer fails this test.
      const res = await upload(big, 'big.pdf').catch((err) => {
        if (!err.response) throw err;
        return err.response;
      });
      expect(res.status).toBe(413);
      expect(res.body.issues[0].path).toBe('file');
      await unchanged();
    });

    it('an oversized file streamed without a length → 413 before it has all arrived', async () => {
      expect(await streamUpload(40 * 1024 * 1024, librarian)).toBe(413);
      await unchanged();
    });

    it('no file field, a JSON body, a bad revision label, a designer, an unknown part', async () => {
      const noFile = await request(appUrl())
        .post(`/api/parts/${partId}/datasheets`)
        .set('Cookie', librarian)
        .set('Origin', appUrl())
        .field('revision', 'A');
      expect(noFile.status).toBe(400);
      const json = await request(appUrl())
        .post(`/api/parts/${partId}/datasheets`)
        .set('Cookie', librarian)
        .set('Content-Type', 'application/json')
        .send('{}');
      expect(json.status).toBe(415);
      const badRevision = await upload(await makePdf('rev'), 'rev.pdf', librarian, '<script>');
      expect(badRevision.status).toBe(400);
      expect(badRevision.body.issues[0].path).toBe('revision');
      expect((await upload(await makePdf('designer'), 'd.pdf', await sessionCookie('designer'))).status).toBe(403);
      const unknown = await request(appUrl())
        .post('/api/parts/99999999/datasheets')
        .set('Cookie', librarian)
        .set('Origin', appUrl())
        .attach('file', await makePdf('x'), 'x.pdf');
      expect(unknown.status).toBe(404);
      await unchanged();
    });
  });
});

describe('the text check on attach', () => {
  const latestAudit = async () =>
    knex('audit_events').where({ entity_type: 'part', entity_id: partId, action: 'datasheet.add' }).orderBy('id', 'desc').first();
  const remove = (id: number) =>
    request(appUrl()).delete(`/api/datasheets/${id}`).set('Cookie', librarian).set('Content-Type', 'application/json');

  it("a diode's datasheet on the MOSFET → 409 naming the missing part number and the other kind; confirm=true attaches it, audited", async () => {
    // Hand-written: an invented rectifier's sheet, as issue 14 met it.
    const diodeSheet = await makePdf('forward voltage 0.5 V at 2 A', 2, 'ORS20-40-MA Schottky barrier rectifier, 40 V, 2 A');
    const before = { rows: await rows(), files: await files() };
    const asked = await upload(diodeSheet, 'ORS20-40-MA.pdf');
    expect(asked.status, JSON.stringify(asked.body)).toBe(409);
    expect(asked.body.error).toMatch(/may not be the datasheet of CWN30L02-S3/);
    expect(asked.body.error).toMatch(/attach it anyway/);
    expect(asked.body.issues).toEqual([
      { path: 'file', message: 'the part number CWN30L02-S3 does not occur on pages 1–2' },
      { path: 'file', message: 'it reads as a diode datasheet (“Schottky”, “rectifier”) and never names a MOSFET' },
    ]);
    expect(asked.body.confirmation).toEqual({
      needed: true,
      field: 'confirm',
      problems: ['part-number-missing', 'other-kind'],
      mpn: MPN,
      mpnFound: false,
      textFound: true,
      pagesRead: 2,
      otherKind: { category: 'diode', words: ['Schottky', 'rectifier'] },
    });
    expect(await rows()).toBe(before.rows);
    expect(await files()).toEqual(before.files);

    const confirmed = await upload(diodeSheet, 'ORS20-40-MA.pdf', librarian, '', 'true');
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(201);
    const audit = await latestAudit();
    expect(JSON.parse(audit.after_json)).toMatchObject({
      datasheet: { id: confirmed.body.id },
      textCheck: { confirmed: true, problems: ['part-number-missing', 'other-kind'], mpnFound: false },
    });
    expect(audit.note).toBe(
      'Attached after confirming: the part number CWN30L02-S3 does not occur on pages 1–2; it reads as a diode datasheet (“Schottky”, “rectifier”) and never names a MOSFET',
    );
    await remove(confirmed.body.id);
  });

  it('a PDF with no text (drawings only, as a scan) → 409 "no text found"; confirm=true attaches it', async () => {
    const doc = await PDFDocument.create();
    doc.addPage([595, 842]).drawRectangle({ x: 40, y: 40, width: 500, height: 700, borderWidth: 2 });
    const scan = Buffer.from(await doc.save());
    const asked = await upload(scan, 'scan.pdf');
    expect(asked.status, JSON.stringify(asked.body)).toBe(409);
    expect(asked.body.error).toMatch(/^No text found in this PDF/);
    expect(asked.body.issues).toEqual([
      { path: 'file', message: 'no text found on page 1 (a scanned sheet?), so it cannot be checked against CWN30L02-S3' },
    ]);
    expect(asked.body.confirmation).toMatchObject({ problems: ['no-text'], textFound: false });
    const confirmed = await upload(scan, 'scan.pdf', librarian, undefined, 'true');
    expect(confirmed.status).toBe(201);
    expect(JSON.parse((await latestAudit()).after_json).textCheck).toMatchObject({ confirmed: true, problems: ['no-text'] });
    await remove(confirmed.body.id);
  });

  it('text in a font with a ToUnicode CMap is read: the part number there attaches at once, another one asks', async () => {
    const own = await pdfWithCMapFont(['cwn30l02 s3', 'N-channel MOSFET, 30 V (invented)']);
    const ok = await upload(own, 'cmap.pdf');
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(JSON.parse((await latestAudit()).after_json).textCheck).toEqual({
      problems: [],
      confirmed: false,
      mpnFound: true,
      textFound: true,
      pagesRead: 1,
      otherKind: null,
    });
    expect((await latestAudit()).note).toBeNull();
    await remove(ok.body.id);

    const other = await pdfWithCMapFont(['MQN20T06-S3', 'N-channel MOSFET, 20 V (invented)']);
    const asked = await upload(other, 'other.pdf');
    expect(asked.status).toBe(409);
    expect(asked.body.confirmation.problems).toEqual(['part-number-missing']);
  });

  it('the part number set with an en dash and in lower case still counts', async () => {
    const res = await upload(await makePdf('dash', 1, 'cwn30l02\u2013s3 MOSFET'), 'dash.pdf');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    await remove(res.body.id);
  });

  it('confirm must be "true", "false" or left out → 400 naming confirm; "false" asks as if left out', async () => {
    const sheet = await makePdf('unrelated', 1, 'Some other invented sheet');
    const bad = await upload(sheet, 'x.pdf', librarian, undefined, 'yes please');
    expect(bad.status).toBe(400);
    expect(bad.body.issues[0].path).toBe('confirm');
    expect((await upload(sheet, 'x.pdf', librarian, undefined, 'false')).status).toBe(409);
  });

  it("the demo's sample datasheets (scripts/make-sample-datasheets.ts) attach to their parts without a question", async () => {
    for (const part of sampleDatasheetParts()) {
      const id = (await knex('parts').where({ mpn: part.mpn }).first('id')).id;
      const res = await upload(await makeDatasheetPdf(part), `${part.mpn}.pdf`, librarian, undefined, undefined, id);
      expect(res.status, `${part.mpn}: ${JSON.stringify(res.body)}`).toBe(201);
      await remove(res.body.id);
    }
  });
});

describe('GET and DELETE /api/datasheets/:id', () => {
  it('needs a sign-in to download; librarians remove (record and file), others may not', async () => {
    const created = (await upload(await makePdf('to remove'), 'remove-me.pdf')).body;
    const key = (await knex('datasheets').where({ id: created.id }).first()).storage_key;
    expect((await request(appUrl()).get(`/api/datasheets/${created.id}`)).status).toBe(401);
    expect(
      (
        await request(appUrl())
          .delete(`/api/datasheets/${created.id}`)
          .set('Cookie', await sessionCookie('buyer'))
          .set('Content-Type', 'application/json')
      ).status,
    ).toBe(403);
    expect(
      (await request(appUrl()).delete(`/api/datasheets/${created.id}`).set('Cookie', librarian).set('Content-Type', 'application/json'))
        .status,
    ).toBe(204);
    expect(await files()).not.toContain(key);
    expect((await request(appUrl()).get(`/api/datasheets/${created.id}`).set('Cookie', librarian)).status).toBe(404);
  });
});
