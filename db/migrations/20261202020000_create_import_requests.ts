import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('import_requests', (t) => {
    t.comment('Committed CSV imports by Idempotency-Key: a repeated request replays the stored result instead of importing twice');
    t.increments('id').primary().comment('Surrogate key');
    t.string('idempotency_key', 100).notNullable().unique().comment('Idempotency-Key header the client sent with the commit');
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Who committed the import');
    t.string('request_sha256', 64).notNullable().comment('SHA-256 of the CSV text, hex: the same key with another file is refused');
    t.integer('rows_imported').unsigned().notNullable().defaultTo(0).comment('Parts created by this import');
    t.text('result_json', 'longtext').nullable().comment('The response body of the commit, JSON, replayed on a repeat');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('When the import was committed (UTC)');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('import_requests');
}
