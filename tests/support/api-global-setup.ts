import { PORT_VARIABLE, startThrowawayCluster } from './throwaway-cluster';
import { registerTeardown } from './global-teardown';

/** One throw-away cluster for the whole API suite; each test file copies the template database. */
export default async function apiGlobalSetup(): Promise<void> {
  const cluster = await startThrowawayCluster();
  process.env[PORT_VARIABLE] = String(cluster.port);
  registerTeardown(() => cluster.stop());
}
