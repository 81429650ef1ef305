import type { Knex } from 'knex';

/**
 * What else an import's check keeps for its commit: how many girders the file gives each span,
 * which a new span is created with. The commit otherwise read every girders page twice, once to
 * count them before writing the spans and again to write them. Null for a check kept before this
 * column (the commit then counts them from the pages) and once committed or set aside.
 *
 * The checked rows' pages are compressed with lz4 instead of the default pglz: storing the pages
 * of 100 000 rows took the database most of a second, of which compressing was more than half.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('imports', (table) => {
    table.json('girders_per_span').comment('{"[\\"<structure number>\\",<span index>]": girders in the file, …}; null once committed or set aside');
  });
  await knex.raw('alter table import_row_pages alter column rows set compression lz4');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table import_row_pages alter column rows set compression default');
  await knex.schema.alterTable('imports', (table) => {
    table.dropColumn('girders_per_span');
  });
}
