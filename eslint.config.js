// Lint with import boundaries. The pure core (model, io, mechanics) may not reach three.js,
// React, the DOM or Node built-ins, so the same code runs in the worker, in Node and in tests.
// The UI's directions (an arrow means "may import"): app -> scene -> state -> model,
// app -> state, app -> engine client -> workers, state -> workers/protocol (types). So the
// workers import no UI code, the scene nothing from the app, the store neither app nor scene.
// test/unit/lintBoundaries.test.ts shows that each of these rules reports a forbidden import.
import tseslint from 'typescript-eslint'
import globals from 'globals'

const forbiddenInCore = {
  patterns: [
    { group: ['three', 'three/*', '@react-three/*', 'react', 'react-dom', 'react/*', 'react-dom/*', 'zustand', 'comlink'], message: 'The pure core may not import UI or worker libraries.' },
    { group: ['node:*', 'fs', 'path', 'os', 'url', 'child_process', 'worker_threads', 'crypto', 'zlib', 'stream', 'buffer', 'util'], message: 'The pure core may not import Node built-ins.' },
    { group: ['**/app/*', '**/scene/*', '**/state/*', '**/cli/*', '**/demo/*', '**/workers/*'], message: 'The pure core may not import app, scene, state, cli, demo or worker code.' },
  ],
}

// The UI folders, by the pattern `no-restricted-imports` matches against an import's path.
const UI = {
  app: ['**/app/*', '**/app/**'],
  scene: ['**/scene/*', '**/scene/**'],
  state: ['**/state/*', '**/state/**'],
  demo: ['**/demo/*', '**/demo/**'],
}

const forbiddenInWorkers = {
  patterns: [
    { group: [...UI.app, ...UI.scene, ...UI.state, ...UI.demo], message: 'The workers import no UI or demo code: types that cross the worker boundary live in workers/protocol.ts.' },
  ],
}

const forbiddenInState = {
  patterns: [
    { group: [...UI.app, ...UI.scene, ...UI.demo, '**/cli/*'], message: 'The store imports neither the app nor the scene (app -> scene -> state).' },
    { group: ['**/workers/*', '!**/workers/protocol.ts'], message: 'The store may import only the worker protocol\'s types from workers/.' },
    { group: ['three', 'three/*', '@react-three/*', 'react-dom', 'react-dom/*'], message: 'The store holds data and actions; drawing is the scene\'s.' },
  ],
}

const forbiddenInScene = {
  patterns: [
    { group: [...UI.app], message: 'The scene imports nothing from the app (app -> scene -> state); what both need lives in src/state or src/scene.' },
    { group: ['**/mechanics/*', '**/io/*', 'node:*'], message: 'The scene reads the store and model; heavy work is the worker\'s.' },
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
    files: ['workers/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', forbiddenInWorkers],
    },
  },
  {
    files: ['src/state/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', forbiddenInState],
    },
  },
  {
    files: ['src/scene/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', forbiddenInScene],
    },
  },
)
