/**
 * Datasheet PDFs: checked by their bytes, SHA-256 taken and a duplicate refused before any parsing, then
 * inspected within a budget (worker thread: validity, page count), stored under a generated name in the
 * datasheet store, recorded in the audit trail.
 */
import { createHash, randomUUID } from 'node:crypto';
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import { datasheetRevisionSchema, type DatasheetView } from '../../lib/schemas/parts.ts';
import { deleteDatasheetRow, findDatasheet, findDatasheetBySha, insertDatasheet, type DatasheetRecord } from '../repos/datasheets.ts';
import { findPartRow } from '../repos/part-writes.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { datasheetStore } from '../storage/index.ts';
import { notFound, ServiceError } from './errors.ts';
import { inspectPdf, PDF_INSPECTION_BUDGET } from './pdf-inspection.ts';

export const MAX_DATASHEET_BYTES = 20 * 1024 * 1024;
const PDF_MAGIC = [0x25, 0x50, 0x44, 0x46, 0x2d]; // "%PDF-"

/** The original name reduced to a harmless base name ending in .pdf (never used as a storage path). */
export function safePdfName(name: string): string {
  const base = (name.split(/[\\/]/).pop() ?? '').normalize('NFKC');
  let s = base
    .replace(/[\p{Cc}\p{Cf}"<>:|?*;]/gu, '')
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/^[.\s]+/, '');
  s = s.replace(/\.pdf$/i, '').replace(/[.\s]+$/, '');
  if (s === '') s = 'datasheet';
  return `${s.slice(0, 110)}.pdf`;
}

function view(r: DatasheetRecord): DatasheetView {
  const { storageKey: _key, partId: _part, ...rest } = r;
  return rest;
}

function checkMagic(bytes: Uint8Array): void {
  if (!PDF_MAGIC.every((b, i) => bytes[i] === b))
    throw new ServiceError(415, 'Only PDF datasheets are accepted; this file is not a PDF.', [
      { path: 'file', message: 'does not start with %PDF-' },
    ]);
}

/** The page count from the bounded inspection (src/server/services/pdf-inspection.ts), or a refusal naming the file. */
async function pageCount(bytes: Uint8Array): Promise<number> {
  const result = await inspectPdf(bytes);
  if (result.ok) return result.pages;
  const { heapMb, deadlineMs, unpackedBytes } = PDF_INSPECTION_BUDGET;
  switch (result.reason) {
    case 'unpacked-too-large':
      throw new ServiceError(413, 'The PDF unpacks to more than Stallpoint inspects; it was not stored.', [
        { path: 'file', message: `its object streams unpack to more than ${unpackedBytes / 1024 / 1024} MB` },
      ]);
    case 'out-of-memory':
      throw new ServiceError(413, 'Reading this PDF needs more memory than Stallpoint allows; it was not stored.', [
        { path: 'file', message: `needs more than ${heapMb} MB to read` },
      ]);
    case 'too-slow':
      throw new ServiceError(413, 'Reading this PDF takes longer than Stallpoint allows; it was not stored.', [
        { path: 'file', message: `not read within ${deadlineMs / 1000} s` },
      ]);
    default:
      throw new ServiceError(415, 'The file starts like a PDF but could not be read as one.', [
        { path: 'file', message: result.reason === 'no-pages' ? 'a PDF without pages' : 'not a readable PDF' },
      ]);
  }
}

export interface DatasheetUpload {
  name: string;
  bytes: Uint8Array;
  revision: string;
}

export async function addDatasheet(user: SessionUser, partId: number, upload: DatasheetUpload): Promise<DatasheetView> {
  if (!(await findPartRow(db(), partId))) throw notFound('The part');
  const revision = datasheetRevisionSchema.safeParse(upload.revision);
  if (!revision.success)
    throw new ServiceError(400, 'The revision label is not valid.', [{ path: 'revision', message: revision.error.issues[0].message }]);
  if (upload.bytes.byteLength === 0) throw new ServiceError(400, 'The file is empty.', [{ path: 'file', message: '0 bytes' }]);
  if (upload.bytes.byteLength > MAX_DATASHEET_BYTES)
    throw new ServiceError(413, 'The file is larger than 20 MB.', [{ path: 'file', message: `at most ${MAX_DATASHEET_BYTES} bytes` }]);
  checkMagic(upload.bytes);
  // Hash and duplicate check first: a file already attached is never parsed again.
  const sha256 = createHash('sha256').update(upload.bytes).digest('hex');
  const duplicate = await findDatasheetBySha(db(), partId, sha256);
  if (duplicate)
    throw new ServiceError(409, 'This exact file is already attached to the part.', [
      { path: 'file', message: `same SHA-256 as datasheet ${duplicate.id}` },
    ]);
  const pages = await pageCount(upload.bytes);
  const storageKey = `${randomUUID()}.pdf`;
  await datasheetStore().put(storageKey, upload.bytes);
  try {
    const id = await db().transaction(async (trx) => {
      const newId = await insertDatasheet(trx, {
        partId,
        originalName: safePdfName(upload.name),
        storageKey,
        sha256,
        bytes: upload.bytes.byteLength,
        pages,
        revision: revision.data || null,
        uploadedByUserId: user.id,
      });
      await insertAuditEvent(trx, {
        actorUserId: user.id,
        action: 'datasheet.add',
        entityType: 'part',
        entityId: partId,
        before: null,
        after: { datasheet: { id: newId, name: safePdfName(upload.name), revision: revision.data || null, pages, sha256 } },
      });
      return newId;
    });
    return view((await findDatasheet(db(), id))!);
  } catch (err) {
    await datasheetStore().delete(storageKey);
    if ((err as { code?: string }).code === 'ER_DUP_ENTRY')
      throw new ServiceError(409, 'This exact file is already attached to the part.', [{ path: 'file', message: 'same SHA-256' }]);
    throw err;
  }
}

export async function removeDatasheet(user: SessionUser, id: number): Promise<void> {
  const sheet = await findDatasheet(db(), id);
  if (!sheet) throw notFound('The datasheet');
  await db().transaction(async (trx) => {
    await deleteDatasheetRow(trx, id);
    await insertAuditEvent(trx, {
      actorUserId: user.id,
      action: 'datasheet.remove',
      entityType: 'part',
      entityId: sheet.partId,
      before: { datasheet: { id, name: sheet.originalName, revision: sheet.revision, sha256: sheet.sha256 } },
      after: null,
    });
  });
  await datasheetStore().delete(sheet.storageKey);
}

export async function datasheetFile(id: number): Promise<{ name: string; bytes: Uint8Array }> {
  const sheet = await findDatasheet(db(), id);
  if (!sheet) throw notFound('The datasheet');
  const bytes = await datasheetStore().get(sheet.storageKey);
  if (!bytes) throw notFound('The datasheet file');
  return { name: sheet.originalName, bytes };
}

/** attachment; an ASCII fallback name and the exact UTF-8 name (RFC 6266 / RFC 8187). */
export function attachmentDisposition(name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}
