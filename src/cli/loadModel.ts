/**
 * Reads a model from disk for the command line: a bundle folder (CSV files and an optional
 * model.json, which may name files of any extension in "files") or a native `.tractus` file.
 * Reader errors name the file by its path on disk.
 */
import { closeSync, openSync, readSync, readdirSync, readFileSync, statSync } from 'node:fs'
import { basename, extname, join } from 'node:path'
import { InputError, isInputError } from '../model/errors.ts'
import { NATIVE_MAGIC, assertWithinLimit, readCsvBundleInPieces, readModelFiles, readNative } from '../io/index.ts'
import type { CsvFile, ReadModel } from '../io/index.ts'
import { PIECES_MIN_CHARS, startCsvLanes } from './csvLanes.ts'
import { readWholeFile } from './readWholeFile.ts'

export const NATIVE_EXTENSION = '.tractus'

export interface LoadedModel {
  readonly model: ReadModel
  /** The path as given. */
  readonly path: string
  /** 'bundle' for a CSV folder, 'native' for a .tractus file. */
  readonly format: 'bundle' | 'native'
  /** Bytes read from disk. */
  readonly bytes: number
}

export function loadModel(path: string): LoadedModel {
  const st = statOrThrow(path)
  if (st.isDirectory()) {
    const container = containerOfFolder(path)
    return container ? loadModel(container) : loadBundle(path)
  }
  const ext = extname(path).toLowerCase()
  if (ext === NATIVE_EXTENSION) {
    const buf = withPath(() => readWholeFile(path, basename(path)), path, basename(path))
    // A view on the file's bytes, so the reader can keep zero-copy views into it.
    const bytes = new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength)
    const model = withPath(() => readNative(bytes, basename(path)), path, basename(path))
    return { model, path, format: 'native', bytes: buf.byteLength }
  }
  if (ext === '.csv' || ext === '.json') {
    throw new InputError('bad-argument', `a model is a bundle folder or a ${NATIVE_EXTENSION} file: give the folder that holds this file`, { file: path })
  }
  throw new InputError('bad-argument', `not a model: expected a bundle folder or a ${NATIVE_EXTENSION} file`, { file: path })
}

/**
 * loadModel for the commands: a bundle folder is read file by file as the reader asks for each
 * (a bundle of fifty load cases never holds all their texts: each case's text is dropped once its
 * rows are read), and a large bundle's first tables in pieces on worker threads
 * (src/cli/csvLanes.ts), the same model bit for bit. A container, or a folder that holds one, is
 * read as loadModel reads it.
 */
export async function loadModelAsync(path: string): Promise<LoadedModel> {
  const st = statOrThrow(path)
  if (!st.isDirectory()) return loadModel(path)
  const container = containerOfFolder(path)
  if (container) return loadModel(container)
  const names = bundleNames(path)
  const sizes = names.map((n) => statSync(join(path, n)).size)
  // A container among the files: the reader's refusal, as loadModel gives it.
  if (names.some((n, k) => startsWithMagic(join(path, n), sizes[k]))) return loadBundle(path)
  for (let k = 0; k < names.length; k++) withPath(() => assertWithinLimit(names[k], sizes[k]), path, null)
  const files: CsvFile[] = names.map((name, k) => ({ name, size: sizes[k], get bytes() { return readWholeFile(join(path, name), name) } }))
  const bytes = sizes.reduce((a, b) => a + b, 0)
  // What is read in pieces: the first case's tables, not the other cases' files (read one by one).
  const firstBytes = sizes.reduce((a, b, k) => (OTHER_CASE.test(names[k]) ? a : a + b), 0)
  const first = firstBytes >= PIECES_MIN_CHARS ? startCsvLanes() : null
  try {
    // Workers that are not up within a fraction of a one-thread reading (at about 150 MB/s) are not waited for.
    const up = first !== null && first.lanes.length > 0 && await first.readyWithin(Math.max(300, (0.3 * firstBytes) / 150e3))
    const model = await withPathAsync(() => readCsvBundleInPieces(files, {}, up ? first.lanes : []), path)
    return { model, path, format: 'bundle', bytes }
  } finally {
    await first?.close()
  }
}

/** A load case's file other than the first case's (stress.NAME.csv, displacement.NAME.csv). */
const OTHER_CASE = /^(stress|displacement)\.[^./\\]+\.csv$/i

/** True when the file starts with the container's magic bytes. */
function startsWithMagic(file: string, size: number): boolean {
  if (size < NATIVE_MAGIC.length) return false
  const fd = openSync(file, 'r')
  try {
    const head = new Uint8Array(NATIVE_MAGIC.length)
    readSync(fd, head, 0, head.length, 0)
    return head.every((b, i) => b === NATIVE_MAGIC[i])
  } finally {
    closeSync(fd)
  }
}

/**
 * A folder with no CSV file but one container (a demo's folder: the .tractus file and its
 * model.json card) is that container; several containers and no CSV file are a question only the
 * user can answer. null for a CSV folder.
 */
function containerOfFolder(dir: string): string | null {
  const entries = readdirSync(dir).filter((n) => statSync(join(dir, n)).isFile())
  if (entries.some((n) => extname(n).toLowerCase() === '.csv')) return null
  const containers = entries.filter((n) => extname(n).toLowerCase() === NATIVE_EXTENSION).sort()
  if (containers.length > 1) {
    throw new InputError('bad-argument', `this folder holds ${containers.length} ${NATIVE_EXTENSION} files (${containers.join(', ')}) and no CSV bundle: give the path of one of them`, { file: dir })
  }
  return containers.length === 1 ? join(dir, containers[0]) : null
}

/** The files of a bundle folder that the reader is given: .csv, .json and what model.json names. */
function bundleNames(dir: string): string[] {
  const entries = readdirSync(dir).filter((n) => statSync(join(dir, n)).isFile())
  const named = namedInModelJson(dir, entries)
  const names = entries.filter((n) => {
    const e = extname(n).toLowerCase()
    return e === '.csv' || e === '.json' || named.has(n.toLowerCase())
  }).sort()
  if (names.length === 0) {
    throw new InputError('missing-file', 'no CSV files in this folder (expected nodes.csv, elements.csv, stress.csv and optionally model.json)', { file: dir })
  }
  return names
}

function loadBundle(dir: string): LoadedModel {
  const names = bundleNames(dir)
  let bytes = 0
  const files = names.map((name) => {
    const raw = withPath(() => readWholeFile(join(dir, name), name), dir, null)
    bytes += raw.byteLength
    return { name, data: raw }
  })
  const model = withPath(() => readModelFiles(files), dir, null)
  return { model, path: dir, format: 'bundle', bytes }
}

/**
 * The base names (lower-case) that model.json "files" gives, so files of any extension are read.
 * A model.json that does not parse names none here: the reader reports it.
 */
function namedInModelJson(dir: string, entries: readonly string[]): Set<string> {
  const json = entries.find((n) => n.toLowerCase() === 'model.json')
  const out = new Set<string>()
  if (!json) return out
  try {
    const files = (JSON.parse(readFileSync(join(dir, json), 'utf8').replace(/^\uFEFF/, '')) as { files?: unknown }).files
    if (files && typeof files === 'object') for (const v of Object.values(files)) if (typeof v === 'string') out.add(basename(v.trim()).toLowerCase())
  } catch {
    // Not JSON: the reader says where.
  }
  return out
}

async function withPathAsync<T>(read: () => Promise<T>, base: string): Promise<T> {
  try {
    return await read()
  } catch (e) {
    throw onDisk(e, base, null)
  }
}

/** Runs a reader and rewrites the file name in its error into the path on disk. */
function withPath<T>(read: () => T, base: string, single: string | null): T {
  try {
    return read()
  } catch (e) {
    throw onDisk(e, base, single)
  }
}

/** An input error with its file named by its path on disk; anything else as it is. */
function onDisk(e: unknown, base: string, single: string | null): unknown {
  if (!isInputError(e)) return e
  const file = e.where.file
  if (file === undefined) return new InputError(e.kind, e.message, { file: base })
  const full = single !== null ? base : join(base, file)
  const rest = e.message.startsWith(file) ? e.message.slice(file.length) : ': ' + e.message
  const err = new InputError(e.kind, '', { ...e.where, file: full })
  err.message = full + rest
  return err
}

function statOrThrow(path: string) {
  try {
    return statSync(path)
  } catch (e) {
    const code = (e as { code?: string }).code
    if (code === 'ENOENT') throw new InputError('missing-file', 'no such file or folder', { file: path })
    if (code === 'EACCES') throw new InputError('missing-file', 'permission denied', { file: path })
    throw new InputError('missing-file', (e as Error).message, { file: path })
  }
}
