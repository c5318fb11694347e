import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mosfet_zth_points', (t) => {
    t.comment('Points read off a MOSFET datasheet single-pulse transient thermal impedance Zth(j-a) curve');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The MOSFET');
    t.double('pulse_s').notNullable().comment('Length of the single power pulse, s');
    t.double('zth_c_per_w').notNullable().comment('Junction-to-ambient transient thermal impedance after that pulse, K/W');
    t.unique(['part_id', 'pulse_s'], { indexName: 'zth_part_pulse_unique' });
    t.index(['part_id'], 'zth_part_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mosfet_zth_points');
}
