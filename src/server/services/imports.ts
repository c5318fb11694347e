/**
 * CSV import of parts (format: services/parts-csv.ts, README "CSV import and export").
 * preview: every row's outcome and errors, nothing written. commit: all rows in one transaction or none,
 * once per Idempotency-Key (a repeat replays the stored result; the same key with another file is a 409).
 * The rows are written with multi-row INSERTs (repos/part-bulk.ts) and their audit events likewise, so a
 * file costs a few dozen statements per 500 rows rather than a dozen per row.
 */
import { createHash } from 'node:crypto';
import { db, type Db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import { partInputSchema, type PartInput } from '../../lib/schemas/parts.ts';
import { BULK_CHUNK_ROWS, insertPartsBulk } from '../repos/part-bulk.ts';
import { findPartsByMpns, loadPartsByIds } from '../repos/part-writes.ts';
import { insertAuditEvents, type AuditEventInput } from '../repos/audit.ts';
import { claimImportKey, completeImportRequest, findImportRequest } from '../repos/import-requests.ts';
import { ServiceError } from './errors.ts';
import { readCsvRecords, type CsvRecord } from '../../lib/csv.ts';
import { CSV_COLUMNS, columnForPath, csvRowToInput } from './parts-csv.ts';
import { toNewPart } from './parts.ts';

export const MAX_IMPORT_BYTES = 2 * 1024 * 1024;
export const MAX_IMPORT_ROWS = 5000;
const REQUIRED_COLUMNS = ['category', 'manufacturer', 'mpn'];
export const IDEMPOTENCY_KEY_PATTERN = /^[A-Za-z0-9_.:-]{8,100}$/;

export interface ImportError {
  line: number;
  column: string;
  message: string;
}

export interface ImportRowResult {
  line: number;
  outcome: 'ready' | 'created' | 'invalid';
  category: string;
  manufacturer: string;
  mpn: string;
  partId?: number;
}

export interface ImportReport {
  mode: 'preview' | 'commit';
  rows: ImportRowResult[];
  errors: ImportError[];
  counts: { rows: number; ready: number; invalid: number; created: number };
  replayed?: boolean;
}

interface ParsedRow {
  line: number;
  input: PartInput | null;
  result: ImportRowResult;
}

function headerErrors(header: string[]): ImportError[] {
  const errors: ImportError[] = [];
  header.forEach((h) => {
    if (!CSV_COLUMNS.includes(h)) errors.push({ line: 1, column: h || '(empty)', message: 'unknown column' });
  });
  if (new Set(header).size !== header.length) errors.push({ line: 1, column: '(header)', message: 'a column name appears twice' });
  for (const c of REQUIRED_COLUMNS) if (!header.includes(c)) errors.push({ line: 1, column: c, message: 'required column is missing' });
  return errors;
}

function parseRow(header: string[], record: CsvRecord, errors: ImportError[]): ParsedRow {
  const cells = Object.fromEntries(header.map((h, i) => [h, record.cells[i] ?? '']));
  const result: ImportRowResult = {
    line: record.line,
    outcome: 'ready',
    category: cells.category ?? '',
    manufacturer: (cells.manufacturer ?? '').trim(),
    mpn: (cells.mpn ?? '').trim(),
  };
  const rowErrors: ImportError[] = [];
  if (record.cells.length !== header.length) {
    rowErrors.push({ line: record.line, column: '(row)', message: `has ${record.cells.length} fields, the header has ${header.length}` });
  }
  const read = csvRowToInput(cells);
  for (const e of read.errors) rowErrors.push({ line: record.line, ...e });
  const parsed = partInputSchema.safeParse(read.input);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const column = columnForPath(issue.path as (string | number)[]);
      if (!rowErrors.some((e) => e.column === column)) rowErrors.push({ line: record.line, column, message: issue.message });
    }
  }
  errors.push(...rowErrors);
  if (rowErrors.length > 0) return { line: record.line, input: null, result: { ...result, outcome: 'invalid' } };
  return { line: record.line, input: parsed.data!, result };
}

/** Flags rows whose maker and part number are already in the catalogue or earlier in the file. */
async function markDuplicates(k: Db, rows: ParsedRow[], errors: ImportError[]): Promise<void> {
  const key = (maker: string, mpn: string) => `${maker.toLowerCase()}\u0000${mpn.toLowerCase()}`;
  const mpns = rows.filter((r) => r.input).map((r) => r.input!.mpn);
  const existing = new Map<string, number>();
  for (const f of await findPartsByMpns(k, mpns)) existing.set(key(f.manufacturer, f.mpn), f.id);
  const seen = new Map<string, number>();
  for (const row of rows) {
    if (!row.input) continue;
    const k2 = key(row.input.manufacturer, row.input.mpn);
    const message = existing.has(k2)
      ? `already in the catalogue as part ${existing.get(k2)}`
      : seen.has(k2)
        ? `the same maker and part number as line ${seen.get(k2)}`
        : null;
    seen.set(k2, seen.get(k2) ?? row.line);
    if (message) {
      errors.push({ line: row.line, column: 'mpn', message });
      row.input = null;
      row.result.outcome = 'invalid';
    }
  }
}

async function analyse(k: Db, text: string): Promise<{ rows: ParsedRow[]; errors: ImportError[] }> {
  const records = readCsvRecords(text);
  if (records.length === 0) return { rows: [], errors: [{ line: 1, column: '(file)', message: 'the file is empty' }] };
  const header = records[0].cells.map((h) => h.trim());
  const errors = headerErrors(header);
  if (errors.length > 0) return { rows: [], errors };
  const data = records.slice(1);
  if (data.length === 0) return { rows: [], errors: [{ line: 2, column: '(file)', message: 'no part rows under the header' }] };
  if (data.length > MAX_IMPORT_ROWS)
    return {
      rows: [],
      errors: [{ line: data[MAX_IMPORT_ROWS].line, column: '(file)', message: `more than ${MAX_IMPORT_ROWS} rows; split the file` }],
    };
  const rows = data.map((r) => parseRow(header, r, errors));
  await markDuplicates(k, rows, errors);
  errors.sort((a, b) => a.line - b.line);
  return { rows, errors };
}

function report(mode: ImportReport['mode'], rows: ParsedRow[], errors: ImportError[]): ImportReport {
  const results = rows.map((r) => r.result);
  const count = (o: ImportRowResult['outcome']) => results.filter((r) => r.outcome === o).length;
  return {
    mode,
    rows: results,
    errors,
    counts: { rows: results.length, ready: count('ready'), invalid: count('invalid'), created: count('created') },
  };
}

/** Every row's outcome and errors; nothing is written. */
/** Checks a file without writing anything (who may import: the policy, librarians). */
export async function previewImport(text: string): Promise<ImportReport> {
  const { rows, errors } = await analyse(db(), text);
  return report('preview', rows, errors);
}

export class ImportRefused extends ServiceError {
  constructor(readonly report: ImportReport) {
    super(
      400,
      `The file has ${report.errors.length} problem(s); nothing was imported.`,
      report.errors.slice(0, 50).map((e) => ({ path: `line ${e.line}, ${e.column}`, message: e.message })),
      {},
      { ...report },
    );
  }
}

const sha256 = (text: string): string => createHash('sha256').update(text).digest('hex');

function replay(stored: { requestSha256: string; result: unknown }, digest: string): ImportReport {
  if (stored.requestSha256 !== digest) {
    throw new ServiceError(409, 'This Idempotency-Key was already used for a different file.', [
      { path: '(headers).idempotency-key', message: 'use a new key for a new file' },
    ]);
  }
  return { ...(stored.result as ImportReport), replayed: true };
}

/** Imports every row in one transaction, or nothing; the same key twice imports once. */
export async function commitImport(user: SessionUser, text: string, key: string): Promise<ImportReport> {
  const digest = sha256(text);
  const stored = await findImportRequest(db(), key);
  if (stored) return replay(stored, digest);
  try {
    return await db().transaction(async (trx) => {
      await claimImportKey(trx, key, user.id, digest);
      const { rows, errors } = await analyse(trx, text);
      if (errors.length > 0 || rows.length === 0) throw new ImportRefused(report('commit', rows, errors));
      const ids = await insertPartsBulk(
        trx,
        rows.map((row) => toNewPart(row.input!, row.input!.reviewStatus ?? 'pending')),
        user.id,
      );
      // The audit trail holds each part as stored (read back, as a single create does), per chunk of ids.
      const events: AuditEventInput[] = [];
      for (let i = 0; i < ids.length; i += BULK_CHUNK_ROWS) {
        const stored = await loadPartsByIds(trx, ids.slice(i, i + BULK_CHUNK_ROWS));
        stored.forEach((part, j) =>
          events.push({
            actorUserId: user.id,
            action: 'part.import',
            entityType: 'part',
            entityId: ids[i + j],
            before: null,
            after: part,
            note: `CSV import ${key}, line ${rows[i + j].line}`,
          }),
        );
      }
      await insertAuditEvents(trx, events);
      rows.forEach((row, i) => (row.result = { ...row.result, outcome: 'created', partId: ids[i] }));
      const done = report('commit', rows, []);
      await completeImportRequest(trx, key, rows.length, done);
      return done;
    });
  } catch (err) {
    if ((err as { code?: string }).code === 'ER_DUP_ENTRY') {
      const again = await findImportRequest(db(), key);
      if (again) return replay(again, digest);
    }
    throw err;
  }
}
