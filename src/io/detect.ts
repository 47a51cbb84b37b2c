/**
 * One entry point for whatever the user handed over: a CSV bundle (several files) or a single
 * native container. The container is recognised by its magic bytes, whatever its name; a file
 * named *.tractus without them is an error rather than being read as text.
 */
import { InputError } from '../model/errors.ts'
import type { ReadModel } from './intakeReport.ts'
import { NATIVE_EXTENSION, isNativeContainer, readNative } from './nativeContainer.ts'
import { baseName, readCsvBundle, readCsvBundleInPieces } from './readCsvBundle.ts'
import type { PieceLane } from './csvPieces.ts'
import type { CsvBundleOptions, CsvFile } from './readCsvBundle.ts'
import { MAX_CONTAINER_BYTES, assertWithinLimit, limitFor } from './sizeGuard.ts'

export interface InputFile {
  readonly name: string
  readonly data: ArrayBuffer | Uint8Array | string
}

export interface ReadModelOptions {
  /** Largest accepted file in bytes (default MAX_CONTAINER_BYTES for a container, else limitFor its name: a JSON or a CSV file's). */
  readonly maxBytes?: number
  /** Model name when the files give none. */
  readonly name?: string
  /** Units chosen when opening a CSV bundle, for those its files do not declare (CsvBundleOptions.units). */
  readonly units?: CsvBundleOptions['units']
}

function bytesOf(d: ArrayBuffer | Uint8Array): Uint8Array {
  return d instanceof Uint8Array ? d : new Uint8Array(d)
}

function sizeOf(d: ArrayBuffer | Uint8Array | string): number {
  return typeof d === 'string' ? d.length : d.byteLength
}

const MAGIC_TEXT = 'TRACTUS\0'

export function readModelFiles(files: readonly InputFile[], options: ReadModelOptions = {}): ReadModel {
  const r = readModelOrBundle(files, options)
  return 'mesh' in r ? r : readCsvBundle(r.texts, r.options)
}

/**
 * readModelFiles with a CSV bundle's first tables read in pieces on `lanes` (src/io/csvPieces.ts):
 * the same model, the same messages.
 */
export async function readModelFilesInPieces(files: readonly InputFile[], options: ReadModelOptions, lanes: readonly PieceLane[]): Promise<ReadModel> {
  const r = readModelOrBundle(files, options)
  return 'mesh' in r ? r : readCsvBundleInPieces(r.texts, r.options, lanes)
}

/** A container read, or the texts of a CSV bundle and its options, not read yet. */
function readModelOrBundle(files: readonly InputFile[], options: ReadModelOptions): ReadModel | { readonly texts: CsvFile[]; readonly options: CsvBundleOptions } {
  if (files.length === 0) throw new InputError('missing-file', 'no files given: choose nodes.csv, elements.csv and stress.csv together (and model.json), or one .tractus file')
  const native = files.filter((f) => (typeof f.data === 'string' ? f.data.startsWith(MAGIC_TEXT) : isNativeContainer(bytesOf(f.data))))
  for (const f of files) assertWithinLimit(f.name, sizeOf(f.data), options.maxBytes ?? (native.includes(f) ? MAX_CONTAINER_BYTES : limitFor(f.name)))
  if (native.length > 0) {
    if (files.length > 1) {
      throw new InputError('bad-argument', `give either one ${NATIVE_EXTENSION} container or a CSV bundle, not both; got: ${files.map((f) => f.name).join(', ')}`, { file: native[0].name })
    }
    const f = native[0]
    if (typeof f.data === 'string') throw new InputError('encoding', `a ${NATIVE_EXTENSION} container must be read as bytes, not as text`, { file: f.name })
    return readNative(f.data, f.name)
  }
  const named = files.find((f) => baseName(f.name).toLowerCase().endsWith(NATIVE_EXTENSION))
  if (named) {
    // Named like a container but without its magic: let the container reader say what is wrong.
    if (files.length === 1 && typeof named.data !== 'string') return readNative(named.data, named.name)
    throw new InputError('container', `does not start with the ${NATIVE_EXTENSION} magic bytes "TRACTUS\\0"`, { file: named.name, field: 'magic' })
  }
  // Bytes as they are: the readers parse UTF-8 bytes (src/io/csvBytes.ts) and check the text they keep.
  const texts: CsvFile[] = files.map((f) => (typeof f.data === 'string' ? { name: f.name, text: f.data } : { name: f.name, bytes: bytesOf(f.data) }))
  return { texts, options: { ...(options.maxBytes !== undefined ? { maxBytes: options.maxBytes } : {}), name: options.name, ...(options.units ? { units: options.units } : {}) } }
}

