/**
 * `npm start`: system packages, the project-local PostgreSQL cluster, migrations, the demo
 * scenario, the front-end build, then the server. Ctrl-C stops the server and the database.
 */
import { loadConfig, type AppConfig } from '../backend/src/config';
import { startServer, type RunningServer } from '../backend/src/server';
import { buildFrontendIfChanged } from './lib/frontend-build';
import { bringUpLocalDatabase, createDatabase, localClusterSettings, prepareDatabase } from './lib/local-database';
import { stopCluster, type ClusterSettings } from './lib/postgres-cluster';
import { ensureSystemPackages } from './lib/system-packages';

const loadDemo = process.env.SPANLEDGER_DEMO_DATA !== 'false';

async function prepare(config: AppConfig, cluster: ClusterSettings, databaseName: string): Promise<AppConfig> {
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
  return config;
}

async function main(): Promise<void> {
  const config = loadConfig();
  if (process.env.DATABASE_URL) {
    throw new Error('npm start runs its own database cluster: unset DATABASE_URL, or run the server alone with `node --import tsx backend/src/main.ts`');
  }
  const dbSettings = new URL(config.databaseUrl);
  const cluster = localClusterSettings(Number(dbSettings.port));
  const databaseName = dbSettings.pathname.slice(1);

  let server: RunningServer | null = null;
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: stopping the server and the database…`);
    try {
      await server?.close();
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
    server = await startServer(await prepare(config, cluster, databaseName));
  } catch (error) {
    console.error(`\n${error instanceof Error ? error.message : String(error)}`);
    await stopCluster(cluster).catch(() => undefined);
    process.exit(1);
  }
  console.log(`\nSpanledger is running at ${server.url}  (Ctrl-C to stop)\n`);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
});
