/**
 * A scanning cursor over one CSV text and the field parsers of the hot path.
 *
 * Speed matters (files of hundreds of MB), so fields are parsed in place with charCodeAt: no
 * split() per line, no regex per field, no substring on the fast path. Results must equal what
 * `Number()` gives for the same token; the fast path is Clinger's: an integer mantissa below 2^53
 * times or divided by an exact power of ten (10^0..10^22) is one correctly rounded operation, so
 * it equals the correctly rounded decimal value that Number() returns (Clinger, "How to read
 * floating point numbers accurately", PLDI 1990). Everything else that is a valid decimal goes to
 * Number(substring).
 *
 * Accepted number grammar (spaces and tabs around a field are ignored):
 *   [+-]? ( digits [. digits?]? | . digits ) ( [eE] [+-]? digits )?
 * Number() accepts more ("0x1F", "Infinity", ""): those are rejected here on purpose.
 */

/** Parse status left in `cursor.status` by the field readers. */
export const PARSE_OK = 0
export const PARSE_NOT_A_NUMBER = 1
export const PARSE_NOT_FINITE = 2
export const PARSE_EMPTY = 3
/** An id or part field that is a finite number but not an integer in range. */
export const PARSE_BAD_INTEGER = 4

export interface CsvCursor {
  readonly text: string
  /** File name used in messages. */
  readonly file: string
  /** UTF-16 index into `text`. */
  pos: number
  /** 1-based line number of `pos`, counting comment and blank lines. */
  line: number
  /** Status of the last field read (PARSE_*). */
  status: number
  /** Trimmed extent of the last field read, for messages. */
  tokStart: number
  tokEnd: number
}

const CH_TAB = 9, CH_LF = 10, CH_CR = 13, CH_SPACE = 32, CH_HASH = 35, CH_PLUS = 43, CH_COMMA = 44
const CH_MINUS = 45, CH_DOT = 46, CH_0 = 48, CH_9 = 57, CH_E = 69, CH_e = 101

/** 2^53: below it every integer is exact in a double. */
const EXACT_INT_LIMIT = 9007199254740992
const POW10 = new Float64Array(23)
for (let i = 0, p = 1; i < 23; i++, p *= 10) POW10[i] = p
const MAX_ID = 2147483647

export function createCursor(file: string, text: string): CsvCursor {
  // A UTF-8 byte order mark decoded as text is U+FEFF at the start; skip it.
  const pos = text.length > 0 && text.charCodeAt(0) === 0xfeff ? 1 : 0
  return { text, file, pos, line: 1, status: PARSE_OK, tokStart: pos, tokEnd: pos }
}

/**
 * Moves to the start of the next data line, skipping blank lines and lines whose first non-blank
 * character is '#'. Returns false at the end of the text.
 */
export function nextRecord(cur: CsvCursor): boolean {
  const text = cur.text, len = text.length
  let p = cur.pos
  for (;;) {
    const lineStart = p
    let c = p < len ? text.charCodeAt(p) : -1
    while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? text.charCodeAt(p) : -1
    if (c === -1) { cur.pos = p; return false }
    if (c === CH_HASH) {
      // Comment: skip to the end of the line.
      while (c !== CH_LF && c !== CH_CR && c !== -1) c = ++p < len ? text.charCodeAt(p) : -1
    }
    if (c === CH_CR) {
      p++
      if (p < len && text.charCodeAt(p) === CH_LF) p++
      cur.line++
      continue
    }
    if (c === CH_LF) { p++; cur.line++; continue }
    if (c === -1) { cur.pos = p; return false }
    cur.pos = lineStart
    return true
  }
}

/** True when the cursor sits on a field separator (and steps over it). */
export function takeComma(cur: CsvCursor): boolean {
  if (cur.pos < cur.text.length && cur.text.charCodeAt(cur.pos) === CH_COMMA) { cur.pos++; return true }
  return false
}

/** True when the cursor sits at the end of a line or of the text (after trailing blanks). */
export function atLineEnd(cur: CsvCursor): boolean {
  const text = cur.text, len = cur.text.length
  let p = cur.pos
  let c = p < len ? text.charCodeAt(p) : -1
  while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? text.charCodeAt(p) : -1
  cur.pos = p
  return c === -1 || c === CH_LF || c === CH_CR
}

/** Steps past the end of the current line (the caller has checked atLineEnd). */
export function finishLine(cur: CsvCursor): void {
  const text = cur.text, len = text.length
  let p = cur.pos
  if (p >= len) return
  if (text.charCodeAt(p) === CH_CR) p++
  if (p < len && text.charCodeAt(p) === CH_LF) p++
  cur.pos = p
  cur.line++
}

/** Skips the rest of the current field (up to a comma or the end of line); returns its trimmed extent in tokStart/tokEnd. */
export function skipField(cur: CsvCursor): void {
  const text = cur.text, len = text.length
  let p = cur.pos
  let c = p < len ? text.charCodeAt(p) : -1
  while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? text.charCodeAt(p) : -1
  const start = p
  while (c !== CH_COMMA && c !== CH_LF && c !== CH_CR && c !== -1) c = ++p < len ? text.charCodeAt(p) : -1
  let end = p
  while (end > start && (text.charCodeAt(end - 1) === CH_SPACE || text.charCodeAt(end - 1) === CH_TAB)) end--
  cur.pos = p
  cur.tokStart = start
  cur.tokEnd = end
}

/** The last field's text, shortened for messages. */
export function tokenText(cur: CsvCursor): string {
  const s = cur.text.slice(cur.tokStart, cur.tokEnd)
  return s.length > 40 ? s.slice(0, 37) + '...' : s
}

/**
 * Reads one number field; leaves the cursor on the following comma or line end. Sets
 * `cur.status` to PARSE_OK, PARSE_NOT_A_NUMBER, PARSE_NOT_FINITE or PARSE_EMPTY.
 */
export function readNumber(cur: CsvCursor): number {
  const text = cur.text, len = text.length
  let p = cur.pos
  let c = p < len ? text.charCodeAt(p) : -1
  while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? text.charCodeAt(p) : -1
  const start = p
  let neg = false
  if (c === CH_MINUS) { neg = true; c = ++p < len ? text.charCodeAt(p) : -1 } else if (c === CH_PLUS) c = ++p < len ? text.charCodeAt(p) : -1
  let m = 0, digits = 0, frac = 0
  while (c >= CH_0 && c <= CH_9) { m = m * 10 + (c - CH_0); digits++; c = ++p < len ? text.charCodeAt(p) : -1 }
  if (c === CH_DOT) {
    c = ++p < len ? text.charCodeAt(p) : -1
    while (c >= CH_0 && c <= CH_9) { m = m * 10 + (c - CH_0); digits++; frac++; c = ++p < len ? text.charCodeAt(p) : -1 }
  }
  let exp = 0
  let valid = digits > 0
  if (valid && (c === CH_e || c === CH_E)) {
    c = ++p < len ? text.charCodeAt(p) : -1
    let eneg = false
    if (c === CH_MINUS) { eneg = true; c = ++p < len ? text.charCodeAt(p) : -1 } else if (c === CH_PLUS) c = ++p < len ? text.charCodeAt(p) : -1
    let ed = 0
    // Cap the exponent's magnitude: past the cap Number() decides (0 or Infinity) anyway.
    while (c >= CH_0 && c <= CH_9) { if (exp < 100000) exp = exp * 10 + (c - CH_0); ed++; c = ++p < len ? text.charCodeAt(p) : -1 }
    if (ed === 0) valid = false
    if (eneg) exp = -exp
  }
  const end = p
  while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? text.charCodeAt(p) : -1
  if (valid && (c === CH_COMMA || c === CH_LF || c === CH_CR || c === -1)) {
    cur.pos = p
    cur.tokStart = start
    cur.tokEnd = end
    cur.status = PARSE_OK
    const e10 = exp - frac
    if (m < EXACT_INT_LIMIT) {
      if (e10 === 0) return neg ? -m : m
      if (e10 < 0 && e10 >= -22) return neg ? -(m / POW10[-e10]) : m / POW10[-e10]
      if (e10 > 0 && e10 <= 22) return neg ? -(m * POW10[e10]) : m * POW10[e10]
    }
    // Valid decimal outside the fast path: the platform's correctly rounded conversion.
    const v = Number(text.slice(start, end))
    if (v === Infinity || v === -Infinity) cur.status = PARSE_NOT_FINITE
    return v
  }
  // Not a plain decimal: find the field's extent and say what it is.
  cur.pos = start
  skipField(cur)
  cur.status = classifyBadToken(text, cur.tokStart, cur.tokEnd)
  return NaN
}

function classifyBadToken(text: string, start: number, end: number): number {
  if (end <= start) return PARSE_EMPTY
  let s = start
  const c0 = text.charCodeAt(s)
  if (c0 === CH_PLUS || c0 === CH_MINUS) s++
  const word = text.slice(s, end).toLowerCase()
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
  const text = cur.text, len = text.length
  let p = cur.pos
  let c = p < len ? text.charCodeAt(p) : -1
  while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? text.charCodeAt(p) : -1
  const start = p
  let v = 0, digits = 0
  while (c >= CH_0 && c <= CH_9 && digits < 11) { v = v * 10 + (c - CH_0); digits++; c = ++p < len ? text.charCodeAt(p) : -1 }
  const end = p
  while (c === CH_SPACE || c === CH_TAB) c = ++p < len ? text.charCodeAt(p) : -1
  if (digits > 0 && (c === CH_COMMA || c === CH_LF || c === CH_CR || c === -1)) {
    cur.pos = p
    cur.tokStart = start
    cur.tokEnd = end
    cur.status = v >= min && v <= MAX_ID ? PARSE_OK : PARSE_BAD_INTEGER
    return v
  }
  cur.pos = start
  const x = readNumber(cur)
  if (cur.status === PARSE_OK && !(Number.isInteger(x) && x >= min && x <= MAX_ID)) cur.status = PARSE_BAD_INTEGER
  if (cur.status === PARSE_NOT_FINITE) cur.status = PARSE_BAD_INTEGER
  return x
}

/**
 * Estimates the number of records from the line ends (LF, or lone CR when a file has no LF), to
 * size the first buffers; readers still grow them when the estimate is short.
 */
export function estimateRecordCount(text: string): number {
  let n = 1
  let p = text.indexOf('\n')
  while (p !== -1) { n++; p = text.indexOf('\n', p + 1) }
  if (n === 1 && text.indexOf('\r') !== -1) {
    p = text.indexOf('\r')
    while (p !== -1) { n++; p = text.indexOf('\r', p + 1) }
  }
  return n
}
