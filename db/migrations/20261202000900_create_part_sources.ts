import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('part_sources', (t) => {
    t.comment('Where a part can be bought');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The part');
    t.string('distributor', 120).notNullable().comment('Distributor name');
    t.string('sku', 80).notNullable().comment("Distributor's stock-keeping unit");
    t.integer('moq').unsigned().notNullable().defaultTo(1).comment('Minimum order quantity');
    t.integer('lead_time_days').unsigned().notNullable().defaultTo(0).comment('Factory lead time when out of stock, days');
    t.integer('stock_qty').unsigned().notNullable().defaultTo(0).comment('Units in stock at last update');
    t.string('currency', 3).notNullable().defaultTo('USD').comment('ISO 4217 currency of the price breaks');
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Last supply-data update (UTC)');
    t.unique(['part_id', 'distributor', 'sku'], { indexName: 'part_sources_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('part_sources');
}
