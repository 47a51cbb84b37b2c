import { defineConfig } from 'vitest/config'

// The 10^7-element browser run (`npm run e2e:large`), apart from `npm run e2e`: one file, long
// timeouts (a load of 10^7 elements on two shared cores takes minutes).
export default defineConfig({
  test: {
    include: ['test/e2e/large10m.e2e.ts'],
    globalSetup: ['test/e2e/globalSetup.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 1_800_000,
    hookTimeout: 120_000,
    // writeCsvBundle builds each file of the 10^7 bundle as rows in memory (about 6 GB at once)
    execArgv: ['--max-old-space-size=12288'],
  },
})
