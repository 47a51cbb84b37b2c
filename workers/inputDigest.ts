/**
 * SHA-256 (FIPS 180-4) of the user's files for the report's traceability, off the load's
 * critical path: a digest worker reads each Blob itself, a slice at a time into one reused
 * buffer, and hashes as it goes (@noble/hashes, incremental), so no file is held twice and the
 * engine's thread never waits on it. The engine starts it after the model's first picture, at
 * half a core (`share`), so that it takes a core neither from the load nor from the first cuts. The platform's own digest
 * (crypto.subtle) takes a whole buffer, copies it and blocks the calling thread while it hashes:
 * 1.6–3.2 s on the engine's thread for a 334 MB container in headless Chromium (load average 6–7).
 * Where no worker can start (Node, the tests) the same code runs here, one file after another.
 */
import * as Comlink from 'comlink'
import { createDigestHold, DIGEST_SLICE_BYTES, digestBlob, holdDigests } from './blobDigest.ts'
import type { DigestHold } from './blobDigest.ts'
import type { DigestWorkerApi } from './digest.worker.ts'

/** The hold every background digest of this thread obeys (blobDigest.ts DigestHold); null without shared memory. */
const HOLD: DigestHold | null = createDigestHold()

/**
 * Pauses the background digests started from this thread (`background` in digestsOf) for the
 * next `ms` milliseconds: the engine calls it at every section cut, so that a drag has both cores.
 */
export function holdBackgroundDigests(ms: number): void {
  holdDigests(HOLD, ms)
}

/**
 * The digests of `blobs`, in order, computed on a worker of their own where one can start (else
 * here), taking `share` of a core (blobDigest.ts). Started at once; the caller awaits the promise
 * when it needs the digests. `background`: they also pause while holdBackgroundDigests holds them.
 */
export function digestsOf(blobs: readonly Blob[], share = 1, background = false): Promise<string[]> {
  const hold = background ? HOLD : null
  if (blobs.length === 0) return Promise.resolve([])
  const inline = async (): Promise<string[]> => {
    const out: string[] = []
    for (const b of blobs) out.push(await digestBlob(b, DIGEST_SLICE_BYTES, share, hold))
    return out
  }
  if (typeof Worker === 'undefined') return inline()
  let w: Worker
  try {
    w = new Worker(new URL('./digest.worker.ts', import.meta.url), { type: 'module', name: 'tractus-digest' })
  } catch {
    return inline()
  }
  const remote = Comlink.wrap<DigestWorkerApi>(w)
  // A worker that fails to start (a script error) rejects through onerror: fall back to here.
  const failed = new Promise<never>((_, reject) => { w.onerror = (e) => { e.preventDefault(); reject(new Error('digest worker failed')) } })
  const run = async (): Promise<string[]> => {
    const out: string[] = []
    for (const b of blobs) out.push(await Promise.race([remote.digest(b, share, hold), failed]))
    return out
  }
  return run().catch(inline).finally(() => { remote[Comlink.releaseProxy](); w.terminate() })
}
