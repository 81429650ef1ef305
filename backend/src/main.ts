import { loadConfig } from './config';
import { startServer } from './server';

/** Runs the server alone, against a database that is already up (for deployments). */
async function main(): Promise<void> {
  const server = await startServer(loadConfig());
  server.logger.info({ url: server.url }, 'Spanledger is listening');
  const shutdown = (signal: string) => {
    server.logger.info({ signal }, 'shutting down');
    server.close().then(
      () => process.exit(0),
      (error: unknown) => {
        server.logger.error({ err: error }, 'shutdown failed');
        process.exit(1);
      },
    );
  };
  process.once('SIGINT', shutdown);
  process.once('SIGTERM', shutdown);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
