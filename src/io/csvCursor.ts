/**
 * A scanning cursor over one CSV file's bytes and the field parsers of the hot path.
 *
 * Speed matters (files of hundreds of MB), so fields are parsed in place from the file's UTF-8
 * bytes (src/io/csvBytes.ts): no text of the file, no split() per line, no regex per field, no
 * substring on the fast path. Results must equal what
 * `Number()` gives for the same token; the fast path is Clinger's: an integer mantissa below 2^53
 * times or divided by an exact power of ten (10^0..10^22) is one correctly rounded operation, so
 * it equals the correctly rounded decimal value that Number() returns (Clinger, "How to read
 * floating point numbers accurately", PLDI 1990). A mantissa of up to 20 digits (what "full
 * precision" output writes) divided by a power of ten takes src/io/longDecimal.ts, exact in doubles
 * or undecided. Everything else that is a valid decimal goes to Number(substring).
 *
 * The file's dialect (src/io/csvDialect.ts) is a set of character codes in the cursor, not a
 * setting the parsers branch on per character: the separator `sep` (',' ';' tab, or a space for
 * runs of blanks), the decimal mark `dec` ('.' or ',') and the second blank trimmed around a field
 * (`blank`: tab, or none when tab separates). A comma file runs the very code it always ran.
 *
 * Accepted number grammar (blanks around a field are ignored; `.` is the file's decimal mark):
 *   [+-]? ( digits [. digits?]? | . digits ) ( [eEdD] [+-]? digits )?
 * `D` exponents are Fortran's double-precision form (1.5D+03 = 1.5e3). Number() accepts more
 * ("0x1F", "Infinity", ""): those are rejected here on purpose.
 *
 * Quoted fields (RFC 4180: "..." with "" for a quote inside; a quoted field may hold the
 * separator) take a slower path that starts only where a field opens with a quote. A line break
 * inside quotes is refused (PARSE_OPEN_QUOTE): every table here is one record per line, and a
 * number or name never holds a line break.
 */

import { decodeUtf8, textOf } from './csvBytes.ts'
import { longDecimalQuotient } from './longDecimal.ts'

/** Parse status left in `cursor.status` by the field readers. */
export const PARSE_OK = 0
export const PARSE_NOT_A_NUMBER = 1
export const PARSE_NOT_FINITE = 2
export const PARSE_EMPTY = 3
/** An id or part field that is a finite number but not an integer in range. */
export const PARSE_BAD_INTEGER = 4
/** A quoted field whose closing quote is missing on its line. */
export const PARSE_OPEN_QUOTE = 5
/** A quoted field with text after its closing quote. */
export const PARSE_BAD_QUOTE = 6

export interface CsvCursor {
  /** The file's UTF-8 bytes (a plain Uint8Array, src/io/csvBytes.ts asBytes). */
  readonly bytes: Uint8Array
  /** File name used in messages. */
  readonly file: string
  /** Byte offset into `bytes`. */
  pos: number
  /** Byte offset of bytes[0] in the file (a piece read from a copy of its bytes): messages name offsets in the file. */
  readonly offset: number
  /** 1-based line number of `pos`, counting comment and blank lines. */
  line: number
  /** Status of the last field read (PARSE_*). */
  status: number
  /** Trimmed extent of the last field read, for messages. */
  tokStart: number
  tokEnd: number
  /** Separator code: 44 ',', 59 ';', 9 tab, or 32 for runs of spaces and tabs. */
  readonly sep: number
  /** Decimal mark code: 46 '.' or 44 ','. */
  readonly dec: number
  /** Trimmed around fields besides the space: tab (9), or -2 (nothing) when tab separates. */
  readonly blank: number
  /** True when runs of blanks separate fields (sep = 32). */
  readonly runs: boolean
}

const CH_TAB = 9, CH_LF = 10, CH_CR = 13, CH_SPACE = 32, CH_QUOTE = 34, CH_HASH = 35, CH_PLUS = 43
const CH_MINUS = 45, CH_DOT = 46, CH_0 = 48, CH_9 = 57, CH_e = 101, CH_d = 100

/** The mantissa accumulator takes digits while below this: m·10 + 9 stays under 2^53, so exact. */
const M_LIMIT = 9e14
const POW10 = new Float64Array(23)
for (let i = 0, p = 1; i < 23; i++, p *= 10) POW10[i] = p
const MAX_ID = 2147483647
// Module copy of the import: under a CommonJS transform (tsx) each use of an imported name is a getter call.
const longQuotient = longDecimalQuotient

/**
 * A cursor at the start of `bytes` (after a byte order mark). `separator` is ',', ';', '\t' or
 * ' ' (runs of spaces and tabs); `decimal` '.' or ','. `offset`: where bytes[0] lies in the file,
 * for a piece read from a copy of its bytes.
 */
export function createCursor(file: string, bytes: Uint8Array, separator = ',', decimal = '.', offset = 0): CsvCursor {
  // A UTF-8 byte order mark (EF BB BF) at the start of the file: skip it.
  const pos = offset === 0 && bytes.length >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0
  const sep = separator.charCodeAt(0)
  return {
    bytes, file, pos, offset, line: 1, status: PARSE_OK, tokStart: pos, tokEnd: pos,
    sep, dec: decimal.charCodeAt(0), blank: sep === CH_TAB ? -2 : CH_TAB, runs: sep === CH_SPACE,
  }
}

/** Moves the cursor to `pos`, the start of line `line` (1-based), e.g. past a preamble. */
export function moveCursor(cur: CsvCursor, pos: number, line: number): void {
  cur.pos = pos
  cur.line = line
}

/**
 * Moves to the start of the next data line, skipping blank lines and lines whose first non-blank
 * character is '#'. Returns false at the end of the file, or at a line that starts at or past
 * `limit` (the end of a piece: the blank and comment lines after it are the next piece's, so a
 * long run of them is walked once, not once per slice). A comment that is not UTF-8 is an input
 * error naming its line.
 */
export function nextRecord(cur: CsvCursor, limit: number = cur.bytes.length): boolean {
  const bytes = cur.bytes, len = bytes.length
  let p = cur.pos
  for (;;) {
    const lineStart = p
    if (p >= limit) { cur.pos = p; return false }
    let c = p < len ? bytes[p] : -1
    while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? bytes[p] : -1
    if (c === -1) { cur.pos = p; return false }
    if (c === CH_HASH) {
      // Comment: skip to the end of the line; one with a byte over 127 is checked as UTF-8.
      const from = p
      let high = 0
      while (c !== CH_LF && c !== CH_CR && c !== -1) { high |= c; c = ++p < len ? bytes[p] : -1 }
      if (high >= 0x80) decodeUtf8(cur.file, bytes.subarray(from, p), true, cur.offset + from, cur.line)
    }
    if (c === CH_CR) {
      p++
      if (p < len && bytes[p] === CH_LF) p++
      cur.line++
      continue
    }
    if (c === CH_LF) { p++; cur.line++; continue }
    if (c === -1) { cur.pos = p; return false }
    cur.pos = lineStart
    return true
  }
}

/**
 * True when the cursor sits on a field separator (and steps over it). With runs of blanks as the
 * separator, the field readers have already stepped over the blanks after a field: the cursor is
 * then on the next field, which counts as a separator when blanks precede it.
 */
export function takeSeparator(cur: CsvCursor): boolean {
  // Past the end the index gives undefined, which equals no separator. Kept this small: it runs
  // once per field and must stay inlined into the table readers.
  if (cur.bytes[cur.pos] === cur.sep && !cur.runs) { cur.pos++; return true }
  return cur.runs && takeBlankRun(cur)
}

function takeBlankRun(cur: CsvCursor): boolean {
  const bytes = cur.bytes, len = bytes.length
  let p = cur.pos
  let c = p < len ? bytes[p] : -1
  if (!isBlankCode(c) && !(p > 0 && isBlankCode(bytes[p - 1]))) return false
  while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? bytes[p] : -1
  cur.pos = p
  // At the line's end there is no next field.
  return !(c === -1 || c === CH_LF || c === CH_CR)
}

function isBlankCode(c: number): boolean {
  return c === CH_SPACE || c === CH_TAB
}

/** True when the cursor sits at the end of a line or of the file (after trailing blanks). */
export function atLineEnd(cur: CsvCursor): boolean {
  const bytes = cur.bytes, len = bytes.length, blank = cur.blank
  let p = cur.pos
  let c = p < len ? bytes[p] : -1
  while (c === CH_SPACE || c === blank) c = ++p < len ? bytes[p] : -1
  cur.pos = p
  return c === -1 || c === CH_LF || c === CH_CR
}

/** Steps past the end of the current line (the caller has checked atLineEnd). */
export function finishLine(cur: CsvCursor): void {
  const bytes = cur.bytes, len = bytes.length
  let p = cur.pos
  if (p >= len) return
  if (bytes[p] === CH_CR) p++
  if (p < len && bytes[p] === CH_LF) p++
  cur.pos = p
  cur.line++
}

/**
 * Skips the rest of the current field (up to the separator or the end of line); returns its
 * trimmed extent in tokStart/tokEnd (with its quotes, when quoted). Status PARSE_OK, or
 * PARSE_OPEN_QUOTE / PARSE_BAD_QUOTE for a quoted field without its closing quote on the line or
 * with text after it.
 */
export function skipField(cur: CsvCursor): void {
  const bytes = cur.bytes, len = bytes.length, sep = cur.sep, blank = cur.blank
  // With runs of blanks a tab ends a field as a space does; otherwise this repeats `sep`.
  const alsoEnds = cur.runs ? CH_TAB : sep
  let p = cur.pos
  let c = p < len ? bytes[p] : -1
  while (c === CH_SPACE || c === blank) c = ++p < len ? bytes[p] : -1
  const start = p
  if (c === CH_QUOTE) { skipQuoted(cur, start); return }
  while (c !== sep && c !== alsoEnds && c !== CH_LF && c !== CH_CR && c !== -1) c = ++p < len ? bytes[p] : -1
  let end = p
  while (end > start && (bytes[end - 1] === CH_SPACE || bytes[end - 1] === blank)) end--
  cur.pos = p
  cur.tokStart = start
  cur.tokEnd = end
  cur.status = PARSE_OK
}

/** A quoted field from its opening quote at `start`: RFC 4180, "" is a quote inside. */
function skipQuoted(cur: CsvCursor, start: number): void {
  const bytes = cur.bytes, len = bytes.length, sep = cur.sep, blank = cur.blank
  let p = start + 1
  for (;;) {
    const c = p < len ? bytes[p] : -1
    if (c === -1 || c === CH_LF || c === CH_CR) {
      cur.pos = p; cur.tokStart = start; cur.tokEnd = p; cur.status = PARSE_OPEN_QUOTE
      return
    }
    if (c === CH_QUOTE) {
      if (p + 1 < len && bytes[p + 1] === CH_QUOTE) { p += 2; continue }
      break
    }
    p++
  }
  const end = ++p
  let c = p < len ? bytes[p] : -1
  while (c === CH_SPACE || c === blank) c = ++p < len ? bytes[p] : -1
  cur.tokStart = start
  cur.tokEnd = end
  if (c === sep || c === CH_LF || c === CH_CR || c === -1 || (cur.runs && p > end)) {
    cur.pos = p
    cur.status = PARSE_OK
    return
  }
  // Text after the closing quote: the field runs on to the separator, and is malformed.
  const alsoEnds = cur.runs ? CH_TAB : sep
  while (c !== sep && c !== alsoEnds && c !== CH_LF && c !== CH_CR && c !== -1) c = ++p < len ? bytes[p] : -1
  cur.pos = p
  cur.tokEnd = p
  cur.status = PARSE_BAD_QUOTE
}

/**
 * The last field's text without its quotes ("" inside read as one quote), decoded strictly: bytes
 * that are not UTF-8 are an input error naming the line (src/io/csvBytes.ts).
 */
export function fieldText(cur: CsvCursor): string {
  const s = decodeUtf8(cur.file, cur.bytes.subarray(cur.tokStart, cur.tokEnd), true, cur.offset + cur.tokStart, cur.line)
  if (s.length >= 2 && s.charCodeAt(0) === CH_QUOTE && s.charCodeAt(s.length - 1) === CH_QUOTE) return s.slice(1, -1).replace(/""/g, '"').trim()
  return s
}

/** The last field's text, shortened for messages. */
export function tokenText(cur: CsvCursor): string {
  const s = textOf(cur.bytes, cur.tokStart, cur.tokEnd)
  return s.length > 40 ? s.slice(0, 37) + '...' : s
}

/**
 * Reads one number field; leaves the cursor on the following separator or line end (with runs of
 * blanks: on the next field). Sets `cur.status` to PARSE_OK, PARSE_NOT_A_NUMBER,
 * PARSE_NOT_FINITE, PARSE_EMPTY or a quote status.
 */
export function readNumber(cur: CsvCursor): number {
  const bytes = cur.bytes, len = bytes.length, sep = cur.sep, dec = cur.dec, blank = cur.blank
  let p = cur.pos
  let c = p < len ? bytes[p] : -1
  while (c === CH_SPACE || c === blank) c = ++p < len ? bytes[p] : -1
  const start = p
  let neg = false
  if (c === CH_MINUS) { neg = true; c = ++p < len ? bytes[p] : -1 } else if (c === CH_PLUS) c = ++p < len ? bytes[p] : -1
  // m collects the digits while it stays below 9·10^14, so it is exact (m·10 + 9 < 2^53); the
  // digits after it go to lo (a long mantissa: full-precision output).
  let m = 0, digits = 0, frac = 0, lo = 0, nLo = 0
  while (c >= CH_0 && c <= CH_9) {
    if (m < M_LIMIT) m = m * 10 + (c - CH_0); else { lo = lo * 10 + (c - CH_0); nLo++ }
    digits++; c = ++p < len ? bytes[p] : -1
  }
  if (c === dec) {
    c = ++p < len ? bytes[p] : -1
    while (c >= CH_0 && c <= CH_9) {
      if (m < M_LIMIT) m = m * 10 + (c - CH_0); else { lo = lo * 10 + (c - CH_0); nLo++ }
      digits++; frac++; c = ++p < len ? bytes[p] : -1
    }
  }
  let exp = 0
  let valid = digits > 0
  // c | 32 folds E to e and D to d (and maps no other code to either).
  const lower = c | 32
  if (valid && (lower === CH_e || lower === CH_d)) {
    c = ++p < len ? bytes[p] : -1
    let eneg = false
    if (c === CH_MINUS) { eneg = true; c = ++p < len ? bytes[p] : -1 } else if (c === CH_PLUS) c = ++p < len ? bytes[p] : -1
    let ed = 0
    // Cap the exponent's magnitude: past the cap Number() decides (0 or Infinity) anyway.
    while (c >= CH_0 && c <= CH_9) { if (exp < 100000) exp = exp * 10 + (c - CH_0); ed++; c = ++p < len ? bytes[p] : -1 }
    if (ed === 0) valid = false
    if (eneg) exp = -exp
  }
  const end = p
  while (c === CH_SPACE || c === blank) c = ++p < len ? bytes[p] : -1
  if (valid && (c === sep || c === CH_LF || c === CH_CR || c === -1 || (cur.runs && p > end))) {
    cur.pos = p
    cur.tokStart = start
    cur.tokEnd = end
    cur.status = PARSE_OK
    const e10 = exp - frac
    if (nLo === 0) {
      if (e10 === 0) return neg ? -m : m
      if (e10 < 0 && e10 >= -22) return neg ? -(m / POW10[-e10]) : m / POW10[-e10]
      if (e10 > 0 && e10 <= 22) return neg ? -(m * POW10[e10]) : m * POW10[e10]
    } else if (e10 <= 0) {
      // 17 to 20 digits (full-precision output): exact in doubles, or NaN to ask Number().
      const v = longQuotient(m, lo, nLo, -e10)
      if (v === v) return neg ? -v : v
    }
    // Valid decimal outside the fast path: the platform's correctly rounded conversion, of the
    // token rewritten in its grammar (decimal point, e exponent) where the file writes otherwise.
    let tok = textOf(bytes, start, end)
    if (dec !== CH_DOT) tok = tok.replace(',', '.')
    if (lower === CH_d) tok = tok.replace(/[dD]/, 'e')
    const v = Number(tok)
    if (v === Infinity || v === -Infinity) cur.status = PARSE_NOT_FINITE
    return v
  }
  cur.pos = start
  if (bytes[start] === CH_QUOTE) return readQuotedNumber(cur, start)
  // Not a plain decimal: find the field's extent and say what it is.
  skipField(cur)
  cur.status = classifyBadToken(bytes, cur.tokStart, cur.tokEnd)
  return NaN
}

/** A quoted number field ("1.5"): the quotes stripped, the same grammar inside. */
function readQuotedNumber(cur: CsvCursor, start: number): number {
  skipQuoted(cur, start)
  if (cur.status !== PARSE_OK) return NaN
  const inner = cur.bytes.subarray(cur.tokStart + 1, cur.tokEnd - 1)
  if (inner.indexOf(CH_QUOTE) >= 0) { cur.status = PARSE_NOT_A_NUMBER; return NaN }
  const sub: CsvCursor = { bytes: inner, file: cur.file, pos: 0, offset: cur.offset + cur.tokStart + 1, line: cur.line, status: PARSE_OK, tokStart: 0, tokEnd: 0, sep: -3, dec: cur.dec, blank: CH_TAB, runs: false }
  const v = readNumber(sub)
  cur.status = sub.status === PARSE_OK && sub.pos === inner.length ? PARSE_OK : sub.status === PARSE_OK ? PARSE_NOT_A_NUMBER : sub.status
  return v
}

function classifyBadToken(bytes: Uint8Array, start: number, end: number): number {
  if (end <= start) return PARSE_EMPTY
  let s = start
  const c0 = bytes[s]
  if (c0 === CH_PLUS || c0 === CH_MINUS) s++
  const word = textOf(bytes, s, end).toLowerCase()
  if (word === 'nan' || word === 'inf' || word === 'infinity' || word === '1.#inf' || word === '1.#qnan') return PARSE_NOT_FINITE
  return PARSE_NOT_A_NUMBER
}

/**
 * Reads a positive integer id (1..2^31-1). Plain digit strings take the fast path; anything else
 * is read as a number and accepted only when its value is such an integer ("12.0" is 12).
 * Sets PARSE_BAD_INTEGER for a finite number that is not a valid id.
 */
export function readId(cur: CsvCursor): number {
  return readInteger(cur, 1)
}

/** Reads a non-negative integer (0..2^31-1), e.g. a part number. */
export function readCount(cur: CsvCursor): number {
  return readInteger(cur, 0)
}

function readInteger(cur: CsvCursor, min: number): number {
  const bytes = cur.bytes, len = bytes.length, sep = cur.sep, blank = cur.blank
  let p = cur.pos
  let c = p < len ? bytes[p] : -1
  while (c === CH_SPACE || c === blank) c = ++p < len ? bytes[p] : -1
  const start = p
  let v = 0, digits = 0
  while (c >= CH_0 && c <= CH_9 && digits < 11) { v = v * 10 + (c - CH_0); digits++; c = ++p < len ? bytes[p] : -1 }
  const end = p
  while (c === CH_SPACE || c === blank) c = ++p < len ? bytes[p] : -1
  if (digits > 0 && (c === sep || c === CH_LF || c === CH_CR || c === -1 || (cur.runs && p > end))) {
    cur.pos = p
    cur.tokStart = start
    cur.tokEnd = end
    cur.status = v >= min && v <= MAX_ID ? PARSE_OK : PARSE_BAD_INTEGER
    return v
  }
  return readIntegerAsNumber(cur, start, min)
}

/**
 * An integer field that is not plain digits: read as a number, accepted when its value is an
 * integer in range. Apart from readInteger so that the common path stays small enough to inline.
 */
function readIntegerAsNumber(cur: CsvCursor, start: number, min: number): number {
  cur.pos = start
  const x = readNumber(cur)
  if (cur.status === PARSE_OK && !(Number.isInteger(x) && x >= min && x <= MAX_ID)) cur.status = PARSE_BAD_INTEGER
  if (cur.status === PARSE_NOT_FINITE) cur.status = PARSE_BAD_INTEGER
  return x
}

/** Bytes of one sample of estimateRecordCount, and the number of samples. */
const SAMPLE_BYTES = 16 * 1024, SAMPLES = 16

/**
 * Estimates the number of records of bytes[from, to) from its line ends (LF, or CR where there
 * is no LF), to size the first buffers; readers still grow them when the estimate is short. A
 * short range is counted whole; a long one from SAMPLES samples spread over it, with a tenth
 * more for the rows the samples miss (a count of every line end, one indexOf per line, cost a
 * tenth of the read).
 */
export function estimateRecordCount(bytes: Uint8Array, from = 0, to = bytes.length): number {
  const len = to - from
  if (len <= SAMPLES * SAMPLE_BYTES) return lineEndsOf(bytes, from, to) + 1
  let ends = 0
  for (let s = 0; s < SAMPLES; s++) {
    const a = from + Math.floor(((len - SAMPLE_BYTES) * s) / (SAMPLES - 1))
    ends += lineEndsOf(bytes, a, a + SAMPLE_BYTES)
  }
  return Math.ceil(((len * ends) / (SAMPLES * SAMPLE_BYTES)) * 1.1) + 16
}

/** LFs in bytes[a, b), or CRs where there is no LF. */
function lineEndsOf(bytes: Uint8Array, a: number, b: number): number {
  let lf = 0, cr = 0
  for (let i = a; i < b; i++) {
    const c = bytes[i]
    if (c === CH_LF) lf++
    else if (c === CH_CR) cr++
  }
  return lf > 0 ? lf : cr
}
