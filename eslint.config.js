// ESLint flat config: TypeScript, React hooks, and the import boundaries of STYLE.md (src and server never import each
// other; shared imports neither).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

const boundary = (from, banned) => ({
  files: [`${from}/**/*.{ts,tsx}`],
  rules: {
    'no-restricted-imports': [
      'error',
      { patterns: banned.map((b) => ({ group: [`**/${b}/*`, `**/${b}`], message: `${from}/ must not import ${b}/` })) },
    ],
  },
});

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
);
