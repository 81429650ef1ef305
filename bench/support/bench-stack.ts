import path from 'node:path';
import { loadConfig } from '../../backend/src/config';
import { createDatabase, type Database } from '../../backend/src/db/database';
import { startLocalIdentityProviderFor } from '../../scripts/lib/local-sign-in';
import { connectionUrl, ensureDatabase, findFreePort } from '../../scripts/lib/postgres-cluster';
import { FRONTEND_DIST_DIR } from '../../scripts/lib/project-paths';
import { ensureSystemPackages } from '../../scripts/lib/system-packages';
import { prepareTestSigningKeys, testKeysFolder, testSignInEnv } from '../../tests/support/sign-in-settings';
import { startThrowawayCluster, TEMPLATE_DATABASE } from '../../tests/support/throwaway-cluster';
import { startAppServerProcess } from './app-server';
import { benchStructures, seedBenchStructures } from './bench-network';
import type { CleanUp } from './clean-up';
import { parentOf } from './machine-load';

const BENCH_DATABASE = 'spanledger_bench';
/** A manager of the demo authority with every district: sees the whole benchmark network. */
export const BENCH_SUBJECT = 'bv-staff-3002';

export interface BenchStack {
  readonly appUrl: string;
  readonly structureCount: number;
  /** The server's process id. */
  readonly serverPid: number;
  /** The throw-away cluster's postmaster, whose children are its backends. */
  readonly databasePid: number;
}

const elapsedMs = (started: bigint) => Math.round(Number(process.hrtime.bigint() - started) / 1e6);

/** The postmaster of the cluster a connection is open to: the parent of that connection's backend. */
async function postmasterPid(db: Database): Promise<number> {
  const { rows } = await db.raw<{ rows: { pid: number }[] }>('select pg_backend_pid() as pid');
  const postmaster = parentOf(rows[0]!.pid);
  if (postmaster === null) throw new Error('could not find the PostgreSQL postmaster of the benchmark cluster');
  return postmaster;
}

async function seededDatabase(clusterPort: number): Promise<{ url: string; structureCount: number; postmasterPid: number }> {
  await ensureDatabase(clusterPort, BENCH_DATABASE, TEMPLATE_DATABASE);
  const url = connectionUrl(clusterPort, BENCH_DATABASE);
  const db = createDatabase(url, { min: 0, max: 1 });
  try {
    const structures = benchStructures();
    const started = process.hrtime.bigint();
    await seedBenchStructures(db, structures);
    console.log(`Seeded ${structures.length} structures in ${elapsedMs(started)} ms`);
    return { url, structureCount: structures.length, postmasterPid: await postmasterPid(db) };
  } finally {
    await db.destroy();
  }
}

/**
 * Everything a benchmark runs against, none of it shared with the developer's own `.data/`: a
 * throw-away PostgreSQL/PostGIS cluster in the temporary folder holding the benchmark network, the
 * local identity provider with a throw-away key pair, and the real server in its own process,
 * all on loopback ports chosen by the system. Each piece is registered with `cleanUp` as soon as
 * it runs.
 */
export async function startBenchStack(cleanUp: CleanUp, { forBrowser }: { forBrowser: boolean }): Promise<BenchStack> {
  await ensureSystemPackages({ forTests: forBrowser });
  const cluster = await startThrowawayCluster();
  cleanUp.add('the throw-away database cluster', () => cluster.stop());
  const database = await seededDatabase(cluster.port);

  cleanUp.add('the identity provider keys', await prepareTestSigningKeys());
  const [appPort, idpPort] = [await findFreePort(), await findFreePort()];
  const settings: Record<string, string> = {
    PORT: String(appPort),
    DATABASE_URL: database.url,
    // Request logs would measure the logger; warnings and errors still show.
    LOG_LEVEL: process.env.BENCH_LOG_LEVEL ?? 'warn',
    FRONTEND_DIST: path.join(FRONTEND_DIST_DIR, 'browser'),
    ...(await testSignInEnv(idpPort)),
  };
  const identityProvider = await startLocalIdentityProviderFor(loadConfig(settings), testKeysFolder(), idpPort);
  cleanUp.add('the local identity provider', () => identityProvider.close());
  const server = await startAppServerProcess(settings);
  cleanUp.add('the server', () => server.stop());
  return { appUrl: server.url, structureCount: database.structureCount, serverPid: server.pid, databasePid: database.postmasterPid };
}
