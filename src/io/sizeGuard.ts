/**
 * Upper bound on the size of one model file, so the app can refuse a file before reading it.
 * 512 MiB: a JavaScript string holds at most about 2^29 UTF-16 units in V8 (common practice,
 * from memory), so a larger CSV file could not even be decoded; a container of that size already
 * holds tens of millions of nodes.
 */
import { InputError } from '../model/errors.ts'

export const MAX_MODEL_BYTES = 512 * 1024 * 1024

function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${(n / (1024 * 1024)).toFixed(1)} MiB (${n} bytes)`
  if (n >= 1024) return `${(n / 1024).toFixed(1)} KiB (${n} bytes)`
  return `${n} bytes`
}

/** Throws 'too-large' when `size` (bytes, or characters for text) exceeds `limit`. */
export function assertWithinLimit(file: string, size: number, limit: number = MAX_MODEL_BYTES): void {
  if (size > limit) {
    throw new InputError('too-large', `the file is ${formatBytes(size)}, more than the limit of ${formatBytes(limit)}`, { file })
  }
}

/** Checks every file of a set (name and size in bytes) against the limit, before reading any. */
export function checkModelSize(files: readonly { readonly name: string; readonly size: number }[], limit: number = MAX_MODEL_BYTES): void {
  for (const f of files) assertWithinLimit(f.name, f.size, limit)
}
