import { loadConfig } from '../../backend/src/config';
import { startServer } from '../../backend/src/server';
import { buildFrontendIfChanged } from '../../scripts/lib/frontend-build';
import { createDatabase, prepareDatabase } from '../../scripts/lib/local-database';
import { connectionUrl, ensureDatabase } from '../../scripts/lib/postgres-cluster';
import { registerTeardown } from './global-teardown';
import { startThrowawayCluster } from './throwaway-cluster';

export const APP_URL_VARIABLE = 'SPANLEDGER_TEST_APP_URL';
const JOURNEY_DATABASE = 'spanledger_journeys';

/**
 * The browser journeys run against the real product: a built front end served by the real
 * server, over a throw-away cluster holding the demo scenario.
 */
export default async function browserGlobalSetup(): Promise<void> {
  await buildFrontendIfChanged();
  const cluster = await startThrowawayCluster();
  registerTeardown(() => cluster.stop());

  await ensureDatabase(cluster.port, JOURNEY_DATABASE);
  const url = connectionUrl(cluster.port, JOURNEY_DATABASE);
  const db = createDatabase(url, { min: 0, max: 1 });
  try {
    await prepareDatabase(db, { loadDemo: true });
  } finally {
    await db.destroy();
  }

  const config = loadConfig({ PORT: '0', DATABASE_URL: url, LOG_LEVEL: process.env.TEST_LOG_LEVEL ?? 'warn' });
  const server = await startServer(config);
  registerTeardown(() => server.close());
  process.env[APP_URL_VARIABLE] = server.url;
}
