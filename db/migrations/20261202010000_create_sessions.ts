import type { Knex } from 'knex';

/** Sign-in sessions (Lucia sessions guide): the cookie holds `id.secret`, only SHA-256(secret) is stored. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sessions', (t) => {
    t.comment('Signed-in sessions; the secret half of the token is stored only as its SHA-256');
    t.string('id', 32).primary().comment('Public half of the session token (random, base32)');
    t.specificType('secret_hash', 'binary(32)').notNullable().comment('SHA-256 of the secret half of the token');
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE').comment('The signed-in person');
    t.datetime('created_at', { precision: 3 }).notNullable().comment('Sign-in time (UTC); absolute expiry counts from here');
    t.datetime('last_active_at', { precision: 3 })
      .notNullable()
      .comment('Last refresh (UTC, at most hourly); idle expiry counts from here');
    t.index(['user_id'], 'sessions_user_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sessions');
}
