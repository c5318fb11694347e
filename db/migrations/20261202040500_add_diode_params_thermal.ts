import type { Knex } from 'knex';

/** What the diode's own junction check and its repetitive-current check need (all optional ratings). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('diode_params', (t) => {
    t.double('ifrm_a').nullable().comment('IFRM repetitive peak forward current, A; null when the datasheet gives none');
    t.double('rth_ja_c_per_w')
      .nullable()
      .comment('Junction-to-ambient thermal resistance on the datasheet test board, K/W; null when not stated');
    t.double('tj_max_c').nullable().comment('Maximum junction temperature, C; null when not stated');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('diode_params', (t) => {
    t.dropColumn('tj_max_c');
    t.dropColumn('rth_ja_c_per_w');
    t.dropColumn('ifrm_a');
  });
}
