import type { Knex } from 'knex';

/**
 * Stored files (datasheet objects) still to be deleted. The transaction that removes a datasheet's row
 * records its storage key here; after commit the object is deleted and the row goes. When the store does
 * not answer, the row stays with the next try later (backoff) and a background run retries it, so no
 * object is left behind without a record. Claimed like mail_outbox (claimed_by, claimed_until).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('blob_deletions', (t) => {
    t.comment('Objects in the datasheet store whose record is gone and which are still to be deleted');
    t.increments('id').primary().comment('Surrogate key');
    t.enu('store', ['local', 's3']).notNullable().comment('Which kind of store holds the object (STORAGE when it was recorded)');
    t.string('storage_key', 100).notNullable().comment('Key of the object in that store');
    t.integer('attempts').unsigned().notNullable().defaultTo(0).comment('Deletion tries so far');
    t.timestamp('next_attempt_at', { precision: 3 })
      .notNullable()
      .defaultTo(knex.fn.now(3))
      .comment('Not tried again before this time (UTC)');
    t.string('claimed_by', 120).nullable().comment('Run deleting it now; NULL when nobody is');
    t.timestamp('claimed_until', { precision: 3 }).nullable().comment('The claim runs out at this time (UTC)');
    t.string('last_error', 1000).nullable().comment('Why the last try failed');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When the record was removed (UTC)');
    t.unique(['store', 'storage_key'], { indexName: 'blob_deletions_key_uq' });
    t.index(['next_attempt_at'], 'blob_deletions_due_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('blob_deletions');
}
