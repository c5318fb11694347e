/**
 * BlobStore on an S3-compatible object store (@aws-sdk/client-s3, path-style requests so a local fake
 * or a self-hosted store answers on its own address). One object per key in one bucket; a PUT is atomic
 * on the store's side (an object is either there whole or not at all). Every request is bounded in time,
 * so a store that does not answer gives an error the middleware maps, not a request that hangs.
 */
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  NoSuchKey,
  NotFound,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { assertBlobKey, type BlobStore } from './blob-store.ts';
import { ServiceError } from '../services/errors.ts';

export interface S3StoreOptions {
  endpoint: string;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
  /** Bound of one request (connect and answer), ms. */
  timeoutMs?: number;
}

const missing = (err: unknown): boolean =>
  err instanceof NoSuchKey || err instanceof NotFound || (err instanceof S3ServiceException && err.$metadata.httpStatusCode === 404);

/** Seconds a client is asked to wait while the store does not answer. */
export const STORE_RETRY_AFTER_S = 5;

/**
 * The store not answering (refused, timed out, a 5xx) → 503 with Retry-After naming the datasheet store,
 * not the database. Refusals of a request (4xx other than a missing key) stay as they are: bugs.
 */
function unavailable(err: unknown): unknown {
  const status = err instanceof S3ServiceException ? err.$metadata.httpStatusCode : undefined;
  if (err instanceof S3ServiceException && status !== undefined && status < 500) return err;
  return new ServiceError(503, 'The datasheet store is not answering; try again in a moment.', [], {
    'Retry-After': String(STORE_RETRY_AFTER_S),
  });
}

export class S3Store implements BlobStore {
  private readonly client: S3Client;
  private readonly bucket: string;

  constructor(options: S3StoreOptions) {
    const timeoutMs = options.timeoutMs ?? 10_000;
    this.bucket = options.bucket;
    this.client = new S3Client({
      endpoint: options.endpoint,
      region: options.region,
      forcePathStyle: true,
      credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey },
      maxAttempts: 2,
      requestHandler: { connectionTimeout: timeoutMs, requestTimeout: timeoutMs },
    });
  }

  async put(key: string, bytes: Uint8Array): Promise<void> {
    assertBlobKey(key);
    const command = new PutObjectCommand({
      Bucket: this.bucket,
      Key: key,
      Body: bytes,
      ContentLength: bytes.byteLength,
      ContentType: 'application/octet-stream',
    });
    await this.call((c) => c.send(command));
  }

  async get(key: string): Promise<Uint8Array | null> {
    assertBlobKey(key);
    try {
      const res = await this.call((c) => c.send(new GetObjectCommand({ Bucket: this.bucket, Key: key })));
      if (!res.Body) return new Uint8Array(0);
      return await res.Body.transformToByteArray();
    } catch (err) {
      if (missing(err)) return null;
      throw err;
    }
  }

  async delete(key: string): Promise<void> {
    assertBlobKey(key);
    await this.call((c) => c.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key })));
  }

  async exists(key: string): Promise<boolean> {
    assertBlobKey(key);
    try {
      await this.call((c) => c.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key })));
      return true;
    } catch (err) {
      if (missing(err)) return false;
      throw err;
    }
  }

  /** Runs one request; a missing key passes through, a store that does not answer becomes a 503. */
  private async call<T>(request: (client: S3Client) => Promise<T>): Promise<T> {
    try {
      return await request(this.client);
    } catch (err) {
      if (missing(err)) throw err;
      throw unavailable(err);
    }
  }

  /** Closes the client's sockets (tests and scripts that make their own store). */
  close(): void {
    this.client.destroy();
  }
}
