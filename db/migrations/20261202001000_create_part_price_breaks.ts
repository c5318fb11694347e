import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('part_price_breaks', (t) => {
    t.comment('Quantity price breaks of a source');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('source_id').unsigned().notNullable().references('part_sources.id').onDelete('CASCADE').comment('The source');
    t.integer('qty').unsigned().notNullable().comment('Quantity from which the price applies');
    t.decimal('unit_price', 12, 5).notNullable().comment('Unit price at this quantity, in the source currency');
    t.unique(['source_id', 'qty'], { indexName: 'price_breaks_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('part_price_breaks');
}
