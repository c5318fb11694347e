import type { Knex } from 'knex';

/** input_pull with inverting now says what input_default said; the derived column goes. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.dropColumn('input_default');
  });
}

/**
 * Recreates the column (nullable; the previous migration's down makes it required) and derives it
 * from the current input pull: output high with the input open ⇔ (pulled up) ≠ inverting; no pull
 * → floating. Data follows the one DDL change so a failed fill leaves a column that can be refilled.
 */
export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('driver_params', (t) => {
    t.enu('input_default', ['low', 'high', 'floating'])
      .nullable()
      .comment('Superseded by input_pull: output state with the input left open');
  });
  await knex('driver_params').update({
    input_default: knex.raw(
      `case when input_pull = 'none' then 'floating'
            when (input_pull = 'up') <> (inverting <> 0) then 'high'
            else 'low' end`,
    ),
  });
}
