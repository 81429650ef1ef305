import type { Knex } from 'knex';

/** Rows of one template per page; the commit holds one page in memory at a time. */
const ROWS_PER_PAGE = 5000;

/**
 * A checked import's rows are kept in pages of a few thousand rows of one template, as JSON text,
 * instead of a row each: storing and reading 100 000 rows one by one took the database seconds,
 * and the commit had to hold all of them at once. Checked imports waiting for their commit keep
 * their rows, paged in file order within each template.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('import_row_pages', (table) => {
    table.integer('import_id').notNullable().references('imports.id').onDelete('CASCADE');
    table.text('template').notNullable();
    table.integer('page').notNullable().comment('0, 1, … within the template, in file order');
    table.integer('row_count').notNullable();
    table.json('rows').notNullable().comment('[{ template, sheet, rowNumber, keyColumns, body }, …] as the check converted them');
    table.primary(['import_id', 'template', 'page']);
  });
  await knex.raw(
    `insert into import_row_pages (import_id, template, page, row_count, rows)
     select import_id, template, place / ${ROWS_PER_PAGE}, count(*),
            json_agg(json_build_object('template', template, 'sheet', sheet, 'rowNumber', row_number, 'keyColumns', key_columns, 'body', body) order by position)
       from (select *, row_number() over (partition by import_id, template order by position) - 1 as place from import_rows) as placed
      group by import_id, template, place / ${ROWS_PER_PAGE}`,
  );
  await knex.schema.dropTable('import_rows');
}

export async function down(knex: Knex): Promise<void> {
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
  await knex.raw(
    `insert into import_rows (import_id, position, template, sheet, row_number, key_columns, body)
     select p.import_id, row_number() over (partition by p.import_id order by p.template, p.page, r.place) - 1, p.template,
            r.row->>'sheet', (r.row->>'rowNumber')::integer, r.row->>'keyColumns', (r.row->'body')::jsonb
       from import_row_pages p, json_array_elements(p.rows) with ordinality as r(row, place)`,
  );
  await knex.schema.dropTable('import_row_pages');
}
