import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createDatabase, migrationConfig } from '../../backend/src/db/database';
import { isRoot, runCommand } from '../../scripts/lib/run-command';
import { connectionUrl, ensureDatabase, findFreePort, startCluster, stopCluster } from '../../scripts/lib/postgres-cluster';

/** Name of the migrated database each test file copies, so files never see each other's rows. */
export const TEMPLATE_DATABASE = 'spanledger_template';
export const PORT_VARIABLE = 'SPANLEDGER_TEST_DB_PORT';

export interface ThrowawayCluster {
  readonly port: number;
  stop(): Promise<void>;
}

/** A new PostgreSQL/PostGIS cluster in a temporary folder on a free loopback port, with the schema migrated. */
export async function startThrowawayCluster(): Promise<ThrowawayCluster> {
  const baseDir = fs.mkdtempSync(path.join(os.tmpdir(), 'spanledger-test-'));
  if (isRoot()) await runCommand('chown', ['postgres:postgres', baseDir]);
  const settings = { dataDir: path.join(baseDir, 'cluster'), port: await findFreePort(), disposable: true };
  await startCluster(settings);
  await ensureDatabase(settings.port, TEMPLATE_DATABASE);
  const db = createDatabase(connectionUrl(settings.port, TEMPLATE_DATABASE), { min: 0, max: 1 });
  try {
    await db.migrate.latest(migrationConfig);
  } finally {
    await db.destroy();
  }
  return {
    port: settings.port,
    async stop() {
      await stopCluster(settings);
      fs.rmSync(baseDir, { recursive: true, force: true });
    },
  };
}
