import type { Knex } from 'knex';

/**
 * The design-input schema version each revision was saved under, so a revision is brought up to the
 * current schema (src/server/repos/designs.ts UPGRADES) before it is validated on read. Every revision
 * stored so far is version 1.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('design_revisions', (t) => {
    t.integer('input_schema_version')
      .unsigned()
      .notNullable()
      .defaultTo(1)
      .comment('Version of the design-input schema input_json was saved under');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('design_revisions', (t) => {
    t.dropColumn('input_schema_version');
  });
}
