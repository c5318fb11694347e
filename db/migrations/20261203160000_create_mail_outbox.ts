import type { Knex } from 'knex';

/**
 * E-mail waiting to go out (an outbox). The transaction that records what a mail reports (a request for
 * quotation) writes the whole message here; after commit a sender claims a row (claimed_by and
 * claimed_until set in one UPDATE where the row is unclaimed or its claim has run out), hands it to the
 * SMTP server and marks it delivered. A failed try leaves it pending with the next try later (backoff);
 * after the last allowed try it is marked failed. A rolled-back transaction leaves no row, so no mail.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.comment('E-mail recorded with the change it reports, delivered after commit (outbox)');
    t.increments('id').primary().comment('Surrogate key');
    t.string('idempotency_key', 150).notNullable().comment('One row per message meant; also the stable Message-ID of the mail');
    t.string('kind', 40).notNullable().comment('What the mail is for ("quote_request")');
    t.integer('ref_id').unsigned().nullable().comment('The record the mail reports (quote_requests.id for kind quote_request)');
    t.string('to_address', 320).notNullable().comment('Recipient');
    t.string('subject', 500).notNullable().comment('Subject line');
    t.text('text_body', 'mediumtext').notNullable().comment('Plain-text body');
    t.text('html_body', 'mediumtext').notNullable().comment('HTML body');
    t.text('attachments_json', 'mediumtext').nullable().comment('Attachments as JSON [{filename, contentType, content}], or NULL');
    t.enu('state', ['pending', 'delivered', 'failed'])
      .notNullable()
      .defaultTo('pending')
      .comment('pending → delivered, or failed after the last try');
    t.integer('attempts').unsigned().notNullable().defaultTo(0).comment('Delivery tries so far');
    t.timestamp('next_attempt_at', { precision: 3 })
      .notNullable()
      .defaultTo(knex.fn.now(3))
      .comment('Not tried again before this time (UTC)');
    t.string('claimed_by', 120).nullable().comment('Sender run delivering it now; NULL when nobody is');
    t.timestamp('claimed_until', { precision: 3 })
      .nullable()
      .comment('The claim runs out at this time (UTC), so a sender that died frees the row');
    t.string('last_error', 1000).nullable().comment('Why the last try failed');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When it was recorded (UTC)');
    t.timestamp('delivered_at', { precision: 3 }).nullable().comment('When the SMTP server took it (UTC)');
    t.unique(['idempotency_key'], { indexName: 'mail_outbox_key_uq' });
    t.index(['state', 'next_attempt_at'], 'mail_outbox_due_idx');
    t.index(['kind', 'ref_id'], 'mail_outbox_ref_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mail_outbox');
}
