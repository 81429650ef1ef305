import { PORT_VARIABLE, startThrowawayCluster } from './throwaway-cluster';
import { registerTeardown } from './global-teardown';
import { startTestObjectStorage } from './object-storage-settings';
import { prepareTestSigningKeys } from './sign-in-settings';

/**
 * One throw-away cluster, one identity-provider key pair and one photo store for the whole API
 * suite; each test file copies the template database, and each test app gets a bucket of its own.
 */
export default async function apiGlobalSetup(): Promise<void> {
  const cluster = await startThrowawayCluster();
  process.env[PORT_VARIABLE] = String(cluster.port);
  registerTeardown(() => cluster.stop());
  registerTeardown(await prepareTestSigningKeys());
  registerTeardown(await startTestObjectStorage());
}
