/**
 * The engine worker's intake of the user's files: each file arrives as a Blob (a handle; the main
 * thread never reads it) and is read here a slice at a time straight into one buffer of its size
 * (workers/blobBytes.ts), so its bytes are held once, in this worker only. A container keeps
 * those bytes (the model's arrays are views into them); a CSV or JSON file stays as its bytes,
 * which the readers parse as they are (src/io/csvBytes.ts): no text of it is made.
 *
 * Each file's SHA-256 (for the report's traceability) comes from a digest worker that reads the
 * same Blob itself (workers/inputDigest.ts); the records carrying the digests are a promise the
 * engine hands on when the app asks (EngineApi.inputDigests), after the model's first picture.
 */
import type { InputFile } from '../src/io/detect.ts'
import { NATIVE_EXTENSION, isNativeContainer } from '../src/io/nativeContainer.ts'
import { checkModelSize } from '../src/io/sizeGuard.ts'
import { InputError } from '../src/model/errors.ts'
import type { EngineFile, InputFileRecord } from './protocol.ts'
import { sliceReader } from './blobBytes.ts'
import { digestsOf } from './inputDigest.ts'

/** Bytes per slice: large enough that the per-read overhead vanishes, small next to a model file. */
export const SLICE_BYTES = 16 * 1024 * 1024

export interface ReadInputs {
  readonly files: InputFile[]
  /** One record per Blob read (name and size), at once; empty when none was a Blob. */
  readonly records: readonly InputFileRecord[]
  /** The same records with their digests, once the digests are done. */
  readonly inputs: Promise<InputFileRecord[]>
}

/**
 * The whole of `blob`, read `slice` bytes at a time into one buffer; `read(bytes)` after each
 * slice. Each slice is read into a small buffer, kept for the next, and copied to its place: a
 * stream reader moves the buffer it fills, and a read that stalls (blobBytes.ts) keeps it, so the
 * bytes already in place are never handed to the reader. `shared`: the buffer is a
 * SharedArrayBuffer, so a container's arrays, views into it, go to the pool without the copy into
 * shared memory a load otherwise makes (about 1.1 s at 10^7 tet4 in the browser).
 */
export async function readInSlices(blob: Blob, read: (bytes: number) => void, slice = SLICE_BYTES, shared = false): Promise<Uint8Array<ArrayBuffer | SharedArrayBuffer>> {
  const next = sliceReader(blob)
  const out = new Uint8Array(shared ? new SharedArrayBuffer(blob.size) : new ArrayBuffer(blob.size))
  let scratch = new ArrayBuffer(Math.max(1, Math.min(slice, blob.size)))
  for (let at = 0; at < blob.size; at += slice) {
    const n = Math.min(slice, blob.size - at)
    const view = await next(new Uint8Array(scratch, 0, n))
    out.set(view, at)
    scratch = view.buffer
    read(n)
  }
  return out
}

/** The part of a core the digests take once they start after the gate (the app is in use then). */
const BACKGROUND_DIGEST_SHARE = 0.5

/**
 * The files as the readers take them: Blobs read in slices (size limits checked first) into
 * bytes; bytes and strings given already pass through. `progress(fraction)` follows the
 * bytes read over all Blobs. The digests start when `digestsAfter` settles (at once without it):
 * the engine starts them once the model's first picture is out, so that hashing a large file does
 * not take a core from the load.
 */
export async function readInputFiles(
  files: readonly EngineFile[], progress: (fraction: number) => void = () => undefined, slice = SLICE_BYTES, sharedContainers = false,
  digestsAfter: Promise<unknown> | null = null,
): Promise<ReadInputs> {
  const blobs = files.filter((f): f is EngineFile & { data: Blob } => f.data instanceof Blob)
  checkModelSize(blobs.map((f) => ({ name: f.name, size: f.data.size })))
  const total = blobs.reduce((s, f) => s + f.data.size, 0)
  let done = 0
  const out: InputFile[] = []
  const records: Omit<InputFileRecord, 'sha256'>[] = []
  const data = blobs.map((f) => f.data)
  // after the gate the digests are background work: half a core (blobDigest.ts)
  const digests = digestsAfter ? digestsAfter.then(() => digestsOf(data, BACKGROUND_DIGEST_SHARE, true)) : digestsOf(data)
  // never unhandled when a read below fails first
  digests.catch(() => undefined)
  for (const f of files) {
    if (!(f.data instanceof Blob)) { out.push({ name: f.name, data: f.data }); continue }
    let bytes: Uint8Array
    try {
      // a container (by its name) into shared memory when the pool shares it
      const shared = sharedContainers && f.name.toLowerCase().endsWith(NATIVE_EXTENSION)
      const read = await readInSlices(f.data, (n) => { done += n; progress(total > 0 ? done / total : 1) }, slice, shared)
      // not a container after all: ordinary memory, which every reader (and decoder) takes
      bytes = read.buffer instanceof ArrayBuffer || isNativeContainer(read) ? read : read.slice()
    } catch (e) {
      throw new InputError('missing-file', `the file could not be read whole (${e instanceof Error ? e.message : String(e)}); choose it again`, { file: f.name })
    }
    records.push({ name: f.name, bytes: bytes.byteLength })
    out.push({ name: f.name, data: bytes })
  }
  // A file that cannot be read again for its digest (changed or gone meanwhile) keeps its record
  // without one; the model read is not lost for it.
  const inputs = digests.then((d) => records.map((r, i) => ({ ...r, sha256: d[i] })), () => records)
  return { files: out, records, inputs }
}
