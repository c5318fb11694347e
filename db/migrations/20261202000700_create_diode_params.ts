import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('diode_params', (t) => {
    t.comment('Freewheel diode candidates');
    t.integer('part_id').unsigned().primary().references('parts.id').onDelete('CASCADE').comment('The part');
    t.enu('kind', ['schottky', 'ultrafast', 'fast', 'general']).notNullable().comment('Diode technology class');
    t.double('vrrm_v').notNullable().comment('VRRM repetitive peak reverse voltage, V');
    t.double('if_av_a').notNullable().comment('IF(AV) average forward current, A');
    t.double('ifsm_a').notNullable().comment('IFSM non-repetitive surge current, A');
    t.double('vf_v').notNullable().comment('Maximum forward voltage at vf_at_if_a, V');
    t.double('vf_at_if_a').notNullable().comment('Forward current of the VF test condition, A');
    t.double('trr_ns').nullable().comment('Reverse recovery time, ns; null for Schottky (no stored charge)');
    t.index(['kind', 'vrrm_v'], 'diode_kind_vrrm_idx');
    t.index(['if_av_a'], 'diode_if_av_idx');
    t.index(['trr_ns'], 'diode_trr_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('diode_params');
}
