// Lint with import boundaries: the pure core (model, io, mechanics) may not reach three.js,
// React, the DOM or Node built-ins, so the same code runs in the worker, in Node and in tests.
import tseslint from 'typescript-eslint'
import globals from 'globals'

const forbiddenInCore = {
  patterns: [
    { group: ['three', 'three/*', '@react-three/*', 'react', 'react-dom', 'react/*', 'react-dom/*', 'zustand', 'comlink'], message: 'The pure core may not import UI or worker libraries.' },
    { group: ['node:*', 'fs', 'path', 'os', 'url', 'child_process', 'worker_threads', 'crypto', 'zlib', 'stream', 'buffer', 'util'], message: 'The pure core may not import Node built-ins.' },
    { group: ['**/app/*', '**/scene/*', '**/cli/*', '**/demo/*', '**/workers/*'], message: 'The pure core may not import app, scene, cli, demo or worker code.' },
  ],
}

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'public/**', 'coverage/**', 'test-output/**'] },
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
      'no-eval': 'error',
      'no-new-func': 'error',
      'no-implied-eval': 'error',
    },
  },
  {
    files: ['src/model/**/*.ts', 'src/io/**/*.ts', 'src/mechanics/**/*.ts'],
    languageOptions: { globals: {} },
    rules: {
      'no-restricted-imports': ['error', forbiddenInCore],
      'no-restricted-globals': ['error', 'window', 'document', 'navigator', 'process', 'require', 'Buffer', 'localStorage', 'fetch', 'XMLHttpRequest'],
    },
  },
  {
    files: ['src/scene/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/mechanics/*', '**/io/*', 'node:*'], message: 'The scene reads the store and model; heavy work is the worker\'s.' }] }],
    },
  },
)
