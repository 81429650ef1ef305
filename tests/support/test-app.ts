import type { Express } from 'express';
import { createApp } from '../../backend/src/app';
import { loadConfig } from '../../backend/src/config';
import type { Database } from '../../backend/src/db/database';
import { createLogger } from '../../backend/src/logger';

/** The real Express app over a test database, quiet unless TEST_LOG_LEVEL asks for logs. */
export function createTestApp(db: Database, env: NodeJS.ProcessEnv = {}): Express {
  const config = loadConfig({ LOG_LEVEL: process.env.TEST_LOG_LEVEL ?? 'silent', ...env });
  return createApp({ config, db, logger: createLogger(config.logLevel) });
}
