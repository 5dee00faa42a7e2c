// Lint enforces the architecture: shared/ never imports client/ or server/, and the engine
// (shared/rf) imports nothing but itself and zod, so the worker, server, CLI and tests run the same code.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import globals from 'globals';

// Bare module names shared/ may not import (exact names, so '../rf/path' is not caught by 'path').
const NODE_AND_UI = ['fs', 'path', 'os', 'child_process', 'http', 'https', 'net', 'worker_threads', 'react', 'react-dom'];

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
            { group: ['node:*'], message: 'shared/ holds pure code: no Node I/O.' },
          ],
          paths: NODE_AND_UI.map((name) => ({ name, message: 'shared/ holds pure code: no Node I/O, no React.' })),
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
            { group: ['node:*'], message: 'The engine has no I/O, DOM or document dependencies.' },
          ],
          paths: [...NODE_AND_UI, 'yjs'].map((name) => ({ name, message: 'The engine has no I/O, DOM or document dependencies.' })),
        },
      ],
    },
  },
);
