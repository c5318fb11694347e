/** Idempotency records of committed CSV imports. */
import type { Db } from '../db.ts';

export interface DbImportRequestRow {
  id: number;
  idempotency_key: string;
  user_id: number | null;
  request_sha256: string;
  rows_imported: number;
  result_json: string | null;
  created_at: Date;
}

export interface StoredImport {
  requestSha256: string;
  rowsImported: number;
  result: unknown;
}

export async function findImportRequest(db: Db, key: string): Promise<StoredImport | null> {
  const row = await db<DbImportRequestRow>('import_requests').where({ idempotency_key: key }).first();
  if (!row) return null;
  return {
    requestSha256: row.request_sha256,
    rowsImported: row.rows_imported,
    result: row.result_json ? JSON.parse(row.result_json) : null,
  };
}

/** Claims the key inside the caller's transaction; a concurrent claim of the same key waits, then fails as a duplicate. */
export async function claimImportKey(db: Db, key: string, userId: number, sha256: string): Promise<void> {
  await db('import_requests').insert({ idempotency_key: key, user_id: userId, request_sha256: sha256 });
}

export async function completeImportRequest(db: Db, key: string, rowsImported: number, result: unknown): Promise<void> {
  await db('import_requests')
    .where({ idempotency_key: key })
    .update({ rows_imported: rowsImported, result_json: JSON.stringify(result) });
}
