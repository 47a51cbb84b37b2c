/**
 * The app's engine client: one instance of `createEngineClient` (src/app/engineClient.ts) over the
 * browser's engine worker and the app's store. Cards and actions call it; `App` switches on its
 * watch of the store.
 */
import { computeOptionsFromHash } from './computeOptions.ts'
import { createEngineClient } from './engineClient.ts'
import { startEngineWorker } from './engineWorker.ts'
import { useStore } from '../state/store.ts'

export type { AppSource } from './engineClient.ts'

export const engine = createEngineClient({
  createWorker: startEngineWorker,
  store: useStore,
  computeOptions: () => computeOptionsFromHash(location.hash),
})
