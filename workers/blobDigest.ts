/**
 * SHA-256 (FIPS 180-4) of a whole Blob, read a slice at a time into one reused buffer and hashed
 * as it goes (@noble/hashes, incremental): the file is never held whole. Lower-case hex.
 */
import { sha256 } from '@noble/hashes/sha2.js'
import { sliceReader } from './blobBytes.ts'

/** Bytes hashed per slice: the read's overhead vanishes, the buffer stays small. */
export const DIGEST_SLICE_BYTES = 8 * 1024 * 1024

/**
 * A pause the engine can put on background digests from its own thread: `until[0]` (an
 * Int32Array on shared memory, so the digest worker sees it at once) is the time, in ms after
 * `t0` (Date.now() clock, the same in every worker), before which a digest takes no further slice.
 * The engine sets it while section cuts run: at 10^7 elements on two cores the user's first cut
 * took 225–312 ms beside a digest (three runs), 221–231 ms with the digests all but off (two).
 */
export interface DigestHold {
  readonly until: Int32Array
  readonly t0: number
}

/** A hold on shared memory, or null where there is none (not cross-origin isolated): the digests then never pause. */
export function createDigestHold(): DigestHold | null {
  if (typeof SharedArrayBuffer === 'undefined') return null
  try {
    return { until: new Int32Array(new SharedArrayBuffer(4)), t0: Date.now() }
  } catch {
    return null
  }
}

/** Holds the digests for the next `ms` milliseconds (from now; a longer hold already set stands). */
export function holdDigests(hold: DigestHold | null, ms: number): void {
  if (!hold) return
  const until = Date.now() - hold.t0 + ms
  if (until > Atomics.load(hold.until, 0)) Atomics.store(hold.until, 0, until)
}

/**
 * A file of at most this many slices ignores the hold: it is hashed in a few tens of ms, and its
 * digest is wanted at once (a view link names the file by it).
 */
export const HOLD_MIN_SLICES = 4

/** Polling step while held (ms): short beside a drag's pace, long beside a slice's hashing. */
const HOLD_POLL_MS = 50

async function whileHeld(hold: DigestHold | null): Promise<void> {
  if (!hold) return
  for (;;) {
    const left = Atomics.load(hold.until, 0) - (Date.now() - hold.t0)
    if (left <= 0) return
    await new Promise((r) => setTimeout(r, Math.min(left, HOLD_POLL_MS)))
  }
}

/**
 * Lower-case hex SHA-256 of the whole Blob. `share` (0 < share ≤ 1): the part of a core it may
 * take; below 1 it rests after each slice for as long as the slice took, scaled (0.5: as long), so
 * that hashing a large file in the background leaves the other threads most of a shared core.
 * `hold`: before each slice it waits while the hold is set (DigestHold), for a Blob of more
 * than HOLD_MIN_SLICES slices.
 */
export async function digestBlob(blob: Blob, slice = DIGEST_SLICE_BYTES, share = 1, hold: DigestHold | null = null): Promise<string> {
  const h = sha256.create()
  const next = sliceReader(blob)
  let buf = new ArrayBuffer(Math.max(1, Math.min(slice, blob.size)))
  const rest = share > 0 && share < 1 ? 1 / share - 1 : 0
  const held = blob.size > HOLD_MIN_SLICES * slice ? hold : null
  for (let at = 0; at < blob.size; at += slice) {
    await whileHeld(held)
    const t0 = performance.now()
    const view = await next(new Uint8Array(buf, 0, Math.min(slice, blob.size - at)))
    h.update(view)
    buf = view.buffer
    if (rest > 0) await new Promise((r) => setTimeout(r, rest * (performance.now() - t0)))
  }
  return Array.from(h.digest(), (b) => b.toString(16).padStart(2, '0')).join('')
}

