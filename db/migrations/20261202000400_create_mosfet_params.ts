import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mosfet_params', (t) => {
    t.comment('MOSFET ratings and characteristics; P-channel values stored as magnitudes');
    t.integer('part_id').unsigned().primary().references('parts.id').onDelete('CASCADE').comment('The part');
    t.enu('channel', ['n', 'p']).notNullable().comment('Channel type');
    t.double('vds_max_v').notNullable().comment('V(BR)DSS, drain-source breakdown voltage, V');
    t.double('vgs_max_v').notNullable().comment('VGS(max) absolute maximum gate-source voltage, V');
    t.double('vgs_th_min_v').notNullable().comment('VGS(th) minimum, V, at vgs_th_test_current_a');
    t.double('vgs_th_max_v').notNullable().comment('VGS(th) maximum, V, at vgs_th_test_current_a');
    t.double('vgs_th_test_current_a').notNullable().defaultTo(0.00025).comment('ID at which VGS(th) is specified, A');
    t.double('id_continuous_a').notNullable().comment('Continuous drain current at TA = 25 C on the datasheet board, A');
    t.double('id_pulsed_a').notNullable().comment('IDM pulsed drain current, A');
    t.double('qg_total_nc').notNullable().comment('Total gate charge Qg, nC, at qg_test_vgs_v');
    t.double('qg_test_vgs_v').notNullable().comment('VGS at which Qg is specified, V');
    t.double('qgs_nc').nullable().comment('Gate-source charge Qgs, nC');
    t.double('qgd_nc').nullable().comment('Gate-drain (Miller) charge Qgd, nC');
    t.double('v_plateau_v').nullable().comment('Miller plateau voltage, V');
    t.double('rth_ja_c_per_w').notNullable().comment('RthJA junction-to-ambient on the datasheet test board, K/W');
    t.double('tj_max_c').notNullable().comment('Maximum junction temperature, C');
    t.double('body_diode_vf_v').nullable().comment('Body-diode forward voltage (typ.), V');
    t.double('min_rds_on_vgs_v').notNullable().comment('Lowest VGS with an RDS(on) spec point (denormalised for filtering), V');
    t.index(['channel', 'vds_max_v'], 'mosfet_channel_vds_idx');
    t.index(['vgs_th_max_v'], 'mosfet_vgs_th_max_idx');
    t.index(['min_rds_on_vgs_v'], 'mosfet_min_rds_vgs_idx');
    t.index(['id_continuous_a'], 'mosfet_id_cont_idx');
    t.index(['qg_total_nc'], 'mosfet_qg_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mosfet_params');
}
