import fs from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { CreateBucketCommand, HeadBucketCommand, S3Client } from '@aws-sdk/client-s3';
import S3rver from 's3rver';

export const DEFAULT_LOCAL_OBJECT_STORAGE_PORT = 4302;
export const LOCAL_BUCKET = 'spanledger-photos';
/** The only credentials s3rver accepts; it is a fake for one machine and checks signatures with them. */
const LOCAL_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };
const LOCAL_REGION = 'us-east-1';

export interface RunningObjectStorage {
  /** The S3 endpoint, e.g. http://127.0.0.1:4302. */
  readonly url: string;
  close(): Promise<void>;
}

export interface LocalObjectStorageOptions {
  /** 0 picks a free port. */
  readonly port: number;
  /** Folder that keeps the buckets and their objects. */
  readonly directory: string;
  /** Buckets to make when missing. */
  readonly buckets?: readonly string[];
}

/**
 * A local S3 photo store (s3rver) on 127.0.0.1, keeping its objects in `directory`. It runs in an
 * HTTP server of our own because s3rver's `run()` lets a port in use crash the process.
 */
export async function startLocalObjectStorage({ port, directory, buckets = [] }: LocalObjectStorageOptions): Promise<RunningObjectStorage> {
  fs.mkdirSync(directory, { recursive: true });
  const store = new S3rver({ silent: true, directory, configureBuckets: buckets.map((name) => ({ name })) });
  await store.configureBuckets();
  const server = createServer(store.callback());
  await new Promise<void>((resolve, reject) => {
    server.once('error', (error: NodeJS.ErrnoException) =>
      reject(error.code === 'EADDRINUSE' ? new Error(`Port ${port} on 127.0.0.1 is in use: stop what uses it or set LOCAL_OBJECT_STORAGE_PORT to another port`) : error),
    );
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const { port: actualPort } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${actualPort}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      }),
  };
}

/** The S3_* settings that point Spanledger at the local photo store. */
export function localObjectStorageSettings(url: string, bucket = LOCAL_BUCKET): Record<string, string> {
  return {
    S3_ENDPOINT: url,
    S3_REGION: LOCAL_REGION,
    S3_BUCKET: bucket,
    S3_ACCESS_KEY_ID: LOCAL_CREDENTIALS.accessKeyId,
    S3_SECRET_ACCESS_KEY: LOCAL_CREDENTIALS.secretAccessKey,
    S3_FORCE_PATH_STYLE: 'true',
  };
}

/** A client for the local photo store, for scripts and tests that look inside it. */
export function localObjectStorageClient(url: string): S3Client {
  return new S3Client({ endpoint: url, region: LOCAL_REGION, credentials: LOCAL_CREDENTIALS, forcePathStyle: true });
}

/** Makes a bucket in the local photo store unless it is there already. */
export async function ensureLocalBucket(url: string, bucket: string): Promise<void> {
  const client = localObjectStorageClient(url);
  try {
    await client.send(new HeadBucketCommand({ Bucket: bucket })).catch(() => client.send(new CreateBucketCommand({ Bucket: bucket })));
  } finally {
    client.destroy();
  }
}
