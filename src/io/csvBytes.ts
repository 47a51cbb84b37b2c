/**
 * The CSV readers take a file as its UTF-8 bytes, as the disk or the browser's Blob gives them:
 * no text of the whole file is made. Reading a byte from a Uint8Array costs less than reading a
 * character from a string with charCodeAt (about 1.45 × the rows per second, DEVELOPERS.md "What
 * bounds what"), and the decode pass and the second copy of the file go.
 *
 * Every field the readers parse is ASCII (numbers, ids, element type names) and is checked as
 * such; text they keep or show (header names, comment lines, a token in a message) is decoded
 * here, strictly where it is kept, so a file in another encoding is still refused with its line.
 */
import { InputError } from '../model/errors.ts'

const ENCODER = new TextEncoder()
/** Lenient, for the text of messages: a bad byte shows as U+FFFD. */
const LENIENT = new TextDecoder('utf-8', { ignoreBOM: true })

/**
 * The bytes of a table: a string is encoded (UTF-8), bytes are taken as they are. A Node Buffer
 * (a Uint8Array subclass) becomes a plain view of the same memory, so the readers' loops see one
 * kind of array.
 */
export function asBytes(src: string | Uint8Array): Uint8Array {
  if (typeof src === 'string') return ENCODER.encode(src)
  return Object.getPrototypeOf(src) === Uint8Array.prototype ? src : new Uint8Array(src.buffer, src.byteOffset, src.byteLength)
}

/** A CSV file as the readers take it: its bytes, or its text (tests, exports, pasted text). */
export interface CsvSource {
  readonly name: string
  readonly text?: string
  readonly bytes?: Uint8Array
}

/** The file's bytes (its text encoded when it has no bytes). Read once per use: either may be a getter that reads the disk. */
export function sourceBytes(f: CsvSource): Uint8Array {
  const b = f.bytes
  if (b !== undefined) return asBytes(b)
  const t = f.text
  if (t === undefined) throw new RangeError(`${f.name} has neither bytes nor text`)
  return asBytes(t)
}

/** The file's text, decoded strictly from its bytes when it has no text (model.json). */
export function sourceText(f: CsvSource): string {
  const t = f.text
  if (t !== undefined) return t
  const b = f.bytes
  if (b === undefined) throw new RangeError(`${f.name} has neither bytes nor text`)
  return decodeUtf8(f.name, b)
}

/** bytes[start, end) as text, for a message (bad bytes shown as U+FFFD). */
export function textOf(bytes: Uint8Array, start: number, end: number): string {
  return LENIENT.decode(bytes.subarray(start, end))
}

/** The number of UTF-8 bytes of `text` (a short text: a file's first lines). */
export function utf8Length(text: string): number {
  return ENCODER.encode(text).length
}

/**
 * UTF-8 bytes as text; bytes that are not UTF-8 are an input error naming the line of the first
 * bad one (`offset`: where `bytes` starts in the file, `line`: its line there). `keepBom` keeps a
 * leading byte order mark as U+FEFF (positions in the text then match the file's).
 */
export function decodeUtf8(file: string, bytes: Uint8Array, keepBom = false, offset = 0, line = 1): string {
  try {
    // fatal: a file in another encoding is reported, not silently mangled.
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: keepBom }).decode(bytes)
  } catch {
    const at = firstBadUtf8Byte(bytes)
    let n = line
    for (let i = 0; i < at; i++) if (bytes[i] === 10) n++
    const where = at >= 0 ? ` (first bad byte at offset ${offset + at})` : ''
    throw new InputError('encoding', `the file is not UTF-8 text${where}; save it as UTF-8`, at >= 0 ? { file, line: n } : { file })
  }
}

/** Offset of the first byte that starts no well-formed UTF-8 sequence (lead and continuation bytes only), or -1. */
function firstBadUtf8Byte(b: Uint8Array): number {
  const n = b.length
  for (let i = 0; i < n;) {
    const c = b[i]
    if (c < 0x80) { i++; continue }
    const need = c >= 0xc2 && c <= 0xdf ? 1 : c >= 0xe0 && c <= 0xef ? 2 : c >= 0xf0 && c <= 0xf4 ? 3 : 0
    if (need === 0 || i + need > n - 1) return i
    for (let k = 1; k <= need; k++) if ((b[i + k] & 0xc0) !== 0x80) return i
    i += need + 1
  }
  return -1
}
