/**
 * Datasheet PDFs: checked by their bytes, SHA-256 taken and a duplicate refused before any parsing, then
 * inspected within a budget (worker thread: validity, page count, text of the first pages), checked against
 * the part (src/lib/datasheet-text.ts: its part number in the text, no other kind of part named instead, any
 * text at all), stored under a generated name in the datasheet store, recorded in the audit trail.
 * A file that fails the text check answers 409 asking for confirmation; sent again with confirm=true it is
 * attached, and the audit records what was confirmed.
 */
import { createHash, randomUUID } from 'node:crypto';
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import { datasheetConfirmSchema, datasheetRevisionSchema, type DatasheetView } from '../../lib/schemas/parts.ts';
import { deleteDatasheetRow, findDatasheet, findDatasheetBySha, insertDatasheet, type DatasheetRecord } from '../repos/datasheets.ts';
import { findPartRow } from '../repos/part-writes.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { datasheetStore } from '../storage/index.ts';
import { appConfig } from '../config.ts';
import { insertBlobDeletion } from '../repos/blob-deletions.ts';
import { deletePendingBlobs } from './outbox.ts';
import { notFound, ServiceError } from './errors.ts';
import { inspectPdf, PDF_INSPECTION_BUDGET, type PdfText } from './pdf-inspection.ts';
import type { DbPartRow } from '../repos/part-rows.ts';
import {
  checkDatasheetText,
  datasheetTextProblems,
  KIND_NAMES,
  type DatasheetTextCheck,
  type DatasheetTextProblem,
} from '../../lib/datasheet-text.ts';

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

/** Page count and text from the bounded inspection (src/server/services/pdf-inspection.ts), or a refusal naming the file. */
async function inspect(bytes: Uint8Array): Promise<{ pages: number; text: PdfText }> {
  const result = await inspectPdf(bytes);
  if (result.ok) return { pages: result.pages, text: result.text };
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
  /** The form field "confirm": "true" attaches a file whose text does not fit the part. */
  confirm?: string;
}

/** What the text check found, as the 409 answer and the audit carry it. */
interface TextCheckRecord extends DatasheetTextCheck {
  problems: DatasheetTextProblem[];
  mpn: string;
  pagesRead: number;
  truncated: boolean;
}

const pagesWord = (n: number): string => (n <= 1 ? 'page 1' : `pages 1–${n}`);

/** One line per problem, naming what was (not) found. */
function problemLines(part: DbPartRow, check: TextCheckRecord): string[] {
  const where = pagesWord(check.pagesRead);
  return check.problems.map((p) => {
    if (p === 'no-text') return `no text found on ${where} (a scanned sheet?), so it cannot be checked against ${part.mpn}`;
    if (p === 'part-number-missing') return `the part number ${part.mpn} does not occur on ${where}`;
    const other = check.otherKind!;
    return `it reads as a ${KIND_NAMES[other.category]} datasheet (${other.words.map((w) => `“${w}”`).join(', ')}) and never names a ${KIND_NAMES[part.category]}`;
  });
}

function textCheck(part: DbPartRow, text: PdfText): TextCheckRecord {
  const check = checkDatasheetText({ mpn: part.mpn, category: part.category }, text.text);
  return { ...check, problems: datasheetTextProblems(check), mpn: part.mpn, pagesRead: text.pagesRead, truncated: text.truncated };
}

function confirmationNeeded(part: DbPartRow, check: TextCheckRecord): ServiceError {
  const lines = problemLines(part, check);
  const first = check.problems[0] === 'no-text' ? 'No text found in this PDF' : `This PDF may not be the datasheet of ${part.mpn}`;
  return new ServiceError(
    409,
    `${first}: ${lines.join('; ')}. Check the file; attach it anyway only if it is this ${KIND_NAMES[part.category]}'s datasheet.`,
    lines.map((message) => ({ path: 'file', message })),
    {},
    {
      confirmation: {
        needed: true,
        field: 'confirm',
        problems: check.problems,
        mpn: part.mpn,
        mpnFound: check.mpnFound,
        textFound: check.hasText,
        pagesRead: check.pagesRead,
        otherKind: check.otherKind,
      },
    },
  );
}

export async function addDatasheet(user: SessionUser, partId: number, upload: DatasheetUpload): Promise<DatasheetView> {
  const part = await findPartRow(db(), partId);
  if (!part) throw notFound('The part');
  const revision = datasheetRevisionSchema.safeParse(upload.revision);
  if (!revision.success)
    throw new ServiceError(400, 'The revision label is not valid.', [{ path: 'revision', message: revision.error.issues[0].message }]);
  const confirm = datasheetConfirmSchema.safeParse(upload.confirm ?? '');
  if (!confirm.success)
    throw new ServiceError(400, 'The confirm field is not valid.', [
      { path: 'confirm', message: 'send "true" to attach anyway, or leave it out' },
    ]);
  const confirmed = confirm.data === 'true';
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
  const { pages, text } = await inspect(upload.bytes);
  const check = textCheck(part, text);
  if (check.problems.length > 0 && !confirmed) throw confirmationNeeded(part, check);
  const confirmedDespite = check.problems.length > 0 ? problemLines(part, check) : [];
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
        after: {
          datasheet: { id: newId, name: safePdfName(upload.name), revision: revision.data || null, pages, sha256 },
          textCheck: {
            problems: check.problems,
            confirmed: check.problems.length > 0,
            mpnFound: check.mpnFound,
            textFound: check.hasText,
            pagesRead: check.pagesRead,
            otherKind: check.otherKind,
          },
        },
        note: confirmedDespite.length > 0 ? `Attached after confirming: ${confirmedDespite.join('; ')}` : undefined,
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

/**
 * Removes the datasheet's record and, in the same transaction, records its object as still to be deleted
 * (blob_deletions). After the commit the object is deleted at once; when the store does not answer the
 * record stays and the background outbox run retries (src/server/services/outbox.ts), so the removal
 * answers either way and no object is left without a record of it.
 */
export async function removeDatasheet(user: SessionUser, id: number): Promise<void> {
  const sheet = await findDatasheet(db(), id);
  if (!sheet) throw notFound('The datasheet');
  let deletionId = 0;
  await db().transaction(async (trx) => {
    await deleteDatasheetRow(trx, id);
    deletionId = await insertBlobDeletion(trx, appConfig().storage.kind, sheet.storageKey);
    await insertAuditEvent(trx, {
      actorUserId: user.id,
      action: 'datasheet.remove',
      entityType: 'part',
      entityId: sheet.partId,
      before: { datasheet: { id, name: sheet.originalName, revision: sheet.revision, sha256: sheet.sha256 } },
      after: null,
    });
  });
  await deletePendingBlobs({ onlyId: deletionId }).catch((err: unknown) =>
    console.error(`[stallpoint] deleting datasheet object ${sheet.storageKey} failed: ${err instanceof Error ? err.message : String(err)}`),
  );
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
