import type { Knex } from 'knex';

/**
 * A buyer's preferred source and note for one option of a shortlist line: keyed by design, BOM line and
 * part (the chosen part and each alternate may have their own). The source is kept by its distributor and
 * SKU, which are unique per part and survive a re-save of the part's sources (source rows get new ids
 * then). Last write wins; every write leaves an audit event with the state before and after.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('shortlist_preferences', (t) => {
    t.comment('Preferred source and note of a buyer per design, BOM line and part, shown on the shortlist and the design');
    t.increments('id').primary().comment('Surrogate key (the audit trail refers to it)');
    t.integer('design_id').unsigned().notNullable().references('designs.id').onDelete('CASCADE').comment('The design');
    t.enu('line', ['motor', 'switch', 'driver', 'diode']).notNullable().comment('BOM line of the design (its role)');
    t.integer('part_id')
      .unsigned()
      .notNullable()
      .references('parts.id')
      .onDelete('CASCADE')
      .comment('The option of the line: chosen part or an alternate');
    t.string('preferred_distributor', 120).nullable().comment('Distributor of the preferred source; NULL: the cheapest source is used');
    t.string('preferred_sku', 80).nullable().comment('SKU of the preferred source at that distributor; NULL with the distributor');
    t.string('note', 500).nullable().comment("The buyer's note on this option, shown read-only to designers");
    t.integer('set_by').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Who wrote the row last');
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When the row was last written (UTC)');
    t.unique(['design_id', 'line', 'part_id'], { indexName: 'shortlist_preferences_key_uq' });
    t.index(['part_id'], 'shortlist_preferences_part_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('shortlist_preferences');
}
