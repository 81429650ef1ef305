import type { Knex } from 'knex';

/**
 * Field inspections and their findings, the damage register, and in-app alerts. A finding is
 * recorded against one girder; when a later inspection carries it forward, the copy points back
 * to it (`carried_from_id`) and, once submitted, supersedes it or marks it repaired. Every change
 * is kept in the history; inspections and findings carry a `version` for optimistic concurrency.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('inspections', (table) => {
    table.increments('id').primary();
    table.integer('structure_id').notNullable().references('structures.id').onDelete('CASCADE');
    table.date('inspected_on').notNullable();
    table.text('kind').notNullable();
    table.integer('inspector_id').notNullable().references('users.id');
    table.smallint('deck_condition');
    table.smallint('superstructure_condition');
    table.smallint('substructure_condition');
    table.text('notes').notNullable().defaultTo('');
    table.text('state').notNullable().defaultTo('draft');
    table.text('return_comment');
    table.timestamp('submitted_at', { useTz: true });
    table.integer('reviewed_by').references('users.id');
    table.timestamp('reviewed_at', { useTz: true });
    table.integer('version').notNullable().defaultTo(1);
    table.integer('created_by');
    table.integer('updated_by');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("kind in ('routine', 'in-depth', 'damage')", [], 'inspections_kind_known');
    table.check("state in ('draft', 'submitted', 'returned', 'accepted')", [], 'inspections_state_known');
    table.check(
      ['deck_condition', 'superstructure_condition', 'substructure_condition'].map((c) => `(${c} is null or ${c} between 0 and 9)`).join(' and '),
      [],
      'inspections_condition_range',
    );
  });
  await knex.raw('create index inspections_structure on inspections (structure_id, inspected_on desc)');

  await knex.schema.createTable('findings', (table) => {
    table.increments('id').primary();
    table.integer('inspection_id').notNullable().references('inspections.id').onDelete('CASCADE');
    table.integer('girder_id').notNullable().references('girders.id').onDelete('CASCADE');
    table.text('kind').notNullable();
    table.jsonb('strands').comment('{ rowId, strands | count } for kinds that name strands');
    table.double('loss_fraction');
    table.smallint('broken_wires');
    table.jsonb('spall').comment('{ depthMm, widthMm } of a bottom-flange spall');
    table.double('deck_loss_mm');
    table.double('crack_width_mm');
    table.double('from_m').notNullable();
    table.double('to_m').notNullable();
    table.text('severity').notNullable();
    table.text('notes').notNullable().defaultTo('');
    table.text('disposition').notNullable().defaultTo('new');
    table.integer('carried_from_id').references('findings.id');
    table.integer('superseded_by_id').references('findings.id');
    table.boolean('critical').notNullable().defaultTo(false);
    table.integer('version').notNullable().defaultTo(1);
    table.integer('created_by');
    table.integer('updated_by');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check(
      "kind in ('lost-strands', 'strand-section-loss', 'broken-wires', 'exposed-strands', 'spall', 'deck-loss', 'crack', 'other')",
      [],
      'findings_kind_known',
    );
    table.check("severity in ('minor', 'moderate', 'severe', 'critical')", [], 'findings_severity_known');
    table.check("disposition in ('new', 'to-review', 'confirmed', 'grown', 'repaired')", [], 'findings_disposition_known');
    table.check('from_m >= 0 and to_m >= from_m', [], 'findings_location_ordered');
    table.check('(disposition = \'new\') = (carried_from_id is null)', [], 'findings_carried_have_origin');
  });
  await knex.raw('create index findings_inspection on findings (inspection_id)');
  await knex.raw('create index findings_girder on findings (girder_id)');
  // One inspection carries a finding forward once.
  await knex.raw('create unique index findings_carried_once on findings (inspection_id, carried_from_id) where carried_from_id is not null');

  await knex.schema.createTable('alerts', (table) => {
    table.increments('id').primary();
    table.integer('user_id').notNullable().references('users.id').onDelete('CASCADE');
    table.text('kind').notNullable();
    table.text('message').notNullable();
    table.integer('structure_id').notNullable().references('structures.id').onDelete('CASCADE');
    table.integer('girder_id').references('girders.id').onDelete('SET NULL');
    table.integer('inspection_id').references('inspections.id').onDelete('SET NULL');
    table.integer('finding_id').references('findings.id').onDelete('SET NULL');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('read_at', { useTz: true });
    table.check("kind in ('critical-finding')", [], 'alerts_kind_known');
  });
  await knex.raw('create index alerts_user on alerts (user_id, created_at desc)');
}

export async function down(knex: Knex): Promise<void> {
  for (const name of ['alerts', 'findings', 'inspections']) await knex.schema.dropTable(name);
}
