/**
 * Upper bounds on the size of one model file, so the app refuses a file before reading it, with
 * the file, its size, the limit and what to do instead.
 *
 * - A CSV file: 2 GiB. The readers parse its UTF-8 bytes (src/io/csvBytes.ts) and make no text of
 *   it, so no string length binds it. The engine worker holds the file once (read in slices into
 *   one buffer, workers/inputFiles.ts), the pieces sent to the pool (a copy of at most the part
 *   of each table the pool reads, moved there and dropped once read) and the model beside it,
 *   which is smaller than its CSV text (a number takes 8-15 characters in the file, 4 or 8 bytes
 *   in the model). Byte positions stay below 2^31, as the readers' 32-bit fields expect.
 * - A JSON file (model.json): 2^29 - 24 bytes (just under 512 MiB), the longest string V8 makes
 *   (2^29 - 24 UTF-16 units, measured in Chromium and Node 20: one unit more throws "Invalid
 *   string length"; a UTF-8 file never has more units than bytes). It is parsed from its text.
 * - A `.tractus` container: 2 GiB. The engine worker holds the file once (its arrays are views
 *   into the file's bytes, read in slices) and the analysis beside it, about 1.2 × the file again
 *   (the command line peaks at 787 MB on the 333 MB container of 10^7 tet4 elements); 2 GiB, about
 *   6 × 10^7 tet4 elements, so needs about 4.5 GiB in the worker, what a browser tab on a 16 GB
 *   machine can hold. Chromium allocates one buffer of up to 4 GiB, but not the analysis beside it.
 * The command line takes the same limits for CSV and JSON files and reads a container up to the
 * largest buffer Node makes (src/cli/readWholeFile.ts), so a refused container is sent there.
 */
import { InputError } from '../model/errors.ts'

/** Longest JSON file, in bytes (the longest string V8 makes). */
export const MAX_TEXT_BYTES = 2 ** 29 - 24
/** Largest CSV file, in bytes. */
export const MAX_CSV_BYTES = 2 * 1024 ** 3
/** Largest `.tractus` container, in bytes. */
export const MAX_CONTAINER_BYTES = 2 * 1024 ** 3

const CONTAINER_EXTENSION = '.tractus'

/** The kind of file a name says: a container, a JSON file (model.json), or else a CSV file. */
export function fileKindOf(name: string): 'container' | 'json' | 'csv' {
  const n = name.toLowerCase()
  if (n.endsWith(CONTAINER_EXTENSION)) return 'container'
  return n.endsWith('.json') ? 'json' : 'csv'
}

const LIMIT_OF_KIND = { container: MAX_CONTAINER_BYTES, json: MAX_TEXT_BYTES, csv: MAX_CSV_BYTES } as const

/** The limit for a file of this name: a container's, a JSON file's, or else a CSV file's. */
export function limitFor(name: string): number {
  return LIMIT_OF_KIND[fileKindOf(name)]
}

export function formatBytes(n: number): string {
  if (n >= 1024 ** 3) return `${(n / 1024 ** 3).toFixed(2)} GiB (${n} bytes)`
  if (n >= 1024 * 1024) return `${(n / (1024 * 1024)).toFixed(1)} MiB (${n} bytes)`
  if (n >= 1024) return `${(n / 1024).toFixed(1)} KiB (${n} bytes)`
  return `${n} bytes`
}

/** Throws 'too-large' when `size` (bytes, or characters for text) exceeds `limit` (by default the limit for the file's kind). */
export function assertWithinLimit(file: string, size: number, limit: number = limitFor(file)): void {
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

/** A size as formatBytes rounds it, without the exact count ("2.00 GiB"). */
function roundBytes(n: number): string {
  return formatBytes(n).split(' (')[0]
}

/** What to do with a file the browser refused as too large (the error card's hint). */
export function tooLargeHint(file: string | undefined): string {
  const name = file ?? 'the file'
  const kind = fileKindOf(name)
  if (kind === 'container') {
    return `The browser opens a ${CONTAINER_EXTENSION} container of up to ${roundBytes(MAX_CONTAINER_BYTES)}. ` +
      `The command line reads larger ones (up to the largest buffer of Node.js, 4 GiB in Node.js 20): npx tractus audit ${name} (also info, cut, sweep, line).`
  }
  if (kind === 'json') {
    return `The browser reads a JSON file of up to ${roundBytes(MAX_TEXT_BYTES)} (the longest text it holds); ` +
      'model.json holds only the bundle\'s settings, a few kilobytes: put the tables in CSV files beside it.'
  }
  return `The browser and the command line read a CSV file of up to ${roundBytes(MAX_CSV_BYTES)}. ` +
    'Write each load case\'s stress to a file of its own (stress.NAME.csv) or with fewer digits, ' +
    `or write the model as a ${CONTAINER_EXTENSION} container (its layout is in the README), which the command line reads ` +
    `beyond the browser's ${roundBytes(MAX_CONTAINER_BYTES)}: npx tractus audit model${CONTAINER_EXTENSION}.`
}
