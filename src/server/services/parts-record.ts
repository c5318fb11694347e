/** Everything the part page shows about one part, assembled from the repos into view types. */
import { db } from '../db.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { diffStates, type DatasheetView, type HistoryEntry } from '../../lib/schemas/parts.ts';
import { describePartChanges } from '../../lib/part-diff.ts';
import { findPartRow, loadPart } from '../repos/part-writes.ts';
import { findPerson, listAuditEvents } from '../repos/audit.ts';
import { listDatasheets } from '../repos/datasheets.ts';
import { designsUsingPart } from '../repos/designs.ts';
import type { SessionUser } from '../auth/types.ts';
import { canSeePart } from './parts-access.ts';

export interface PartRecordView {
  part: Part;
  lifecycleNote: string | null;
  reviewNote: string | null;
  proposer: { id: number; name: string } | null;
  createdAt: string;
  updatedAt: string;
  datasheets: DatasheetView[];
  history: HistoryEntry[];
  whereUsed: { designId: number; designName: string; role: string; chosen: boolean; designStatus: string }[];
}

/**
 * The full record, or null when there is no such part or, when a viewer is given, the viewer may not see it
 * (canSeePart: another person's draft, proposal or rejected part reads as missing). Without a viewer the
 * caller applies its own rule (the edit page: partPermissions).
 */
export async function partRecord(id: number, viewer?: SessionUser | null): Promise<PartRecordView | null> {
  const k = db();
  const row = await findPartRow(k, id);
  if (!row) return null;
  if (viewer !== undefined && !canSeePart(viewer, { reviewStatus: row.review_status, createdBy: row.created_by })) return null;
  const [part, proposer, sheets, events, uses] = await Promise.all([
    loadPart(k, id),
    findPerson(k, row.created_by),
    listDatasheets(k, id),
    listAuditEvents(k, 'part', id),
    designsUsingPart(k, id),
  ]);
  if (!part) return null;
  return {
    part,
    lifecycleNote: row.lifecycle_note,
    reviewNote: row.review_note,
    proposer: proposer ? { id: proposer.id, name: proposer.name } : null,
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
    datasheets: sheets.map(({ storageKey: _key, partId: _part, ...rest }) => rest),
    whereUsed: uses.map((u) => ({ designId: u.id, designName: u.name, role: u.role, chosen: u.position === 0, designStatus: u.status })),
    history: events
      .map((e) => {
        const snapshots = isPartSnapshot(e.before) && isPartSnapshot(e.after);
        return {
          id: e.id,
          occurredAt: e.occurredAt,
          actor: e.actorName,
          action: e.action,
          note: e.note,
          changes: e.before && e.after ? diffStates(e.before, e.after) : [],
          groups: snapshots ? describePartChanges(e.before as Part, e.after as Part) : [],
        };
      })
      // An edit that changed nothing (saved before such saves were skipped) is no entry.
      .filter((h) => !(h.action === 'part.update' && h.changes.length === 0)),
  };
}

/** An audit snapshot of a whole part (datasheet events carry other shapes). */
function isPartSnapshot(x: unknown): x is Part {
  return !!x && typeof x === 'object' && 'category' in x && 'params' in x && 'sources' in x;
}
