import type { Knex } from 'knex';

/** Words of the maker and the description, found without reading every row (MariaDB FULLTEXT). */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE parts ADD FULLTEXT INDEX parts_text_ft (manufacturer, description)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE parts DROP INDEX parts_text_ft');
}
