/**
 * The engine worker's intake of the user's files: each file arrives as a Blob (a handle; the main
 * thread never reads it) and is read here in slices into one buffer of its size, so its bytes are
 * held once, in this worker only. A container keeps those bytes (the model's arrays are views into
 * them); a CSV or JSON file is decoded to text and its bytes dropped before the next file is read.
 *
 * Each file's SHA-256 (for the report's traceability) is the browser's own digest of the whole
 * buffer, taken before the parse: its copy lives only while the digest runs (native, about
 * 1 GB/s), and the parse's arrays that come after need more than it did, so it does not raise the
 * peak. A digest in script over the slices as they stream by would hold nothing more but costs
 * about 10 × the time (100 MB/s measured here), on the load's critical path.
 */
import { decodeUtf8 } from '../src/io/detect.ts'
import type { InputFile } from '../src/io/detect.ts'
import { isNativeContainer } from '../src/io/nativeContainer.ts'
import { checkModelSize } from '../src/io/sizeGuard.ts'
import type { EngineFile, InputFileRecord } from './protocol.ts'

/** Bytes per slice: large enough that the per-read overhead vanishes, small next to a model file. */
export const SLICE_BYTES = 16 * 1024 * 1024

const TEXT_EXTENSIONS = ['.csv', '.json', '.txt']

export interface ReadInputs {
  readonly files: InputFile[]
  /** One record per Blob read (name, size, digest); empty when none was a Blob. */
  readonly inputs: InputFileRecord[]
}

/** Lower-case hex SHA-256 by the platform's digest, or undefined where there is none. */
async function digestOf(bytes: Uint8Array<ArrayBuffer>): Promise<string | undefined> {
  const subtle = globalThis.crypto?.subtle
  if (!subtle) return undefined
  const d = new Uint8Array(await subtle.digest('SHA-256', bytes))
  return Array.from(d, (b) => b.toString(16).padStart(2, '0')).join('')
}

/** The whole of `blob`, read `slice` bytes at a time into one buffer; `read(bytes)` after each slice. */
export async function readInSlices(blob: Blob, read: (bytes: number) => void, slice = SLICE_BYTES): Promise<Uint8Array<ArrayBuffer>> {
  const out = new Uint8Array(blob.size)
  for (let at = 0; at < blob.size; at += slice) {
    const end = Math.min(blob.size, at + slice)
    out.set(new Uint8Array(await blob.slice(at, end).arrayBuffer()), at)
    read(end - at)
  }
  return out
}

/**
 * The files as the readers take them: Blobs read in slices (size limits checked first), text
 * files decoded; bytes and strings given already pass through. `progress(fraction)` follows the
 * bytes read over all Blobs.
 */
export async function readInputFiles(files: readonly EngineFile[], progress: (fraction: number) => void = () => undefined, slice = SLICE_BYTES): Promise<ReadInputs> {
  const blobs = files.filter((f): f is EngineFile & { data: Blob } => f.data instanceof Blob)
  checkModelSize(blobs.map((f) => ({ name: f.name, size: f.data.size })))
  const total = blobs.reduce((s, f) => s + f.data.size, 0)
  let done = 0
  const out: InputFile[] = []
  const inputs: InputFileRecord[] = []
  for (const f of files) {
    if (!(f.data instanceof Blob)) { out.push({ name: f.name, data: f.data }); continue }
    const bytes = await readInSlices(f.data, (n) => { done += n; progress(total > 0 ? done / total : 1) }, slice)
    const sha256 = await digestOf(bytes)
    inputs.push({ name: f.name, bytes: bytes.byteLength, ...(sha256 ? { sha256 } : {}) })
    const lower = f.name.toLowerCase()
    const text = !isNativeContainer(bytes) && TEXT_EXTENSIONS.some((e) => lower.endsWith(e))
    // Text files become text here, so their bytes are gone before the next file is read.
    out.push({ name: f.name, data: text ? decodeUtf8(f.name, bytes) : bytes })
  }
  return { files: out, inputs }
}
