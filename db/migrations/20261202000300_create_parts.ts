import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('parts', (t) => {
    t.comment('Catalogue parts of every category; category parameters live in <category>_params');
    t.increments('id').primary().comment('Surrogate key');
    t.enu('category', ['motor', 'mosfet', 'driver', 'diode']).notNullable().comment('Part category');
    t.string('manufacturer', 120).notNullable().comment('Maker name as printed on the datasheet');
    t.string('mpn', 80).notNullable().comment('Manufacturer part number');
    t.string('description', 500).notNullable().defaultTo('').comment('One-line description');
    t.string('package', 40).notNullable().defaultTo('').comment('Package or case style');
    t.enu('lifecycle', ['active', 'nrnd', 'last-buy', 'obsolete']).notNullable().defaultTo('active').comment('Production status');
    t.date('lifecycle_effective_date').nullable().comment('Date the current lifecycle status took effect');
    t.string('lifecycle_note', 500).nullable().comment('Why the lifecycle changed (notice number, replacement)');
    t.enu('review_status', ['draft', 'pending', 'approved', 'rejected'])
      .notNullable()
      .defaultTo('approved')
      .comment('Librarian review state');
    t.string('review_note', 500).nullable().comment('Reason given with the last review decision');
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Who created or proposed the part');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Creation time (UTC)');
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Last change (UTC)');
    t.integer('version').unsigned().notNullable().defaultTo(1).comment('Optimistic-locking counter, +1 on every change');
    t.unique(['manufacturer', 'mpn'], { indexName: 'parts_manufacturer_mpn_unique' });
    t.index(['category', 'review_status', 'lifecycle'], 'parts_category_review_lifecycle_idx');
    t.index(['mpn'], 'parts_mpn_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('parts');
}
