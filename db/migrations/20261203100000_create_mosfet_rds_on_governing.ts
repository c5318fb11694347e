import type { Knex } from 'knex';

/**
 * The governing RDS(on) line per VGS interval (src/lib/rdson-governing.ts): one row per 25 °C line, valid
 * for drives from its VGS up to the next line's VGS. The RDS(on) filter reads one indexed row per part
 * instead of a correlated subquery over the lines. Written by every part write (repos/parts.ts,
 * repos/part-bulk.ts); existing MOSFETs are filled here from their lines.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mosfet_rds_on_governing', (t) => {
    t.comment('Governing 25 C RDS(on) line of a MOSFET per VGS interval (derived from mosfet_rds_on_points)');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The MOSFET');
    t.double('vgs_from_v').notNullable().comment('Lowest drive of the interval (inclusive) = VGS of the governing line, V');
    t.double('vgs_to_v').nullable().comment('Highest drive of the interval (exclusive) = VGS of the next line, V; null above the highest');
    t.double('max_ohm').notNullable().comment('Maximum RDS(on) of the governing line, ohm');
    t.primary(['part_id', 'vgs_from_v']);
    t.index(['vgs_from_v', 'max_ohm'], 'rds_gov_vgs_max_idx');
  });
  await knex.raw(
    `insert into mosfet_rds_on_governing (part_id, vgs_from_v, vgs_to_v, max_ohm)
     select part_id, vgs_v, lead(vgs_v) over (partition by part_id order by vgs_v), max_ohm
     from (select part_id, vgs_v, min(max_ohm) as max_ohm from mosfet_rds_on_points
           where tj_c between 24 and 26 group by part_id, vgs_v) as at25`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mosfet_rds_on_governing');
}
