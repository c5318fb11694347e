/** Stored objects still to be deleted (see the blob_deletions migration). */
import type { Db } from '../db.ts';

export type StoreKind = 'local' | 's3';

/** Inside the caller's transaction (the one removing the record): the object is to be deleted. */
export async function insertBlobDeletion(trx: Db, store: StoreKind, storageKey: string): Promise<number> {
  const [id] = await trx('blob_deletions').insert({ store, storage_key: storageKey });
  return Number(id);
}

/** The key held by this claim, or null when the row is gone or taken meanwhile. */
export async function claimedBlobDeletion(
  db: Db,
  id: number,
  token: string,
): Promise<{ id: number; storageKey: string; attempts: number } | null> {
  const row = await db('blob_deletions').where({ id, claimed_by: token }).first('id', 'storage_key', 'attempts');
  return row ? { id: row.id as number, storageKey: row.storage_key as string, attempts: row.attempts as number } : null;
}

/** The object is gone: the row goes, only by the holder of its claim. */
export async function finishBlobDeletion(db: Db, id: number, token: string): Promise<boolean> {
  return Number(await db('blob_deletions').where({ id, claimed_by: token }).delete()) === 1;
}

export async function blobDeletionIdByKey(db: Db, store: StoreKind, storageKey: string): Promise<number | null> {
  const row = await db('blob_deletions').where({ store, storage_key: storageKey }).first('id');
  return row ? (row.id as number) : null;
}
