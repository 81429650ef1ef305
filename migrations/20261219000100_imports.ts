import type { Knex } from 'knex';

/**
 * Imports of spreadsheets. Each upload is checked before anything is written, and the check is
 * kept: who sent which file (by name and by the SHA-256 of its bytes), what each template's rows
 * would create, change or leave alone, and every problem found, for the history and its error
 * report; and the rows as checked, which a commit writes in one transaction. A file's content can be imported once: a second committed import of the same bytes is
 * refused by the database itself.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('imports', (table) => {
    table.increments('id').primary();
    table.text('file_name').notNullable();
    table.text('file_kind').notNullable();
    table.integer('byte_size').notNullable();
    table.text('content_sha256').notNullable();
    table.text('state').notNullable().defaultTo('checked');
    table.jsonb('counts').notNullable().defaultTo('{}').comment('per template: { rows, create, update, unchanged }');
    table.integer('problem_count').notNullable().defaultTo(0);
    table.jsonb('problems').notNullable().defaultTo('[]').comment('every problem: { sheet, row, column, value, message }');
    table.integer('uploaded_by').references('users.id');
    table.timestamp('uploaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.integer('committed_by').references('users.id');
    table.timestamp('committed_at', { useTz: true });
    table.integer('progress_done');
    table.integer('progress_total');
    table.integer('version').notNullable().defaultTo(1);
    table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("file_kind in ('csv', 'xlsx')", [], 'imports_file_kind_known');
    table.check("state in ('checked', 'committing', 'committed', 'failed', 'discarded')", [], 'imports_state_known');
  });
  // The rows as checked, in file order: a commit writes them, so the file itself need not be kept.
  await knex.schema.createTable('import_rows', (table) => {
    table.integer('import_id').notNullable().references('imports.id').onDelete('CASCADE');
    table.integer('position').notNullable();
    table.text('template').notNullable();
    table.text('sheet').notNullable();
    table.integer('row_number').notNullable();
    table.text('key_columns').notNullable();
    table.jsonb('body').notNullable();
    table.primary(['import_id', 'position']);
  });
  await knex.raw('create index imports_uploaded on imports (uploaded_at desc)');
  await knex.raw("create unique index imports_content_once on imports (content_sha256) where state = 'committed'");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('import_rows');
  await knex.schema.dropTable('imports');
}
