import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import globals from 'globals';

export default tseslint.config(
  {
    ignores: [
      'node_modules/**',
      'dist/**',
      'build/**',
      'release/**',
      'test-results/**',
      'playwright-report/**',
      '**/*.svelte',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['bin/**/*.mjs', 'test/**/*.mjs', '*.config.js', 'renderer/*.config.js'],
    languageOptions: { globals: { ...globals.node } },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  {
    // The engine is pure TypeScript: it runs unchanged in Node, a Web Worker and the CLI.
    files: ['engine/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['node:*', 'fs', 'path', 'os', 'child_process', 'crypto', 'url', 'util', 'stream', 'buffer'],
              message: 'engine/ is pure: no Node imports.',
            },
            { group: ['electron', 'electron/*'], message: 'engine/ is pure: no Electron imports.' },
            {
              group: ['dexie', 'svelte', 'svelte/*', 'chart.js', 'chart.js/*'],
              message: 'engine/ is pure: no UI or storage imports.',
            },
          ],
        },
      ],
      'no-restricted-globals': ['error', 'window', 'document', 'process', 'require', 'Buffer', '__dirname'],
    },
  },
);
