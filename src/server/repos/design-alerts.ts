/** Change alerts on designs (design_alerts): raised once per design, part and change; mailed once; acknowledged. */
import type { Db } from '../db.ts';

export type AlertKind = 'lifecycle' | 'no-longer-holds';

export interface DbDesignAlertRow {
  id: number;
  design_id: number;
  part_id: number;
  kind: AlertKind;
  change_key: string;
  detail: string;
  created_at: Date;
  sent_at: Date | null;
  acknowledged_by: number | null;
  acknowledged_at: Date | null;
}

export interface OpenAlert {
  id: number;
  designId: number;
  designName: string;
  partId: number;
  mpn: string;
  kind: AlertKind;
  detail: string;
  createdAt: string;
}

export interface NewAlert {
  designId: number;
  partId: number;
  kind: AlertKind;
  changeKey: string;
  detail: string;
}

/** Insert-ignore on the unique key: the same change raised twice (or by two servers) stays one alert. */
export async function insertAlerts(db: Db, alerts: NewAlert[]): Promise<void> {
  if (alerts.length === 0) return;
  await db('design_alerts')
    .insert(alerts.map((a) => ({ design_id: a.designId, part_id: a.partId, kind: a.kind, change_key: a.changeKey, detail: a.detail })))
    .onConflict(['design_id', 'part_id', 'kind', 'change_key'])
    .ignore();
}

/** Every design using one of the parts in its current revision (chosen or alternate), any status. */
export async function designsUsingParts(
  db: Db,
  partIds: number[],
): Promise<{ designId: number; partId: number; role: string; position: number }[]> {
  if (partIds.length === 0) return [];
  const rows: { design_id: number; part_id: number; role: string; position: number }[] = await db('design_parts')
    .whereIn('part_id', partIds)
    .select('design_id', 'part_id', 'role', 'position')
    .orderBy(['design_id', 'role', 'position']);
  return rows.map((r) => ({ designId: r.design_id, partId: r.part_id, role: r.role, position: r.position }));
}

/** Ids of alerts whose mail has not gone out yet, oldest first. */
export async function unsentAlertIds(db: Db, limit: number): Promise<number[]> {
  const rows: { id: number }[] = await db('design_alerts').whereNull('sent_at').orderBy('id').limit(limit).select('id');
  return rows.map((r) => r.id);
}

/** The alert row locked for the rest of the transaction (the second server waits here, then sees sent_at). */
export async function lockAlert(db: Db, id: number): Promise<DbDesignAlertRow | undefined> {
  return db<DbDesignAlertRow>('design_alerts').where({ id }).forUpdate().first();
}

export async function findAlert(db: Db, id: number): Promise<DbDesignAlertRow | undefined> {
  return db<DbDesignAlertRow>('design_alerts').where({ id }).first();
}

export async function markAlertSent(db: Db, id: number, at: Date): Promise<void> {
  await db('design_alerts').where({ id }).update({ sent_at: at });
}

/** Sets who and when; only an open alert (returns false when someone acknowledged it first). */
export async function acknowledgeAlertRow(db: Db, id: number, userId: number, at: Date): Promise<boolean> {
  const n = await db('design_alerts').where({ id }).whereNull('acknowledged_at').update({ acknowledged_by: userId, acknowledged_at: at });
  return Number(n) === 1;
}

const toOpen = (r: {
  id: number;
  design_id: number;
  design_name: string;
  part_id: number;
  mpn: string;
  kind: AlertKind;
  detail: string;
  created_at: Date;
}): OpenAlert => ({
  id: r.id,
  designId: r.design_id,
  designName: r.design_name,
  partId: r.part_id,
  mpn: r.mpn,
  kind: r.kind,
  detail: r.detail,
  createdAt: new Date(r.created_at).toISOString(),
});

/** Open alerts, newest first, limited; optionally of some designs or of designs one person owns. */
export async function listOpenAlerts(
  db: Db,
  filter: { designIds?: number[]; ownerId?: number; limit: number },
): Promise<{ items: OpenAlert[]; total: number }> {
  const base = db('design_alerts')
    .join('designs', 'designs.id', 'design_alerts.design_id')
    .join('parts', 'parts.id', 'design_alerts.part_id')
    .whereNull('design_alerts.acknowledged_at');
  if (filter.designIds) base.whereIn('design_alerts.design_id', filter.designIds.length ? filter.designIds : [-1]);
  if (filter.ownerId != null) base.where('designs.owner_id', filter.ownerId);
  const [rows, count] = await Promise.all([
    base
      .clone()
      .select(
        'design_alerts.id',
        'design_alerts.design_id',
        'designs.name as design_name',
        'design_alerts.part_id',
        'parts.mpn',
        'design_alerts.kind',
        'design_alerts.detail',
        'design_alerts.created_at',
      )
      .orderBy('design_alerts.id', 'desc')
      .limit(filter.limit),
    base.clone().count({ n: '*' }).first(),
  ]);
  return { items: rows.map(toOpen), total: Number((count as { n: number } | undefined)?.n ?? 0) };
}

/** Active buyers (and the e-mail of a design's owner) for the alert mail. */
export async function alertRecipients(db: Db, ownerId: number): Promise<{ id: number; email: string; name: string }[]> {
  const rows: { id: number; email: string; name: string }[] = await db('users')
    .where('users.active', true)
    .andWhere((q) => q.where('users.id', ownerId).orWhereIn('users.id', db('user_roles').where('role', 'buyer').select('user_id')))
    .select('users.id', 'users.email', 'users.name')
    .orderBy('users.id');
  return rows;
}
