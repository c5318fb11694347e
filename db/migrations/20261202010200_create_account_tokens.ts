import type { Knex } from 'knex';

/** Single-use e-mailed tokens: invitations (72 h) and password resets (30 min). Only hashes are stored. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('account_tokens', (t) => {
    t.comment('Single-use invitation and password-reset tokens; only the SHA-256 of each token is stored');
    t.increments('id').primary().comment('Surrogate key');
    t.specificType('token_hash', 'binary(32)').notNullable().unique().comment('SHA-256 of the token sent by e-mail');
    t.enu('purpose', ['invite', 'reset']).notNullable().comment('invite: set a first password; reset: replace a forgotten one');
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE').comment('Whose account the token opens');
    t.integer('created_by')
      .unsigned()
      .nullable()
      .references('users.id')
      .onDelete('SET NULL')
      .comment('Admin who sent an invite; null for resets');
    t.datetime('created_at', { precision: 3 }).notNullable().comment('Issue time (UTC)');
    t.datetime('expires_at', { precision: 3 }).notNullable().comment('No longer accepted from this time (UTC)');
    t.datetime('used_at', { precision: 3 }).nullable().comment('When it was used or withdrawn (UTC); null while open');
    t.index(['user_id', 'purpose'], 'account_tokens_user_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('account_tokens');
}
