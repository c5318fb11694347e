import type { Knex } from 'knex';

/** Order multiples: a source sells in whole reels, tubes or packs; existing sources sell any quantity (1). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('part_sources', (t) => {
    t.integer('order_multiple')
      .unsigned()
      .notNullable()
      .defaultTo(1)
      .after('moq')
      .comment('Orders go in whole multiples of this (reel, tube or pack size); 1 = any quantity');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('part_sources', (t) => {
    t.dropColumn('order_multiple');
  });
}
