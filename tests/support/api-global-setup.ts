import { PORT_VARIABLE, startThrowawayCluster } from './throwaway-cluster';
import { registerTeardown } from './global-teardown';
import { prepareTestSigningKeys } from './sign-in-settings';

/** One throw-away cluster and one identity-provider key pair for the whole API suite; each test file copies the template database. */
export default async function apiGlobalSetup(): Promise<void> {
  const cluster = await startThrowawayCluster();
  process.env[PORT_VARIABLE] = String(cluster.port);
  registerTeardown(() => cluster.stop());
  registerTeardown(await prepareTestSigningKeys());
}
