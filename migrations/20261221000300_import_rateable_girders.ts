import type { Knex } from 'knex';

/**
 * What an import's check found the engine could rate, kept for its commit: the digests of the
 * girders passed (engine version, record, section and span), so the commit checks again only a
 * girder whose calculation file the register has changed since. Cleared once the import is
 * committed or set aside.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('imports', (table) => {
    table.json('rateable_girders').comment('["<sha-256, base64>", …]: girders the check passed; null once committed or set aside');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('imports', (table) => {
    table.dropColumn('rateable_girders');
  });
}
