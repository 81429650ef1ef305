import type { Knex } from 'knex';

/**
 * The girder inventory: the structure register grows its condition and status, and gains spans,
 * a catalogue of girder types, girders and their strand rows, and the engine's vehicle library
 * and rating policies. Girder data maps one-to-one onto the calculation file's `girder` part
 * (docs/calc-file.md), so a rating can be assembled from it without loss. Every table keeps who
 * and when created and last changed it, and a `version` for optimistic concurrency.
 */

/** Who changed a row is a user id of the sign-in users table; history keeps the full story. */
function changeTracking(knex: Knex, table: Knex.CreateTableBuilder): void {
  table.integer('version').notNullable().defaultTo(1);
  table.integer('created_by');
  table.integer('updated_by');
  table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
}

const conditionRating = (column: string) => `${column} is null or ${column} between 0 and 9`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('structures', (table) => {
    table.smallint('year_last_major_work');
    table.double('skew_deg').notNullable().defaultTo(0);
    table.smallint('deck_condition');
    table.smallint('superstructure_condition');
    table.smallint('substructure_condition');
    table.date('condition_rated_on');
    table.text('status').notNullable().defaultTo('open');
    table.text('notes').notNullable().defaultTo('');
    table.integer('version').notNullable().defaultTo(1);
    table.integer('created_by');
    table.integer('updated_by');
    table.check("status in ('open', 'posted', 'closed')", [], 'structures_status_known');
    table.check('skew_deg >= 0 and skew_deg < 90', [], 'structures_skew_range');
    table.check(
      [conditionRating('deck_condition'), conditionRating('superstructure_condition'), conditionRating('substructure_condition')].map((rule) => `(${rule})`).join(' and '),
      [],
      'structures_condition_range',
    );
  });

  await knex.schema.createTable('spans', (table) => {
    table.increments('id').primary();
    table.integer('structure_id').notNullable().references('structures.id').onDelete('CASCADE');
    table.smallint('span_index').notNullable().comment('1, 2, … from the start of the structure');
    table.double('length_m').notNullable();
    table.smallint('girder_count').notNullable();
    table.double('girder_spacing_mm').notNullable();
    table.double('overhang_mm').notNullable();
    table.double('roadway_width_mm').notNullable();
    table.double('barrier_face_to_girder_mm').comment('Exterior girder centreline to the barrier traffic face, positive when the face is outboard');
    table.double('deck_thickness_mm').notNullable().comment('Structural thickness, without a sacrificial wearing surface');
    table.double('haunch_mm').notNullable().defaultTo(0);
    table.jsonb('wearing_surface').comment('calc-file span.wearingSurface, or null');
    table.jsonb('barriers').notNullable().defaultTo('[]');
    table.jsonb('diaphragms').notNullable().defaultTo('[]');
    table.text('support_type').notNullable().defaultTo('simple').comment('simple now; continuous spans are rated in a later version');
    table.specificType('line_geometry', 'geometry(LineString,4326)');
    changeTracking(knex, table);
    table.unique(['structure_id', 'span_index']);
    table.check('length_m > 0 and girder_count >= 2 and girder_spacing_mm > 0 and overhang_mm >= 0', [], 'spans_geometry_positive');
    table.check('roadway_width_mm > 0 and deck_thickness_mm > 0 and haunch_mm >= 0', [], 'spans_deck_positive');
    table.check("support_type in ('simple', 'continuous')", [], 'spans_support_known');
  });

  await knex.schema.createTable('girder_types', (table) => {
    table.increments('id').primary();
    table.text('name').notNullable().unique();
    table.jsonb('section').notNullable().comment('calc-file girder.section');
    table.text('source').notNullable().comment('The published table the shape comes from, or "from memory — verify"');
    changeTracking(knex, table);
  });

  await knex.schema.createTable('girders', (table) => {
    table.increments('id').primary();
    table.integer('span_id').notNullable().references('spans.id').onDelete('CASCADE');
    table.smallint('girder_number').notNullable().comment('1…n across the span from the left edge of the plans');
    table.text('position').notNullable();
    table.integer('girder_type_id').references('girder_types.id');
    table.jsonb('section').comment('A custom calc-file section, when the girder has no type');
    table.jsonb('section_overrides').notNullable().defaultTo('{}').comment("Keys of the type's section that this girder changes");
    table.jsonb('concrete').notNullable().comment('calc-file girder.concrete');
    table.jsonb('deck_concrete').notNullable().comment('calc-file girder.deck strength, basis, unit weight, Ec');
    table.text('tensioning').notNullable().defaultTo('pre');
    table.jsonb('losses').notNullable().defaultTo('{"method":"given"}');
    table.jsonb('profiles').notNullable().defaultTo('[]');
    table.jsonb('debonding').notNullable().defaultTo('[]');
    table.jsonb('bars').notNullable().defaultTo('[]');
    changeTracking(knex, table);
    table.unique(['span_id', 'girder_number']);
    table.check("position in ('interior', 'exterior')", [], 'girders_position_known');
    table.check("tensioning in ('pre', 'post')", [], 'girders_tensioning_known');
    table.check('(girder_type_id is null) <> (section is null)', [], 'girders_type_or_section');
  });

  await knex.schema.createTable('strand_rows', (table) => {
    table.increments('id').primary();
    table.integer('girder_id').notNullable().references('girders.id').onDelete('CASCADE');
    table.text('row_key').notNullable().comment('The stable id damage entries and profiles refer to');
    table.smallint('row_order').notNullable();
    table.double('y_mm').notNullable();
    table.smallint('strand_count').notNullable();
    table.specificType('x_mm', 'double precision[]');
    table.double('strand_area_mm2').notNullable();
    table.double('strand_diameter_mm').notNullable();
    table.double('fpu_mpa').notNullable();
    table.double('fpy_mpa').notNullable();
    table.double('eps_mpa').notNullable();
    table.double('fpe_mpa');
    table.boolean('bonded').notNullable().defaultTo(true);
    table.double('unbonded_length_mm');
    changeTracking(knex, table);
    table.unique(['girder_id', 'row_key']);
    table.check('strand_count > 0 and strand_area_mm2 > 0 and strand_diameter_mm > 0', [], 'strand_rows_positive');
    table.check('fpy_mpa < fpu_mpa and eps_mpa > 0', [], 'strand_rows_material');
    table.check('x_mm is null or cardinality(x_mm) = strand_count', [], 'strand_rows_positions_match_count');
  });
  await knex.raw('create index girders_span on girders (span_id)');
  await knex.raw('create index strand_rows_girder on strand_rows (girder_id)');

  // The engine's vehicle library and rating policies, versioned: a rating records the version it used.
  for (const name of ['vehicles', 'rating_policies']) {
    await knex.schema.createTable(name, (table) => {
      table.text('id').notNullable();
      table.text('version').notNullable();
      table.jsonb('definition').notNullable();
      table.text('source').notNullable();
      table.integer('created_by');
      table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
      table.primary(['id', 'version']);
    });
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const name of ['rating_policies', 'vehicles', 'strand_rows', 'girders', 'girder_types', 'spans']) await knex.schema.dropTable(name);
  await knex.schema.alterTable('structures', (table) => {
    table.dropChecks(['structures_status_known', 'structures_skew_range', 'structures_condition_range']);
    for (const column of ['year_last_major_work', 'skew_deg', 'deck_condition', 'superstructure_condition', 'substructure_condition', 'condition_rated_on', 'status', 'notes', 'version', 'created_by', 'updated_by']) {
      table.dropColumn(column);
    }
  });
}
