import type { Knex } from 'knex';

/** Exact, prefix and suffix lookups of a part number without scanning the catalogue. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parts', (t) => {
    t.index(['mpn_norm'], 'parts_mpn_norm_idx');
    t.index(['mpn_rev'], 'parts_mpn_rev_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parts', (t) => {
    t.dropIndex(['mpn_norm'], 'parts_mpn_norm_idx');
    t.dropIndex(['mpn_rev'], 'parts_mpn_rev_idx');
  });
}
