// Where uploaded files live: local disk by default (content-addressed under .data/uploads), or S3-compatible object
// storage (storage-s3.ts) when several API processes must see the same files.
import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, existsSync } from 'node:fs';
import { mkdir, open, rename, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { ServerResponse } from 'node:http';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

export interface Storage {
  /**
   * Stores the bytes under their key (the SHA-256 of the content); storing the same bytes twice is a no-op, and then
   * `created` is false (nothing may remove that file on this caller's behalf).
   */
  put(bytes: Buffer): Promise<Stored>;
  /** Moves a finished upload (a file under `tempDir`) into the store like `put`; the file is gone afterwards. */
  putFile(file: string, sha256?: string): Promise<Stored>;
  /** A stored file as a stream (read it to the end or destroy it), or null when there is none. */
  open(key: string): Promise<StoredFile | null>;
  /** The whole file in memory (small files only); `open` streams. */
  get(key: string): Promise<Buffer | null>;
  /** Removes a stored file; for taking back what a refused request created. */
  remove(key: string): Promise<void>;
  /** Where uploads stream to while they arrive (the same disk as the store, so keeping one is a rename). */
  readonly tempDir: string;
}

export type Stored = { key: string; created: boolean };
export type StoredFile = { stream: Readable; size: number };

export const STORAGE_KEY = /^[a-f0-9]{64}$/;

/**
 * Streams a stored file as the response body (the caller has set the other headers). Once bytes have gone out no
 * error answer is possible: a failed read, or a client that went away, ends the response where it is.
 */
export async function sendStoredFile(res: ServerResponse, file: StoredFile): Promise<void> {
  res.setHeader('Content-Length', String(file.size));
  try {
    await pipeline(file.stream, res);
  } catch {
    file.stream.destroy();
    res.destroy();
  }
}

/** A whole stored file in memory: for small ones only (tests, thumbnails); serve files with `open`. */
export async function readStored(storage: Pick<Storage, 'open'>, key: string): Promise<Buffer | null> {
  const file = await storage.open(key);
  if (!file) return null;
  const chunks: Buffer[] = [];
  for await (const chunk of file.stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

/** The SHA-256 of a file, read as a stream. */
export function hashFile(file: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash('sha256');
    createReadStream(file)
      .on('error', reject)
      .on('data', (chunk) => hash.update(chunk))
      .on('end', () => resolve(hash.digest('hex')));
  });
}

export function createLocalStorage(root: string): Storage {
  const fileOf = (key: string) => path.join(root, key.slice(0, 2), key.slice(2, 4), key);
  const storage: Storage = {
    tempDir: path.join(root, 'incoming'),
    async put(bytes) {
      const key = createHash('sha256').update(bytes).digest('hex');
      const file = fileOf(key);
      if (existsSync(file)) return { key, created: false };
      await mkdir(path.dirname(file), { recursive: true });
      const tmp = `${file}.${randomBytes(6).toString('hex')}.tmp`;
      await writeFile(tmp, bytes);
      await rename(tmp, file);
      return { key, created: true };
    },
    async putFile(upload, sha256) {
      const key = sha256 ?? (await hashFile(upload));
      const file = fileOf(key);
      if (existsSync(file)) {
        await rm(upload, { force: true });
        return { key, created: false };
      }
      await mkdir(path.dirname(file), { recursive: true });
      await rename(upload, file);
      return { key, created: true };
    },
    async open(key) {
      if (!STORAGE_KEY.test(key)) return null;
      const file = fileOf(key);
      const info = await stat(file).catch(() => null);
      if (!info?.isFile()) return null;
      return { stream: createReadStream(file), size: info.size };
    },
    async remove(key) {
      if (STORAGE_KEY.test(key)) await rm(fileOf(key), { force: true });
    },
    get: (key) => readStored(storage, key),
  };
  return storage;
}

export type SniffedType = 'image/jpeg' | 'image/png' | 'image/webp' | 'application/pdf';

/** Recognises the allowed upload types by their first bytes, never by the file name. */
export function sniffMimeType(bytes: Buffer): SniffedType | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) {
    return 'image/png';
  }
  if (bytes.length >= 12 && bytes.toString('latin1', 0, 4) === 'RIFF' && bytes.toString('latin1', 8, 12) === 'WEBP') {
    return 'image/webp';
  }
  if (bytes.length >= 5 && bytes.toString('latin1', 0, 5) === '%PDF-') return 'application/pdf';
  return null;
}

/** The type of a file on disk by its first bytes. */
export async function sniffFile(file: string): Promise<SniffedType | null> {
  const handle = await open(file, 'r');
  try {
    const head = Buffer.alloc(16);
    const { bytesRead } = await handle.read(head, 0, head.length, 0);
    return sniffMimeType(head.subarray(0, bytesRead));
  } finally {
    await handle.close();
  }
}
