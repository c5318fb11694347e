import type { Knex } from 'knex';

/**
 * Change alerts: a part a design uses moved to NRND, last-buy or obsolete, or changed so the design no
 * longer holds. One row per design, part and change (the unique key makes a repeated or concurrent
 * processing of the same change one alert); sent_at is claimed under a row lock so the mail goes once.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('design_alerts', (t) => {
    t.comment('Change alerts on designs: a used part changed lifecycle or no longer holds the design');
    t.increments('id').primary().comment('Alert id');
    t.integer('design_id').unsigned().notNullable().references('designs.id').onDelete('CASCADE').comment('The design flagged');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The part that changed');
    t.enu('kind', ['lifecycle', 'no-longer-holds'])
      .notNullable()
      .comment('lifecycle = moved to NRND, last-buy or obsolete; no-longer-holds = the design fails with it');
    t.string('change_key', 120).notNullable().comment('Identifies the change (part version and new state), so one change makes one alert');
    t.string('detail', 2000).notNullable().comment('What changed, in words, as shown on the banner');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When the alert was raised (UTC)');
    t.timestamp('sent_at', { precision: 3 }).nullable().comment('When the alert mail went out (UTC); NULL until sent');
    t.integer('acknowledged_by')
      .unsigned()
      .nullable()
      .references('users.id')
      .onDelete('SET NULL')
      .comment('Who acknowledged it; NULL while open');
    t.timestamp('acknowledged_at', { precision: 3 }).nullable().comment('When it was acknowledged (UTC); NULL while open');
    t.unique(['design_id', 'part_id', 'kind', 'change_key'], { indexName: 'design_alerts_change_uq' });
    t.index(['design_id', 'acknowledged_at'], 'design_alerts_design_open_idx');
    t.index(['acknowledged_at', 'id'], 'design_alerts_open_idx');
    t.index(['sent_at', 'id'], 'design_alerts_unsent_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('design_alerts');
}
