import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('designs', (t) => {
    t.comment('Drive designs; the inputs of every saved revision live in design_revisions');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('owner_id').unsigned().notNullable().references('users.id').comment('Designer who owns the design');
    t.string('name', 120).notNullable().comment('Design name (copy of the current revision input, for search)');
    t.enu('status', ['draft', 'ready']).notNullable().defaultTo('draft').comment('ready: lines and alternates are on the buyer shortlist');
    t.timestamp('ready_at', { precision: 3 }).nullable().comment('When the design was last marked ready (UTC)');
    t.integer('current_revision').unsigned().notNullable().defaultTo(1).comment('Number of the current revision');
    t.integer('version').unsigned().notNullable().defaultTo(1).comment('Optimistic-locking counter, +1 on every change');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Creation time (UTC)');
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Last change (UTC)');
    t.index(['owner_id', 'updated_at'], 'designs_owner_idx');
    t.index(['status'], 'designs_status_idx');
    t.index(['name'], 'designs_name_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('designs');
}
