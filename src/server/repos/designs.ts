/** Data access for designs and their revisions. Row types stay here; services get domain objects. */
import type { Db } from '../db.ts';
import type { Design, DesignInput, DesignStatus, DesignSummary } from '../../lib/domain/design.ts';
import { designInputSchema } from '../../lib/schemas/design.ts';
import { issuesOf } from '../../lib/schemas/issues.ts';
import { ServiceError } from '../services/errors.ts';

export interface DbDesignRow {
  id: number;
  owner_id: number;
  name: string;
  status: DesignStatus;
  ready_at: Date | null;
  status_reason: string | null;
  status_changed_at: Date | null;
  current_revision: number;
  version: number;
  created_at: Date;
  updated_at: Date;
  owner_name?: string;
}

export interface DbDesignRevisionRow {
  id: number;
  design_id: number;
  revision: number;
  input_json: string;
  created_by: number | null;
  created_at: Date;
  created_by_name?: string | null;
}

/**
 * A stored revision, validated on read: fields added since it was saved take their schema defaults
 * (the worst-case ones), and a row that no longer validates is refused plainly instead of crashing later.
 */
export function parseStoredInput(json: string, designId: number, revision: number): DesignInput {
  const parsed = designInputSchema.safeParse(JSON.parse(json));
  if (parsed.success) return parsed.data as DesignInput;
  throw new ServiceError(
    409,
    `Revision ${revision} of design ${designId} no longer validates; open it and save it again.`,
    issuesOf(parsed.error),
  );
}

const iso = (d: Date | string): string => (d instanceof Date ? d.toISOString() : new Date(d).toISOString());

function summaryFromRow(row: DbDesignRow): DesignSummary {
  return {
    id: row.id,
    name: row.name,
    ownerId: row.owner_id,
    ownerName: row.owner_name ?? '',
    status: row.status,
    statusReason: row.status_reason ?? null,
    statusChangedAt: row.status_changed_at ? iso(row.status_changed_at) : null,
    revision: row.current_revision,
    updatedAt: iso(row.updated_at),
  };
}

function designQuery(db: Db) {
  return db<DbDesignRow>('designs').select('designs.*', 'users.name as owner_name').join('users', 'users.id', 'designs.owner_id');
}

export interface DesignListQuery {
  q?: string;
  status?: DesignStatus;
  ownerId?: number;
  page: number;
  pageSize: number;
}

export async function listDesignRows(db: Db, query: DesignListQuery): Promise<{ items: DesignSummary[]; total: number }> {
  const base = db('designs');
  if (query.q) base.where('designs.name', 'like', `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`);
  if (query.status) base.where('designs.status', query.status);
  if (query.ownerId) base.where('designs.owner_id', query.ownerId);
  const [{ n }] = await base.clone().count({ n: '*' });
  const rows: DbDesignRow[] = await base
    .clone()
    .select('designs.*', 'users.name as owner_name')
    .join('users', 'users.id', 'designs.owner_id')
    .orderBy('designs.updated_at', 'desc')
    .orderBy('designs.id', 'desc')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return { items: rows.map(summaryFromRow), total: Number(n) };
}

export async function findDesignRow(db: Db, id: number): Promise<DbDesignRow | undefined> {
  return designQuery(db).where('designs.id', id).first();
}

export async function loadDesign(db: Db, id: number, revision?: number): Promise<Design | null> {
  const row = await findDesignRow(db, id);
  if (!row) return null;
  const revisions: DbDesignRevisionRow[] = await db('design_revisions')
    .select('design_revisions.*', 'users.name as created_by_name')
    .leftJoin('users', 'users.id', 'design_revisions.created_by')
    .where('design_id', id)
    .orderBy('revision', 'desc');
  const wanted = revisions.find((r) => r.revision === (revision ?? row.current_revision));
  if (!wanted) return null;
  return {
    ...summaryFromRow(row),
    revision: wanted.revision,
    version: row.version,
    input: parseStoredInput(wanted.input_json, id, wanted.revision),
    revisions: revisions.map((r) => ({ revision: r.revision, createdAt: iso(r.created_at), createdByName: r.created_by_name ?? null })),
  };
}

export async function insertRevision(db: Db, designId: number, revision: number, input: DesignInput, userId: number | null): Promise<void> {
  await db('design_revisions').insert({ design_id: designId, revision, input_json: JSON.stringify(input), created_by: userId });
}

/** Replaces the where-used rows of a design with its current motor and selections. */
export async function replaceDesignParts(db: Db, designId: number, input: DesignInput): Promise<void> {
  await db('design_parts').where({ design_id: designId }).delete();
  const rows: { design_id: number; role: string; position: number; part_id: number }[] = [];
  if (input.motor.source === 'catalogue') rows.push({ design_id: designId, role: 'motor', position: 0, part_id: input.motor.partId });
  for (const role of ['switch', 'driver', 'diode'] as const) {
    const sel = input.selections[role];
    if (sel.chosenPartId != null) rows.push({ design_id: designId, role, position: 0, part_id: sel.chosenPartId });
    sel.alternatePartIds.forEach((partId, i) => rows.push({ design_id: designId, role, position: i + 1, part_id: partId }));
  }
  if (rows.length) await db('design_parts').insert(rows);
}

/** Designs that use a part (for the part page's where-used list). */
export async function designsUsingPart(
  db: Db,
  partId: number,
): Promise<{ id: number; name: string; role: string; position: number; status: DesignStatus }[]> {
  return db('design_parts')
    .join('designs', 'designs.id', 'design_parts.design_id')
    .select('designs.id', 'designs.name', 'design_parts.role', 'design_parts.position', 'designs.status')
    .where('design_parts.part_id', partId)
    .orderBy('designs.name');
}
