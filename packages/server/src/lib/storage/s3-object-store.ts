import type { Readable } from 'node:stream';
import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3';
import { assertStorageKey, type FileStorage } from './storage';

export interface ObjectStoreOptions {
  /** Any S3-compatible service's address; left out for Amazon S3 itself. */
  endpoint?: string;
  region: string;
  bucket: string;
  /** Left out to use the SDK's own chain (AWS_* variables, an instance role). */
  credentials?: { accessKeyId: string; secretAccessKey: string };
  /** `bucket` in the path rather than the host name: what most self-hosted S3-compatible services expect. */
  forcePathStyle: boolean;
}

/**
 * Files in an S3-compatible bucket, so every app instance reads what any other stored. A put is one
 * request that the store either keeps whole or not at all, like the local disk's rename.
 */
export class S3ObjectStore implements FileStorage {
  private readonly client: S3Client;

  constructor(private readonly options: ObjectStoreOptions) {
    this.client = new S3Client({
      endpoint: options.endpoint,
      region: options.region,
      credentials: options.credentials,
      forcePathStyle: options.forcePathStyle,
    });
  }

  async put(key: string, body: Buffer, meta: { contentType: string }): Promise<void> {
    assertStorageKey(key);
    await this.client.send(new PutObjectCommand({ Bucket: this.options.bucket, Key: key, Body: body, ContentType: meta.contentType }));
  }

  async get(key: string): Promise<{ body: Readable; byteSize: number } | null> {
    assertStorageKey(key);
    try {
      const object = await this.client.send(new GetObjectCommand({ Bucket: this.options.bucket, Key: key }));
      // On Node the SDK's body is the HTTP response itself, a Readable.
      return { body: object.Body as Readable, byteSize: object.ContentLength ?? 0 };
    } catch (error) {
      if (error instanceof NoSuchKey) return null;
      if (error instanceof S3ServiceException && error.$metadata.httpStatusCode === 404) return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    assertStorageKey(key);
    // S3 answers a delete of a missing object with success too.
    await this.client.send(new DeleteObjectCommand({ Bucket: this.options.bucket, Key: key }));
  }

  close(): void {
    this.client.destroy();
  }
}
