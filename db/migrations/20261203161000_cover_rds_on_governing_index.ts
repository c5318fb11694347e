import type { Knex } from 'knex';

/**
 * The RDS(on) filter of the parameter list starts from the governing intervals that hold the drive
 * (repos/part-search.ts filteredParts): an index on (vgs_from_v, max_ohm, vgs_to_v) answers the whole
 * interval condition from the index (part_id rides along as the primary key), without reading the rows.
 * It replaces the (vgs_from_v, max_ohm) index, its prefix.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('mosfet_rds_on_governing', (t) => {
    t.index(['vgs_from_v', 'max_ohm', 'vgs_to_v'], 'rds_gov_cover_idx');
  });
  await knex.schema.alterTable('mosfet_rds_on_governing', (t) => {
    t.dropIndex(['vgs_from_v', 'max_ohm'], 'rds_gov_vgs_max_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('mosfet_rds_on_governing', (t) => {
    t.index(['vgs_from_v', 'max_ohm'], 'rds_gov_vgs_max_idx');
  });
  await knex.schema.alterTable('mosfet_rds_on_governing', (t) => {
    t.dropIndex(['vgs_from_v', 'max_ohm', 'vgs_to_v'], 'rds_gov_cover_idx');
  });
}
