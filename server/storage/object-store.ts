import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  NoSuchKey,
  S3Client,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { Config } from '../config';

export interface StoredObject {
  body: Readable;
  contentType: string | undefined;
  contentLength: number | undefined;
}

/** Hilum's view of the object store; any S3-compatible bucket serves, by configuration alone. */
export interface ObjectStore {
  put(key: string, body: Buffer | Readable, contentType: string): Promise<void>;
  /** Resolves to null when the key does not exist. */
  get(key: string): Promise<StoredObject | null>;
  getBuffer(key: string): Promise<Buffer | null>;
  delete(key: string): Promise<void>;
  ping(timeoutMs?: number): Promise<boolean>;
  close(): void;
}

export function createObjectStore(options: Config['storage']): ObjectStore {
  const client = new S3Client({
    region: options.region,
    endpoint: options.endpoint,
    credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey },
    // Path-style addressing and no default checksums: without these, s3rver (and several other
    // S3-compatible stores) store streamed uploads with aws-chunked framing, i.e. corrupted.
    forcePathStyle: true,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 2,
  });
  const Bucket = options.bucket;

  async function get(key: string): Promise<StoredObject | null> {
    try {
      const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      return {
        body: out.Body as Readable,
        contentType: out.ContentType,
        contentLength: out.ContentLength,
      };
    } catch (error) {
      if (error instanceof NoSuchKey || (error as { name?: string }).name === 'NoSuchKey') return null;
      throw error;
    }
  }

  return {
    async put(key, body, contentType) {
      // lib-storage's Upload streams bodies of unknown length in parts.
      await new Upload({ client, params: { Bucket, Key: key, Body: body, ContentType: contentType } }).done();
    },
    get,
    async getBuffer(key) {
      const object = await get(key);
      if (!object) return null;
      const chunks: Buffer[] = [];
      for await (const chunk of object.body) chunks.push(Buffer.from(chunk as Uint8Array));
      return Buffer.concat(chunks);
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
    async ping(timeoutMs = 2_000) {
      try {
        await client.send(new HeadBucketCommand({ Bucket }), { abortSignal: AbortSignal.timeout(timeoutMs) });
        return true;
      } catch {
        return false;
      }
    },
    close() {
      client.destroy();
    },
  };
}
