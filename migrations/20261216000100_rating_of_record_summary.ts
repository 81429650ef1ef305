import type { Knex } from 'knex';

/**
 * The rating of record's headline figures kept on the structure, so the network map can colour
 * and filter ten thousand structures without reading their ratings: the lowest legal-load rating
 * factor and the design-load inventory factor, with the day they were approved. Rating records
 * (a later migration) set them when a rating is approved; null means not rated.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('structures', (table) => {
    table.double('rating_of_record_legal_rf');
    table.double('rating_of_record_inventory_rf');
    table.timestamp('rating_of_record_approved_at', { useTz: true });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('structures', (table) => {
    table.dropColumns('rating_of_record_legal_rf', 'rating_of_record_inventory_rf', 'rating_of_record_approved_at');
  });
}
