/**
 * The one shape of a versioned write: in a transaction, lock the row, refuse when it is gone or its
 * version is not the one the caller loaded, take the before-snapshot, change, take the after-snapshot,
 * write the audit event. Services say what the change is; this says how every change is made.
 */
import { db, type Db } from '../db.ts';
import { insertAuditEvent } from './audit.ts';
import type { ServiceError } from '../services/errors.ts';

export interface VersionedEntity<Row extends { version: number }, Snapshot> {
  /** 'part', 'design': the audit entity type. */
  entityType: string;
  lock(trx: Db, id: number): Promise<Row | null | undefined>;
  snapshot(trx: Db, id: number): Promise<Snapshot | null>;
  notFound(): ServiceError;
  stale(currentVersion: number): ServiceError;
}

export interface VersionedChange<Row, Snapshot, T> {
  id: number;
  /** The version the caller loaded; null skips the check (a delete without a version). */
  expectedVersion: number | null;
  actorUserId: number | null;
  /** The audit action ('part.lifecycle'); a function when it depends on the change's result. */
  action: string | ((result: T) => string);
  note?: string | null | ((result: T) => string | null);
  /** Refusals that depend on the locked row and come before the version check (permissions). */
  precheck?: (row: Row) => void;
  /** The change itself. Return what the caller needs; `deleted: true` records no after-snapshot. */
  apply(trx: Db, row: Row, before: Snapshot | null): Promise<T>;
  deleted?: boolean;
  /**
   * True when the change left the record as it was (a save with no edit): the transaction is rolled back,
   * nothing is written (no version bump, no audit event) and the result says `unchanged`.
   */
  unchanged?: (before: Snapshot | null, after: Snapshot | null) => boolean;
}

export interface VersionedResult<Row, Snapshot, T> {
  row: Row;
  before: Snapshot | null;
  after: Snapshot | null;
  result: T;
  /** The change was a no-op (see VersionedChange.unchanged): nothing was written and `after` is `before`. */
  unchanged?: boolean;
}

/** Carries a no-op's outcome out of the transaction it rolls back. */
class NoChange<R> {
  constructor(readonly outcome: R) {}
}

export async function withLockedVersion<Row extends { version: number }, Snapshot, T>(
  entity: VersionedEntity<Row, Snapshot>,
  change: VersionedChange<Row, Snapshot, T>,
): Promise<VersionedResult<Row, Snapshot, T>> {
  try {
    return await db().transaction(async (trx) => {
      const row = await entity.lock(trx, change.id);
      if (!row) throw entity.notFound();
      change.precheck?.(row);
      if (change.expectedVersion !== null && row.version !== change.expectedVersion) throw entity.stale(row.version);
      const before = await entity.snapshot(trx, change.id);
      const result = await change.apply(trx, row, before);
      const after = change.deleted ? null : await entity.snapshot(trx, change.id);
      if (change.unchanged?.(before, after)) throw new NoChange({ row, before, after: before, result, unchanged: true });
      await insertAuditEvent(trx, {
        actorUserId: change.actorUserId,
        action: typeof change.action === 'function' ? change.action(result) : change.action,
        entityType: entity.entityType,
        entityId: change.id,
        before,
        after,
        note: typeof change.note === 'function' ? change.note(result) : (change.note ?? null),
      });
      return { row, before, after, result };
    });
  } catch (err) {
    if (err instanceof NoChange) return err.outcome as VersionedResult<Row, Snapshot, T>;
    throw err;
  }
}
