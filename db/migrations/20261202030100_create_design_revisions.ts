import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('design_revisions', (t) => {
    t.comment('Every saved state of a design; earlier revisions are kept unchanged');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('design_id').unsigned().notNullable().references('designs.id').onDelete('CASCADE').comment('The design');
    t.integer('revision').unsigned().notNullable().comment('Revision number, 1 upwards');
    t.text('input_json', 'longtext').notNullable().comment('The design input (DesignInput) as JSON, units in field names');
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Who saved it');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When it was saved (UTC)');
    t.unique(['design_id', 'revision'], { indexName: 'design_revisions_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('design_revisions');
}
