import {
  AbortMultipartUploadCommand,
  DeleteObjectCommand,
  ListMultipartUploadsCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { Readable } from 'node:stream';
import { AppError } from '../errors';

/** Object storage behind one small interface; the S3 SDK backs it, whatever the endpoint. */
export interface ObjectStore {
  put(key: string, body: Buffer | Readable, opts?: { contentType?: string; metadata?: Record<string, string> }): Promise<void>;
  getStream(key: string): Promise<{ body: Readable; contentType?: string; contentLength?: number }>;
  getBuffer(key: string): Promise<Buffer>;
  exists(key: string): Promise<boolean>;
  delete(key: string): Promise<void>;
  /** Throws when the bucket cannot be reached. */
  ping(): Promise<void>;
  /**
   * Aborts multipart uploads started more than `olderThanSeconds` ago and never completed (a
   * process died mid-upload); answers how many. Optional: stores without multipart lack it.
   */
  abortStaleUploads?(olderThanSeconds: number): Promise<number>;
}

export interface S3Settings {
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  forcePathStyle: boolean;
}

/** Large bodies go through lib-storage's multipart upload so memory stays bounded. */
const MULTIPART_THRESHOLD = 8 * 1024 * 1024;

const unavailable = (err: unknown) =>
  new AppError('STORAGE_UNAVAILABLE', 'File storage is not reachable right now; nothing was saved. Try again shortly.', 503, {
    cause: err instanceof Error ? err.name : String(err),
  });

function isNotFound(err: unknown) {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
}

export function createS3ObjectStore(settings: S3Settings): ObjectStore {
  const client = new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: settings.forcePathStyle,
    credentials:
      settings.accessKeyId && settings.secretAccessKey
        ? { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey }
        : undefined,
    // Without these the SDK sends streams aws-chunked with a checksum trailer, which some
    // S3-compatible servers store verbatim inside the object (a silently corrupted file).
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 2,
  });
  const Bucket = settings.bucket;

  return {
    async put(key, body, opts = {}) {
      try {
        if (Buffer.isBuffer(body) && body.length < MULTIPART_THRESHOLD) {
          await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: opts.contentType, Metadata: opts.metadata }));
        } else {
          await new Upload({ client, params: { Bucket, Key: key, Body: body, ContentType: opts.contentType, Metadata: opts.metadata } }).done();
        }
      } catch (err) {
        throw unavailable(err);
      }
    },
    async getStream(key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
        return { body: out.Body as Readable, contentType: out.ContentType, contentLength: out.ContentLength };
      } catch (err) {
        if (isNotFound(err)) throw new AppError('OBJECT_MISSING', 'The stored file is missing', 404);
        throw unavailable(err);
      }
    },
    async getBuffer(key) {
      const { body } = await this.getStream(key);
      const chunks: Buffer[] = [];
      for await (const chunk of body) chunks.push(Buffer.from(chunk));
      return Buffer.concat(chunks);
    },
    async exists(key) {
      try {
        await client.send(new HeadObjectCommand({ Bucket, Key: key }));
        return true;
      } catch (err) {
        if (isNotFound(err)) return false;
        throw unavailable(err);
      }
    },
    async delete(key) {
      try {
        await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
      } catch (err) {
        throw unavailable(err);
      }
    },
    async ping() {
      await client.send(new HeadBucketCommand({ Bucket }));
    },
    async abortStaleUploads(olderThanSeconds) {
      const before = Date.now() - olderThanSeconds * 1000;
      let aborted = 0;
      let KeyMarker: string | undefined;
      let UploadIdMarker: string | undefined;
      for (let page = 0; page < 100; page++) {
        const out = await client.send(new ListMultipartUploadsCommand({ Bucket, KeyMarker, UploadIdMarker }));
        for (const u of out.Uploads ?? []) {
          if (!u.Key || !u.UploadId || (u.Initiated && u.Initiated.getTime() > before)) continue;
          await client.send(new AbortMultipartUploadCommand({ Bucket, Key: u.Key, UploadId: u.UploadId }));
          aborted++;
        }
        if (!out.IsTruncated) break;
        KeyMarker = out.NextKeyMarker;
        UploadIdMarker = out.NextUploadIdMarker;
      }
      return aborted;
    },
  };
}
