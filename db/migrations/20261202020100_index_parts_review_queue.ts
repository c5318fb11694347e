import type { Knex } from 'knex';

/** The review queue lists pending parts oldest first. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parts', (t) => {
    t.index(['review_status', 'created_at'], 'parts_review_queue_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parts', (t) => {
    t.dropIndex(['review_status', 'created_at'], 'parts_review_queue_idx');
  });
}
