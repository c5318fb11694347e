/**
 * Text read from a PDF's first pages by the inspection worker (src/server/services/pdf-text-source.ts),
 * on PDFs made by hand here: one written byte by byte (literal strings with escapes, hex strings, TJ gaps,
 * the ' and " operators, an inline image, a form XObject), one built from pdf-lib's low-level objects with
 * hand-written ToUnicode CMaps (bfchar, bfrange with a start code and with an array, a two-byte codespace,
 * a surrogate pair), a page with no text, and a long document of which only the first pages are read.
 * Every expected text is written out by hand from the content streams below, not taken from the reader.
 */
import { createDeflate } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { PDFDocument, PDFName, PDFString, StandardFonts, rgb } from 'pdf-lib';
import { inspectPdf, PDF_INSPECTION_BUDGET } from '../../src/server/services/pdf-inspection.ts';

/** A PDF file from its numbered objects (1 = catalog), with a correct cross-reference table. */
function handWrittenPdf(objects: string[]): Buffer {
  const parts: Buffer[] = [];
  const offsets: number[] = [];
  let at = 0;
  const add = (s: string): void => {
    const b = Buffer.from(s, 'latin1');
    parts.push(b);
    at += b.length;
  };
  add('%PDF-1.4\n');
  objects.forEach((body, i) => {
    offsets.push(at);
    add(`${i + 1} 0 obj\n${body}\nendobj\n`);
  });
  const xref = at;
  add(`xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map((o) => `${String(o).padStart(10, '0')} 00000 n \n`).join('')}`);
  add(`trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`);
  return Buffer.concat(parts);
}

const stream = (dict: string, content: string): string =>
  `<< ${dict} /Length ${Buffer.byteLength(content, 'latin1')} >>\nstream\n${content}\nendstream`;

/** Deflates `before`, then `megabytes` MB of spaces, without ever holding the spaces whole. */
function deflatedSpaces(before: string, megabytes: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const z = createDeflate({ level: 9 });
    const out: Buffer[] = [];
    z.on('data', (c: Buffer) => out.push(c));
    z.on('end', () => resolve(Buffer.concat(out)));
    z.on('error', reject);
    z.write(before);
    const mb = Buffer.alloc(1024 * 1024, 0x20);
    let left = megabytes;
    const pump = (): void => {
      while (left > 0) {
        left--;
        if (!z.write(mb)) return void z.once('drain', pump);
      }
      z.end();
    };
    pump();
  });
}

async function textOf(bytes: Uint8Array) {
  const result = await inspectPdf(bytes);
  if (!result.ok) throw new Error(`inspection refused the file: ${result.reason} ${result.detail ?? ''}`);
  return result.text;
}

describe('text of the first pages', () => {
  it('reads literal and hex strings, escapes, TJ gaps, the quote operators and a form XObject; skips comments and inline images', async () => {
    const content = [
      '% (a comment, not text) Tj',
      'BT',
      '/F1 12 Tf',
      '50 700 Td',
      String.raw`(Part \(rev. 2\): KX\1017-Q) Tj`,
      '0 -14 Td',
      '[(Drain) -300 (source) 20 (volt) -50 (age)] TJ',
      "(next line) '",
      String.raw`1 0 (back\\slash) "`,
      '0 -14 Td',
      String.raw`<4D4F53 46> Tj ( A\205B) Tj`,
      'ET',
      'BI /W 2 /H 1 /BPC 8 /CS /G ID \x01) EI',
      '/X1 Do',
    ].join('\n');
    const form = 'BT /F1 10 Tf 1 0 0 1 50 600 Tm (in a form) Tj ET';
    const pdf = handWrittenPdf([
      '<< /Type /Catalog /Pages 2 0 R >>',
      '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
      '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Resources << /Font << /F1 4 0 R >> /XObject << /X1 6 0 R >> >> /Contents 5 0 R >>',
      '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
      stream('', content),
      stream('/Type /XObject /Subtype /Form /BBox [0 0 595 842]', form),
    ]);
    const text = await textOf(pdf);
    // By hand: \( \) are parentheses, \101 is octal 65 "A"; -300 in TJ is a word gap (over 0.18 em), 20 and
    // -50 are kerning; ' and " start a new line; hex 4D 4F 53 46 is "MOSF"; \205 is 0x85, the en dash
    // U+2013 in PDFDocEncoding (PDF specification, Annex D; from memory); the form XObject's text comes last.
    expect(text.text).toBe('Part (rev. 2): KXA7-Q\nDrain sourcevoltage\nnext line\nback\\slash\nMOSF A\u2013B\nin a form');
    expect(text).toMatchObject({ pagesRead: 1, truncated: false });
  });

  it("honours a font's ToUnicode CMap: bfchar, bfrange with a start code and with an array, two-byte codes, a surrogate pair", async () => {
    const doc = await PDFDocument.create();
    const page = doc.addPage([595, 842]);
    const ctx = doc.context;
    const oneByteCMap = [
      '/CIDInit /ProcSet findresource begin 12 dict begin begincmap',
      '/CIDSystemInfo << /Registry (Adobe) /Ordering (UCS) /Supplement 0 >> def',
      '1 begincodespacerange <00> <FF> endcodespacerange',
      '2 beginbfchar <01> <0051> <02> <002D> endbfchar',
      '1 beginbfrange <10> <19> <0030> endbfrange',
      '1 beginbfrange <20> <22> [<004B> <0058> <03A9>] endbfrange',
      'endcmap CMapName currentdict /CMap defineresource pop end end',
    ].join('\n');
    // Written the way pdf-lib writes its own (no space inside the codespace pair).
    const twoByteCMap = [
      'begincmap 1 begincodespacerange\n<0000><ffff>\nendcodespacerange',
      '1 beginbfrange <0100> <0105> <0041> endbfrange',
      '1 beginbfchar <0200> <D835DC00> endbfchar endcmap',
    ].join('\n');
    const simple = ctx.register(
      ctx.obj({ Type: 'Font', Subtype: 'Type1', BaseFont: 'Helvetica', ToUnicode: ctx.register(ctx.flateStream(oneByteCMap)) }),
    );
    const cidFont = (toUnicode: boolean) =>
      ctx.register(
        ctx.obj({
          Type: 'Font',
          Subtype: 'Type0',
          BaseFont: 'HandMade',
          Encoding: 'Identity-H',
          DescendantFonts: [
            ctx.obj({
              Type: 'Font',
              Subtype: 'CIDFontType2',
              BaseFont: 'HandMade',
              CIDSystemInfo: { Registry: PDFString.of('Adobe'), Ordering: PDFString.of('Identity'), Supplement: 0 },
            }),
          ],
          ...(toUnicode ? { ToUnicode: ctx.register(ctx.flateStream(twoByteCMap)) } : {}),
        }),
      );
    page.node.set(PDFName.of('Resources'), ctx.obj({ Font: { F2: simple, F3: cidFont(true), F4: cidFont(false) } }));
    const content = [
      'BT /F2 12 Tf 50 700 Td <20 21 13 10 01 02 15 19 22> Tj (ok) Tj',
      '0 -20 Td /F3 12 Tf <0100 0102 0105 0200> Tj',
      '0 -20 Td /F4 12 Tf <00010002> Tj ET',
    ].join('\n');
    page.node.set(PDFName.of('Contents'), ctx.register(ctx.flateStream(content)));
    const text = await textOf(await doc.save());
    // By hand from the CMaps: 20 21 → K X (array), 13 10 → 3 0 (range from U+0030), 01 02 → Q - (bfchar),
    // 15 19 → 5 9, 22 → Ω (U+03A9); "ok" has codes the CMap lacks (o 6F, k 6B), read as PDFDocEncoding; 0100 0102 0105 →
    // A C F (range from U+0041), 0200 → U+1D400 (surrogates D835 DC00); F4 has no ToUnicode: its glyph ids give nothing.
    expect(text.text).toBe('KX30Q-59\u03a9ok\nACF\u{1d400}');
  });

  it('a page with drawings only (as a scan) gives no text', async () => {
    const doc = await PDFDocument.create();
    doc.addPage([595, 842]).drawRectangle({ x: 50, y: 50, width: 400, height: 600, color: rgb(0.5, 0.5, 0.5) });
    expect(await textOf(await doc.save())).toEqual({ text: '', pagesRead: 1, truncated: false });
  });

  it(`reads only the first ${PDF_INSPECTION_BUDGET.textPages} pages and says the text was cut`, async () => {
    const doc = await PDFDocument.create();
    const font = await doc.embedFont(StandardFonts.Helvetica);
    for (let i = 1; i <= 5; i++) doc.addPage([595, 842]).drawText(`page ${i}`, { x: 50, y: 700, size: 12, font });
    expect(PDF_INSPECTION_BUDGET.textPages).toBe(3);
    expect(await textOf(await doc.save())).toEqual({ text: 'page 1\npage 2\npage 3', pagesRead: 3, truncated: true });
  });

  it('a content stream longer than the decoded-bytes budget is read only up to the budget', async () => {
    const doc = await PDFDocument.create();
    const page = doc.addPage([595, 842]);
    const ctx = doc.context;
    page.node.set(
      PDFName.of('Resources'),
      ctx.obj({ Font: { F1: ctx.register(ctx.obj({ Type: 'Font', Subtype: 'Type1', BaseFont: 'Helvetica' })) } }),
    );
    // 8 MB of path operators (twice the budget) after the text: packs to a few KiB.
    const content = `BT /F1 12 Tf 50 700 Td (MQN20T06-S3) Tj ET\n${'0 0 m 1 1 l S\n'.repeat(600_000)}BT (after the budget) Tj ET`;
    page.node.set(PDFName.of('Contents'), ctx.register(ctx.flateStream(content)));
    expect(await textOf(await doc.save())).toEqual({ text: 'MQN20T06-S3', pagesRead: 1, truncated: true });
  });

  it('a content stream that unpacks to more than the worker heap (512 MB of spaces) is read only up to the budget, not refused', async () => {
    const packed = await deflatedSpaces('BT /F1 12 Tf 50 700 Td (ORS20-40-MA) Tj ET\n', 512);
    expect(512).toBeGreaterThan(PDF_INSPECTION_BUDGET.heapMb);
    const pdf = handWrittenPdf([
      '<< /Type /Catalog /Pages 2 0 R >>',
      '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
      '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Resources << /Font << /F1 4 0 R >> >> /Contents 5 0 R >>',
      '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
      stream('/Filter /FlateDecode', packed.toString('latin1')),
    ]);
    expect(await textOf(pdf)).toEqual({ text: 'ORS20-40-MA', pagesRead: 1, truncated: true });
  });
});
