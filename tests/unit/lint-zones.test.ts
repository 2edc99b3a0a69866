import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { ESLint, type Linter } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

// Probes of the lint zones (eslint.config.js, docs/feature-map.md): text linted as if it sat at a path inside the
// tree, through ESLint's Node API, so the rules see the real folders and files it imports.
const ROOT = path.resolve(import.meta.dirname, '../..');
const TIMEOUT = 60_000;

/** The first two feature folders of a side that hold a source file, and a file of each. */
function twoFeatures(side: 'server' | 'src'): { name: string; file: string }[] {
  const dir = path.join(ROOT, side, 'features');
  const firstFile = (d: string): string | undefined => {
    for (const name of readdirSync(d).sort()) {
      const p = path.join(d, name);
      const found = statSync(p).isDirectory() ? firstFile(p) : /\.tsx?$/.test(name) ? p : undefined;
      if (found) return found;
    }
    return undefined;
  };
  const features = readdirSync(dir)
    .sort()
    .map((name) => ({ name, file: firstFile(path.join(dir, name)) }))
    .filter((f): f is { name: string; file: string } => f.file !== undefined);
  return features.slice(0, 2);
}

/** The specifier a file at `from` would write to import `to`. */
function specifier(from: string, to: string): string {
  const rel = path.relative(path.dirname(path.join(ROOT, from)), to).replace(/\.tsx?$/, '');
  return rel.startsWith('.') ? rel : `./${rel}`;
}

/** Imports every module (as values, so the cycle rule counts them) and uses them, so no other rule speaks. */
const importing = (specs: string[]) =>
  specs.map((s, i) => `import * as m${i} from '${s}';`).join('\n') +
  `\nexport const probe = [${specs.map((_, i) => `m${i}`).join(', ')}];\n`;

let eslint: ESLint;
async function lint(filePath: string, code: string): Promise<Linter.LintMessage[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(ROOT, filePath) });
  return result.messages;
}
const errorsOf = (messages: Linter.LintMessage[], ruleId: string) =>
  messages.filter((m) => m.ruleId === ruleId && m.severity === 2);

beforeAll(() => {
  eslint = new ESLint({ cwd: ROOT });
});

describe('lint zones', () => {
  for (const side of ['server', 'src'] as const) {
    it(`fails a ${side} feature that imports another feature`, { timeout: TIMEOUT }, async () => {
      const [own, other] = twoFeatures(side);
      expect(other, `${side}/features needs two features with source files`).toBeDefined();
      const probe = `${side}/features/${own.name}/zone-probe.ts`;
      const messages = await lint(probe, importing([specifier(probe, other.file)]));
      expect(errorsOf(messages, 'import-x/no-restricted-paths')).toHaveLength(1);
    });
  }

  it(
    'passes a server feature that imports its own folder, server/lib, server/db and shared',
    { timeout: TIMEOUT },
    async () => {
      const [own] = twoFeatures('server');
      const probe = `server/features/${own.name}/zone-probe.ts`;
      const allowed = [own.file, 'server/lib/retry.ts', 'server/db/client.ts', 'shared/permissions.ts'];
      const messages = await lint(probe, importing(allowed.map((f) => specifier(probe, path.resolve(ROOT, f)))));
      expect(messages).toEqual([]);
    },
  );

  it(
    'passes a client feature that imports its own folder, src/lib, src/config and shared',
    { timeout: TIMEOUT },
    async () => {
      const [own] = twoFeatures('src');
      const probe = `src/features/${own.name}/zone-probe.ts`;
      const allowed = [own.file, 'src/lib/api-client.ts', 'src/config/paths.ts', 'shared/permissions.ts'];
      const messages = await lint(probe, importing(allowed.map((f) => specifier(probe, path.resolve(ROOT, f)))));
      expect(messages).toEqual([]);
    },
  );

  it('fails the client importing the server, and shared importing either', { timeout: TIMEOUT }, async () => {
    const client = await lint('src/lib/zone-probe.ts', importing(['../../server/lib/retry']));
    expect(errorsOf(client, 'no-restricted-imports')).toHaveLength(1);
    const shared = await lint('shared/domain/zone-probe.ts', importing(['../../src/lib/api-client']));
    expect(errorsOf(shared, 'no-restricted-imports')).toHaveLength(1);
  });

  it('fails an import cycle', { timeout: TIMEOUT }, async () => {
    // The engine's barrel re-exports its modules; one of them importing the barrel closes a loop.
    const barrel = readFileSync(path.join(ROOT, 'shared/domain/index.ts'), 'utf8');
    const first = /from '\.\/([\w-]+)'/.exec(barrel)?.[1];
    expect(first).toBeDefined();
    const messages = await lint(`shared/domain/${first}.ts`, importing(['./index']));
    expect(errorsOf(messages, 'import-x/no-cycle')).toHaveLength(1);
  });

  for (const file of ['server/lib/zone-probe.ts', 'src/lib/zone-probe.ts']) {
    it(
      `fails a function over 150 lines in ${file.split('/')[0]}, blank lines and comments not counted`,
      { timeout: TIMEOUT },
      async () => {
        const fn = (statements: number) =>
          `export function probe(): number {\n  let n = 0;\n${'  n++;\n\n  // a comment\n'.repeat(statements)}  return n;\n}\n`;
        // The function's own two lines, `let` and `return`, and the statements.
        expect(errorsOf(await lint(file, fn(146)), 'max-lines-per-function')).toEqual([]);
        expect(errorsOf(await lint(file, fn(147)), 'max-lines-per-function')).toHaveLength(1);
      },
    );
  }
});
