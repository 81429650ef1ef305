import type { Knex } from 'knex';

/**
 * Photos of inspections and of their findings. The image files live in the S3 photo store under
 * `object_key` (the original, byte for byte) and `thumbnail_key` (a JPEG of at most 320 px); the
 * row holds what the API answers without reading the store. A photo goes with its inspection
 * (CASCADE); when its finding is deleted it stays on the inspection (SET NULL), because a cascade
 * would drop the row silently and leave its files in the store with nothing pointing at them.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('photos', (table) => {
    table.increments('id').primary();
    table.integer('inspection_id').notNullable().references('inspections.id').onDelete('CASCADE');
    table.integer('finding_id').references('findings.id').onDelete('SET NULL');
    table.text('object_key').notNullable().unique();
    table.text('thumbnail_key').notNullable().unique();
    table.text('content_type').notNullable();
    table.integer('byte_size').notNullable();
    table.integer('width_px').notNullable();
    table.integer('height_px').notNullable();
    table.text('original_name').notNullable();
    table.integer('uploaded_by').notNullable().references('users.id');
    table.timestamp('uploaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.integer('created_by');
    table.integer('updated_by');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("content_type in ('image/jpeg', 'image/png', 'image/webp')", [], 'photos_content_type_known');
    table.check('byte_size > 0 and width_px > 0 and height_px > 0', [], 'photos_sizes_positive');
  });
  await knex.raw('create index photos_inspection on photos (inspection_id, uploaded_at)');
  await knex.raw('create index photos_finding on photos (finding_id) where finding_id is not null');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('photos');
}
