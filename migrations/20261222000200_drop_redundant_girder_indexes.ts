import type { Knex } from 'knex';

/**
 * Two indexes that the unique keys already give: a girder's span is the leading column of
 * (span_id, girder_number), a strand row's girder of (girder_id, row_key), and PostgreSQL finds
 * rows by a leading column through either. Each costs every girder or strand row written an
 * index entry to keep — a bulk import of 50 000 girders keeps 100 000 of them for nothing.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('drop index girders_span');
  await knex.raw('drop index strand_rows_girder');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('create index girders_span on girders (span_id)');
  await knex.raw('create index strand_rows_girder on strand_rows (girder_id)');
}
