import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureLocalBucket, localObjectStorageSettings, startLocalObjectStorage } from '../../scripts/lib/local-object-storage';

/** Address of the suite's throw-away photo store, started once per jest run by the global setup. */
export const TEST_OBJECT_STORAGE_VARIABLE = 'SPANLEDGER_TEST_OBJECT_STORAGE_URL';

/** Starts the photo store on a free loopback port with its files in a temporary folder; returns a clean-up. */
export async function startTestObjectStorage(): Promise<() => Promise<void>> {
  const directory = fs.mkdtempSync(path.join(os.tmpdir(), 'spanledger-objects-'));
  const storage = await startLocalObjectStorage({ port: 0, directory });
  process.env[TEST_OBJECT_STORAGE_VARIABLE] = storage.url;
  return async () => {
    await storage.close();
    fs.rmSync(directory, { recursive: true, force: true });
  };
}

export function testObjectStorageUrl(): string {
  const url = process.env[TEST_OBJECT_STORAGE_VARIABLE];
  if (!url) throw new Error(`${TEST_OBJECT_STORAGE_VARIABLE} is not set: run this suite through jest's api or browser project`);
  return url;
}

/** S3_* settings for one test app: a bucket of its own, so files never see each other's photos. */
export async function testObjectStorageEnv(): Promise<Record<string, string>> {
  const bucket = `test-${randomBytes(6).toString('hex')}`;
  await ensureLocalBucket(testObjectStorageUrl(), bucket);
  return localObjectStorageSettings(testObjectStorageUrl(), bucket);
}
