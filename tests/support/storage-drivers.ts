// Both storage drivers for the storage tests (describe.each): local disk, and S3 against a fake S3 server on loopback
// that the test file starts and stops, in a child process so that the memory test measures the app's side alone.
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { createLocalStorage, type Storage } from '../../server/lib/storage';
import { createS3Client, createS3Storage } from '../../server/lib/storage-s3';
import { FAKE_S3_KEY, startFakeS3Process } from '../../scripts/cluster/fake-s3';

export const STORAGE_DRIVERS = ['local', 's3'] as const;
export type StorageDriverName = (typeof STORAGE_DRIVERS)[number];

export type TestStorage = {
  storage: Storage;
  /** The keys of the files kept (temporary uploads not included). */
  keys(): Promise<string[]>;
  /** The files waiting in the temporary folder. */
  tempFiles(): string[];
  stop(): Promise<void>;
};

function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.relative(dir, path.join(e.parentPath, e.name)))
    .sort();
}

export async function openTestStorage(driver: StorageDriverName): Promise<TestStorage> {
  const root = mkdtempSync(path.join(os.tmpdir(), `tightloop-storage-${driver}-`));
  const tempFiles = () => filesUnder(path.join(root, 'incoming'));
  if (driver === 'local') {
    const storage = createLocalStorage(root);
    return {
      storage,
      tempFiles,
      keys: async () =>
        filesUnder(root)
          .filter((f) => !f.startsWith('incoming'))
          .map((f) => path.basename(f)),
      stop: async () => rmSync(root, { recursive: true, force: true }),
    };
  }
  const bucket = 'tightloop-test';
  const s3 = await startFakeS3Process({ directory: path.join(root, 's3'), buckets: [bucket] });
  const settings = {
    bucket,
    endpoint: s3.endpoint,
    region: 'us-east-1',
    forcePathStyle: true,
    accessKeyId: FAKE_S3_KEY,
    secretAccessKey: FAKE_S3_KEY,
    prefix: 'uploads/',
    tempDir: path.join(root, 'incoming'),
  };
  const client = createS3Client(settings);
  const storage = createS3Storage(settings, client);
  return {
    storage,
    tempFiles,
    async keys() {
      const out = await client.send(new ListObjectsV2Command({ Bucket: bucket }));
      return (out.Contents ?? []).map((o) => path.basename(o.Key ?? '')).sort();
    },
    async stop() {
      client.destroy();
      await s3.stop();
      rmSync(root, { recursive: true, force: true });
    },
  };
}
