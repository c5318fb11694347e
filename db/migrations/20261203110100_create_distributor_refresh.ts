import type { Knex } from 'knex';

/**
 * The distributor refresh's lock and its last outcome: one row. A server takes the lock by setting
 * holder and locked_until where the lock is free or expired (one atomic UPDATE), so only one server
 * refreshes at a time, and a server that died holding it frees it when locked_until passes.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('distributor_refresh', (t) => {
    t.comment('Lock and last outcome of the distributor offers refresh (one row per job)');
    t.string('job', 40).primary().comment('Which refresh ("offers")');
    t.string('holder', 120).nullable().comment('Server and run holding the lock; NULL when free');
    t.timestamp('locked_until', { precision: 3 }).nullable().comment('The lock expires at this time (UTC) even if never released');
    t.timestamp('last_started_at', { precision: 3 }).nullable().comment('When the last refresh began (UTC)');
    t.timestamp('last_finished_at', { precision: 3 }).nullable().comment('When the last refresh ended (UTC)');
    t.string('last_outcome', 1000).nullable().comment('What the last refresh did, or why it failed');
    t.boolean('last_ok').nullable().comment('Whether every batch of the last refresh was answered');
  });
  await knex('distributor_refresh').insert({ job: 'offers' });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('distributor_refresh');
}
