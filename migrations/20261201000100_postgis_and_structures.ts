import type { Knex } from 'knex';

/** PostGIS and the bridge register: one row per structure the owner carries. */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('create extension if not exists postgis');
  await knex.schema.createTable('structures', (table) => {
    table.increments('id').primary();
    table.text('structure_number').notNullable().unique().comment("The owner's own structure number");
    table.text('name').notNullable();
    table.text('route_carried').notNullable();
    table.text('feature_crossed').notNullable();
    table.text('district').notNullable();
    table.specificType('location', 'geometry(Point,4326)').notNullable();
    table.smallint('year_built');
    table.integer('adt').comment('Average daily traffic, vehicles per day');
    table.integer('adtt').comment('Average daily truck traffic, trucks per day');
    table.timestamps(true, true);
    table.check('year_built between 1800 and 2200', [], 'structures_year_built_range');
    table.check('adt >= 0 and adtt >= 0 and adtt <= adt', [], 'structures_traffic_range');
    table.check("structure_number <> '' and name <> ''", [], 'structures_identity_not_blank');
  });
  await knex.raw('create index structures_location_gist on structures using gist (location)');
  await knex.raw('create index structures_district on structures (district)');

  // Remembers which one-time data loads (the demo scenario) have run, so they run once.
  await knex.schema.createTable('data_loads', (table) => {
    table.text('name').primary();
    table.timestamp('loaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('data_loads');
  await knex.schema.dropTable('structures');
}
