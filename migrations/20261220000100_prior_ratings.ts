import type { Knex } from 'knex';

/**
 * Imported findings and prior ratings.
 *
 * An inspection is recorded in the field (`source = 'field'`) or from an imported spreadsheet of
 * field sheets (`source = 'import'`), and an imported one names the import that wrote it.
 *
 * `prior_ratings` keeps the ratings an owner had on file before Spanledger — for a whole structure
 * (`span_id` null) or one span — so that the change from the previous rating is known from the
 * first day and a network never rated in Spanledger still has rating-of-record figures for the
 * map. One prior rating per structure, span and day of approval.
 *
 * The rows an import's commit writes are claimed by that import when it becomes committed, in the
 * same transaction: the commit's writers do not know the import's id, and a row not yet claimed
 * can only be one written by the transaction making the commit — any other transaction's rows are
 * invisible until it commits, and by then its own import has claimed them. A failed commit rolls
 * its rows back with it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('inspections', (table) => {
    table.text('source').notNullable().defaultTo('field');
    table.integer('import_id').references('imports.id');
    table.check("source in ('field', 'import')", [], 'inspections_source_known');
  });
  await knex.raw("create index inspections_unclaimed_import on inspections (structure_id) where source = 'import' and import_id is null");

  await knex.schema.createTable('prior_ratings', (table) => {
    table.increments('id').primary();
    table.integer('structure_id').notNullable().references('structures.id').onDelete('CASCADE');
    table.integer('span_id').references('spans.id').onDelete('CASCADE').comment('null: the rating is of the whole structure');
    table.double('lowest_legal_rf');
    table.double('design_inventory_rf');
    table.date('approved_on').notNullable();
    table.text('source_note').notNullable();
    table.integer('import_id').references('imports.id').comment('the import that last wrote it');
    table.integer('version').notNullable().defaultTo(1);
    table.integer('created_by').references('users.id');
    table.integer('updated_by').references('users.id');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check('lowest_legal_rf is not null or design_inventory_rf is not null', [], 'prior_ratings_some_figure');
    table.check('(lowest_legal_rf is null or lowest_legal_rf >= 0) and (design_inventory_rf is null or design_inventory_rf >= 0)', [], 'prior_ratings_figures_range');
  });
  await knex.raw('create unique index prior_ratings_one_a_day on prior_ratings (structure_id, coalesce(span_id, 0), approved_on)');
  await knex.raw('create index prior_ratings_unclaimed on prior_ratings (structure_id) where import_id is null');

  await knex.raw(`
    create function imports_claim_written_rows() returns trigger language plpgsql as $$
    begin
      update inspections set import_id = new.id where source = 'import' and import_id is null;
      update prior_ratings set import_id = new.id where import_id is null;
      return new;
    end $$`);
  await knex.raw(`
    create trigger imports_claim_written_rows after update of state on imports
    for each row when (new.state = 'committed' and old.state is distinct from 'committed')
    execute function imports_claim_written_rows()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop trigger imports_claim_written_rows on imports');
  await knex.raw('drop function imports_claim_written_rows()');
  await knex.schema.dropTable('prior_ratings');
  await knex.raw('drop index inspections_unclaimed_import');
  await knex.schema.alterTable('inspections', (table) => {
    table.dropChecks(['inspections_source_known']);
    table.dropColumns('source', 'import_id');
  });
}
