import type { Knex } from 'knex';

/** The home page lists the most recently changed parts of each category without sorting the catalogue. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parts', (t) => {
    t.index(['category', 'updated_at'], 'parts_category_updated_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parts', (t) => {
    t.dropIndex(['category', 'updated_at'], 'parts_category_updated_idx');
  });
}
