import type { Knex } from 'knex';

/** Messages caught by the local SMTP sink (npm start / npm test), shown to admins on the mail-sink page. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('captured_mail', (t) => {
    t.comment('E-mail received by the local SMTP sink in place of a hosted mail service (local mode only)');
    t.increments('id').primary().comment('Surrogate key');
    t.datetime('received_at', { precision: 3 }).notNullable().comment('When the sink accepted it (UTC)');
    t.string('envelope_from', 320).notNullable().comment('SMTP MAIL FROM address');
    t.string('envelope_to', 2000).notNullable().comment('SMTP RCPT TO addresses, comma-separated, lower-case');
    t.string('subject', 500).notNullable().comment('Subject header');
    t.text('text_body', 'mediumtext').nullable().comment('Plain-text part');
    t.text('html_body', 'mediumtext').nullable().comment('HTML part, stored as received (never rendered as HTML by the app)');
    t.string('message_id', 300).nullable().comment('Message-ID header');
    t.integer('size_bytes').unsigned().notNullable().comment('Size of the raw message, bytes');
    t.index(['received_at'], 'captured_mail_received_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('captured_mail');
}
