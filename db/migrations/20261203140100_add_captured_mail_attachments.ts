import type { Knex } from 'knex';

/** The local SMTP sink keeps attachments too (requests for quotation carry a CSV), so admins and tests can read them. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('captured_mail', (t) => {
    t.text('attachments_json', 'mediumtext')
      .nullable()
      .after('html_body')
      .comment('Attachments as JSON: [{filename, contentType, text}] (text: the content as UTF-8); NULL: none');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('captured_mail', (t) => {
    t.dropColumn('attachments_json');
  });
}
