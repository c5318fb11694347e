import type { Knex } from 'knex';

/** Every driver states its input pull (none is a statement too) once existing rows are converted. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.enu('input_pull', ['up', 'down', 'none'])
      .notNullable()
      .comment('Internal input pull as the datasheet states it: up (to the input-side supply), down (to ground) or none')
      .alter();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.enu('input_pull', ['up', 'down', 'none'])
      .nullable()
      .comment('Internal input pull as the datasheet states it: up (to the input-side supply), down (to ground) or none')
      .alter();
  });
}
