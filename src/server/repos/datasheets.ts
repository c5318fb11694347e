/** Datasheet records (the files themselves sit in the datasheet store under storage_key). */
import type { Db } from '../db.ts';

export interface DbDatasheetRow {
  id: number;
  part_id: number;
  original_name: string;
  storage_key: string;
  sha256: string;
  bytes: number;
  pages: number;
  revision: string | null;
  uploaded_by: number | null;
  uploaded_at: Date;
}

export interface DatasheetRecord {
  id: number;
  partId: number;
  originalName: string;
  storageKey: string;
  sha256: string;
  bytes: number;
  pages: number;
  revision: string | null;
  uploadedBy: string | null;
  uploadedAt: string;
}

export type NewDatasheet = Omit<DatasheetRecord, 'id' | 'uploadedBy' | 'uploadedAt'> & { uploadedByUserId: number | null };

function fromRow(r: DbDatasheetRow & { uploader_name?: string | null }): DatasheetRecord {
  return {
    id: r.id,
    partId: r.part_id,
    originalName: r.original_name,
    storageKey: r.storage_key,
    sha256: r.sha256,
    bytes: r.bytes,
    pages: r.pages,
    revision: r.revision,
    uploadedBy: r.uploader_name ?? null,
    uploadedAt: new Date(r.uploaded_at).toISOString(),
  };
}

const withUploader = (db: Db) =>
  db('datasheets as s').leftJoin('users as u', 'u.id', 's.uploaded_by').select('s.*', 'u.name as uploader_name');

export async function insertDatasheet(db: Db, d: NewDatasheet): Promise<number> {
  const [id] = await db('datasheets').insert({
    part_id: d.partId,
    original_name: d.originalName,
    storage_key: d.storageKey,
    sha256: d.sha256,
    bytes: d.bytes,
    pages: d.pages,
    revision: d.revision,
    uploaded_by: d.uploadedByUserId,
  });
  return id;
}

export async function findDatasheet(db: Db, id: number): Promise<DatasheetRecord | null> {
  const row = await withUploader(db).where('s.id', id).first();
  return row ? fromRow(row) : null;
}

export async function findDatasheetBySha(db: Db, partId: number, sha256: string): Promise<DatasheetRecord | null> {
  const row = await withUploader(db).where({ 's.part_id': partId, 's.sha256': sha256 }).first();
  return row ? fromRow(row) : null;
}

export async function listDatasheets(db: Db, partId: number): Promise<DatasheetRecord[]> {
  const rows = await withUploader(db)
    .where('s.part_id', partId)
    .orderBy([
      { column: 's.uploaded_at', order: 'desc' },
      { column: 's.id', order: 'desc' },
    ]);
  return rows.map(fromRow);
}

export async function deleteDatasheetRow(db: Db, id: number): Promise<void> {
  await db('datasheets').where({ id }).delete();
}
