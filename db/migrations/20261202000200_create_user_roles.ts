import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('user_roles', (t) => {
    t.comment('Roles held by a person; a person may hold several');
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE').comment('The person');
    t.enu('role', ['admin', 'librarian', 'designer', 'buyer']).notNullable().comment('One role the person holds');
    t.primary(['user_id', 'role']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('user_roles');
}
