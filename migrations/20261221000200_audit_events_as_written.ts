import type { Knex } from 'knex';

/**
 * The history keeps each event's before and after as the JSON text written, not as `jsonb`: the
 * history is only ever read back whole, never searched inside, and turning every event into
 * `jsonb` was a third of the database's work in a bulk import (56 000 events for 50 000 girders).
 * The text is also kept exactly as written.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('alter table audit_events alter column before type json using before::json, alter column after type json using after::json');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table audit_events alter column before type jsonb using before::jsonb, alter column after type jsonb using after::jsonb');
}
