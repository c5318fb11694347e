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
  input_schema_version: number;
  created_by: number | null;
  created_at: Date;
  created_by_name?: string | null;
}

/**
 * The version of the design-input schema a revision was saved under. Bump it when a change to
 * src/lib/schemas/design.ts needs more than the schema's defaults to read older revisions, and add the
 * step to UPGRADES. Version 1: every revision up to and including the supply, stall and reset fields.
 */
export const DESIGN_INPUT_SCHEMA_VERSION = 1;

/** Steps that turn a revision saved under version n into version n + 1 (raw JSON, before validation). */
const UPGRADES: Record<number, (raw: unknown) => unknown> = {};

/**
 * A stored revision, validated on read: it is brought up to the current schema version, fields added
 * since it was saved take their schema defaults (the worst-case ones), and a row that no longer
 * validates, or was saved by a newer Stallpoint, is refused plainly instead of crashing later.
 */
export function parseStoredInput(
  json: string,
  designId: number,
  revision: number,
  schemaVersion = DESIGN_INPUT_SCHEMA_VERSION,
): DesignInput {
  if (schemaVersion > DESIGN_INPUT_SCHEMA_VERSION) {
    throw new ServiceError(
      409,
      `Revision ${revision} of design ${designId} was saved by a newer Stallpoint (input schema ${schemaVersion}); update this server.`,
    );
  }
  let raw: unknown = JSON.parse(json);
  for (let v = schemaVersion; v < DESIGN_INPUT_SCHEMA_VERSION; v++) raw = (UPGRADES[v] ?? ((x: unknown) => x))(raw);
  const parsed = designInputSchema.safeParse(raw);
  if (parsed.success) return parsed.data;
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
    input: parseStoredInput(wanted.input_json, id, wanted.revision, wanted.input_schema_version),
    revisions: revisions.map((r) => ({ revision: r.revision, createdAt: iso(r.created_at), createdByName: r.created_by_name ?? null })),
  };
}

export async function insertRevision(db: Db, designId: number, revision: number, input: DesignInput, userId: number | null): Promise<void> {
  await db('design_revisions').insert({
    design_id: designId,
    revision,
    input_json: JSON.stringify(input),
    input_schema_version: DESIGN_INPUT_SCHEMA_VERSION,
    created_by: userId,
  });
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

/** The design row, locked for the rest of the transaction. */
export async function lockDesignRow(db: Db, id: number): Promise<DbDesignRow | undefined> {
  return db<DbDesignRow>('designs').where({ id }).forUpdate().first();
}

/** A revision's input, validated (null when there is no such revision). */
export async function loadRevisionInput(db: Db, designId: number, revision: number): Promise<DesignInput | null> {
  const row: Pick<DbDesignRevisionRow, 'input_json' | 'input_schema_version'> | undefined = await db('design_revisions')
    .where({ design_id: designId, revision })
    .first('input_json', 'input_schema_version');
  return row ? parseStoredInput(row.input_json, designId, revision, row.input_schema_version) : null;
}

export async function insertDesignRow(db: Db, ownerId: number, name: string): Promise<number> {
  const [id] = await db('designs').insert({ owner_id: ownerId, name, current_revision: 1 });
  return id as number;
}

/** A new current revision (and the name it carries), one version on. */
export async function setCurrentRevision(db: Db, id: number, name: string, revision: number, version: number): Promise<void> {
  await db('designs')
    .where({ id })
    .update({ name, current_revision: revision, version, updated_at: db.fn.now(3) });
}

/**
 * Sets the status, one version on. `reason` is why the system changed it (null when set by hand);
 * `onlyIfReady` makes the write a no-op unless the row is still ready (used when withdrawing).
 */
export async function writeDesignStatus(
  db: Db,
  id: number,
  change: { status: DesignStatus; reason: string | null; version?: number; onlyIfReady?: boolean },
): Promise<void> {
  const q = db('designs').where({ id });
  if (change.onlyIfReady) q.where({ status: 'ready' });
  await q.update({
    status: change.status,
    ready_at: change.status === 'ready' ? db.fn.now(3) : null,
    status_reason: change.reason,
    status_changed_at: db.fn.now(3),
    version: change.version ?? db.raw('version + 1'),
    updated_at: db.fn.now(3),
  });
}

/** Ready designs that use any of the parts (motor, chosen or alternate), from the where-used rows. */
export async function readyDesignIdsUsingParts(db: Db, partIds: number[]): Promise<number[]> {
  if (partIds.length === 0) return [];
  const rows: { id: number }[] = await db('design_parts')
    .join('designs', 'designs.id', 'design_parts.design_id')
    .whereIn('design_parts.part_id', partIds)
    .where('designs.status', 'ready')
    .distinct('designs.id as id')
    .orderBy('designs.id');
  return rows.map((r) => r.id);
}

export interface ReadyDesignHead {
  id: number;
  name: string;
  revision: number;
  readyAt: string | null;
  ownerName: string;
}

/** Every ready design with its owner, newest first. */
export async function listReadyDesigns(db: Db): Promise<ReadyDesignHead[]> {
  const rows: { id: number; name: string; current_revision: number; ready_at: Date | null; owner_name: string }[] = await db('designs')
    .join('users', 'users.id', 'designs.owner_id')
    .where('designs.status', 'ready')
    .select('designs.id', 'designs.name', 'designs.current_revision', 'designs.ready_at', 'users.name as owner_name')
    .orderBy('designs.ready_at', 'desc');
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    revision: r.current_revision,
    readyAt: r.ready_at ? iso(r.ready_at) : null,
    ownerName: r.owner_name,
  }));
}
