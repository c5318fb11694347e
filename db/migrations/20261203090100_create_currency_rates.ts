import type { Knex } from 'knex';

/**
 * The rates table the admin keeps: one row per foreign currency, its value in the organisation's currency
 * (ORG_CURRENCY), the day it was set and who set it. Shortlist totals convert through it and show the date.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('currency_rates', (t) => {
    t.comment('Exchange rates into the organisation currency, kept by an admin');
    t.increments('id').primary().comment('Surrogate key (the audit trail refers to it)');
    t.string('currency', 3)
      .notNullable()
      .unique({ indexName: 'currency_rates_currency_uq' })
      .comment('ISO 4217 code of the foreign currency');
    t.decimal('rate_to_org', 18, 8).notNullable().comment("Value of one unit of the currency in the organisation's currency");
    t.date('as_of').notNullable().comment('Day the rate applies from (as entered)');
    t.integer('set_by').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Who set the rate; NULL for seeded rows');
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When the row was last written (UTC)');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('currency_rates');
}
