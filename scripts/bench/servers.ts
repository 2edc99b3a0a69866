// The app and the bare baseline, each in its own process (scripts/lib/bench-server.ts) so the load generator does not
// share their event loop; and the demo engineer's session cookie for the app.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { freePort, PROJECT_ROOT } from '../lib/mariadb';

export type BenchServers = {
  appUrl: string;
  baselineUrl: string;
  /** Headers of a signed-in engineer's requests to the app. */
  appHeaders: Record<string, string>;
  stopAll: () => void;
};

const tsx = path.join(PROJECT_ROOT, 'node_modules', '.bin', 'tsx');

export async function startServers(databaseUrl: string): Promise<BenchServers> {
  const children: ChildProcess[] = [];
  const stopAll = () => {
    for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
  };
  process.once('exit', stopAll);
  process.once('SIGINT', () => {
    stopAll();
    process.exit(130);
  });
  const start = async (mode: 'app' | 'baseline'): Promise<string> => {
    const port = await freePort();
    const child = spawn(tsx, [path.join(PROJECT_ROOT, 'scripts/lib/bench-server.ts'), mode, String(port)], {
      env: { ...process.env, DATABASE_URL: databaseUrl, NODE_ENV: 'production', LOG_LEVEL: 'silent' },
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    children.push(child);
    await new Promise<void>((resolve, reject) => {
      child.once('exit', (code) => reject(new Error(`bench ${mode} server exited (${code})`)));
      child.stdout!.on('data', (b: Buffer) => {
        if (b.toString().includes('ready')) resolve();
      });
    });
    return `http://127.0.0.1:${port}`;
  };
  const appUrl = await start('app');
  const baselineUrl = await start('baseline');
  const cookie = await signIn(appUrl);
  const appHeaders = { cookie, origin: appUrl, 'content-type': 'application/json', accept: 'application/json' };
  return { appUrl, baselineUrl, appHeaders, stopAll };
}

async function signIn(appUrl: string): Promise<string> {
  const res = await fetch(`${appUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: appUrl },
    body: JSON.stringify({ email: DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!.email, password: DEMO_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`Signing in as the demo engineer failed: ${res.status} ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}
