import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.comment('People who sign in to Stallpoint');
    t.increments('id').primary().comment('Surrogate key');
    t.string('email', 254).notNullable().unique().comment('Sign-in address, stored lower-case');
    t.string('name', 120).notNullable().comment('Display name');
    t.string('password_hash', 255).nullable().comment('argon2id PHC string; null until an invitee sets a password');
    t.boolean('active').notNullable().defaultTo(true).comment('False once deactivated: no sign-in, sessions revoked');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Row creation time (UTC)');
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Last change (UTC)');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users');
}
