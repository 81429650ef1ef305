import path from 'node:path';
import knex, { type Knex } from 'knex';
import knexPostgis from 'knex-postgis';

export type Database = Knex;
export type Transaction = Knex.Transaction;

const projectRoot = path.resolve(__dirname, '../../..');

/** Where migrations live, for every caller that runs them: the server's start, the tests, `npm run migrate`. */
export const migrationConfig: Knex.MigratorConfig = {
  directory: path.join(projectRoot, 'migrations'),
  loadExtensions: ['.ts'],
  tableName: 'knex_migrations',
};

/** A Knex pool on PostgreSQL; timestamps and dates come back as JavaScript values. */
export function createDatabase(connectionString: string, pool: Knex.PoolConfig = { min: 0, max: 10 }): Database {
  const db = knex({ client: 'pg', connection: connectionString, pool, migrations: migrationConfig });
  knexPostgis(db);
  return db;
}

/** PostGIS functions bound to one database's query builder (knex-postgis). */
export function postgis(db: Database) {
  return knexPostgis(db);
}

/** Runs `work` in a transaction, or inside the caller's when one is already open, so a whole story commits once. */
export async function withTransaction<T>(db: Database | Transaction, work: (trx: Transaction) => Promise<T>): Promise<T> {
  if (db.isTransaction) return work(db as Transaction);
  return db.transaction(work);
}
