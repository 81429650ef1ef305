import { loadConfig, type AppConfig } from '../../backend/src/config';
import { startServer, type RunningServer } from '../../backend/src/server';
import type { RunningIdentityProvider } from '../../scripts/lib/local-identity-provider/identity-provider';
import { startLocalIdentityProviderFor } from '../../scripts/lib/local-sign-in';
import { findFreePort } from '../../scripts/lib/postgres-cluster';
import { testObjectStorageEnv } from './object-storage-settings';
import { testKeysFolder, testSignInEnv } from './sign-in-settings';

export interface SignInTestBed {
  readonly config: AppConfig;
  readonly server: RunningServer;
  readonly identityProvider: RunningIdentityProvider;
  stop(): Promise<void>;
}

/**
 * The real server on a free loopback port with the real local identity provider beside it, and a
 * bucket of its own in the suite's photo store. The ports are chosen first because the SAML
 * addresses (callback, audience) name the server's port.
 */
export async function startSignInTestBed(databaseUrl: string, env: NodeJS.ProcessEnv = {}): Promise<SignInTestBed> {
  const [appPort, idpPort] = [await findFreePort(), await findFreePort()];
  const config = loadConfig({
    PORT: String(appPort),
    DATABASE_URL: databaseUrl,
    LOG_LEVEL: process.env.TEST_LOG_LEVEL ?? 'silent',
    ...(await testSignInEnv(idpPort)),
    ...(await testObjectStorageEnv()),
    ...env,
  });
  const identityProvider = await startLocalIdentityProviderFor(config, testKeysFolder(), idpPort);
  const server = await startServer(config);
  return {
    config,
    server,
    identityProvider,
    async stop() {
      await server.close();
      await identityProvider.close();
    },
  };
}
