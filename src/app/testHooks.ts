/**
 * Hooks for the browser tests, installed by main.tsx only in the end-to-end build
 * (`vite build --mode e2e`); the release build leaves this module out (test/unit/app/
 * releaseBundle.test.ts checks the bundle).
 */
import type { CrashKind } from '../../workers/protocol.ts'
import type { EngineClient } from './engineClient.ts'

declare global {
  interface Window {
    /** Hooks for the end-to-end tests only; nothing in the app calls them. */
    __tractusTest?: { crashEngine: (kind?: CrashKind) => Promise<void> }
  }
}

export function installTestHooks(engine: EngineClient): void {
  window.__tractusTest = {
    // The worker throws an unexpected error or fails an allocation; the app must recover.
    crashEngine: async (kind = 'throw') => {
      await engine.runJob((calls) => (calls.crash ? calls.crash(kind) : Promise.reject(new Error('this build has no crash hook'))))
    },
  }
}
