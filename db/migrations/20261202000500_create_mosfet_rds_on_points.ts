import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mosfet_rds_on_points', (t) => {
    t.comment('RDS(on) specification points of a MOSFET, each with its test conditions');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The MOSFET');
    t.double('vgs_v').notNullable().comment('Gate-source voltage of the test condition, V');
    t.double('tj_c').notNullable().defaultTo(25).comment('Junction temperature of the test condition, C');
    t.double('max_ohm').notNullable().comment('Maximum RDS(on) at this condition, ohm');
    t.double('typ_ohm').nullable().comment('Typical RDS(on) at this condition, ohm');
    t.double('id_a').nullable().comment('Drain current of the test condition, A');
    t.unique(['part_id', 'vgs_v', 'tj_c'], { indexName: 'rds_on_part_vgs_tj_unique' });
    t.index(['vgs_v', 'max_ohm'], 'rds_on_vgs_max_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mosfet_rds_on_points');
}
