/**
 * The dialect of one CSV text: how its fields are separated, its decimal mark, the lines before
 * its header, and whether it has a header at all. Detected per file from a sample of its first
 * lines (the header and the first data rows); what model.json declares (`"csv"`, see
 * src/io/bundleLayout.ts) is taken as given and only the rest is detected.
 *
 * The rule, over the first SAMPLE_LINES lines that are neither blank nor `#` comments:
 * - A field is a number when it reads as [+-]digits[.digits][(e|E|d|D)[+-]digits] with a decimal
 *   point, or with a decimal comma where the separator is not a comma (NaN and Inf count as
 *   numbers here so that the reader, not the detection, reports them); a word is a field with a
 *   letter in it. A data row has at least two numbers, no field that is neither a number, a word
 *   nor empty, and at most one word per three fields (one at least: the element type). A header
 *   has a word and no number.
 * - Separators are tried in the order tab, semicolon, comma, runs of spaces; the first one under
 *   which data rows make up at least half the sample from the first of them on wins. The first
 *   row is the first data row of the most common width in a numeric table (nodes, stress,
 *   displacement; element rows follow their types). Tried in that order, a comma file whose
 *   fields are padded with spaces is read as comma separated, and a file with decimal commas
 *   between runs of spaces is not split at its commas (its "numbers" would be "1 0" and "5 2").
 * - Going up from the first row over lines that are rows as well (data rows, or lines of the
 *   rows' width with digits: malformed rows, which the reader then reports by line), the line
 *   reached is the header when it is header-like (the table reader then matches its names, and
 *   says which are missing). Lines above the header, or above the first row of a file with no
 *   header, are the preamble: `skipLines` = the line number of its last line.
 * - Decimal mark: a comma when the sample's data rows hold numbers with a decimal comma, a point
 *   when they hold decimal points; both at once are an ambiguity (refused, naming
 *   `csv.decimal`). When the sample holds whole numbers only, the first point or comma in the
 *   rest of the file decides. Thousands separators are not read.
 * A sample of one line, or without any digit, is a header alone (or text): its first line is
 * taken as the header and the table reader reports what is missing.
 *
 * A file read as bytes (the readers' way, src/io/csvBytes.ts) is sampled from its first lines
 * decoded (strictly: a file that is not UTF-8 is refused there, naming the line); positions are
 * then byte offsets.
 */
import { InputError } from '../model/errors.ts'
import { decodeUtf8, utf8Length } from './csvBytes.ts'

export type Separator = ',' | ';' | '\t' | ' '
export type DecimalMark = '.' | ','
export type DialectKey = 'separator' | 'decimal' | 'skipLines' | 'header'

/** What model.json may declare about a file; absent keys are detected. */
export interface DialectSettings {
  readonly separator?: Separator
  readonly decimal?: DecimalMark
  /** Physical lines (blank and comment lines included) to skip before the header or first row. */
  readonly skipLines?: number
  readonly header?: boolean
}

/** How one file is read; `declared` lists what model.json said, the rest was detected. */
export interface CsvDialect {
  readonly separator: Separator
  readonly decimal: DecimalMark
  /** False when the decimal mark was neither declared nor seen (whole numbers only). */
  readonly decimalSeen: boolean
  /** Lines skipped before the header (or the first row): declared, or the detected preamble. */
  readonly skipLines: number
  /** 1-based line of the header, 0 when the file has none. */
  readonly headerLine: number
  readonly declared: readonly DialectKey[]
  /** UTF-16 index and 1-based line where reading starts: the header, or the first row. */
  readonly start: number
  readonly startLine: number
  /** Fields of the rows: the most common width among the first data rows of a numeric table, the
   * first row's in the element table. The width of a file without a header. */
  readonly rowFields: number
}

/** Numeric tables have one width; element rows follow their types. */
export type TableShape = 'numeric' | 'elements'

export const SAMPLE_LINES = 64
const SEPARATOR_ORDER: readonly Separator[] = ['\t', ';', ',', ' ']
export const SEPARATOR_NAMES: Readonly<Record<Separator, string>> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', ' ': 'spaces' }

interface SampleLine {
  readonly text: string
  readonly pos: number
  /** 1-based line number. */
  readonly line: number
}

/** Sample line kinds. */
const Kind = { Data: 0, Header: 1, Other: 2 } as const
type Kind = (typeof Kind)[keyof typeof Kind]

interface Split {
  readonly fields: readonly string[]
  /** Per field: 0 not a number, 1 a number without decimal mark, 2 with a point, 3 with a comma. */
  readonly numberKind: readonly number[]
  readonly kind: Kind
}

/** The first position of `ch` in the file from text position `from` on (past the sample), or -1. */
type FarSearch = (ch: string, from: number) => number

/** Bytes first decoded to sample a file's lines; doubled while they hold fewer than SAMPLE_LINES lines. */
export const HEAD_BYTES = 64 * 1024

/**
 * detectDialect for a file given as its UTF-8 bytes: the sample comes from its first lines,
 * decoded strictly (HEAD_BYTES, more while they hold too few lines); `start` is a byte offset.
 */
export function detectDialectOfBytes(file: string, bytes: Uint8Array, settings: DialectSettings, shape: TableShape, role: string): CsvDialect {
  for (let n = HEAD_BYTES; ; n *= 2) {
    const whole = n >= bytes.length
    // Cut after the last line end of the first n bytes (never inside a character).
    const cut = whole ? bytes.length : Math.max(bytes.lastIndexOf(10, n - 1), bytes.lastIndexOf(13, n - 1)) + 1
    if (cut === 0 && !whole) continue
    const head = decodeUtf8(file, bytes.subarray(0, cut), true)
    if (!whole && sampleLines(head, settings.skipLines ?? 0).length < SAMPLE_LINES) continue
    // All ASCII (the usual case): text positions are byte offsets.
    const toByte = (at: number) => (head.length === cut ? at : utf8Length(head.slice(0, at)))
    const d = detectDialect(file, head, settings, shape, role, (ch, from) => bytes.indexOf(ch.charCodeAt(0), toByte(from)))
    return { ...d, start: d.start >= head.length ? cut : toByte(d.start) }
  }
}

/**
 * Detects the dialect of `text` (a whole file) under what `settings` declares. `role` names the
 * file's key under "csv" in model.json, for messages. Throws InputError 'csv-dialect' when the
 * sample is ambiguous, naming the key that settles it.
 */
export function detectDialect(file: string, text: string, settings: DialectSettings, shape: TableShape, role: string, far: FarSearch = (ch, from) => text.indexOf(ch, from)): CsvDialect {
  const declared: DialectKey[] = (['separator', 'decimal', 'skipLines', 'header'] as const).filter((k) => settings[k] !== undefined)
  const sample = sampleLines(text, settings.skipLines ?? 0)
  const key = (k: DialectKey, v: string) => `"csv": {"${k}": ${v}} in model.json (or "csv": {"${role}": {"${k}": ${v}}} for this file only)`
  if (sample.length === 0) {
    // Empty, or only comments: the table reader says so.
    return { separator: settings.separator ?? ',', decimal: settings.decimal ?? '.', decimalSeen: settings.decimal !== undefined, skipLines: settings.skipLines ?? 0, headerLine: 0, declared, start: text.length, startLine: 1, rowFields: 0 }
  }
  // A declared decimal comma rules the comma out as the separator.
  const candidates = settings.separator !== undefined ? [settings.separator] : SEPARATOR_ORDER.filter((c) => !(c === ',' && settings.decimal === ','))
  let sep: Separator | null = null
  let splits: Split[] = []
  let block = -1, width = 0
  for (const c of candidates) {
    const s = sample.map((l) => splitSample(l.text, c, shape))
    const b = findFirstRow(s, shape)
    if (b.row >= 0) { sep = c; splits = s; block = b.row; width = b.width; break }
  }
  if (sep === null) {
    if (sample.length === 1 || !sample.some((l) => /[0-9]/.test(l.text))) return headerOnly(sample, settings, declared, shape)
    const first = sample.find((l) => /[0-9]/.test(l.text))!
    const tried = candidates.map((c) => SEPARATOR_NAMES[c]).join(', ')
    throw new InputError('csv-dialect', `cannot find the rows of numbers: split by ${tried}, the first lines do not form rows of the same fields (first line with digits: ${quoteLine(first.text)}); declare the separator, e.g. ${key('separator', '";"')}, and "skipLines" if lines above the header are not # comments`, { file, line: first.line })
  }
  // Up from the first row over lines that are rows too (malformed ones the reader will judge):
  // the line reached is the header candidate.
  let h = block - 1
  while (h >= 0 && rowLike(splits[h], width, shape)) h--
  let headerAt = -1, firstRow = h + 1
  if (settings.skipLines !== undefined) {
    // The preamble is declared: the first line left is the header or the first row.
    firstRow = 0
    if (settings.header === undefined && splits[0].kind === Kind.Header && shape === 'numeric' && splits[0].fields.length !== width) {
      // A header-like line of another width than the rows: a preamble line left in.
      const next = splits.findIndex((x, i) => i > 0 && x.kind === Kind.Header && x.fields.length === width)
      const raise = next > 0 ? `raise skipLines to ${sample[next].line - 1}` : 'raise skipLines'
      throw new InputError('csv-dialect', `${quoteLine(sample[0].text)} is not the header of rows of ${width} fields; "skipLines": ${settings.skipLines} leaves it in: ${raise}, or declare "header": false`, { file, line: sample[0].line })
    }
    if (settings.header === true || (settings.header === undefined && splits[0].kind === Kind.Header)) { headerAt = 0; firstRow = 1 }
    else if (settings.header === undefined && !rowLike(splits[0], width, shape)) {
      throw new InputError('csv-dialect', `${quoteLine(sample[0].text)} is neither a header nor a row of numbers; "skipLines": ${settings.skipLines} leaves it in: skip it too, or declare "header": true`, { file, line: sample[0].line })
    }
  } else if (settings.header === true) {
    if (h < 0) throw new InputError('csv-dialect', `"header": true, but line ${sample[0].line} is already a row of numbers; remove "header" or add the header line`, { file, line: sample[0].line })
    headerAt = h
  } else if (settings.header === undefined && h >= 0 && splits[h].kind === Kind.Header) {
    headerAt = h
  }
  const skipLines = settings.skipLines ?? (headerAt >= 0 ? (headerAt > 0 ? sample[headerAt - 1].line : 0) : (firstRow > 0 ? sample[firstRow - 1].line : 0))
  if (firstRow >= sample.length) {
    // A header and nothing below it in the sample: the table reader reports the missing rows.
    firstRow = sample.length - 1
  }
  const found = settings.decimal !== undefined ? { mark: settings.decimal, seen: true } : detectDecimal(file, far, sample, splits, Math.max(firstRow, headerAt + 1), sep, shape, key)
  const at = headerAt >= 0 ? sample[headerAt] : sample[firstRow]
  return {
    separator: sep, decimal: found.mark, decimalSeen: found.seen, skipLines, headerLine: headerAt >= 0 ? sample[headerAt].line : 0, declared,
    start: at.pos, startLine: at.line, rowFields: shape === 'numeric' ? width : splits[Math.min(Math.max(firstRow, headerAt + 1), splits.length - 1)].fields.length,
  }
}

function headerOnly(sample: readonly SampleLine[], settings: DialectSettings, declared: DialectKey[], shape: TableShape): CsvDialect {
  // The separator that splits the first line into the most fields (in the order of preference).
  let best: Separator = settings.separator ?? ',', most = 0
  for (const c of settings.separator !== undefined ? [settings.separator] : SEPARATOR_ORDER) {
    const n = splitSample(sample[0].text, c, shape).fields.length
    if (n > most) { most = n; best = c }
  }
  const header = settings.header !== false
  return { separator: best, decimal: settings.decimal ?? '.', decimalSeen: settings.decimal !== undefined, skipLines: settings.skipLines ?? 0, headerLine: header ? sample[0].line : 0, declared, start: sample[0].pos, startLine: sample[0].line, rowFields: most }
}

function detectDecimal(file: string, far: FarSearch, sample: readonly SampleLine[], splits: readonly Split[], from: number, sep: Separator, shape: TableShape, key: (k: DialectKey, v: string) => string): { mark: DecimalMark; seen: boolean } {
  let point = -1, comma = -1
  for (let i = from; i < splits.length; i++) {
    if (splits[i].kind !== Kind.Data) continue
    for (const k of splits[i].numberKind) {
      if (k === 2 && point < 0) point = i
      if (k === 3 && comma < 0) comma = i
    }
  }
  if (point >= 0 && comma >= 0) {
    throw new InputError('csv-dialect', `the first rows write decimal points (line ${sample[point].line}) and decimal commas (line ${sample[comma].line}); declare which one the file uses, e.g. ${key('decimal', '","')}`, { file, line: sample[Math.max(point, comma)].line })
  }
  if (comma >= 0) return { mark: ',', seen: true }
  if (point >= 0) return { mark: '.', seen: true }
  // Element rows hold no decimals worth a search.
  if (sample.length < SAMPLE_LINES || shape === 'elements') return { mark: '.', seen: false }
  // Only whole numbers in the sample: the first point or comma after it decides (two native
  // searches, no parse); the reader refuses the other mark where it appears, saying so.
  const after = sample[sample.length - 1].pos + sample[sample.length - 1].text.length
  const p = far('.', after), c = sep === ',' ? -1 : far(',', after)
  return { mark: c >= 0 && (p < 0 || c < p) ? ',' : '.', seen: p >= 0 || c >= 0 }
}

/**
 * The first row of the sample under one separator, and the rows' width: the first data row of
 * the most common width among the data rows (numeric tables; element rows follow their types),
 * provided data rows are at least half the lines from there on. -1 when there is none.
 */
function findFirstRow(s: readonly Split[], shape: TableShape): { row: number; width: number } {
  const counts = new Map<number, number>()
  for (const x of s) if (x.kind === Kind.Data) counts.set(x.fields.length, (counts.get(x.fields.length) ?? 0) + 1)
  if (counts.size === 0) return { row: -1, width: 0 }
  let width = 0, most = 0
  for (const [w, n] of counts) if (n > most) { most = n; width = w }
  const row = s.findIndex((x) => x.kind === Kind.Data && (shape === 'elements' || x.fields.length === width))
  let data = 0
  for (let i = row; i < s.length; i++) if (s[i].kind === Kind.Data) data++
  return 2 * data >= s.length - row ? { row, width } : { row: -1, width: 0 }
}

/** A data row, or a line of the rows' width with digits in it (a malformed row, not a preamble line). */
function rowLike(x: Split, width: number, shape: TableShape): boolean {
  if (x.kind === Kind.Data) return true
  if (x.kind === Kind.Header || !x.numberKind.some((k) => k > 0) && !x.fields.some((f) => /[0-9]/.test(f))) return false
  return shape === 'elements' ? x.fields.length >= 3 : x.fields.length === width
}

/** Up to SAMPLE_LINES lines that are neither blank nor comments, after `skip` physical lines. */
function sampleLines(text: string, skip: number): SampleLine[] {
  const out: SampleLine[] = []
  const len = text.length
  let p = len > 0 && text.charCodeAt(0) === 0xfeff ? 1 : 0
  let line = 1
  while (p < len && out.length < SAMPLE_LINES) {
    let e = p
    while (e < len) { const c = text.charCodeAt(e); if (c === 10 || c === 13) break; e++ }
    if (line > skip) {
      const t = text.slice(p, e)
      const trimmed = t.trim()
      if (trimmed !== '' && trimmed[0] !== '#') out.push({ text: t, pos: p, line })
    }
    // CRLF, LF or a lone CR ends the line, as the cursor counts them.
    if (e < len && text.charCodeAt(e) === 13 && e + 1 < len && text.charCodeAt(e + 1) === 10) e++
    p = e + 1
    line++
  }
  return out
}

/** Splits one line by `sep` (RFC 4180 quotes; ' ' = runs of blanks) and classifies it. */
export function splitLine(line: string, sep: Separator): string[] {
  const out: string[] = []
  const n = line.length
  let i = 0
  const blank = (c: string) => c === ' ' || (c === '\t' && sep !== '\t')
  for (;;) {
    while (i < n && blank(line[i])) i++
    if (sep === ' ' && i >= n) break
    let field = ''
    if (line[i] === '"') {
      i++
      for (;;) {
        if (i >= n) break
        if (line[i] === '"') {
          if (line[i + 1] === '"') { field += '"'; i += 2; continue }
          i++
          break
        }
        field += line[i++]
      }
      // Text after the closing quote stays part of the field (the reader refuses it).
      while (i < n && line[i] !== sep && !(sep === ' ' && line[i] === '\t')) field += line[i++]
      field = field.trim()
    } else {
      const s = i
      while (i < n && line[i] !== sep && !(sep === ' ' && line[i] === '\t')) i++
      field = line.slice(s, i).trim()
    }
    out.push(field)
    if (i >= n) break
    i++ // the separator
    if (sep === ' ') { while (i < n && blank(line[i])) i++; if (i >= n) break }
  }
  return out
}

const NUMBER_POINT = /^[+-]?(\d+(\.\d*)?|\.\d+)([eEdD][+-]?\d+)?$/
const NUMBER_COMMA = /^[+-]?(\d+(,\d*)?|,\d+)([eEdD][+-]?\d+)?$/
const NOT_FINITE = /^[+-]?(nan|inf|infinity)$/i
const LETTER = /\p{L}/u

/** 0 not a number, 1 a number without decimal mark, 2 with a decimal point, 3 with a decimal comma. */
export function numberKind(s: string, sep: Separator): number {
  if (NUMBER_POINT.test(s)) return s.includes('.') ? 2 : 1
  if (sep !== ',' && NUMBER_COMMA.test(s)) return 3
  return NOT_FINITE.test(s) ? 1 : 0
}

function splitSample(text: string, sep: Separator, shape: TableShape): Split {
  const fields = splitLine(text, sep)
  const numberKinds = fields.map((f) => numberKind(f, sep))
  let numbers = 0, words = 0, other = 0, filled = 0
  fields.forEach((f, i) => {
    if (f === '') return
    filled++
    if (numberKinds[i] > 0) numbers++
    else if (LETTER.test(f)) words++
    else other++
  })
  const minFields = shape === 'elements' ? 3 : 2
  let kind: Kind = Kind.Other
  if (fields.length >= minFields && numbers >= 2 && other === 0 && words <= Math.max(1, Math.floor(filled / 3))) kind = Kind.Data
  else if (numbers === 0 && words > 0) kind = Kind.Header
  return { fields, numberKind: numberKinds, kind }
}

function quoteLine(s: string): string {
  const t = s.trim()
  return `"${t.length > 60 ? t.slice(0, 57) + '...' : t}"`
}

/** A short description for the model card and `tractus info`. */
export function describeDialect(d: CsvDialect): string {
  const parts = [d.separator === ' ' ? 'separated by spaces' : `${SEPARATOR_NAMES[d.separator]}-separated`]
  if (d.decimalSeen) parts.push(d.decimal === ',' ? 'decimal comma' : 'decimal point')
  if (d.skipLines > 0) parts.push(`${d.skipLines} line${d.skipLines === 1 ? '' : 's'} skipped`)
  parts.push(d.headerLine > 0 ? `header on line ${d.headerLine}` : `no header, first row on line ${d.startLine}`)
  if (d.declared.length) parts.push(`${d.declared.join(', ')} from model.json`)
  return parts.join(', ')
}
