/// <reference types="vitest/config" />
import { defineConfig } from 'vite'
import react from '@vitejs/plugin-react'

// Cross-origin isolation lets the engine share the model with its worker pool through
// SharedArrayBuffer; without these headers (a page opened from a file) the pool copies instead.
const isolation = {
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Embedder-Policy': 'require-corp',
}

// Relative base so the built app also opens from any folder, offline.
export default defineConfig({
  base: './',
  server: { headers: isolation },
  preview: { headers: isolation },
  plugins: [react()],
  worker: { format: 'es' },
  build: { target: 'es2022', chunkSizeWarningLimit: 2000 },
  test: {
    include: ['test/**/*.test.ts'],
    exclude: ['test/e2e/**', 'node_modules/**'],
    environment: 'node',
    testTimeout: 60_000,
  },
})
