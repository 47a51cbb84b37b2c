import { defineConfig } from 'vitest/config'

// End-to-end tests in Debian's Chromium (playwright-core) against `vite preview` of the built app.
// One browser at a time: the machine has two cores and software WebGL.
export default defineConfig({
  test: {
    include: ['test/e2e/**/*.e2e.test.ts'],
    globalSetup: ['test/e2e/globalSetup.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 180_000,
    hookTimeout: 120_000,
  },
})
