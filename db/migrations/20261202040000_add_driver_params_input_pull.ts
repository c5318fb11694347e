import type { Knex } from 'knex';

/**
 * A driver's input structure as its datasheet states it: the internal pull (up, down or none) and its
 * typical value. Nullable here; the next migration fills existing rows, the one after makes it required.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.enu('input_pull', ['up', 'down', 'none'])
      .nullable()
      .comment('Internal input pull as the datasheet states it: up (to the input-side supply), down (to ground) or none');
    t.double('input_pull_ohms')
      .nullable()
      .comment('Typical value of the internal input pull, ohm; null when the datasheet does not state it');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.dropColumn('input_pull_ohms');
    t.dropColumn('input_pull');
  });
}
