/**
 * Line-level CSV handling shared by the bundle readers: the header line, column lookup by name,
 * the messages of a malformed row, and the reader for all-numeric tables (nodes, stress,
 * displacement) whose columns may come in any order.
 */
import { InputError } from '../model/errors.ts'
import type { InputErrorKind } from '../model/errors.ts'
import {
  PARSE_BAD_INTEGER, PARSE_EMPTY, PARSE_NOT_FINITE, PARSE_OK, atLineEnd, createCursor, estimateRecordCount,
  finishLine, nextRecord, readId, readNumber, skipField, takeComma, tokenText,
} from './csvCursor.ts'
import type { CsvCursor } from './csvCursor.ts'

export interface CsvHeader {
  /** Lower-cased, trimmed column names without surrounding quotes. */
  readonly names: readonly string[]
  /** 1-based line of the header. */
  readonly line: number
}

export function fail(cur: CsvCursor, kind: InputErrorKind, message: string, column?: string, elementId?: number): never {
  throw new InputError(kind, message, { file: cur.file, line: cur.line, column, elementId })
}

/** Reads the first non-comment, non-blank line as the header. An empty file is an error. */
export function readHeader(cur: CsvCursor): CsvHeader {
  if (!nextRecord(cur)) {
    throw new InputError('empty-file', 'the file is empty (no header line, no rows)', { file: cur.file })
  }
  const names: string[] = []
  for (;;) {
    skipField(cur)
    let s = cur.text.slice(cur.tokStart, cur.tokEnd)
    if (s.length >= 2 && s.startsWith('"') && s.endsWith('"')) s = s.slice(1, -1).trim()
    names.push(s.toLowerCase())
    if (!takeComma(cur)) break
  }
  const line = cur.line
  finishLine(cur)
  return { names, line }
}

/**
 * Finds each required column by name; every header column must be one of them, once.
 * Returns, per header position, the index into `required`.
 */
export function mapColumns(cur: CsvCursor, header: CsvHeader, required: readonly string[]): Int32Array {
  const slotOf = new Int32Array(header.names.length).fill(-1)
  const seen = new Int32Array(required.length).fill(-1)
  const where = { file: cur.file, line: header.line }
  const expected = `expected the columns ${required.join(',')} (any order)`
  header.names.forEach((n, i) => {
    const k = required.indexOf(n)
    if (k < 0) {
      const what = n === '' ? `column ${i + 1} has no name` : `unknown column "${n}"`
      throw new InputError('header', `${what}; ${expected}`, { ...where, column: n || String(i + 1) })
    }
    if (seen[k] >= 0) throw new InputError('header', `column "${n}" appears twice; ${expected}`, { ...where, column: n })
    seen[k] = i
    slotOf[i] = k
  })
  const missing = required.filter((_, k) => seen[k] < 0)
  if (missing.length) {
    throw new InputError('header', `missing column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}; ${expected}`, { ...where, column: missing[0] })
  }
  return slotOf
}

/** Counts the fields of the line the cursor is on (error path only). */
export function countFieldsOfLine(cur: CsvCursor): number {
  const text = cur.text
  let p = text.lastIndexOf('\n', cur.pos > 0 ? cur.pos - 1 : 0)
  const r = text.lastIndexOf('\r', cur.pos > 0 ? cur.pos - 1 : 0)
  p = Math.max(p, r) + 1
  let n = 1
  for (; p < text.length; p++) {
    const c = text.charCodeAt(p)
    if (c === 10 || c === 13) break
    if (c === 44) n++
  }
  return n
}

export function failColumnCount(cur: CsvCursor, expected: number, names: readonly string[]): never {
  const found = countFieldsOfLine(cur)
  fail(cur, 'column-count', `expected ${expected} fields (${names.join(',')}), found ${found}`)
}

/** Turns a bad field status into the matching error. */
export function failField(cur: CsvCursor, column: string, what: 'number' | 'id' | 'part', elementId?: number): never {
  const tok = tokenText(cur)
  const st = cur.status
  if (st === PARSE_EMPTY) fail(cur, 'not-a-number', `empty field, expected ${what === 'number' ? 'a number' : what === 'id' ? 'a positive integer id' : 'a part number'}`, column, elementId)
  if (st === PARSE_NOT_FINITE) fail(cur, 'not-finite', `"${tok}" is not a finite number`, column, elementId)
  if (st === PARSE_BAD_INTEGER) {
    const rule = what === 'part' ? 'a part number must be an integer from 0 to 2147483647' : 'ids must be integers from 1 to 2147483647'
    fail(cur, 'bad-id', `"${tok}" is not a valid ${what === 'part' ? 'part number' : 'id'}: ${rule}`, column, elementId)
  }
  fail(cur, 'not-a-number', `"${tok}" is not a number`, column, elementId)
}

/**
 * An all-numeric table keyed by id: `values` holds `rows` × (required.length - 1) numbers in the
 * order of `required` (without the id); `lines` the 1-based line of each row.
 */
export interface NumericTable {
  readonly rows: number
  readonly ids: Int32Array
  readonly values: Float64Array
  readonly lines: Int32Array
}

/**
 * Reads a table whose first required column is `id` and whose other columns are numbers; columns
 * are found by header name. Throws InputError on any malformed row; an empty table is an error.
 */
export function readNumericTable(file: string, text: string, required: readonly string[]): NumericTable {
  const cur = createCursor(file, text)
  const header = readHeader(cur)
  const slotOf = mapColumns(cur, header, required)
  // The field readers once into locals: under a CommonJS transform (tsx) every use of an imported
  // name is a getter call that the optimiser does not inline, once per field otherwise.
  const next = nextRecord, comma = takeComma, num = readNumber, id = readId, lineEnd = atLineEnd, finish = finishLine
  const OK = PARSE_OK
  const nf = slotOf.length
  const nv = required.length - 1
  let cap = Math.max(16, estimateRecordCount(text))
  let ids: Int32Array = new Int32Array(cap)
  let values: Float64Array = new Float64Array(cap * nv)
  let lines: Int32Array = new Int32Array(cap)
  let rows = 0
  while (next(cur)) {
    if (rows === cap) {
      // Only when line ends are unusual (lone CRs mixed with LFs): grow by doubling.
      cap *= 2
      ids = growInt(ids, cap); lines = growInt(lines, cap)
      const v = new Float64Array(cap * nv); v.set(values); values = v
    }
    const base = rows * nv
    for (let j = 0; j < nf; j++) {
      if (j > 0 && !comma(cur)) failColumnCount(cur, nf, header.names)
      const s = slotOf[j]
      if (s === 0) {
        const v = id(cur)
        if (cur.status !== OK) failField(cur, header.names[j], 'id')
        ids[rows] = v
      } else {
        const v = num(cur)
        if (cur.status !== OK) failField(cur, header.names[j], 'number')
        values[base + s - 1] = v
      }
    }
    if (!lineEnd(cur)) failColumnCount(cur, nf, header.names)
    lines[rows] = cur.line
    rows++
    finish(cur)
  }
  if (rows === 0) throw new InputError('empty-file', 'the file has a header but no rows', { file, line: header.line })
  return { rows, ids: fitInt(ids, rows), values: fitFloat(values, rows * nv), lines: fitInt(lines, rows) }
}

/**
 * The first `n` entries of a buffer sized from an estimate: a view when the estimate was close
 * (the usual case: it counts the header and the final line end), a copy when it was far over.
 * A copy of fresh memory costs more than the few unused entries of a view.
 */
export function fitInt(a: Int32Array, n: number): Int32Array {
  return n === a.length ? a : n >= a.length - (a.length >> 3) ? a.subarray(0, n) : a.slice(0, n)
}

export function fitFloat(a: Float64Array, n: number): Float64Array {
  return n === a.length ? a : n >= a.length - (a.length >> 3) ? a.subarray(0, n) : a.slice(0, n)
}

export function growInt(a: Int32Array, cap: number): Int32Array {
  const b = new Int32Array(cap)
  b.set(a.subarray(0, Math.min(a.length, cap)))
  return b
}
