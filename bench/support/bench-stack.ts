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

export interface BenchStackOptions {
  readonly forBrowser: boolean;
  /**
   * Loads what the benchmark runs against into its database and answers how many structures
   * that made; the benchmark network (10 000 structures) when left out.
   */
  readonly seed?: (db: Database) => Promise<number>;
  /** Server settings on top of the stack's own (PORT, DATABASE_URL, sign-in, …), e.g. a larger IMPORT_MAX_BYTES. */
  readonly serverSettings?: Readonly<Record<string, string>>;
}

export interface BenchStack {
  readonly appUrl: string;
  /** The benchmark's database, for a benchmark that checks what the server wrote. */
  readonly databaseUrl: string;
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

async function seedBenchNetwork(db: Database): Promise<number> {
  const structures = benchStructures();
  const started = process.hrtime.bigint();
  await seedBenchStructures(db, structures);
  console.log(`Seeded ${structures.length} structures in ${elapsedMs(started)} ms`);
  return structures.length;
}

async function seededDatabase(clusterPort: number, seed: (db: Database) => Promise<number>): Promise<{ url: string; structureCount: number; postmasterPid: number }> {
  await ensureDatabase(clusterPort, BENCH_DATABASE, TEMPLATE_DATABASE);
  const url = connectionUrl(clusterPort, BENCH_DATABASE);
  const db = createDatabase(url, { min: 0, max: 1 });
  try {
    const structureCount = await seed(db);
    return { url, structureCount, postmasterPid: await postmasterPid(db) };
  } finally {
    await db.destroy();
  }
}

/**
 * Everything a benchmark runs against, none of it shared with the developer's own `.data/`: a
 * throw-away PostgreSQL/PostGIS cluster in the temporary folder holding the benchmark network (or
 * what `seed` loads), the local identity provider with a throw-away key pair, and the real server
 * in its own process, all on loopback ports chosen by the system. Each piece is registered with
 * `cleanUp` as soon as it runs.
 */
export async function startBenchStack(cleanUp: CleanUp, { forBrowser, seed = seedBenchNetwork, serverSettings = {} }: BenchStackOptions): Promise<BenchStack> {
  await ensureSystemPackages({ forTests: forBrowser });
  const cluster = await startThrowawayCluster();
  cleanUp.add('the throw-away database cluster', () => cluster.stop());
  const database = await seededDatabase(cluster.port, seed);

  cleanUp.add('the identity provider keys', await prepareTestSigningKeys());
  const [appPort, idpPort] = [await findFreePort(), await findFreePort()];
  const settings: Record<string, string> = {
    PORT: String(appPort),
    DATABASE_URL: database.url,
    // Request logs would measure the logger; warnings and errors still show.
    LOG_LEVEL: process.env.BENCH_LOG_LEVEL ?? 'warn',
    FRONTEND_DIST: path.join(FRONTEND_DIST_DIR, 'browser'),
    ...(await testSignInEnv(idpPort)),
    ...serverSettings,
  };
  const identityProvider = await startLocalIdentityProviderFor(loadConfig(settings), testKeysFolder(), idpPort);
  cleanUp.add('the local identity provider', () => identityProvider.close());
  const server = await startAppServerProcess(settings);
  cleanUp.add('the server', () => server.stop());
  return { appUrl: server.url, databaseUrl: database.url, structureCount: database.structureCount, serverPid: server.pid, databasePid: database.postmasterPid };
}
