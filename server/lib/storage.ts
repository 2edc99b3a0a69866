// Where uploaded files live. Local disk by default (content-addressed under .data/uploads); the interface is what an
// object-storage adapter implements for production.
import { createHash, randomBytes } from 'node:crypto';
import { existsSync } from 'node:fs';
import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';

export interface Storage {
  /** Stores the bytes and returns their key (the SHA-256 of the content); storing the same bytes twice is a no-op. */
  put(bytes: Buffer): Promise<string>;
  get(key: string): Promise<Buffer | null>;
}

const KEY = /^[a-f0-9]{64}$/;

export function createLocalStorage(root: string): Storage {
  const fileOf = (key: string) => path.join(root, key.slice(0, 2), key.slice(2, 4), key);
  return {
    async put(bytes) {
      const key = createHash('sha256').update(bytes).digest('hex');
      const file = fileOf(key);
      if (!existsSync(file)) {
        await mkdir(path.dirname(file), { recursive: true });
        const tmp = `${file}.${randomBytes(6).toString('hex')}.tmp`;
        await writeFile(tmp, bytes);
        await rename(tmp, file);
      }
      return key;
    },
    async get(key) {
      if (!KEY.test(key)) return null;
      try {
        return await readFile(fileOf(key));
      } catch {
        return null;
      }
    },
  };
}

/** Recognises the allowed upload types by their first bytes, never by the file name. */
export function sniffMimeType(bytes: Buffer): 'image/jpeg' | 'image/png' | 'image/webp' | 'application/pdf' | null {
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
