import type { Knex } from 'knex';

/**
 * input_default becomes optional on its way out (the next migration drops it). Its down makes it
 * required again once the drop's down has refilled it from input_pull.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.enu('input_default', ['low', 'high', 'floating'])
      .nullable()
      .comment('Superseded by input_pull: output state with the input left open')
      .alter();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.enu('input_default', ['low', 'high', 'floating']).notNullable().comment('Input state when left open (internal pull)').alter();
  });
}
