import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { Readable } from 'node:stream';
import type { ObjectStorageConfig } from '../config';
import { AppError } from '../http/app-error';
import type { Logger } from '../logger';

/** One object to store: its key in the bucket, its bytes and the type the store records. */
export interface ObjectToStore {
  readonly key: string;
  readonly body: Buffer;
  readonly contentType: string;
}

/** An object read back from the store. */
export interface StoredObject {
  readonly body: Readable;
  readonly byteLength: number | null;
}

function storageUnavailable(message: string, cause: unknown): AppError {
  return new AppError({ code: 'storage_unavailable', status: 502, message, cause });
}

const isMissingObject = (error: unknown) => error instanceof Error && (error.name === 'NoSuchKey' || error.name === 'NotFound');

/** An S3 client for any S3-compatible store: Amazon S3 itself, or one at an endpoint of its own. */
function createS3Client(config: ObjectStorageConfig): S3Client {
  return new S3Client({
    region: config.region,
    ...(config.endpoint ? { endpoint: config.endpoint } : {}),
    ...(config.credentials ? { credentials: config.credentials } : {}),
    forcePathStyle: config.forcePathStyle,
    // Many stores other than Amazon S3 refuse the newer default checksum headers; send them only where S3 requires them.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    // A store that is down must fail an upload within seconds, not hold the request open.
    requestHandler: { connectionTimeout: 5_000, socketTimeout: 60_000 },
  });
}

/**
 * The bucket the photos live in, through the S3 protocol. Every failure of the store becomes a
 * 502 `storage_unavailable` whose message is safe to show; the store's own error is only logged.
 */
export class ObjectStorage {
  private readonly client: S3Client;

  constructor(
    private readonly config: ObjectStorageConfig,
    private readonly logger: Logger,
  ) {
    this.client = createS3Client(config);
  }

  /** Stores every object or, as far as the store lets us, none: when one fails, the others are removed again. */
  async putAll(objects: readonly ObjectToStore[]): Promise<void> {
    const results = await Promise.allSettled(
      objects.map(({ key, body, contentType }) =>
        this.client.send(new PutObjectCommand({ Bucket: this.config.bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length })),
      ),
    );
    const failure = results.find((result) => result.status === 'rejected');
    if (!failure) return;
    await this.deleteQuietly(objects.filter((_object, index) => results[index]!.status === 'fulfilled').map((object) => object.key));
    throw storageUnavailable('The photo store is not answering; nothing was saved — try again in a moment', failure.reason);
  }

  /** The object's bytes as a stream, and their number when the store says; 404 when the store no longer holds it. */
  async open(key: string): Promise<StoredObject> {
    try {
      const object = await this.client.send(new GetObjectCommand({ Bucket: this.config.bucket, Key: key }));
      if (!(object.Body instanceof Readable)) throw new Error(`the store answered ${key} without a body`);
      return { body: object.Body, byteLength: object.ContentLength ?? null };
    } catch (error) {
      if (isMissingObject(error)) throw new AppError({ code: 'not_found', status: 404, message: 'The photo store no longer holds this file', cause: error });
      throw storageUnavailable('The photo store is not answering; try again in a moment', error);
    }
  }

  /**
   * Removes objects and never fails: it runs after the database has settled what exists, so a
   * file the store keeps by mistake is only wasted space; it is logged for clean-up.
   */
  async deleteQuietly(keys: readonly string[]): Promise<void> {
    await Promise.all(
      keys.map(async (key) => {
        try {
          await this.client.send(new DeleteObjectCommand({ Bucket: this.config.bucket, Key: key }));
        } catch (error) {
          this.logger.warn({ err: error, bucket: this.config.bucket, key }, 'could not remove an object from the photo store');
        }
      }),
    );
  }
}
