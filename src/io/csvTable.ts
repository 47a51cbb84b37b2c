/**
 * Line-level CSV handling shared by the bundle readers: opening a file in its dialect (detected
 * or declared, src/io/csvDialect.ts), the header line, the messages of a malformed row (each
 * says how to fix it), and the reader for all-numeric tables (nodes, stress, displacement) whose
 * columns may come in any order, under any names model.json maps, with extra columns left out.
 */
import { InputError } from '../model/errors.ts'
import type { InputErrorKind } from '../model/errors.ts'
import type { ColumnMap } from './bundleLayout.ts'
import { columnLabel, matchColumns, unitOfColumns, unusedColumns, widthMismatch } from './columnMap.ts'
import type { ColumnUnit, CsvHeader } from './columnMap.ts'
import {
  PARSE_BAD_INTEGER, PARSE_BAD_QUOTE, PARSE_EMPTY, PARSE_NOT_FINITE, PARSE_OK, PARSE_OPEN_QUOTE, atLineEnd, createCursor,
  estimateRecordCount, fieldText, finishLine, moveCursor, nextRecord, readId, readNumber, skipField, takeSeparator, tokenText,
} from './csvCursor.ts'
import type { CsvCursor } from './csvCursor.ts'
import { asBytes, textOf } from './csvBytes.ts'
import { SEPARATOR_NAMES, detectDialectOfBytes, splitLine } from './csvDialect.ts'
import type { CsvDialect, DialectSettings, Separator, TableShape } from './csvDialect.ts'
import { splitHeaderUnit } from './headerUnits.ts'

export function fail(cur: CsvCursor, kind: InputErrorKind, message: string, column?: string, elementId?: number): never {
  throw new InputError(kind, message, { file: cur.file, line: cur.line, column, elementId })
}

/** A file opened in its dialect, the cursor past its header (or on its first row). */
export interface OpenTable {
  readonly cur: CsvCursor
  readonly dialect: CsvDialect
  readonly header: CsvHeader
}

/** Detects (or takes) the file's dialect, skips its preamble and reads its header. */
export function openTable(file: string, src: string | Uint8Array, settings: DialectSettings, shape: TableShape, role: string): OpenTable {
  const bytes = asBytes(src)
  const dialect = detectDialectOfBytes(file, bytes, settings, shape, role)
  const cur = createCursor(file, bytes, dialect.separator, dialect.decimal)
  moveCursor(cur, dialect.start, dialect.startLine)
  if (dialect.headerLine > 0 || dialect.start >= bytes.length) return { cur, dialect, header: { ...readHeader(cur), rowWidth: dialect.rowFields } }
  const header: CsvHeader = { raw: [], names: [], bare: [], units: [], line: dialect.startLine, present: false, width: dialect.rowFields, rowWidth: dialect.rowFields }
  return { cur, dialect, header }
}

/** Reads the next non-comment, non-blank line as the header. An empty file is an error. */
export function readHeader(cur: CsvCursor): CsvHeader {
  if (!nextRecord(cur)) {
    throw new InputError('empty-file', 'the file is empty (no header line, no rows)', { file: cur.file })
  }
  const raw: string[] = []
  for (;;) {
    skipField(cur)
    if (cur.status !== PARSE_OK) failQuote(cur, `column ${raw.length + 1} of the header`)
    raw.push(fieldText(cur))
    if (!takeSeparator(cur)) break
  }
  if (!atLineEnd(cur)) failQuote(cur, 'the header')
  const line = cur.line
  finishLine(cur)
  const split = raw.map(splitHeaderUnit)
  return {
    raw, names: raw.map((n) => n.toLowerCase()), bare: split.map((x) => x.bare.toLowerCase()), units: split.map((x) => x.unit),
    line, present: true, width: raw.length, rowWidth: 0,
  }
}

function failQuote(cur: CsvCursor, what: string, elementId?: number): never {
  if (cur.status === PARSE_OPEN_QUOTE) fail(cur, 'column-count', `a quoted field in ${what} has no closing quote on its line; a field may not hold a line break here: close the quote on the same line`, undefined, elementId)
  fail(cur, 'column-count', `text after the closing quote of ${tokenText(cur)} in ${what}; a quoted field ends at its quote: write "a ""b"" c" for a quote inside`, undefined, elementId)
}

/** Counts the fields of the line the cursor is on, as the file's separator splits it (error path only). */
export function countFieldsOfLine(cur: CsvCursor): number {
  return splitLine(lineOf(cur), separatorOf(cur)).length
}

/** The text of the line the cursor is on (error path only). */
export function lineOf(cur: CsvCursor): string {
  const bytes = cur.bytes
  const at = Math.min(cur.pos, bytes.length)
  const p = Math.max(bytes.lastIndexOf(10, at > 0 ? at - 1 : 0), bytes.lastIndexOf(13, at > 0 ? at - 1 : 0)) + 1
  let e = p
  while (e < bytes.length && bytes[e] !== 10 && bytes[e] !== 13) e++
  return textOf(bytes, p, e)
}

function separatorOf(cur: CsvCursor): Separator {
  return String.fromCharCode(cur.sep) as Separator
}

/** How the fields are separated, in words, for messages. */
export function separatorWords(cur: CsvCursor): string {
  return cur.runs ? 'runs of spaces' : `${SEPARATOR_NAMES[separatorOf(cur)]}s`
}

export function failColumnCount(cur: CsvCursor, expected: number, names: readonly string[]): never {
  const found = countFieldsOfLine(cur)
  const line = lineOf(cur)
  let hint = `every row has the ${expected} fields of the header, separated by ${separatorWords(cur)}; if that is not the file's separator, declare it in model.json, e.g. "csv": {"separator": ";"}`
  if (found > expected && cur.sep === 44 && /\d,\d/.test(line)) hint = 'a decimal comma in a comma-separated file splits its number in two: write decimal points, or separate the fields by semicolons (the decimal comma is then read)'
  else if (found < expected) hint = `a field is missing: every row has the ${expected} fields of the header, separated by ${separatorWords(cur)}`
  fail(cur, 'column-count', `expected ${expected} fields (${names.join(', ')}), found ${found}; ${hint}`)
}

/** Turns a bad field status into the matching error, with how to fix it. */
export function failField(cur: CsvCursor, column: string, what: 'number' | 'id' | 'part', elementId?: number): never {
  const tok = tokenText(cur)
  const st = cur.status
  if (st === PARSE_OPEN_QUOTE || st === PARSE_BAD_QUOTE) failQuote(cur, `column "${column}"`, elementId)
  if (st === PARSE_EMPTY) fail(cur, 'not-a-number', `empty field, expected ${what === 'number' ? 'a number' : what === 'id' ? 'a positive integer id' : 'a part number'}; every row needs a value in this column`, column, elementId)
  if (st === PARSE_NOT_FINITE) fail(cur, 'not-finite', `"${tok}" is not a finite number; write a finite value (a solver writes NaN or Inf where it failed)`, column, elementId)
  if (st === PARSE_BAD_INTEGER) {
    const rule = what === 'part' ? 'a part number must be an integer from 0 to 2147483647' : 'ids must be integers from 1 to 2147483647'
    fail(cur, 'bad-id', `"${tok}" is not a valid ${what === 'part' ? 'part number' : 'id'}: ${rule}`, column, elementId)
  }
  fail(cur, 'not-a-number', `"${tok}" is not a number; ${numberHint(cur, tok)}`, column, elementId)
}

function numberHint(cur: CsvCursor, tok: string): string {
  const t = tok.replace(/^"|"$/g, '')
  if (cur.dec === 46 && cur.sep !== 44 && /^[+-]?\d*,\d+([eEdD][+-]?\d+)?$/.test(t)) return 'if the file writes decimal commas, declare them in model.json: "csv": {"decimal": ","}'
  if (cur.dec === 44 && /^[+-]?\d*\.\d+([eEdD][+-]?\d+)?$/.test(t)) return 'this file is read with decimal commas (thousands separators are not read): write 2,5 for two and a half, or declare "csv": {"decimal": "."} in model.json'
  return `write a plain number such as -1${cur.dec === 44 ? ',' : '.'}25e3`
}

/**
 * An all-numeric table keyed by id: `values` holds `rows` × (fields.length - 1) numbers in the
 * order of `fields` (without the id); `lines` the 1-based line of each row.
 */
export interface NumericTable {
  readonly rows: number
  readonly ids: Int32Array
  /**
   * The second id column of a table read by `spec.elementNodal` (the node of each row; `ids` are
   * then the elements), else null.
   */
  readonly ids2: Int32Array | null
  readonly values: Float64Array
  readonly lines: Int32Array
  readonly info: TableInfo
}

/** What reading one table found out: its dialect, the columns left out, its header unit. */
export interface TableInfo {
  readonly dialect: CsvDialect
  readonly ignored: readonly string[]
  readonly unit: ColumnUnit | null
  /** The column of each field, as called in messages. */
  readonly labels: readonly string[]
}

/** One numeric table: its role, our fields (id first), the unit kind of its values, and what model.json says. */
export interface NumericTableSpec {
  readonly role: string
  readonly fields: readonly string[]
  readonly quantity: 'length' | 'stress'
  readonly settings: DialectSettings
  readonly columns: ColumnMap | undefined
  /**
   * Fields read instead of `fields` when the header has an "element" column (or model.json maps
   * one): element id first, node id second, then the values. The table then holds one row per
   * element and node (src/io/elementNodalRows.ts).
   */
  readonly elementNodal?: readonly string[]
}

/** True when the table is in its element-nodal form: an "element" column by name, or mapped. */
function isElementNodalHeader(header: CsvHeader, columns: ColumnMap | undefined): boolean {
  if (columns?.element !== undefined) return true
  return header.present && (header.names.includes('element') || header.bare.includes('element'))
}

/**
 * Reads a table whose first field is `id` and whose other fields are numbers; columns are found
 * by header name or as model.json maps them. Throws InputError on any malformed row; an empty
 * table is an error.
 */
export function readNumericTable(file: string, src: string | Uint8Array, spec: NumericTableSpec): NumericTable {
  const t = openNumericTable(file, src, spec)
  const s = t.setup
  return finishNumericTable(t, [readNumericRows(t.cur, s.slotOf, s.nf, s.nv, s.names, s.twoIds, t.cur.bytes.length)])
}

/**
 * What reading a numeric table's rows needs besides the text: the dialect's characters and the
 * column plan. Plain data (structured-clonable), so a worker can read a piece of the rows with it.
 */
export interface NumericPieceSetup {
  readonly file: string
  readonly separator: string
  readonly decimal: string
  /** Per column: 0 id, k value k, SLOT_ID2 the second id, -1 left out. */
  readonly slotOf: Int32Array
  readonly nf: number
  readonly nv: number
  readonly names: readonly string[]
  readonly twoIds: boolean
}

/** The rows of a numeric table (or of a piece of it), trimmed to `rows`. */
export interface NumericRows {
  readonly rows: number
  readonly ids: Int32Array
  readonly ids2: Int32Array | null
  readonly values: Float64Array
  readonly lines: Int32Array
}

/** A numeric table opened: dialect found, header read and matched, the cursor on the first row. */
export interface OpenNumericTable {
  readonly cur: CsvCursor
  readonly setup: NumericPieceSetup
  readonly header: CsvHeader
  readonly info: TableInfo
}

/** Opens a numeric table (dialect, header, column plan); header problems are thrown here. */
export function openNumericTable(file: string, src: string | Uint8Array, spec: NumericTableSpec): OpenNumericTable {
  const { cur, dialect, header } = openTable(file, src, spec.settings, 'numeric', spec.role)
  if (header.present && header.width === 0) throw new InputError('empty-file', 'the file is empty (no header line, no rows)', { file })
  const twoIds = spec.elementNodal !== undefined && isElementNodalHeader(header, spec.columns)
  const fields = twoIds ? spec.elementNodal! : spec.fields
  const columnOf = matchColumns(file, header, fields, spec.columns, spec.role)
  const mismatch = widthMismatch(header, spec.role)
  if (mismatch) throw new InputError('header', `${header.raw.join(', ')}: ${mismatch}`, { file, line: header.line })
  const nf = header.width
  const { slotOf, labels, names } = columnSlots(header, fields, columnOf, twoIds)
  const unit = unitOfColumns(file, header, columnOf.subarray(twoIds ? 2 : 1), spec.quantity)
  const nv = fields.length - (twoIds ? 2 : 1)
  const used = new Uint8Array(nf)
  for (const c of columnOf) used[c] = 1
  const info: TableInfo = { dialect, ignored: unusedColumns(header, used), unit, labels }
  return { cur, header, info, setup: { file, separator: dialect.separator, decimal: dialect.decimal, slotOf, nf, nv, names, twoIds } }
}

/**
 * Reads the rows of one piece of a table, bytes[start, end) (whole lines, starting on line
 * `line`), as readNumericTable reads them. In place: no copy of the piece.
 */
export function readNumericPiece(setup: NumericPieceSetup, bytes: Uint8Array, start: number, end: number, line: number, offset = 0): NumericRows {
  const cur = createCursor(setup.file, bytes, setup.separator, setup.decimal, offset)
  moveCursor(cur, start, line)
  // Untrimmed: the arrays travel back whole (by transfer) and the merge reads `rows` of them.
  return readNumericRows(cur, setup.slotOf, setup.nf, setup.nv, setup.names, setup.twoIds, end)
}

/** The table from its pieces' rows, in file order (one piece: its arrays as they are). */
export function finishNumericTable(t: OpenNumericTable, pieces: readonly NumericRows[]): NumericTable {
  const { nv, twoIds } = t.setup
  let rows = 0
  for (const p of pieces) rows += p.rows
  if (rows === 0) throw new InputError('empty-file', 'the file has a header but no rows', { file: t.setup.file, line: t.header.line })
  if (pieces.length === 1) {
    const r = pieces[0]
    return { rows, ids: fitInt(r.ids, rows), ids2: r.ids2 ? fitInt(r.ids2, rows) : null, values: fitFloat(r.values, rows * nv), lines: fitInt(r.lines, rows), info: t.info }
  }
  const ids = new Int32Array(rows), lines = new Int32Array(rows), values = new Float64Array(rows * nv)
  const ids2 = twoIds ? new Int32Array(rows) : null
  let at = 0
  for (const p of pieces) {
    ids.set(p.ids.subarray(0, p.rows), at); lines.set(p.lines.subarray(0, p.rows), at)
    values.set(p.values.subarray(0, p.rows * nv), at * nv)
    if (ids2 && p.ids2) ids2.set(p.ids2.subarray(0, p.rows), at)
    at += p.rows
  }
  return { rows, ids, ids2, values, lines, info: t.info }
}

/** Slot of the second id column (the node of an element-nodal row). */
const SLOT_ID2 = -2

/**
 * The rows of a numeric table: per row the id (slot 0) and the values (slots 1..nv) of the
 * columns `slotOf` maps, columns of slot -1 skipped; from the cursor up to `limit`. Only the hot loop, apart from the table's
 * set-up, so that code the loop never reaches cannot discard its optimised form.
 */
export function readNumericRows(cur: CsvCursor, slotOf: Int32Array, nf: number, nv: number, names: readonly string[], twoIds: boolean, limit: number, into?: NumericRows): NumericRows {
  // The field readers once into locals: under a CommonJS transform (tsx) every use of an imported
  // name is a getter call that the optimiser does not inline, once per field otherwise.
  const next = nextRecord, sep = takeSeparator, num = readNumber, id = readId, skip = skipField, lineEnd = atLineEnd, finish = finishLine
  const OK = PARSE_OK
  // `into`: arrays to fill from their start (a piece's share of a table's shared arrays); they are
  // replaced by grown copies only when the rows outrun them, which the caller sees by identity.
  let cap = into ? into.ids.length : Math.max(16, estimateRecordCount(cur.bytes, cur.pos, limit))
  let ids: Int32Array = into ? into.ids : new Int32Array(cap)
  let values: Float64Array = into ? into.values : new Float64Array(cap * nv)
  let lines: Int32Array = into ? into.lines : new Int32Array(cap)
  let ids2: Int32Array = into?.ids2 ? into.ids2 : new Int32Array(twoIds ? cap : 0)
  let rows = 0
  // A piece ends at `limit`, just after a line end: a record found there belongs to the next piece.
  while (next(cur, limit)) {
    if (rows === cap) {
      // Only when line ends are unusual (lone CRs mixed with LFs): grow by doubling.
      cap = Math.max(16, cap * 2)
      ids = growInt(ids, cap); lines = growInt(lines, cap)
      if (twoIds) ids2 = growInt(ids2, cap)
      const v = new Float64Array(cap * nv); v.set(values); values = v
    }
    const base = rows * nv
    for (let j = 0; j < nf; j++) {
      if (j > 0 && !sep(cur)) failColumnCount(cur, nf, names)
      const s = slotOf[j]
      if (s > 0) {
        const v = num(cur)
        if (cur.status !== OK) failField(cur, names[j], 'number')
        values[base + s - 1] = v
      } else if (s === 0) {
        const v = id(cur)
        if (cur.status !== OK) failField(cur, names[j], 'id')
        ids[rows] = v
      } else if (s === SLOT_ID2) {
        const v = id(cur)
        if (cur.status !== OK) failField(cur, names[j], 'id')
        ids2[rows] = v
      } else {
        skip(cur)
        if (cur.status !== OK) failField(cur, names[j], 'number')
      }
    }
    if (!lineEnd(cur)) failColumnCount(cur, nf, names)
    lines[rows] = cur.line
    rows++
    finish(cur)
  }
  return { rows, ids, ids2: twoIds ? ids2 : null, values, lines }
}


/**
 * Per column the field it holds (0 = id, k = value k) or -1 for a column left out, and the
 * message names of fields and columns. Apart from the reader so that no closure there captures
 * what its loop reads (a captured variable lives in a heap context: a load more per field).
 */
function columnSlots(header: CsvHeader, fields: readonly string[], columnOf: Int32Array, twoIds: boolean): { slotOf: Int32Array; labels: string[]; names: string[] } {
  const slotOf = new Int32Array(header.width).fill(-1)
  // With two id columns the second is SLOT_ID2 and the values start at field 2 (slot 1).
  columnOf.forEach((c, k) => { slotOf[c] = !twoIds ? k : k === 0 ? 0 : k === 1 ? SLOT_ID2 : k - 1 })
  const labels = fields.map((f, k) => columnLabel(header, columnOf[k], f))
  const fieldOf = new Int32Array(header.width).fill(-1)
  columnOf.forEach((c, k) => { fieldOf[c] = k })
  const names = Array.from({ length: header.width }, (_, c) => (fieldOf[c] >= 0 ? labels[fieldOf[c]] : columnLabel(header, c)))
  return { slotOf, labels, names }
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
