import type { Knex } from 'knex';

/** Fixed-window counters shared by every app server (sign-in attempts, calculator calls, …). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limit_buckets', (t) => {
    t.comment('Rate-limit counters: hits per bucket in the current fixed window');
    t.string('bucket_key', 300).primary().comment('What is counted, e.g. signin:account:<email> or signin:address:<ip>');
    t.datetime('window_started_at', { precision: 3 }).notNullable().comment('Start of the current window (UTC)');
    t.integer('hits').unsigned().notNullable().comment('Hits counted in the current window');
    t.index(['window_started_at'], 'rate_limit_window_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limit_buckets');
}
