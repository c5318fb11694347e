import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_events', (t) => {
    t.comment('Append-only trail of changes: who changed what, before and after');
    t.bigIncrements('id').primary().comment('Surrogate key');
    t.timestamp('occurred_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When it happened (UTC)');
    t.integer('actor_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Who did it; null for the system');
    t.string('action', 60).notNullable().comment('What happened, e.g. part.update, part.lifecycle');
    t.string('entity_type', 40).notNullable().comment('Kind of thing changed, e.g. part');
    t.bigInteger('entity_id').unsigned().nullable().comment('Id of the thing changed');
    t.text('before_json', 'longtext').nullable().comment('State before the change, JSON');
    t.text('after_json', 'longtext').nullable().comment('State after the change, JSON');
    t.string('note', 500).nullable().comment('Reason or remark');
    t.index(['entity_type', 'entity_id', 'occurred_at'], 'audit_entity_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_events');
}
