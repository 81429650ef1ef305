import type { Knex } from 'knex';

/**
 * Sign-in and history: the users the identity provider vouched for, their sessions, the SAML
 * requests awaiting an answer, and the append-only history of every change.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (table) => {
    table.increments('id').primary();
    // The identity provider's subject (NameID) is the stable key; e-mail addresses can change.
    table.text('subject').notNullable().unique();
    table.text('email').notNullable();
    table.text('display_name').notNullable();
    table.text('role').notNullable();
    table.specificType('districts', 'text[]').notNullable().defaultTo('{}');
    table.boolean('admin').notNullable().defaultTo(false);
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('last_signed_in_at', { useTz: true }).notNullable();
    table.check("role in ('inspector', 'rater', 'manager')", [], 'users_role_known');
    table.check("admin = false or role = 'manager'", [], 'users_admin_is_manager');
  });

  // The layout connect-pg-simple reads and writes.
  await knex.schema.createTable('user_sessions', (table) => {
    table.string('sid').primary();
    table.json('sess').notNullable();
    table.timestamp('expire', { precision: 6 }).notNullable().index('user_sessions_expire');
  });

  // AuthnRequest ids sent to the identity provider, so that only a response to one of them is accepted, once.
  await knex.schema.createTable('saml_pending_requests', (table) => {
    table.text('request_id').primary();
    table.text('issued_at').notNullable();
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now()).index('saml_pending_requests_created_at');
  });

  await knex.schema.createTable('audit_events', (table) => {
    table.bigIncrements('id').primary();
    table.integer('user_id').references('users.id');
    table.text('action').notNullable();
    table.text('entity_type').notNullable();
    table.text('entity_id').notNullable();
    table.jsonb('before');
    table.jsonb('after');
    table.timestamp('occurred_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.index(['entity_type', 'entity_id'], 'audit_events_entity');
  });
  // History is never rewritten: the database itself refuses to change or remove a row.
  await knex.raw(`
    create function audit_events_refuse_change() returns trigger language plpgsql as $$
    begin
      raise exception 'audit_events is append-only: % is not allowed', tg_op using errcode = 'insufficient_privilege';
    end $$`);
  await knex.raw(`
    create trigger audit_events_append_only before update or delete on audit_events
    for each row execute function audit_events_refuse_change()`);
  await knex.raw(`
    create trigger audit_events_no_truncate before truncate on audit_events
    for each statement execute function audit_events_refuse_change()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_events');
  await knex.raw('drop function audit_events_refuse_change()');
  await knex.schema.dropTable('saml_pending_requests');
  await knex.schema.dropTable('user_sessions');
  await knex.schema.dropTable('users');
}
