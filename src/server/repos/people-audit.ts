/** Trail of changes to people (audit_events, entity_type "user"). OWASP ASVS 5.0 V16.3.1 (authentication events logged). */
import type { Db } from '../db.ts';

export async function auditPerson(
  db: Db,
  actorId: number | null,
  action: string,
  userId: number,
  after: unknown,
  now: Date,
): Promise<void> {
  await db('audit_events').insert({
    occurred_at: now,
    actor_user_id: actorId,
    action,
    entity_type: 'user',
    entity_id: userId,
    before_json: null,
    after_json: after === undefined ? null : JSON.stringify(after),
    note: null,
  });
}
