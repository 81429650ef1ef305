import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { localIdentityProviderSettings } from '../../scripts/lib/local-sign-in';

/** Folder holding the local identity provider's test key pair, made once per jest run by the global setup. */
export const TEST_IDP_KEYS_VARIABLE = 'SPANLEDGER_TEST_IDP_KEYS';

/** Makes the test key pair in a temporary folder and returns a clean-up. */
export async function prepareTestSigningKeys(): Promise<() => Promise<void>> {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'spanledger-idp-'));
  await localIdentityProviderSettings(folder, 1);
  process.env[TEST_IDP_KEYS_VARIABLE] = folder;
  return async () => fs.rmSync(folder, { recursive: true, force: true });
}

export function testKeysFolder(): string {
  const folder = process.env[TEST_IDP_KEYS_VARIABLE];
  if (!folder) throw new Error(`${TEST_IDP_KEYS_VARIABLE} is not set: run this suite through jest's api or browser project`);
  return folder;
}

/** Settings for a test server that trusts the local identity provider on `idpPort` (which need not be running). */
export async function testSignInEnv(idpPort: number): Promise<Record<string, string>> {
  return { SESSION_SECRET: randomBytes(32).toString('hex'), ...(await localIdentityProviderSettings(testKeysFolder(), idpPort)) };
}
