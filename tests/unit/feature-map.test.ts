// docs/feature-map.md is the one guess: a feature's name finds its server folder, client folder, tables and API shapes.
// This reads the map's table and holds the tree to it, cell by cell, and the other way round: no feature folder or
// schema file that the map does not name.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(import.meta.dirname, '../..');
const MAP = readFileSync(path.join(ROOT, 'docs/feature-map.md'), 'utf8');

const SIDES = {
  server: (f: string) => ({ path: `server/features/${f}`, dir: true }),
  client: (f: string) => ({ path: `src/features/${f}`, dir: true }),
  tables: (f: string) => ({ path: `server/db/schema/${f}.ts`, dir: false }),
  schemas: (f: string) => ({ path: `shared/schemas/${f}.ts`, dir: false }),
} as const;
type Side = keyof typeof SIDES;

type Row = { feature: string } & Record<Side, string>;

function tableRows(markdown: string): Row[] {
  const lines = markdown.split('\n').filter((l) => l.startsWith('|'));
  const cells = (l: string) =>
    l
      .slice(1, -1)
      .split('|')
      .map((c) => c.trim());
  const header = cells(lines[0]);
  const at = (name: string) => {
    const i = header.indexOf(name);
    if (i < 0) throw new Error(`the feature map has no "${name}" column`);
    return i;
  };
  return lines.slice(2).map((l) => {
    const c = cells(l);
    return {
      feature: c[at('feature')],
      server: c[at('server')],
      client: c[at('client')],
      tables: c[at('tables')],
      schemas: c[at('schemas')],
    };
  });
}

const exists = (p: string, dir: boolean) => {
  const full = path.join(ROOT, p);
  return existsSync(full) && statSync(full).isDirectory() === dir;
};
const folders = (p: string) =>
  readdirSync(path.join(ROOT, p), { withFileTypes: true })
    .filter((d) => d.isDirectory() && readdirSync(path.join(ROOT, p, d.name)).length > 0)
    .map((d) => d.name);
const tsFiles = (p: string) =>
  readdirSync(path.join(ROOT, p))
    .filter((f) => f.endsWith('.ts'))
    .map((f) => f.slice(0, -3));
/** The files the map names as not being features ("Files beside the features' own that are not features: …"). */
const notFeatures = (dir: string) =>
  [...MAP.matchAll(new RegExp(`\`${dir.replace(/\//g, '\\/')}/([\\w-]+)\\.ts\``, 'g'))].map((m) => m[1]);

const rows = tableRows(MAP);
const names = rows.map((r) => r.feature);

describe('docs/feature-map.md', () => {
  it('has one row per feature, each cell "yes" or "—"', () => {
    expect(rows.length).toBeGreaterThan(10);
    expect(new Set(names).size).toBe(names.length);
    for (const r of rows) {
      expect(r.feature, 'feature names are kebab-case').toMatch(/^[a-z]+(-[a-z]+)*$/);
      for (const side of Object.keys(SIDES) as Side[])
        expect([r.feature, r[side]]).toEqual([r.feature, expect.stringMatching(/^(yes|—)$/)]);
    }
  });

  it.each(rows.map((r) => [r.feature, r] as const))('matches the tree for %s', (_name, r) => {
    for (const side of Object.keys(SIDES) as Side[]) {
      const { path: p, dir } = SIDES[side](r.feature);
      expect({ path: p, present: exists(p, dir) }).toEqual({ path: p, present: r[side] === 'yes' });
    }
  });

  it('names every feature folder of the server and the client', () => {
    expect(folders('server/features').filter((f) => !names.includes(f))).toEqual([]);
    expect(folders('src/features').filter((f) => !names.includes(f))).toEqual([]);
  });

  it('names every table file and every API shapes file, as a feature or as one that is not', () => {
    const known = (dir: string) => [...names, ...notFeatures(dir)];
    expect(tsFiles('server/db/schema').filter((f) => !known('server/db/schema').includes(f))).toEqual([]);
    expect(tsFiles('shared/schemas').filter((f) => !known('shared/schemas').includes(f))).toEqual([]);
  });
});
