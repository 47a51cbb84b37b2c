/**
 * SHA-256 (FIPS 180-4) of a whole Blob, read a slice at a time into one reused buffer and hashed
 * as it goes (@noble/hashes, incremental): the file is never held whole. Lower-case hex.
 */
import { sha256 } from '@noble/hashes/sha2.js'
import { sliceReader } from './blobBytes.ts'

/** Bytes hashed per slice: the read's overhead vanishes, the buffer stays small. */
export const DIGEST_SLICE_BYTES = 8 * 1024 * 1024

/**
 * Lower-case hex SHA-256 of the whole Blob. `share` (0 < share ≤ 1): the part of a core it may
 * take; below 1 it rests after each slice for as long as the slice took, scaled (0.5: as long), so
 * that hashing a large file in the background leaves the other threads most of a shared core.
 */
export async function digestBlob(blob: Blob, slice = DIGEST_SLICE_BYTES, share = 1): Promise<string> {
  const h = sha256.create()
  const next = sliceReader(blob)
  let buf = new ArrayBuffer(Math.max(1, Math.min(slice, blob.size)))
  const rest = share > 0 && share < 1 ? 1 / share - 1 : 0
  for (let at = 0; at < blob.size; at += slice) {
    const t0 = performance.now()
    const view = await next(new Uint8Array(buf, 0, Math.min(slice, blob.size - at)))
    h.update(view)
    buf = view.buffer
    if (rest > 0) await new Promise((r) => setTimeout(r, rest * (performance.now() - t0)))
  }
  return Array.from(h.digest(), (b) => b.toString(16).padStart(2, '0')).join('')
}

