import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('datasheets', (t) => {
    t.comment('Datasheet PDFs attached to parts; the file lives in storage under storage_key');
    t.increments('id').primary().comment('Surrogate key');
    t.integer('part_id').unsigned().notNullable().references('parts.id').onDelete('CASCADE').comment('The part');
    t.string('original_name', 255).notNullable().comment('Sanitised original file name, for download');
    t.string('storage_key', 100).notNullable().unique().comment('Generated name in the datasheet store');
    t.string('sha256', 64).notNullable().comment('SHA-256 of the file bytes, hex');
    t.integer('bytes').unsigned().notNullable().comment('File size, bytes');
    t.integer('pages').unsigned().notNullable().comment('Page count read by parsing the PDF');
    t.string('revision', 40).nullable().comment('Datasheet revision label');
    t.integer('uploaded_by').unsigned().nullable().references('users.id').onDelete('SET NULL').comment('Who uploaded it');
    t.timestamp('uploaded_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).comment('Upload time (UTC)');
    t.unique(['part_id', 'sha256'], { indexName: 'datasheets_part_sha_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('datasheets');
}
