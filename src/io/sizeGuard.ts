/**
 * Upper bounds on the size of one model file, so the app refuses a file before reading it, with
 * the file, its size, the limit and what to do instead.
 *
 * - A CSV or JSON file: 2^29 - 24 bytes (just under 512 MiB), the longest string V8 makes (2^29
 *   - 24 UTF-16 units, measured in Chromium and Node 20: one unit more throws "Invalid string
 *   length"; a UTF-8 file never has more units than bytes). A JSON file is parsed from its text,
 *   so the bound is hard for it; a CSV file is parsed from its bytes (src/io/csvBytes.ts), and
 *   for it the bound is the tested size, kept until a larger one is measured in the browser.
 *   The largest file of a 10^7-element tet4 bundle, elements.csv, is about 455 MB.
 * - A `.tractus` container: 2 GiB. The engine worker holds the file once (its arrays are views
 *   into the file's bytes, read in slices) and the analysis beside it, about 1.2 × the file again
 *   (the command line peaks at 787 MB on the 333 MB container of 10^7 tet4 elements); 2 GiB, about
 *   6 × 10^7 tet4 elements, so needs about 4.5 GiB in the worker, what a browser tab on a 16 GB
 *   machine can hold. Chromium allocates one buffer of up to 4 GiB, but not the analysis beside it.
 * The command line reads files of any size, so a refused file is sent there.
 */
import { InputError } from '../model/errors.ts'

/** Longest CSV or JSON file, in bytes (the longest string V8 makes). */
export const MAX_TEXT_BYTES = 2 ** 29 - 24
/** Largest `.tractus` container, in bytes. */
export const MAX_CONTAINER_BYTES = 2 * 1024 ** 3
/** The limit of a text file (the readers that take text check it on characters). */
export const MAX_MODEL_BYTES = MAX_TEXT_BYTES

const CONTAINER_EXTENSION = '.tractus'

/** The limit for a file of this name: a container's, or a text file's. */
export function limitFor(name: string): number {
  return name.toLowerCase().endsWith(CONTAINER_EXTENSION) ? MAX_CONTAINER_BYTES : MAX_TEXT_BYTES
}

export function formatBytes(n: number): string {
  if (n >= 1024 ** 3) return `${(n / 1024 ** 3).toFixed(2)} GiB (${n} bytes)`
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

/**
 * Checks every file of a set (name and size in bytes) before reading any: against `limit`, or
 * by default against the limit for its kind (limitFor).
 */
export function checkModelSize(files: readonly { readonly name: string; readonly size: number }[], limit?: number): void {
  for (const f of files) assertWithinLimit(f.name, f.size, limit ?? limitFor(f.name))
}

/** What to do with a file the browser refused as too large (the error card's hint). */
export function tooLargeHint(file: string | undefined): string {
  const name = file ?? 'the file'
  if (limitFor(name) === MAX_CONTAINER_BYTES) {
    return `The browser opens a ${CONTAINER_EXTENSION} container of up to ${formatBytes(MAX_CONTAINER_BYTES).split(' (')[0]}. ` +
      `The command line reads it whatever its size: npx tractus audit ${name} (also info, cut, sweep, line).`
  }
  return `The browser reads a CSV or JSON file of up to ${formatBytes(MAX_TEXT_BYTES).split(' (')[0]} (the longest text it holds). ` +
    `Convert the bundle on the command line, npx tractus convert <bundle folder> --out model${CONTAINER_EXTENSION}, and open the container ` +
    `(up to ${formatBytes(MAX_CONTAINER_BYTES).split(' (')[0]}), or work on the bundle there: npx tractus audit <bundle folder>.`
}
