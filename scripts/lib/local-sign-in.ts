import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { AppConfig } from '../../backend/src/config';
import { LOCAL_IDP_ENTITY_ID, startLocalIdentityProvider, type RunningIdentityProvider } from './local-identity-provider/identity-provider';
import { certificateFile, loadOrCreateSigningKeys } from './local-identity-provider/signing-keys';

export const DEFAULT_LOCAL_IDP_PORT = 4301;

/** The SAML_IDP_* settings that point Spanledger at the local identity provider; its keys are made on first use. */
export async function localIdentityProviderSettings(keysFolder: string, port: number): Promise<Record<string, string>> {
  await loadOrCreateSigningKeys(keysFolder);
  return {
    SAML_IDP_ENTRY_POINT: `http://127.0.0.1:${port}/sso`,
    SAML_IDP_ENTITY_ID: LOCAL_IDP_ENTITY_ID,
    SAML_IDP_CERT_FILE: certificateFile(keysFolder),
  };
}

/** Starts the local identity provider for the Spanledger server the configuration describes. */
export function startLocalIdentityProviderFor(config: AppConfig, keysFolder: string, port: number): Promise<RunningIdentityProvider> {
  return startLocalIdentityProvider({ port, keysFolder, serviceProvider: { entityId: config.saml.spEntityId, assertionConsumerUrl: config.saml.callbackUrl } });
}

/** A session secret of this machine's own, made once and kept in the git-ignored data folder. */
export function loadOrCreateSessionSecret(dataDir: string): string {
  const file = path.join(dataDir, 'session-secret');
  if (fs.existsSync(file)) return fs.readFileSync(file, 'utf8').trim();
  fs.mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(48).toString('base64url');
  fs.writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}
