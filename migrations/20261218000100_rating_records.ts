import type { Knex } from 'knex';

/**
 * Rating records of spans. A record keeps, per girder rated, the calculation file the engine read
 * and the engine's output (`rating_girders`), so every number can be traced to the inventory and
 * findings that produced it and re-run. One approved record per span is its rating of record.
 * A span is flagged "re-rating due" with the moment of the latest change to its damage or
 * inventory, until a rating run after that moment is approved.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('ratings', (table) => {
    table.increments('id').primary();
    table.integer('span_id').notNullable().references('spans.id');
    table.text('state').notNullable().defaultTo('draft');
    table.jsonb('run').notNullable().comment('the choices of the run: girders, vehicles, policy, curve, exclusions, what-if damage (shared/src/ratings.ts ratingRun)');
    table.timestamp('run_at', { useTz: true }).notNullable().comment('when the inputs were assembled from the inventory and the register');
    table.jsonb('applied_findings').notNullable().comment('each open finding of the span as the run used it: applied or excluded with a reason');
    table.boolean('hypothetical').notNullable().defaultTo(false);
    table.text('engine_version').notNullable();
    table.text('policy_id').notNullable();
    table.text('policy_version').notNullable();
    table.jsonb('vehicles').notNullable().comment('[{ id, version, name, category }] as rated');
    table.double('lowest_legal_rf');
    table.double('lowest_inventory_rf');
    table.jsonb('warnings').notNullable().defaultTo('[]');
    table.integer('previous_record_id').references('ratings.id').comment('the span\'s rating of record when this one was run');
    table.jsonb('review_comments').notNullable().defaultTo('[]');
    table.integer('submitted_by').references('users.id');
    table.timestamp('submitted_at', { useTz: true });
    table.integer('reviewed_by').references('users.id');
    table.timestamp('reviewed_at', { useTz: true });
    table.integer('version').notNullable().defaultTo(1);
    table.integer('created_by').references('users.id');
    table.integer('updated_by').references('users.id');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("state in ('draft', 'submitted', 'returned', 'approved', 'superseded')", [], 'ratings_state_known');
    table.check("not (hypothetical and state in ('approved', 'superseded'))", [], 'ratings_hypothetical_never_of_record');
  });
  await knex.raw('create index ratings_span on ratings (span_id, created_at desc)');
  await knex.raw("create index ratings_waiting on ratings (state) where state = 'submitted'");
  // The rating of record: at most one per span.
  await knex.raw("create unique index ratings_one_of_record on ratings (span_id) where state = 'approved'");

  await knex.schema.createTable('rating_girders', (table) => {
    table.integer('rating_id').notNullable().references('ratings.id').onDelete('CASCADE');
    table.integer('girder_id').notNullable().references('girders.id');
    table.smallint('girder_number').notNullable();
    table.text('position').notNullable();
    table.jsonb('calc_file').notNullable().comment('the rate calculation file as assembled (calc-file.md)');
    table.jsonb('output').notNullable().comment('the engine\'s rate output for that file');
    table.primary(['rating_id', 'girder_id']);
  });

  await knex.schema.alterTable('spans', (table) => {
    table.timestamp('rerating_due_since', { useTz: true }).comment('the latest change to damage or inventory no approved rating has taken in; null when none');
  });
  // Spans whose register already holds damage with an effect on flexure are due from the day it was submitted.
  await knex.raw(`
    update spans as sp set rerating_due_since = due.since
      from (select g.span_id, max(i.submitted_at) as since
              from findings f join inspections i on i.id = f.inspection_id join girders g on g.id = f.girder_id
             where i.submitted_at is not null and f.superseded_by_id is null and f.disposition <> 'repaired'
               and f.kind not in ('crack', 'other')
             group by g.span_id) as due
     where due.span_id = sp.id`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('spans', (table) => table.dropColumn('rerating_due_since'));
  await knex.schema.dropTable('rating_girders');
  await knex.schema.dropTable('ratings');
}
