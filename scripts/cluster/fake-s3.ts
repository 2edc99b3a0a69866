// A fake S3 server on loopback (s3rver, files under a folder) for the tests and the local cluster. Its buckets are made
// when it starts (the app never creates buckets). s3rver computes the signature of bucket-level requests without the
// SDK's trailing slash, so it is told to accept a mismatched signature; the access key must still be its own.
import S3rver from '@20minutes/s3rver';

/** s3rver's fixed credentials; anything else is refused. */
export const FAKE_S3_KEY = 'S3RVER';

export type FakeS3 = { endpoint: string; port: number; stop: () => Promise<void> };

export async function startFakeS3(opts: { directory: string; buckets: string[]; port?: number }): Promise<FakeS3> {
  const server = new S3rver({
    address: '127.0.0.1',
    port: opts.port ?? 0,
    silent: true,
    allowMismatchedSignatures: true,
    directory: opts.directory,
    configureBuckets: opts.buckets.map((name) => ({ name })),
  });
  const { port } = await server.run();
  return { endpoint: `http://127.0.0.1:${port}`, port, stop: () => server.close() };
}

/** The environment that points the API at a fake S3 bucket. */
export function fakeS3Env(endpoint: string, bucket: string): Record<string, string> {
  return {
    STORAGE_DRIVER: 's3',
    S3_ENDPOINT: endpoint,
    S3_BUCKET: bucket,
    S3_REGION: 'us-east-1',
    S3_FORCE_PATH_STYLE: 'true',
    S3_ACCESS_KEY_ID: FAKE_S3_KEY,
    S3_SECRET_ACCESS_KEY: FAKE_S3_KEY,
  };
}
