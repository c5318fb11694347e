/** What the catalogue pages need besides the part itself, as plain view values. */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { packagesByCategory } from '../repos/part-writes.ts';
import { listReviewQueue, type ReviewQueueItem } from '../repos/part-search.ts';
import { loadPartsByIds } from '../repos/part-writes.ts';
import { listDatasheets } from '../repos/datasheets.ts';
import { lastEditors, PART_CONTENT_ACTIONS } from '../repos/audit.ts';
import { closestParts, KEY_RATINGS } from '../repos/part-neighbours.ts';
import { quantity, sig } from '../../lib/units.ts';
import { canCurate, canManageSupply, canPropose, fourEyesApproval } from './parts-access.ts';

export async function searchPageData(
  user: SessionUser | null,
): Promise<{ packages: Record<string, string[]>; canCreate: boolean; canImport: boolean }> {
  return { packages: await packagesByCategory(db()), canCreate: canPropose(user), canImport: canCurate(user) };
}

export interface PartPermissions {
  edit: boolean;
  review: boolean;
  lifecycle: boolean;
  datasheets: boolean;
  supply: boolean;
  delete: boolean;
}

export function partPermissions(user: SessionUser | null, part: Part, proposerId: number | null): PartPermissions {
  const curator = canCurate(user);
  const ownProposal = !!user && proposerId === user.id && part.reviewStatus !== 'approved' && canPropose(user);
  return {
    edit: curator || ownProposal,
    review: curator && (part.reviewStatus === 'pending' || part.reviewStatus === 'draft'),
    lifecycle: curator,
    datasheets: curator,
    supply: canManageSupply(user),
    delete: curator,
  };
}

/** Parts waiting for review, oldest first, with who proposed them. */
export async function reviewQueue(): Promise<ReviewQueueItem[]> {
  return listReviewQueue(db());
}

export interface ReviewItemView extends ReviewQueueItem {
  part: Part;
  /** RDS(on) lines of a MOSFET as people read them ("32 mΩ max at VGS 2.5 V, Tj 25 °C, ID 5 A"). */
  rdsOn: string[];
  datasheets: { id: number; name: string; pages: number; revision: string | null }[];
  closest: { id: number; label: string; ratings: string }[];
  /** Why this person may not approve it (four-eyes rule), or null; `override` when an admin approves their own. */
  approveBlocked: string | null;
  override: boolean;
}

/** The review queue with what a reviewer checks before approving: parameters, datasheets, nearest existing parts. */
export async function reviewQueueView(user: SessionUser): Promise<ReviewItemView[]> {
  const k = db();
  const queue = await listReviewQueue(k);
  const ids = queue.map((q) => q.id);
  const [parts, editors, creators] = await Promise.all([
    loadPartsByIds(k, ids),
    lastEditors(k, 'part', ids, PART_CONTENT_ACTIONS),
    ids.length ? k('parts').whereIn('id', ids).select('id', 'created_by') : Promise.resolve([]),
  ]);
  const createdBy = new Map<number, number | null>(creators.map((r: { id: number; created_by: number | null }) => [r.id, r.created_by]));
  const byId = new Map(parts.map((p) => [p.id!, p]));
  return Promise.all(
    queue
      .filter((q) => byId.has(q.id))
      .map(async (q) => {
        const part = byId.get(q.id)!;
        const [sheets, near] = await Promise.all([listDatasheets(k, q.id), closestParts(k, q.id, part.category, part.package)]);
        const cols = KEY_RATINGS[part.category].columns;
        const four = fourEyesApproval(user, { createdBy: createdBy.get(q.id) ?? null, lastEditedBy: editors.get(q.id) ?? null });
        return {
          ...q,
          part,
          rdsOn:
            part.category === 'mosfet'
              ? part.params.rdsOn.map(
                  (r) =>
                    `${quantity(r.maxOhm * 1000, 'mΩ')} max at VGS ${quantity(r.vgsV, 'V')}, Tj ${quantity(r.tjC, '°C')}${r.idA === null ? '' : `, ID ${quantity(r.idA, 'A')}`}`,
                )
              : [],
          datasheets: sheets.map((s) => ({ id: s.id, name: s.originalName, pages: s.pages, revision: s.revision })),
          closest: near.map((n) => ({
            id: n.id,
            label: `${n.mpn} · ${n.manufacturer}`,
            ratings: cols.map((c, i) => `${c.label} ${n.ratings[i] === null ? '—' : `${sig(n.ratings[i])} ${c.unit}`}`).join(', '),
          })),
          approveBlocked: four.allowed ? null : four.message,
          override: four.allowed && four.override,
        };
      }),
  );
}
