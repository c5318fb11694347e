import type { Knex } from 'knex';

/**
 * Why a design's status last changed and when: a ready design that a catalogue change no longer holds goes
 * back to draft with the reason kept here (shown on the design and in the list). One ALTER statement.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('designs', (t) => {
    t.string('status_reason', 2000)
      .nullable()
      .comment('Why the status last changed when the system changed it (e.g. back to draft after a part change); NULL when set by hand');
    t.timestamp('status_changed_at', { precision: 3 })
      .nullable()
      .comment('When the status last changed (UTC); NULL when never changed since creation');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('designs', (t) => {
    t.dropColumn('status_reason');
    t.dropColumn('status_changed_at');
  });
}
