/** Parts as a versioned entity for withLockedVersion: lock the row, snapshot the whole record. */
import type { Part } from '../../lib/domain/parts.ts';
import type { DbPartRow } from '../repos/part-rows.ts';
import { loadPart, lockPartRow } from '../repos/part-writes.ts';
import type { VersionedEntity } from '../repos/versioned.ts';
import { notFound, staleVersion } from './errors.ts';

export const PART_ENTITY: VersionedEntity<DbPartRow, Part> = {
  entityType: 'part',
  lock: lockPartRow,
  snapshot: loadPart,
  notFound: () => notFound('The part'),
  stale: staleVersion,
};
