// Builds the client, always for production, when the last build was not a production build of exactly these inputs.
// `npm test` runs inside Vitest (NODE_ENV=test) and `npm start` serves what it left behind, so the mode is forced here
// rather than inherited, and the stamp records both the mode and a hash of the inputs' contents.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { PROJECT_ROOT } from './mariadb';

const INPUTS = [
  'src',
  'shared',
  'public',
  'index.html',
  'vite.config.ts',
  'package-lock.json',
  'scripts/lib/build-client.ts',
];
export const BUILD_MODE = 'production';
const STAMP = path.join(PROJECT_ROOT, 'dist', '.build-stamp');

type Stamp = { mode: string; inputs: string; builtAt: string };

function files(p: string): string[] {
  if (!existsSync(p)) return [];
  if (!statSync(p).isDirectory()) return [p];
  return readdirSync(p)
    .sort()
    .flatMap((name) => files(path.join(p, name)));
}

/** A hash of every input file's path and contents: a touched but unchanged file does not rebuild, a changed one does. */
export function inputsHash(): string {
  const h = createHash('sha256');
  for (const f of INPUTS.flatMap((i) => files(path.join(PROJECT_ROOT, i)))) {
    h.update(path.relative(PROJECT_ROOT, f)).update('\0').update(readFileSync(f)).update('\0');
  }
  return h.digest('hex');
}

function readStamp(): Stamp | null {
  try {
    return JSON.parse(readFileSync(STAMP, 'utf8')) as Stamp;
  } catch {
    return null; // missing, or an old plain-date stamp: rebuild
  }
}

export function clientIsStale(): boolean {
  const stamp = readStamp();
  return (
    !stamp ||
    stamp.mode !== BUILD_MODE ||
    stamp.inputs !== inputsHash() ||
    !existsSync(path.join(PROJECT_ROOT, 'dist', 'index.html'))
  );
}

export function buildClient(): void {
  const inputs = inputsHash();
  execFileSync(
    path.join(PROJECT_ROOT, 'node_modules', '.bin', 'vite'),
    ['build', '--mode', BUILD_MODE, '--logLevel', 'warn'],
    {
      cwd: PROJECT_ROOT,
      stdio: 'inherit',
      env: { ...process.env, NODE_ENV: BUILD_MODE },
    },
  );
  const stamp: Stamp = { mode: BUILD_MODE, inputs, builtAt: new Date().toISOString() };
  writeFileSync(STAMP, JSON.stringify(stamp) + '\n');
}

export function buildClientIfStale(log: (s: string) => void = console.log): boolean {
  if (!clientIsStale()) return false;
  log('Building the client (production)…');
  buildClient();
  return true;
}
