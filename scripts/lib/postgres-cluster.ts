import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import pg from 'pg';
import { POSTGRES_BIN_DIR } from './system-packages';
import { isRoot, runCommand } from './run-command';

/** A PostgreSQL cluster of the project's own, on loopback, in a folder it owns. */
export interface ClusterSettings {
  readonly dataDir: string;
  readonly port: number;
  /**
   * For throw-away test clusters only: skip fsync and friends. The project-local cluster keeps
   * PostgreSQL's durable defaults.
   */
  readonly disposable: boolean;
}

const SUPERUSER = 'postgres';

export class ClusterError extends Error {}

const socketDir = (settings: ClusterSettings) => path.join(settings.dataDir, 'socket');
const logFile = (settings: ClusterSettings) => path.join(path.dirname(settings.dataDir), `${path.basename(settings.dataDir)}.log`);

/** PostgreSQL refuses to run as root, so as root its programs run as the `postgres` user. */
async function runPostgresProgram(program: string, args: string[]) {
  const binary = path.join(POSTGRES_BIN_DIR, program);
  return isRoot() ? runCommand('runuser', ['-u', SUPERUSER, '--', binary, ...args]) : runCommand(binary, args);
}

async function giveToPostgresUser(...paths: string[]): Promise<void> {
  if (!isRoot()) return;
  for (const target of paths) {
    const result = await runCommand('chown', ['-R', `${SUPERUSER}:${SUPERUSER}`, target]);
    if (result.code !== 0) throw new ClusterError(`Could not hand ${target} to the postgres user: ${result.output}`);
  }
}

/** As root the server runs as `postgres`, which must be able to walk down to its data folder. */
async function assertPostgresUserCanReach(dataDir: string): Promise<void> {
  if (!isRoot()) return;
  const result = await runCommand('runuser', ['-u', SUPERUSER, '--', 'test', '-w', dataDir]);
  if (result.code !== 0) {
    throw new ClusterError(
      `The postgres user cannot reach ${dataDir}: a folder above it is closed to other users.\n` +
        'Open it (chmod o+x on each parent folder) or move the checkout.',
    );
  }
}

function isPortFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const probe = net.createServer();
    probe.once('error', () => resolve(false));
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
  });
}

/** A free loopback port chosen by the operating system, for throw-away clusters. */
export function findFreePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as net.AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}

async function isRunning(settings: ClusterSettings): Promise<boolean> {
  if (!fs.existsSync(path.join(settings.dataDir, 'PG_VERSION'))) return false;
  const result = await runPostgresProgram('pg_ctl', ['-D', settings.dataDir, 'status']);
  return result.code === 0;
}

/** Creates the cluster on first use; later runs find it and keep its data. */
async function initialiseIfNew(settings: ClusterSettings): Promise<boolean> {
  if (fs.existsSync(path.join(settings.dataDir, 'PG_VERSION'))) return false;
  fs.mkdirSync(path.dirname(settings.dataDir), { recursive: true });
  fs.mkdirSync(settings.dataDir, { recursive: true, mode: 0o700 });
  await giveToPostgresUser(settings.dataDir);
  await assertPostgresUserCanReach(settings.dataDir);
  const result = await runPostgresProgram('initdb', ['-D', settings.dataDir, '-U', SUPERUSER, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  if (result.code !== 0) throw new ClusterError(`initdb failed for ${settings.dataDir}:\n${result.output}`);
  return true;
}

/**
 * Memory for writing: an import commits a few hundred megabytes of rows and history in one
 * transaction, and with PostgreSQL's defaults (128 MB of shared buffers, WAL buffers of 1/32 of
 * them) its one backend spends much of that writing out pages and WAL itself (`npm run bench`,
 * 50 000 girders: the commit takes about a tenth less of PostgreSQL's CPU time than with the defaults).
 */
const BULK_WRITE_SETTINGS = ['-c shared_buffers=512MB', '-c wal_buffers=64MB'];

/**
 * Starts the cluster on 127.0.0.1 (creating it first if needed). A cluster already running on
 * the same folder is reused; a port held by anything else is reported plainly.
 */
export async function startCluster(settings: ClusterSettings): Promise<{ created: boolean; alreadyRunning: boolean }> {
  const created = await initialiseIfNew(settings);
  if (await isRunning(settings)) return { created, alreadyRunning: true };
  if (!(await isPortFree(settings.port))) {
    throw new ClusterError(
      `Port ${settings.port} on 127.0.0.1 is already in use by another program, so the database cannot start there.\n` +
        'Stop that program, or choose another port with DB_PORT=<port>.',
    );
  }
  fs.mkdirSync(socketDir(settings), { recursive: true });
  fs.writeFileSync(logFile(settings), '', { flag: 'a' });
  await giveToPostgresUser(socketDir(settings), logFile(settings));
  const serverOptions = [`-c listen_addresses=127.0.0.1`, `-p ${settings.port}`, `-k ${socketDir(settings)}`, ...BULK_WRITE_SETTINGS];
  if (settings.disposable) serverOptions.push('-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off');
  const result = await runPostgresProgram('pg_ctl', ['-D', settings.dataDir, '-l', logFile(settings), '-w', '-t', '60', '-o', serverOptions.join(' '), 'start']);
  if (result.code !== 0) {
    const log = fs.existsSync(logFile(settings)) ? fs.readFileSync(logFile(settings), 'utf8').split('\n').slice(-15).join('\n') : '';
    throw new ClusterError(`PostgreSQL did not start on port ${settings.port}:\n${result.output}\n${log}`);
  }
  return { created, alreadyRunning: false };
}

/** Stops the cluster with a fast shutdown: open sessions are ended, committed data is kept. */
export async function stopCluster(settings: ClusterSettings): Promise<void> {
  if (!(await isRunning(settings))) return;
  const result = await runPostgresProgram('pg_ctl', ['-D', settings.dataDir, '-m', 'fast', '-w', 'stop']);
  if (result.code !== 0) throw new ClusterError(`PostgreSQL did not stop cleanly:\n${result.output}`);
}

export function connectionUrl(port: number, database: string): string {
  return `postgres://${SUPERUSER}@127.0.0.1:${port}/${database}`;
}

/** Creates a database (optionally from a template) unless it exists, then enables PostGIS in it. */
export async function ensureDatabase(port: number, database: string, template?: string): Promise<void> {
  const admin = new pg.Client({ connectionString: connectionUrl(port, 'postgres') });
  await admin.connect();
  try {
    const existing = await admin.query('select 1 from pg_database where datname = $1', [database]);
    if (existing.rowCount === 0) {
      const from = template ? ` template ${pg.escapeIdentifier(template)}` : '';
      await admin.query(`create database ${pg.escapeIdentifier(database)}${from}`);
    }
  } finally {
    await admin.end();
  }
  const client = new pg.Client({ connectionString: connectionUrl(port, database) });
  await client.connect();
  try {
    await client.query('create extension if not exists postgis');
  } finally {
    await client.end();
  }
}

/** Waits until the server accepts connections (pg_ctl -w already waits; this covers a reused cluster). */
export async function waitUntilAccepting(port: number, attempts = 50): Promise<void> {
  for (let attempt = 1; ; attempt += 1) {
    const client = new pg.Client({ connectionString: connectionUrl(port, 'postgres') });
    try {
      await client.connect();
      await client.end();
      return;
    } catch (error) {
      await client.end().catch(() => undefined);
      if (attempt >= attempts) throw new ClusterError(`PostgreSQL on port ${port} does not accept connections: ${String(error)}`);
      await sleep(100);
    }
  }
}
