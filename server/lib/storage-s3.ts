// Uploads in S3-compatible object storage, shared by every API process. Files stream in from the upload's temporary
// file (multipart, a part at a time) and stream out to the response; no file is held whole in memory.
import { createReadStream, mkdirSync } from 'node:fs';
import { rm, stat } from 'node:fs/promises';
import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { hashFile, readStored, STORAGE_KEY, type Storage } from './storage';

export type S3Settings = {
  bucket: string;
  /** Empty for AWS itself; the address of another S3-compatible service. */
  endpoint?: string;
  region: string;
  forcePathStyle: boolean;
  accessKeyId?: string;
  secretAccessKey?: string;
  /** Put before every object name, e.g. "uploads/" to share a bucket. */
  prefix?: string;
  /** A local folder where uploads arrive before they are sent on. */
  tempDir: string;
};

// The smallest part S3 accepts; one part in flight at a time keeps an upload's memory at about this much.
const PART_BYTES = 5 * 1024 * 1024;

export function createS3Client(s: Omit<S3Settings, 'bucket' | 'tempDir' | 'prefix'>): S3Client {
  // The pinned SDK runs on Node 20; its warning is about releases after January 2027, which the pin keeps out.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  return new S3Client({
    region: s.region,
    endpoint: s.endpoint,
    forcePathStyle: s.forcePathStyle,
    credentials:
      s.accessKeyId && s.secretAccessKey
        ? { accessKeyId: s.accessKeyId, secretAccessKey: s.secretAccessKey }
        : undefined,
    // S3-compatible services other than AWS often refuse the SDK's newer streamed checksums; send them only when an
    // operation requires one.
    ...(s.endpoint ? { requestChecksumCalculation: 'WHEN_REQUIRED', responseChecksumValidation: 'WHEN_REQUIRED' } : {}),
  });
}

const isNotFound = (err: unknown) => {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
};

export function createS3Storage(s: S3Settings, client: S3Client = createS3Client(s)): Storage {
  const Bucket = s.bucket;
  const prefix = s.prefix ?? '';
  const name = (key: string) => `${prefix}${key}`;
  mkdirSync(s.tempDir, { recursive: true });

  async function exists(key: string): Promise<boolean> {
    try {
      await client.send(new HeadObjectCommand({ Bucket, Key: name(key) }));
      return true;
    } catch (err) {
      if (isNotFound(err)) return false;
      throw err;
    }
  }

  const storage: Storage = {
    tempDir: s.tempDir,
    async put(bytes) {
      const key = createHash('sha256').update(bytes).digest('hex');
      if (await exists(key)) return { key, created: false };
      await client.send(new PutObjectCommand({ Bucket, Key: name(key), Body: bytes, ContentLength: bytes.length }));
      return { key, created: true };
    },
    async putFile(file, sha256) {
      const key = sha256 ?? (await hashFile(file));
      try {
        if (await exists(key)) return { key, created: false };
        const { size } = await stat(file);
        // One request for what fits in a part; a multipart upload, a part at a time, for the rest.
        await new Upload({
          client,
          params: { Bucket, Key: name(key), Body: createReadStream(file), ContentLength: size },
          partSize: PART_BYTES,
          queueSize: 1,
          leavePartsOnError: false,
        }).done();
        return { key, created: true };
      } finally {
        await rm(file, { force: true });
      }
    },
    async open(key) {
      if (!STORAGE_KEY.test(key)) return null;
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: name(key) }));
        return { stream: out.Body as Readable, size: Number(out.ContentLength ?? 0) };
      } catch (err) {
        if (isNotFound(err)) return null;
        throw err;
      }
    },
    async remove(key) {
      if (STORAGE_KEY.test(key)) await client.send(new DeleteObjectCommand({ Bucket, Key: name(key) }));
    },
    get: (key) => readStored(storage, key),
  };
  return storage;
}
