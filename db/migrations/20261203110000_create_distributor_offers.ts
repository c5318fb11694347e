import type { Knex } from 'knex';

/**
 * The cache of distributor offers: one row per part and distributor with the figures of the last fetch
 * that worked (kept when a later fetch fails; the failure goes into last_error). Pages read only this.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('distributor_offers', (t) => {
    t.comment('Cached distributor offers per part, written by the distributor refresh');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The part');
    t.string('mpn', 80).notNullable().comment('Part number the distributor was asked for (the part mpn at the time)');
    t.string('distributor', 120).notNullable().comment('Distributor name as its API gives it');
    t.string('sku', 80).notNullable().comment("Distributor's stock-keeping unit");
    t.integer('stock_qty').unsigned().notNullable().comment('Units in stock when fetched');
    t.integer('moq').unsigned().notNullable().defaultTo(1).comment('Minimum order quantity');
    t.string('currency', 3).notNullable().comment('ISO 4217 currency of the price breaks');
    t.json('price_breaks').notNullable().comment('Price breaks as fetched: [{qty, unitPrice}], ascending qty');
    t.integer('lead_time_days').unsigned().nullable().comment('Lead time the distributor states, days; NULL when it states none');
    t.timestamp('fetched_at', { precision: 3 }).notNullable().comment('When these figures were fetched (UTC)');
    t.timestamp('checked_at', { precision: 3 }).notNullable().comment('Last refresh attempt for this row, successful or not (UTC)');
    t.string('last_error', 500).nullable().comment('Why the last attempt failed; NULL when it worked');
    t.unique(['part_id', 'distributor'], { indexName: 'distributor_offers_part_distributor_uq' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('distributor_offers');
}
