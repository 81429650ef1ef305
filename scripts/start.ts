/**
 * `npm start`: system packages, the project-local PostgreSQL cluster, migrations, the demo
 * scenario, the front-end build, the local identity provider and the local photo store (unless
 * real ones are configured), then the server. Ctrl-C stops all of them.
 */
import path from 'node:path';
import { loadConfig, type AppConfig } from '../backend/src/config';
import { startServer, type RunningServer } from '../backend/src/server';
import { buildFrontendIfChanged } from './lib/frontend-build';
import { ObjectStorage } from '../backend/src/photos/object-storage';
import { bringUpLocalDatabase, createDatabase, loadDemoPhotos, localClusterSettings, prepareDatabase } from './lib/local-database';
import type { RunningIdentityProvider } from './lib/local-identity-provider/identity-provider';
import { DEFAULT_LOCAL_IDP_PORT, loadOrCreateSessionSecret, localIdentityProviderSettings, startLocalIdentityProviderFor } from './lib/local-sign-in';
import { DEFAULT_LOCAL_OBJECT_STORAGE_PORT, localObjectStorageSettings, startLocalObjectStorage, type RunningObjectStorage } from './lib/local-object-storage';
import { stopCluster, type ClusterSettings } from './lib/postgres-cluster';
import { DATA_DIR } from './lib/project-paths';
import { ensureSystemPackages } from './lib/system-packages';

const loadDemo = process.env.SPANLEDGER_DEMO_DATA !== 'false';
const IDP_KEYS_FOLDER = path.join(DATA_DIR, 'identity-provider');
/** Set SAML_IDP_ENTRY_POINT (and the other SAML_IDP_* settings) to use a real identity provider instead. */
const useLocalIdentityProvider = !process.env.SAML_IDP_ENTRY_POINT;
const OBJECT_STORAGE_FOLDER = path.join(DATA_DIR, 'object-storage');
/** Set S3_ENDPOINT (and the other S3_* settings) to keep photos in a real S3 store instead. */
const useLocalObjectStorage = !process.env.S3_ENDPOINT;

function portSetting(name: string, fallback: number): number {
  const port = Number(process.env[name] ?? fallback);
  if (!Number.isInteger(port) || port < 1 || port > 65535) throw new Error(`${name} must be a port number, got "${process.env[name]}"`);
  return port;
}

const localIdpPort = () => portSetting('LOCAL_IDP_PORT', DEFAULT_LOCAL_IDP_PORT);
const localObjectStoragePort = () => portSetting('LOCAL_OBJECT_STORAGE_PORT', DEFAULT_LOCAL_OBJECT_STORAGE_PORT);
const localObjectStorageUrl = () => `http://127.0.0.1:${localObjectStoragePort()}`;

/** The environment plus what a developer's machine provides itself: a kept session secret, the local identity provider and photo store. */
async function localEnvironment(): Promise<NodeJS.ProcessEnv> {
  const sessionSecret = process.env.SESSION_SECRET || loadOrCreateSessionSecret(DATA_DIR);
  const signIn = useLocalIdentityProvider ? await localIdentityProviderSettings(IDP_KEYS_FOLDER, localIdpPort()) : {};
  const photos = useLocalObjectStorage ? localObjectStorageSettings(localObjectStorageUrl(), process.env.S3_BUCKET || undefined) : {};
  return { ...process.env, SESSION_SECRET: sessionSecret, ...signIn, ...photos };
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
  let objectStorage: RunningObjectStorage | null = null;
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: stopping the server, the identity provider, the photo store and the database…`);
    try {
      await server?.close();
      await identityProvider?.close();
      await objectStorage?.close();
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
    if (useLocalObjectStorage) {
      objectStorage = await startLocalObjectStorage({ port: localObjectStoragePort(), directory: OBJECT_STORAGE_FOLDER, buckets: [config.objectStorage.bucket] });
    }
    server = await startServer(config);
    if (loadDemo && (await loadDemoPhotos(server.db, new ObjectStorage(config.objectStorage, server.logger)))) console.log('Added the demo scenario’s drawn pictures');
  } catch (error) {
    console.error(`\n${error instanceof Error ? error.message : String(error)}`);
    await identityProvider?.close();
    await objectStorage?.close();
    await stopCluster(cluster).catch(() => undefined);
    process.exit(1);
  }
  const signInFrom = identityProvider ? `the local identity provider at ${identityProvider.url}` : config.saml.idpEntryPoint;
  console.log(`\nSpanledger is running at ${config.publicUrl}  (Ctrl-C to stop)`);
  console.log(`Signing in through ${signInFrom}`);
  const photosIn = objectStorage ? `the local photo store at ${objectStorage.url} (files in ${OBJECT_STORAGE_FOLDER})` : `bucket ${config.objectStorage.bucket} at ${config.objectStorage.endpoint}`;
  console.log(`Keeping photos in ${photosIn}\n`);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
});
