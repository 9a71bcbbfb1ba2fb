// @ts-check
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const nodeBuiltins = [
  'assert', 'buffer', 'child_process', 'crypto', 'events', 'fs', 'fs/promises', 'http', 'https',
  'net', 'os', 'path', 'process', 'stream', 'timers', 'url', 'util', 'worker_threads', 'zlib',
];

export default tseslint.config(
  { ignores: ['dist/**', 'out/**', 'node_modules/**', '.cache/**', 'media/**/*.min.js', 'test/host/workspace/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.ts'],
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // The pure core: usable from the CLI, unit tests and a worker alike.
    files: ['compute/**/*.ts', 'language/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: [
          { name: 'vscode', message: 'compute/ and language/ must not depend on the editor API.' },
          ...nodeBuiltins.flatMap((n) => [
            { name: n, message: 'compute/ and language/ take file access, clock and workers through interfaces.' },
            { name: `node:${n}`, message: 'compute/ and language/ take file access, clock and workers through interfaces.' },
          ]),
        ],
      }],
    },
  },
  {
    files: ['**/*.mjs', '**/*.js'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly', URL: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly', Buffer: 'readonly' } },
  },
);
