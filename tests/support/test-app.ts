import type { Express } from 'express';
import { createApp } from '../../backend/src/app';
import { loadConfig } from '../../backend/src/config';
import type { Database } from '../../backend/src/db/database';
import { createLogger } from '../../backend/src/logger';
import { testObjectStorageEnv } from './object-storage-settings';
import { testSignInEnv } from './sign-in-settings';

/** Port 9 (discard) is never listened on here: these apps trust the test key but reach no identity provider. */
const NO_IDENTITY_PROVIDER_PORT = 9;

/** The real Express app over a test database, quiet unless TEST_LOG_LEVEL asks for logs. */
export async function createTestApp(db: Database, env: NodeJS.ProcessEnv = {}): Promise<Express> {
  const config = loadConfig({
    LOG_LEVEL: process.env.TEST_LOG_LEVEL ?? 'silent',
    ...(await testSignInEnv(NO_IDENTITY_PROVIDER_PORT)),
    ...(await testObjectStorageEnv()),
    ...env,
  });
  return createApp({ config, db, logger: createLogger(config.logLevel) });
}
