// Lint enforces the architecture: shared/ never imports client/ or server/, and the engine
// (shared/rf) imports nothing but itself and zod, so the worker, server, CLI and tests run the same code.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'coverage/**', 'tmp/**', 'e2e/screenshots/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'no-constant-condition': ['error', { checkLoops: false }],
    },
  },
  {
    files: ['shared/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/client/**', '**/server/**', '../client/*', '../server/*'], message: 'shared/ must not import client/ or server/.' },
            { group: ['node:*', 'fs', 'path', 'child_process', 'http', 'net', 'react', 'react-dom'], message: 'shared/ holds pure code: no Node I/O, no React.' },
          ],
        },
      ],
    },
  },
  {
    files: ['shared/rf/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/client/**', '**/server/**', '../collab/*', '../../*'], message: 'shared/rf imports only itself (and zod/mathjs).' },
            { group: ['node:*', 'fs', 'path', 'child_process', 'http', 'net', 'react', 'react-dom', 'yjs'], message: 'The engine has no I/O, DOM or document dependencies.' },
          ],
        },
      ],
    },
  },
);
