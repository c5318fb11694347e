import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('design_parts', (t) => {
    t.comment('Parts a design uses in its current revision (chosen and alternates), for where-used and shortlists');
    t.integer('design_id').unsigned().notNullable().references('designs.id').onDelete('CASCADE').comment('The design');
    t.enu('role', ['motor', 'switch', 'driver', 'diode']).notNullable().comment('Line of the design the part fills');
    t.integer('position').unsigned().notNullable().comment('0 = chosen part, 1-3 = alternates in order of preference');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The part');
    t.primary(['design_id', 'role', 'position']);
    t.index(['part_id'], 'design_parts_part_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('design_parts');
}
