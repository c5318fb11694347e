import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('driver_params', (t) => {
    t.comment('Level-shift and gate-drive parts');
    t.integer('part_id').unsigned().primary().references('parts.id').onDelete('CASCADE').comment('The part');
    t.enu('kind', ['gate-driver', 'level-shifter']).notNullable().comment('Gate driver or logic level shifter');
    t.integer('channels').unsigned().notNullable().defaultTo(1).comment('Number of channels');
    t.boolean('inverting').notNullable().comment('True when output is the inverse of input');
    t.double('supply_min_v').notNullable().comment('Minimum output-side supply, V');
    t.double('supply_max_v').notNullable().comment('Maximum output-side supply, V');
    t.enu('input_logic', ['fixed', 'ratio', 'input-rail'])
      .notNullable()
      .comment(
        'fixed: thresholds in V (TTL-compatible); ratio: fraction of own supply (CMOS); input-rail: fraction of a separate input rail',
      );
    t.double('input_high_min').notNullable().comment('VIH min: volts for fixed, fraction of the reference rail otherwise');
    t.double('input_low_max').notNullable().comment('VIL max: volts for fixed, fraction of the reference rail otherwise');
    t.double('output_high_drop_v').notNullable().comment('Supply minus VOH at rated source current, V');
    t.double('output_low_max_v').notNullable().comment('VOL max at rated sink current, V');
    t.double('source_current_a').notNullable().comment('Peak output source current, A');
    t.double('sink_current_a').notNullable().comment('Peak output sink current, A');
    t.double('propagation_delay_ns').notNullable().comment('Worst propagation delay input to output, ns');
    t.enu('input_default', ['low', 'high', 'floating']).notNullable().comment('Input state when left open (internal pull)');
    t.index(['inverting', 'supply_max_v'], 'driver_inverting_supply_idx');
    t.index(['source_current_a'], 'driver_source_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('driver_params');
}
