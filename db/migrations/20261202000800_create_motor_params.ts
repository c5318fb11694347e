import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('motor_params', (t) => {
    t.comment('Brushed-DC motor datasheet points (SI units)');
    t.integer('part_id').unsigned().primary().references('parts.id').onDelete('CASCADE').comment('The part');
    t.double('rated_voltage_v').notNullable().comment('Rated (nominal) voltage of the datasheet points, V');
    t.double('voltage_min_v').nullable().comment('Lowest recommended operating voltage, V');
    t.double('voltage_max_v').nullable().comment('Highest recommended operating voltage, V');
    t.double('no_load_speed_rpm').notNullable().comment('No-load speed at rated voltage, rpm');
    t.double('no_load_current_a').notNullable().comment('No-load current at rated voltage, A');
    t.double('stall_torque_nm').notNullable().comment('Stall torque at rated voltage, N*m');
    t.double('stall_current_a').notNullable().comment('Stall current at rated voltage, A');
    t.double('terminal_resistance_ohm').nullable().comment('Terminal resistance at 20 C when stated, ohm');
    t.double('inductance_h').nullable().comment('Terminal inductance when stated, H');
    t.double('rotor_inertia_kg_m2').nullable().comment('Rotor inertia when stated, kg*m^2');
    t.index(['rated_voltage_v'], 'motor_rated_v_idx');
    t.index(['no_load_speed_rpm'], 'motor_speed_idx');
    t.index(['stall_torque_nm'], 'motor_torque_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('motor_params');
}
