// Chooses the storage from the environment.
import path from 'node:path';
import type { Env } from '../env';
import { createLocalStorage, type Storage } from './storage';

/** The storage the environment asks for; the S3 SDK is loaded only when it is used. */
export async function createStorage(env: Env): Promise<Storage> {
  const root = path.resolve(env.STORAGE_DIR);
  if (env.STORAGE_DRIVER === 'local') return createLocalStorage(root);
  if (!env.S3_BUCKET) throw new Error('STORAGE_DRIVER=s3 needs S3_BUCKET');
  const { createS3Storage } = await import('./storage-s3');
  return createS3Storage({
    bucket: env.S3_BUCKET,
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    prefix: env.S3_PREFIX,
    // Uploads still arrive on local disk (and are hashed there) before they are sent on.
    tempDir: path.join(root, 'incoming'),
  });
}
