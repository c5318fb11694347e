import type { Knex } from 'knex';

/**
 * Data only: derives input_pull from the old input_default, which recorded what the OUTPUT did with the
 * input open. The output is the input level XOR inverting, so the input is pulled up exactly when
 * (output high) differs from inverting; 'floating' means no pull. input_pull_ohms stays NULL: the old
 * column never recorded a value and none is invented here.
 */
export async function up(knex: Knex): Promise<void> {
  await knex('driver_params').update({
    input_pull: knex.raw(
      `case when input_default = 'floating' then 'none'
            when (input_default = 'high') <> (inverting <> 0) then 'up'
            else 'down' end`,
    ),
  });
}

/** Undoes the fill (input_default is still there, unchanged, whenever this runs). */
export async function down(knex: Knex): Promise<void> {
  await knex('driver_params').update({ input_pull: null });
}
