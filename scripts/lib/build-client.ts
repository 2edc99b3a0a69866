// Builds the client when any of its inputs is newer than the last build.
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { PROJECT_ROOT } from './mariadb';

const INPUTS = ['src', 'shared', 'index.html', 'vite.config.ts', 'package-lock.json', 'public'];
const STAMP = path.join(PROJECT_ROOT, 'dist', '.build-stamp');

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let max = st.mtimeMs;
  for (const name of readdirSync(p)) max = Math.max(max, newestMtime(path.join(p, name)));
  return max;
}

export function clientIsStale(): boolean {
  if (!existsSync(STAMP)) return true;
  const built = statSync(STAMP).mtimeMs;
  return INPUTS.some((i) => newestMtime(path.join(PROJECT_ROOT, i)) > built);
}

export function buildClientIfStale(log: (s: string) => void = console.log): boolean {
  if (!clientIsStale()) return false;
  log('Building the client…');
  execFileSync(path.join(PROJECT_ROOT, 'node_modules', '.bin', 'vite'), ['build', '--logLevel', 'warn'], {
    cwd: PROJECT_ROOT,
    stdio: 'inherit',
  });
  writeFileSync(STAMP, new Date().toISOString());
  return true;
}
