/**
 * Matching a file's columns to our fields: by our field names (case-insensitive, a unit like
 * `[mm]` left out), or as model.json "columns" maps them (the user's header text, or a 1-based
 * column number). Columns no field uses are left out and listed (one warning for the model). A
 * file without a header row needs its columns given by number. Every refusal names the file, the
 * header line and the field, and the model.json key that fixes it.
 */
import { InputError } from '../model/errors.ts'
import type { ColumnMap, ColumnRef } from './bundleLayout.ts'
import { knownUnits } from './headerUnits.ts'
import type { HeaderUnit } from './headerUnits.ts'

export interface CsvHeader {
  /** Column names as written (quotes removed, trimmed); empty when the file has no header. */
  readonly raw: readonly string[]
  /** Lower-case names, whole and without a known unit suffix, for matching. */
  readonly names: readonly string[]
  readonly bare: readonly string[]
  /** The known unit each name carries, or null. */
  readonly units: readonly (HeaderUnit | null)[]
  /** 1-based line of the header; of the first row when the file has none. */
  readonly line: number
  readonly present: boolean
  /** Columns: of the header, or of the first row. */
  readonly width: number
  /** Fields of the first row (the width of the rows, which a header should match). */
  readonly rowWidth: number
}

/** How a column is called in messages: its header text, or its number and our field. */
export function columnLabel(header: CsvHeader, col: number, field?: string): string {
  if (header.present && header.raw[col] !== undefined && header.raw[col] !== '') return header.raw[col]
  return field ? `${col + 1} (${field})` : String(col + 1)
}

function listHeader(header: CsvHeader): string {
  const names = header.raw.map((n, i) => (n === '' ? `(column ${i + 1} unnamed)` : n))
  return names.length > 12 ? names.slice(0, 12).join(', ') + ', ...' : names.join(', ')
}

/**
 * The 0-based column of one field: `ref` from model.json (`key` names it), or our field name
 * when `ref` is undefined. Returns -1 for an absent field that `optional` allows; otherwise a
 * missing column is an InputError. `role` is the file's role in model.json keys.
 */
export function findColumn(file: string, header: CsvHeader, field: string, ref: ColumnRef | undefined, role: string, optional = false): number {
  const where = { file, line: header.line, column: field }
  const key = `columns.${role}.${field}`
  if (typeof ref === 'number') {
    if (ref > header.width) throw new InputError('header', `model.json ${key} is column ${ref}, but the file has ${header.width} column${header.width === 1 ? '' : 's'}; give a column from 1 to ${header.width}`, where)
    return ref - 1
  }
  if (!header.present) {
    if (ref !== undefined) throw new InputError('header', `model.json ${key} is ${JSON.stringify(ref)}, but the file has no header row; give the column's number (1 = the first column)`, where)
    if (optional) return -1
    throw new InputError('header', `the file has no header row (line ${header.line} is already a row); name its columns by number in model.json, e.g. "columns": {"${role}": {"${field}": 1, ...}}`, where)
  }
  const want = (ref ?? field).trim().toLowerCase()
  const hits: number[] = []
  for (let i = 0; i < header.width; i++) if (header.names[i] === want || header.bare[i] === want) hits.push(i)
  if (hits.length > 1) {
    throw new InputError('header', `column "${header.raw[hits[0]]}" appears twice (columns ${hits[0] + 1} and ${hits[1] + 1}); rename one, or pick one by number in model.json: "columns": {"${role}": {"${field}": ${hits[0] + 1}}}`, { ...where, column: header.raw[hits[0]] })
  }
  if (hits.length === 1) return hits[0]
  if (optional && ref === undefined) return -1
  if (ref !== undefined) {
    throw new InputError('header', `model.json ${key} is ${JSON.stringify(ref)}, but the header has ${listHeader(header)}; name one of them (case does not matter, a unit like "[mm]" may be left out) or give a column number`, where)
  }
  return -2
}

/**
 * Columns of `fields` (model.json `mapping` first, then our names). Fields in `optional` may be
 * absent (-1). All missing required fields are reported at once, with the columns no field uses
 * as the likely candidates.
 */
export function matchColumns(file: string, header: CsvHeader, fields: readonly string[], mapping: ColumnMap | undefined, role: string, optional: readonly string[] = []): Int32Array {
  const columnOf = new Int32Array(fields.length)
  const missing: string[] = []
  fields.forEach((f, k) => {
    const ref = mapping?.[f]
    if (Array.isArray(ref)) throw new InputError('header', `model.json columns.${role}.${f} lists several columns; ${f} takes one`, { file, line: header.line, column: f })
    const c = findColumn(file, header, f, ref as ColumnRef | undefined, role, optional.includes(f))
    if (c === -2) missing.push(f)
    columnOf[k] = c
  })
  if (missing.length) {
    const used = new Set(Array.from(columnOf).filter((c) => c >= 0))
    const spare = header.raw.map((n, i) => ({ n, i })).filter(({ i }) => !used.has(i))
    const instead = spare.length ? ` (not used: ${spare.map(({ n, i }) => (n === '' ? `column ${i + 1}` : `"${n}"`)).join(', ')})` : ''
    const example = spare.length && spare[0].n !== '' ? `"${missing[0]}": "${spare[0].n}"` : `"${missing[0]}": "<your header>"`
    const split = widthMismatch(header, role)
    throw new InputError('header', `missing column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}; the header has ${listHeader(header)}${instead}; if yours are named differently, map them in model.json: "columns": {"${role}": {${example}}}${split ? '; ' + split : ''}`, { file, line: header.line, column: missing[0] })
  }
  checkDistinct(file, header, fields, columnOf, role)
  return columnOf
}

/**
 * When a header's names do not match the rows' fields in number, what to do about it, or ''.
 */
export function widthMismatch(header: CsvHeader, role: string): string {
  if (!header.present || header.rowWidth <= 0 || header.rowWidth === header.width) return ''
  return `the header has ${header.width} names but the rows ${header.rowWidth} fields: if names hold the separator, quote them, or declare "csv": {"${role}": {"header": false, "skipLines": ${header.line}}} and name the columns by number; if a name is missing, add it`
}

/** Two fields may not read one column. */
export function checkDistinct(file: string, header: CsvHeader, fields: readonly string[], columnOf: ArrayLike<number>, role: string): void {
  const byColumn = new Map<number, string>()
  for (let k = 0; k < fields.length; k++) {
    const c = columnOf[k]
    if (c < 0) continue
    const other = byColumn.get(c)
    if (other !== undefined) throw new InputError('header', `column ${columnLabel(header, c)} would be both ${other} and ${fields[k]}; map each field to its own column in model.json "columns": {"${role}": {...}}`, { file, line: header.line, column: fields[k] })
    byColumn.set(c, fields[k])
  }
}

/** The columns no field uses, as written ("column 5" when unnamed or without a header). */
export function unusedColumns(header: CsvHeader, used: ArrayLike<boolean | number>): string[] {
  const out: string[] = []
  for (let i = 0; i < header.width; i++) if (!used[i]) out.push(header.present && header.raw[i] ? header.raw[i] : `column ${i + 1}`)
  return out
}

/** The unit the headers of `columns` give their quantity, with the column that gives it. */
export interface ColumnUnit {
  readonly unit: HeaderUnit
  readonly column: string
}

/**
 * The one unit the header gives the columns of a `kind` quantity, or null; a unit of the other
 * kind, or two different units, is an InputError naming both columns.
 */
export function unitOfColumns(file: string, header: CsvHeader, columns: ArrayLike<number>, kind: 'length' | 'stress'): ColumnUnit | null {
  let found: ColumnUnit | null = null
  for (let k = 0; k < columns.length; k++) {
    const c = columns[k]
    const u = c >= 0 ? header.units[c] : null
    if (!u) continue
    const label = header.raw[c]
    if (u.kind !== kind) throw new InputError('bad-unit', `"${u.unit}" is a ${u.kind} unit, but this column holds a ${kind}; write one of ${knownUnits(kind)}`, { file, line: header.line, column: label })
    if (found && found.unit.unit !== u.unit) throw new InputError('bad-unit', `column "${found.column}" says ${found.unit.unit} but column "${label}" says ${u.unit}; the numbers of one quantity share one unit: make the headers agree`, { file, line: header.line, column: label })
    found = found ?? { unit: u, column: label }
  }
  return found
}
