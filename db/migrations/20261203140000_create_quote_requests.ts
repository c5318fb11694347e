import type { Knex } from 'knex';

/**
 * Requests for quotation: a buyer sends shortlist lines to a supplier contact by e-mail (with a CSV of the
 * lines), later enters the supplier's answer per line, then closes the request. States: sent → answered →
 * closed (sent → closed too, when no answer comes). An answered line becomes a source of its part
 * (part_sources, distributor = the contact's company), so the shortlist can choose it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('supplier_contacts', (t) => {
    t.comment('People at suppliers that buyers send requests for quotation to');
    t.increments('id').primary().comment('Surrogate key (the audit trail refers to it)');
    t.string('name', 120).notNullable().comment('Contact person');
    t.string('company', 120).notNullable().comment('Supplier company; becomes the distributor name of quoted sources');
    t.string('email', 320).notNullable().comment('Where requests for quotation are sent');
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Buyer who added the contact');
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Last change (UTC)');
    t.unique(['email'], { indexName: 'supplier_contacts_email_uq' });
  });
  await knex.schema.createTable('quote_requests', (t) => {
    t.comment('A request for quotation sent to one supplier contact');
    t.increments('id').primary().comment('Surrogate key (the audit trail refers to it)');
    t.integer('contact_id').unsigned().notNullable().references('supplier_contacts.id').onDelete('RESTRICT').comment('Who it went to');
    t.enu('state', ['sent', 'answered', 'closed']).notNullable().comment('sent → answered → closed');
    t.string('idempotency_key', 100)
      .notNullable()
      .comment("The sender's key: a repeated send with it returns this request, no second mail");
    t.string('notes', 1000).nullable().comment('Notes for the supplier, in the mail and the CSV');
    t.date('wanted_by').nullable().comment('Date the parts are wanted by');
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Buyer who sent it');
    t.timestamp('sent_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When the mail went out (UTC)');
    t.timestamp('answered_at', { precision: 3 }).nullable().comment('When the answer was entered (UTC)');
    t.timestamp('closed_at', { precision: 3 }).nullable().comment('When it was closed (UTC)');
    t.unique(['idempotency_key'], { indexName: 'quote_requests_idem_uq' });
    t.index(['state'], 'quote_requests_state_idx');
  });
  await knex.schema.createTable('quote_request_lines', (t) => {
    t.comment('One shortlist line of a request for quotation, with the answer when entered');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('quote_request_id').unsigned().notNullable().references('quote_requests.id').onDelete('CASCADE').comment('The request');
    t.integer('line_no').unsigned().notNullable().comment('1, 2, … as in the CSV');
    t.integer('design_id').unsigned().nullable().references('designs.id').onDelete('SET NULL').comment('Design the line came from');
    t.enu('line', ['motor', 'switch', 'driver', 'diode']).notNullable().comment('BOM line of the design');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('Part asked for');
    t.string('mpn', 80).notNullable().comment('Part number as sent');
    t.string('manufacturer', 120).notNullable().comment('Maker as sent');
    t.integer('qty_needed').unsigned().notNullable().comment('Quantity needed (with spares)');
    t.integer('order_qty').unsigned().notNullable().comment('Quantity the buyer means to order');
    t.string('notes', 500).nullable().comment('Line note for the supplier');
    t.decimal('unit_price', 12, 5).nullable().comment('Answer: unit price in the answer currency');
    t.string('currency', 3).nullable().comment('Answer: ISO 4217 currency');
    t.integer('moq').unsigned().nullable().comment('Answer: minimum order quantity');
    t.integer('lead_time_days').unsigned().nullable().comment('Answer: lead time, days');
    t.date('valid_until').nullable().comment('Answer: the offer holds until this date');
    t.integer('source_id')
      .unsigned()
      .nullable()
      .references('part_sources.id')
      .onDelete('SET NULL')
      .comment('The part source made from the answer');
    t.unique(['quote_request_id', 'line_no'], { indexName: 'quote_request_lines_no_uq' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('quote_request_lines');
  await knex.schema.dropTable('quote_requests');
  await knex.schema.dropTable('supplier_contacts');
}
