/**
 * Crafted PDFs for the upload tests (tests/api/datasheets.test.ts, tests/faults/memory.test.ts): small
 * files whose object stream unpacks to far more than they weigh (the "decompression bomb" shape).
 */
import { deflateSync } from 'node:zlib';

/**
 * A one-page PDF with an object stream (/Type /ObjStm, FlateDecode) whose content is `unpacked`: zlib
 * packs runs of one byte about 1000:1, so tens of MB fit in tens of KiB.
 */
export function pdfWithObjectStream(unpacked: Buffer): Buffer {
  const packed = deflateSync(unpacked, { level: 9 });
  const parts: Buffer[] = [];
  const offsets: number[] = [];
  let at = 0;
  const add = (s: string | Buffer): void => {
    const b = typeof s === 'string' ? Buffer.from(s, 'latin1') : s;
    parts.push(b);
    at += b.length;
  };
  add('%PDF-1.7\n');
  offsets[1] = at;
  add('1 0 obj\n<< /Type /Catalog /Pages 2 0 R >>\nendobj\n');
  offsets[2] = at;
  add('2 0 obj\n<< /Type /Pages /Kids [3 0 R] /Count 1 >>\nendobj\n');
  offsets[3] = at;
  add('3 0 obj\n<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] >>\nendobj\n');
  offsets[4] = at;
  add(`4 0 obj\n<< /Type /ObjStm /N 1 /First 5 /Filter /FlateDecode /Length ${packed.length} >>\nstream\n`);
  add(packed);
  add('\nendstream\nendobj\n');
  const xref = at;
  add(`xref\n0 5\n0000000000 65535 f \n${[1, 2, 3, 4].map((i) => `${String(offsets[i]).padStart(10, '0')} 00000 n \n`).join('')}`);
  add(`trailer\n<< /Size 5 /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`);
  return Buffer.concat(parts);
}

/** Unpacks to 64 MB of spaces: over the unpacking budget. */
export const spaceBomb = (): Buffer =>
  pdfWithObjectStream(Buffer.concat([Buffer.from('99 0 '), Buffer.alloc(64 * 1024 * 1024, 0x20), Buffer.from('<< >>')]));

/** Unpacks to 24 MB (within the unpacking budget) holding one array of 12 million numbers: over the memory budget. */
export const numberBomb = (): Buffer =>
  pdfWithObjectStream(Buffer.concat([Buffer.from('99 0 ['), Buffer.from('0 '.repeat(12 * 1024 * 1024)), Buffer.from(']')]));
