/**
 * The design as a versioned entity: how its row is locked and what the audit trail records of it
 * (name, status and current revision). Every design change goes through withLockedVersion with this.
 */
import { findDesignRow, lockDesignRow, type DbDesignRow } from '../repos/designs.ts';
import type { VersionedEntity } from '../repos/versioned.ts';
import { ServiceError, notFound } from './errors.ts';

export interface DesignSnapshot {
  name: string;
  status: DbDesignRow['status'];
  revision: number;
}

export const staleDesign = (current: number): ServiceError =>
  new ServiceError(409, 'This design was changed after you loaded it. Reload to see the change, then apply yours again.', [
    { path: 'version', message: `the design is now at version ${current}` },
  ]);

export const DESIGN_ENTITY: VersionedEntity<DbDesignRow, DesignSnapshot> = {
  entityType: 'design',
  lock: lockDesignRow,
  async snapshot(trx, id) {
    const row = await findDesignRow(trx, id);
    return row ? { name: row.name, status: row.status, revision: row.current_revision } : null;
  },
  notFound: () => notFound('The design'),
  stale: staleDesign,
};

/** Nothing a person would call a change: the same name, status and revision. */
export const sameDesign = (before: DesignSnapshot | null, after: DesignSnapshot | null): boolean =>
  before !== null && after !== null && before.name === after.name && before.status === after.status && before.revision === after.revision;
