import { buildFrontendIfChanged } from '../../scripts/lib/frontend-build';
import { ObjectStorage } from '../../backend/src/photos/object-storage';
import { createLogger } from '../../backend/src/logger';
import { createDatabase, loadDemoPhotos, prepareDatabase } from '../../scripts/lib/local-database';
import { connectionUrl, ensureDatabase } from '../../scripts/lib/postgres-cluster';
import { registerTeardown } from './global-teardown';
import { startTestObjectStorage } from './object-storage-settings';
import { prepareTestSigningKeys } from './sign-in-settings';
import { startSignInTestBed } from './test-server';
import { startThrowawayCluster } from './throwaway-cluster';

export const APP_URL_VARIABLE = 'SPANLEDGER_TEST_APP_URL';
const JOURNEY_DATABASE = 'spanledger_journeys';
/**
 * Imports from this size on are committed by a background job (IMPORT_BACKGROUND_FROM_BYTES),
 * set far below the product's 512 kB so that the imports journey's workbook of a few hundred
 * girders goes the background way and its progress bar can be seen. The other journeys import
 * nothing.
 */
export const JOURNEY_IMPORT_BACKGROUND_FROM_BYTES = 20_000;

/**
 * The browser journeys run against the real product: a built front end served by the real
 * server, over a throw-away cluster holding the demo scenario, signing in through the real local
 * identity provider, keeping photos in a throw-away local photo store.
 */
export default async function browserGlobalSetup(): Promise<void> {
  await buildFrontendIfChanged();
  const cluster = await startThrowawayCluster();
  registerTeardown(() => cluster.stop());
  registerTeardown(await prepareTestSigningKeys());
  registerTeardown(await startTestObjectStorage());

  await ensureDatabase(cluster.port, JOURNEY_DATABASE);
  const url = connectionUrl(cluster.port, JOURNEY_DATABASE);
  const bed = await startSignInTestBed(url, {
    LOG_LEVEL: process.env.TEST_LOG_LEVEL ?? 'warn',
    IMPORT_BACKGROUND_FROM_BYTES: String(JOURNEY_IMPORT_BACKGROUND_FROM_BYTES),
  });
  registerTeardown(() => bed.stop());
  const db = createDatabase(url, { min: 0, max: 1 });
  try {
    await prepareDatabase(db, { loadDemo: true });
    await loadDemoPhotos(db, new ObjectStorage(bed.config.objectStorage, createLogger('silent')));
  } finally {
    await db.destroy();
  }
  process.env[APP_URL_VARIABLE] = bed.server.url;
}
