// ESLint flat config: TypeScript, React hooks, and the import boundaries of STYLE.md and docs/feature-map.md — src and
// server never import each other, shared imports neither, a feature imports only shared, the lib/components folders
// and its own folder, and no module imports itself through others.
import { readdirSync } from 'node:fs';
import path from 'node:path';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';

const boundary = (from, banned) => ({
  files: [`${from}/**/*.{ts,tsx}`],
  rules: {
    'no-restricted-imports': [
      'error',
      { patterns: banned.map((b) => ({ group: [`**/${b}/*`, `**/${b}`], message: `${from}/ must not import ${b}/` })) },
    ],
  },
});

/** The feature folders under `dir`, read when lint starts so a renamed or new feature is covered at once. */
const featuresIn = (dir) =>
  readdirSync(path.join(import.meta.dirname, dir), { withFileTypes: true })
    .filter((d) => d.isDirectory())
    .map((d) => d.name);

/** One zone per feature: nothing from `root` except the allowed folders and the feature's own folder. */
const featureZones = (root, allowed) =>
  featuresIn(`./${root}/features`).map((f) => ({
    target: `./${root}/features/${f}`,
    from: `./${root}`,
    except: [...allowed.map((a) => `./${a}`), `./features/${f}`],
    message: `${root}/features/${f} may import only shared/, ${allowed.map((a) => `${root}/${a}/`).join(', ')} and its own folder (docs/feature-map.md).`,
  }));

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'coverage/**', '.data/**', '.tmp/**', 'drizzle/**', 'bench/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'warn' },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' },
      ],
    },
  },
  boundary('src', ['server', 'seed', 'scripts']),
  boundary('server', ['src']),
  boundary('shared', ['src', 'server', 'seed', 'scripts']),
  {
    files: ['{src,server,shared,seed,scripts}/**/*.{ts,tsx}'],
    plugins: { 'import-x': importX },
    settings: {
      // Which files the import rules read to follow an import: the cycle rule walks the project's own graph, never
      // a package's files.
      'import-x/extensions': ['.ts', '.tsx'],
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts', '.tsx'] },
      'import-x/ignore': ['node_modules'],
      // A module read once is kept for the whole run (the default forgets it after 30 s and reads it again).
      'import-x/cache': { lifetime: Infinity },
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: 'tsconfig.json' })],
    },
    // Type-only imports are not counted: they leave no edge at run time.
    rules: { 'import-x/no-cycle': 'error' },
  },
  {
    files: ['server/features/**/*.ts'],
    rules: {
      'import-x/no-restricted-paths': ['error', { zones: featureZones('server', ['lib', 'db', 'middleware']) }],
    },
  },
  {
    files: ['src/features/**/*.{ts,tsx}'],
    rules: {
      'import-x/no-restricted-paths': ['error', { zones: featureZones('src', ['lib', 'components', 'config']) }],
    },
  },
  {
    files: ['{src,server}/**/*.{ts,tsx}'],
    rules: { 'max-lines-per-function': ['error', { max: 150, skipBlankLines: true, skipComments: true }] },
  },
);
