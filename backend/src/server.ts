import type { AddressInfo } from 'node:net';
import { createServer, type Server } from 'node:http';
import { createApp } from './app';
import type { AppConfig } from './config';
import { createDatabase, type Database } from './db/database';
import { keepHeapGrowthModest } from './heap-growth';
import { runQueuedCommit } from './imports/imports.service';
import { startBackgroundJobs } from './jobs/background-jobs';
import { createLogger, type Logger } from './logger';

export interface RunningServer {
  readonly url: string;
  readonly logger: Logger;
  readonly db: Database;
  /** Stops taking connections, lets open requests and background jobs finish, then closes the pool. */
  close(): Promise<void>;
}

/** Starts the HTTP server on the configured host and port (0 picks a free one). */
export async function startServer(config: AppConfig): Promise<RunningServer> {
  keepHeapGrowthModest();
  const logger = createLogger(config.logLevel);
  const db = createDatabase(config.databaseUrl);
  const jobs = await startBackgroundJobs(config.databaseUrl, logger, { 'import-commit': (data) => runQueuedCommit(db, data as { importId: number; userId: number }) });
  const server: Server = createServer(createApp({ config, db, logger, jobs }));
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  }).catch((error: NodeJS.ErrnoException) => {
    void jobs.stop().finally(() => db.destroy());
    if (error.code === 'EADDRINUSE') {
      throw new Error(`Port ${config.port} on ${config.host} is already in use: stop what uses it or set PORT to another port`);
    }
    throw error;
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${config.host}:${port}`;

  const close = async () => {
    await new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeIdleConnections();
    });
    // A background job under way finishes (or is given again to the next server) before the pool closes.
    await jobs.stop();
    await db.destroy();
  };
  return { url, logger, db, close };
}
