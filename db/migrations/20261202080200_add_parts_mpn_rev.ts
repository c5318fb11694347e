import type { Knex } from 'knex';

/** The normalised part number reversed: a suffix lookup becomes an indexed prefix lookup (a typo near the start). */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    "ALTER TABLE parts ADD COLUMN mpn_rev VARCHAR(80) AS (REVERSE(REGEXP_REPLACE(UPPER(mpn), '[^A-Z0-9]', ''))) PERSISTENT COMMENT 'Normalised part number reversed, for suffix lookups'",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parts', (t) => t.dropColumn('mpn_rev'));
}
