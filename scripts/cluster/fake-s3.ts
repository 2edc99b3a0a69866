// A fake S3 server on loopback (s3rver, files under a folder) for the tests and the local cluster. Its buckets are made
// when it starts (the app never creates buckets). s3rver computes the signature of bucket-level requests without the
// SDK's trailing slash, so it is told to accept a mismatched signature; the access key must still be its own.
import { fork } from 'node:child_process';
import { once } from 'node:events';
import { fileURLToPath } from 'node:url';
import S3rver from '@20minutes/s3rver';

/** s3rver's fixed credentials; anything else is refused. */
export const FAKE_S3_KEY = 'S3RVER';

export type FakeS3 = { endpoint: string; port: number; stop: () => Promise<void> };

type FakeS3Options = { directory: string; buckets: string[]; port?: number };

export async function startFakeS3(opts: FakeS3Options): Promise<FakeS3> {
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

/** The same server in a child process, so that its buffers do not count in the caller's memory. */
export async function startFakeS3Process(opts: FakeS3Options): Promise<FakeS3> {
  const child = fork(fileURLToPath(import.meta.url), [JSON.stringify(opts)], {
    execArgv: ['--import', 'tsx'],
    stdio: ['ignore', 'ignore', 'inherit', 'ipc'],
  });
  const [message] = (await Promise.race([
    once(child, 'message'),
    once(child, 'exit').then(([code]) => {
      throw new Error(`The fake S3 process ended before it started (exit ${code}).`);
    }),
  ])) as [{ port: number }];
  return {
    endpoint: `http://127.0.0.1:${message.port}`,
    port: message.port,
    async stop() {
      if (child.exitCode !== null) return;
      const exited = once(child, 'exit');
      child.kill('SIGTERM');
      await exited;
    },
  };
}

// Run as the child of startFakeS3Process: start, say the port, stop on SIGTERM.
if (process.send && process.argv[1] === fileURLToPath(import.meta.url)) {
  const s3 = await startFakeS3(JSON.parse(process.argv[2]!) as FakeS3Options);
  process.on('SIGTERM', () => void s3.stop().finally(() => process.exit(0)));
  process.send({ port: s3.port });
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
