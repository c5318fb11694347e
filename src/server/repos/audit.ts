/** The append-only audit trail: who changed what, with the state before and after. */
import type { Db } from '../db.ts';

export interface DbAuditEventRow {
  id: number;
  occurred_at: Date;
  actor_user_id: number | null;
  action: string;
  entity_type: string;
  entity_id: number | null;
  before_json: string | null;
  after_json: string | null;
  note: string | null;
}

export interface AuditEventInput {
  actorUserId: number | null;
  action: string;
  entityType: string;
  entityId: number;
  before: unknown;
  after: unknown;
  note?: string | null;
}

export interface StoredAuditEvent {
  id: number;
  occurredAt: string;
  actorName: string | null;
  action: string;
  before: unknown;
  after: unknown;
  note: string | null;
}

const auditRow = (e: AuditEventInput) => ({
  actor_user_id: e.actorUserId,
  action: e.action,
  entity_type: e.entityType,
  entity_id: e.entityId,
  before_json: e.before === undefined || e.before === null ? null : JSON.stringify(e.before),
  after_json: e.after === undefined || e.after === null ? null : JSON.stringify(e.after),
  note: e.note ?? null,
});

export async function insertAuditEvent(db: Db, e: AuditEventInput): Promise<void> {
  await db('audit_events').insert(auditRow(e));
}

/** Rows per multi-row INSERT of audit events: a part's after-state is a few kB, so 500 stay far below max_allowed_packet. */
export const AUDIT_CHUNK_ROWS = 500;

/** Many events with one multi-row INSERT per AUDIT_CHUNK_ROWS (e.g. one per imported part). */
export async function insertAuditEvents(db: Db, events: readonly AuditEventInput[]): Promise<void> {
  for (let i = 0; i < events.length; i += AUDIT_CHUNK_ROWS) {
    await db('audit_events').insert(events.slice(i, i + AUDIT_CHUNK_ROWS).map(auditRow));
  }
}

const parse = (json: string | null): unknown => (json === null ? null : JSON.parse(json));

/** Events of one entity, newest first, with the actor's display name. */
export async function listAuditEvents(db: Db, entityType: string, entityId: number, limit = 200): Promise<StoredAuditEvent[]> {
  const rows: (DbAuditEventRow & { actor_name: string | null })[] = await db('audit_events as a')
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .select('a.*', 'u.name as actor_name')
    .where({ 'a.entity_type': entityType, 'a.entity_id': entityId })
    .orderBy([
      { column: 'a.occurred_at', order: 'desc' },
      { column: 'a.id', order: 'desc' },
    ])
    .limit(limit);
  return rows.map((r) => ({
    id: Number(r.id),
    occurredAt: new Date(r.occurred_at).toISOString(),
    actorName: r.actor_name,
    action: r.action,
    before: parse(r.before_json),
    after: parse(r.after_json),
    note: r.note,
  }));
}

export interface PersonRef {
  id: number;
  name: string;
  email: string;
}

/** Display name and address of a person (proposers, uploaders). */
export async function findPerson(db: Db, id: number | null): Promise<PersonRef | null> {
  if (id === null) return null;
  const row = await db('users').select('id', 'name', 'email').where({ id }).first();
  return row ? { id: row.id, name: row.name, email: row.email } : null;
}

/** The actions that put content into a part record (not review, lifecycle or supply moves). */
export const PART_CONTENT_ACTIONS = ['part.create', 'part.propose', 'part.import', 'part.update'] as const;

/**
 * Who last changed the content of each entity: the actor of its newest event among `actions`
 * (null when the newest such event has no actor, absent when there is none).
 */
export async function lastEditors(
  db: Db,
  entityType: string,
  entityIds: number[],
  actions: readonly string[],
): Promise<Map<number, number | null>> {
  const out = new Map<number, number | null>();
  if (entityIds.length === 0) return out;
  const rows: { entity_id: number; actor_user_id: number | null }[] = await db('audit_events')
    .select('entity_id', 'actor_user_id')
    .where({ entity_type: entityType })
    .whereIn('entity_id', entityIds)
    .whereIn('action', actions as string[])
    .orderBy([
      { column: 'occurred_at', order: 'desc' },
      { column: 'id', order: 'desc' },
    ]);
  for (const r of rows) if (!out.has(Number(r.entity_id))) out.set(Number(r.entity_id), r.actor_user_id);
  return out;
}
