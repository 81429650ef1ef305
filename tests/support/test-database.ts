import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { createDatabase, type Database } from '../../backend/src/db/database';
import { connectionUrl, ensureDatabase } from '../../scripts/lib/postgres-cluster';
import { PORT_VARIABLE, TEMPLATE_DATABASE } from './throwaway-cluster';

export interface TestDatabase {
  readonly db: Database;
  readonly url: string;
  /** Closes the pool and drops the database. */
  drop(): Promise<void>;
}

function clusterPort(): number {
  const port = Number(process.env[PORT_VARIABLE]);
  if (!Number.isInteger(port) || port <= 0) throw new Error(`${PORT_VARIABLE} is not set: run this suite through jest's api project`);
  return port;
}

/** A fresh, migrated, empty database for one test file, copied from the template. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const port = clusterPort();
  const name = `test_${randomBytes(6).toString('hex')}`;
  await ensureDatabase(port, name, TEMPLATE_DATABASE);
  const url = connectionUrl(port, name);
  const db = createDatabase(url, { min: 0, max: 4 });
  return {
    db,
    url,
    async drop() {
      await db.destroy();
      const admin = new pg.Client({ connectionString: connectionUrl(port, 'postgres') });
      await admin.connect();
      try {
        await admin.query(`drop database if exists ${pg.escapeIdentifier(name)} with (force)`);
      } finally {
        await admin.end();
      }
    },
  };
}
