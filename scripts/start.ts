/**
 * `npm start`: system packages, the project-local PostgreSQL cluster, migrations, the demo
 * scenario, the front-end build, the local identity provider (unless a real one is configured),
 * then the server. Ctrl-C stops all of them.
 */
import path from 'node:path';
import { loadConfig, type AppConfig } from '../backend/src/config';
import { startServer, type RunningServer } from '../backend/src/server';
import { buildFrontendIfChanged } from './lib/frontend-build';
import { bringUpLocalDatabase, createDatabase, localClusterSettings, prepareDatabase } from './lib/local-database';
import type { RunningIdentityProvider } from './lib/local-identity-provider/identity-provider';
import { DEFAULT_LOCAL_IDP_PORT, loadOrCreateSessionSecret, localIdentityProviderSettings, startLocalIdentityProviderFor } from './lib/local-sign-in';
import { stopCluster, type ClusterSettings } from './lib/postgres-cluster';
import { DATA_DIR } from './lib/project-paths';
import { ensureSystemPackages } from './lib/system-packages';

const loadDemo = process.env.SPANLEDGER_DEMO_DATA !== 'false';
const IDP_KEYS_FOLDER = path.join(DATA_DIR, 'identity-provider');
/** Set SAML_IDP_ENTRY_POINT (and the other SAML_IDP_* settings) to use a real identity provider instead. */
const useLocalIdentityProvider = !process.env.SAML_IDP_ENTRY_POINT;

function localIdpPort(): number {
  const port = Number(process.env.LOCAL_IDP_PORT ?? DEFAULT_LOCAL_IDP_PORT);
  if (!Number.isInteger(port) || port < 1 || port > 65535) throw new Error(`LOCAL_IDP_PORT must be a port number, got "${process.env.LOCAL_IDP_PORT}"`);
  return port;
}

/** The environment plus what a developer's machine provides itself: a kept session secret and the local identity provider. */
async function localEnvironment(): Promise<NodeJS.ProcessEnv> {
  const sessionSecret = process.env.SESSION_SECRET || loadOrCreateSessionSecret(DATA_DIR);
  const signIn = useLocalIdentityProvider ? await localIdentityProviderSettings(IDP_KEYS_FOLDER, localIdpPort()) : {};
  return { ...process.env, SESSION_SECRET: sessionSecret, ...signIn };
}

async function prepare(config: AppConfig, cluster: ClusterSettings, databaseName: string): Promise<void> {
  await ensureSystemPackages({ forTests: false });
  const database = await bringUpLocalDatabase(cluster, databaseName);
  console.log(`${database.created ? 'Created' : 'Using'} the project database cluster in ${cluster.dataDir} on 127.0.0.1:${cluster.port}`);
  const db = createDatabase(config.databaseUrl, { min: 0, max: 2 });
  try {
    const { migrations, demoLoaded } = await prepareDatabase(db, { loadDemo });
    if (migrations.length > 0) console.log(`Applied ${migrations.length} migration(s)`);
    if (demoLoaded) console.log('Loaded the demo scenario');
  } finally {
    await db.destroy();
  }
  await buildFrontendIfChanged();
}

async function main(): Promise<void> {
  const config = loadConfig(await localEnvironment());
  if (process.env.DATABASE_URL) {
    throw new Error('npm start runs its own database cluster: unset DATABASE_URL, or run the server alone with `node --import tsx backend/src/main.ts`');
  }
  const dbSettings = new URL(config.databaseUrl);
  const cluster = localClusterSettings(Number(dbSettings.port));
  const databaseName = dbSettings.pathname.slice(1);

  let server: RunningServer | null = null;
  let identityProvider: RunningIdentityProvider | null = null;
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: stopping the server, the identity provider and the database…`);
    try {
      await server?.close();
      await identityProvider?.close();
      await stopCluster(cluster);
      console.log('Stopped.');
      process.exit(0);
    } catch (error) {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    }
  };
  process.once('SIGINT', () => void stop('SIGINT'));
  process.once('SIGTERM', () => void stop('SIGTERM'));

  try {
    await prepare(config, cluster, databaseName);
    if (useLocalIdentityProvider) identityProvider = await startLocalIdentityProviderFor(config, IDP_KEYS_FOLDER, localIdpPort());
    server = await startServer(config);
  } catch (error) {
    console.error(`\n${error instanceof Error ? error.message : String(error)}`);
    await identityProvider?.close();
    await stopCluster(cluster).catch(() => undefined);
    process.exit(1);
  }
  const signInFrom = identityProvider ? `the local identity provider at ${identityProvider.url}` : config.saml.idpEntryPoint;
  console.log(`\nSpanledger is running at ${config.publicUrl}  (Ctrl-C to stop)`);
  console.log(`Signing in through ${signInFrom}\n`);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
});
