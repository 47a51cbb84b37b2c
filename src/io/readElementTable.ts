/**
 * The element table. Our header is `id,type[,part],n1,n2,...,nK`: the columns are found by name
 * (case-insensitive; `part` optional, anywhere), the node columns n1..nK side by side in order
 * (K may be the largest node count in the file or fewer: each row's length follows its own type,
 * and empty fields after an element's nodes are padding). model.json may map other headers
 * ("columns": {"elements": {"id": ..., "type": ..., "part": ..., "nodes": [...] or the first node
 * column}}), other type names ("types") and another node order per type ("nodeOrder", applied
 * here, so every later check sees our local order). Types are matched case-insensitively. Rows of
 * several types make one block per type, in order of first appearance; each block keeps the
 * user's element ids and, here, the user's node ids (mapped to indices later).
 *
 * Two row readers give the same blocks: the usual layout (id, type and part before the node
 * columns, the nodes last) is read with a shortcut for plain ",digits" node fields; any other
 * layout (columns after the nodes, node columns apart) field by field.
 */
import { elementType, ELEMENT_TYPE_NAMES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { ColumnMap, ColumnRef } from './bundleLayout.ts'
import { checkDistinct, columnLabel, findColumn, matchColumns, unusedColumns } from './columnMap.ts'
import type { CsvHeader } from './columnMap.ts'
import { PARSE_EMPTY, PARSE_OK, atLineEnd, createCursor, estimateRecordCount, finishLine, moveCursor, nextRecord, readCount, readId, skipField, takeSeparator, tokenText } from './csvCursor.ts'
import type { CsvCursor } from './csvCursor.ts'
import { textOf } from './csvBytes.ts'
import type { DialectSettings } from './csvDialect.ts'
import { countFieldsOfLine, fail, failField, fitInt, growInt, lineOf, openTable, separatorWords } from './csvTable.ts'
import type { TableInfo } from './csvTable.ts'

export interface RawElementBlock {
  readonly type: ElementTypeName
  /** User node ids, nodeCount per element, in our local node order. */
  readonly nodeIds: Int32Array
  readonly ids: Int32Array
  /** Part numbers, or null when the file has no part column. */
  readonly part: Int32Array | null
  /** 1-based line of each element's row. */
  readonly lines: Int32Array
}

/** What model.json says about the element file. */
export interface ElementTableSpec {
  readonly settings: DialectSettings
  readonly columns: ColumnMap | undefined
  /** The user's type names, lower-case → ours. */
  readonly types: ReadonlyMap<string, ElementTypeName>
  /** Per type: entry k = the user's node column (0-based) that holds our local node k. */
  readonly nodeOrder: ReadonlyMap<ElementTypeName, Int32Array>
}

export const PLAIN_ELEMENT_TABLE: ElementTableSpec = { settings: {}, columns: undefined, types: new Map(), nodeOrder: new Map() }

export interface ElementTable {
  readonly blocks: RawElementBlock[]
  readonly info: TableInfo
}

export interface Growing {
  nodeIds: Int32Array
  ids: Int32Array
  part: Int32Array
  lines: Int32Array
  count: number
}

// Column slots: node columns are 0..K-1; the other fields below zero.
const SLOT_IGNORED = -1, SLOT_ID = -2, SLOT_TYPE = -3, SLOT_PART = -4

/** How the columns of the element file map to our fields. */
export interface ElementColumns {
  /** Per column: SLOT_* or the node column index k. */
  readonly slotOf: Int32Array
  readonly hasPart: boolean
  /** Column of the first node and the number of node columns (-1: the nodes run to the row's end). */
  readonly firstNode: number
  readonly nodeColumns: number
  /** The usual layout: id, type and part before the node columns, which stand side by side, last. */
  readonly plain: boolean
  /** Message label of each column; node columns past the header are "node k". */
  readonly labels: readonly string[]
}

/** Reads the element file into raw blocks (one per type). Throws InputError on any malformed row. */
export function readElementTable(file: string, src: string | Uint8Array, spec: ElementTableSpec = PLAIN_ELEMENT_TABLE): ElementTable {
  const t = openElementTable(file, src, spec)
  const bytes = t.cur.bytes
  const grown: Blocks = { byType: [], order: [], estimate: Math.max(16, estimateRecordCount(bytes)), hasPart: t.setup.cols.hasPart }
  readElementRows(t.cur, t.setup.cols, t.setup.header, typeLookup(spec.types), spec, grown, bytes.length)
  return finishElementTable(t, [finishBlocks(grown, spec.nodeOrder)])
}

/**
 * What reading element rows needs besides the bytes: the dialect's characters, the column plan,
 * the header and model.json's element settings. Plain data (structured-clonable), so a worker can
 * read a piece of the rows with it.
 */
export interface ElementPieceSetup {
  readonly file: string
  readonly separator: string
  readonly decimal: string
  readonly cols: ElementColumns
  readonly header: CsvHeader
  readonly spec: ElementTableSpec
}

/** The element file opened: dialect found, header read and matched, the cursor on the first row. */
export interface OpenElementTable {
  readonly cur: CsvCursor
  readonly setup: ElementPieceSetup
  readonly info: TableInfo
}

/** Opens the element file (dialect, header, column plan); header problems are thrown here. */
export function openElementTable(file: string, src: string | Uint8Array, spec: ElementTableSpec): OpenElementTable {
  const { cur, dialect, header } = openTable(file, src, spec.settings, 'elements', 'elements')
  if (header.present && header.width === 0) throw new InputError('empty-file', 'the file is empty (no header line, no rows)', { file })
  const cols = matchElementColumns(file, header, spec.columns)
  const used = Array.from(cols.slotOf, (s) => s !== SLOT_IGNORED)
  const info: TableInfo = { dialect, ignored: unusedColumns(header, used), unit: null, labels: [...cols.labels] }
  return { cur, info, setup: { file, separator: dialect.separator, decimal: dialect.decimal, cols, header, spec } }
}

/**
 * Reads the element rows of one piece of the file, bytes[start, end) (whole lines, starting on
 * line `line`), in place into blocks, one per type in order of first appearance, nodes in our
 * local order.
 */
export function readElementPiece(setup: ElementPieceSetup, bytes: Uint8Array, start: number, end: number, line: number, offset = 0): RawElementBlock[] {
  const cur = createCursor(setup.file, bytes, setup.separator, setup.decimal, offset)
  moveCursor(cur, start, line)
  const grown: Blocks = { byType: [], order: [], estimate: Math.max(16, estimateRecordCount(bytes, start, end)), hasPart: setup.cols.hasPart }
  readElementRows(cur, setup.cols, setup.header, typeLookup(setup.spec.types), setup.spec, grown, end)
  return finishBlocks(grown, setup.spec.nodeOrder)
}

/** The table from its pieces' blocks in file order: one block per type, in order of first appearance. */
export function finishElementTable(t: OpenElementTable, pieces: readonly (readonly RawElementBlock[])[]): ElementTable {
  const types: ElementTypeName[] = []
  for (const p of pieces) for (const b of p) if (!types.includes(b.type)) types.push(b.type)
  if (types.length === 0) throw new InputError('no-elements', 'the file has a header but no element rows', { file: t.setup.file, line: t.setup.header.line })
  if (pieces.length === 1) return { blocks: [...pieces[0]], info: t.info }
  const blocks = types.map((type) => {
    const parts = pieces.flatMap((p) => p.filter((b) => b.type === type))
    return {
      type, nodeIds: concatInt(parts.map((b) => b.nodeIds)), ids: concatInt(parts.map((b) => b.ids)),
      part: t.setup.cols.hasPart ? concatInt(parts.map((b) => b.part!)) : null, lines: concatInt(parts.map((b) => b.lines)),
    }
  })
  return { blocks, info: t.info }
}

/** The arrays one after another (the one array itself when there is one). */
export function concatInt(parts: readonly Int32Array[]): Int32Array {
  if (parts.length === 1) return parts[0]
  let n = 0
  for (const a of parts) n += a.length
  const out = new Int32Array(n)
  let at = 0
  for (const a of parts) { out.set(a, at); at += a.length }
  return out
}

/**
 * The rows of the element file into `grown`, one block per type. Only the row loop, apart from
 * the table's set-up, so that code the loop never reaches cannot discard its optimised form.
 */
export function readElementRows(cur: CsvCursor, cols: ElementColumns, header: CsvHeader, lookup: TypeLookup, spec: ElementTableSpec, grown: Blocks, limit: number): void {
  const slotOf = cols.slotOf
  // Imported readers once into locals (see readNumericTable: getters under a CommonJS transform).
  const next = nextRecord, sep = takeSeparator, id_ = readId, skip = skipField, lineEnd = atLineEnd, finish = finishLine
  const OK = PARSE_OK, EMPTY = PARSE_EMPTY
  const SEP = cur.sep
  const hasPart = cols.hasPart
  const maxNodes = cols.nodeColumns < 0 ? MAX_NODES : cols.nodeColumns
  const firstNode = cols.firstNode
  const bytes = cur.bytes, byteLen = bytes.length
  const byType = grown.byType
  // Node fields of the row being read by the general reader (0 = empty).
  const rowNodes = new Int32Array(Math.max(maxNodes, MAX_NODES))
  // The row being read: id, type, part and which of them the row had (one record, reused).
  const row: RowFields = { id: 0, t: -1, part: 0, gotId: false, gotPart: false }
  // Our own layout id,type[,part],n1,... is read field by field right here, as before model.json
  // could map columns: a call per field through readOtherField costs a fifth more per row.
  const ours = slotOf[0] === SLOT_ID && slotOf[1] === SLOT_TYPE && firstNode === (hasPart ? 3 : 2) && (!hasPart || slotOf[2] === SLOT_PART)
  const count_ = readCount
  // A piece ends at `limit`, just after a line end: a record found there belongs to the next piece.
  while (next(cur, limit)) {
    let k = 0
    if (cols.plain) {
      let id = 0, t = -1
      if (ours) {
        id = id_(cur)
        if (cur.status !== OK) failField(cur, cols.labels[0], 'id')
        if (!sep(cur)) fail(cur, 'column-count', `expected at least ${describeColumns(cols, header)}, found ${countFieldsOfLine(cur)} field`, undefined, id)
        skip(cur)
        if (cur.status !== OK) failField(cur, cols.labels[1], 'id', id)
        t = matchType(bytes, cur.tokStart, cur.tokEnd, lookup)
        if (t < 0) failType(cur, cols.labels[1], spec, id)
        if (hasPart) {
          if (!sep(cur)) fail(cur, 'column-count', 'the row ends before the part column', cols.labels[2], id)
          row.part = count_(cur)
          if (cur.status !== OK) failField(cur, cols.labels[2], 'part', id)
        }
        row.id = id; row.t = t
      } else {
        // id, type and part (and left-out columns) before the nodes, in any order.
        row.id = 0; row.t = -1
        for (let j = 0; j < firstNode; j++) {
          if (j > 0 && !sep(cur)) fail(cur, 'column-count', `the row ends before column "${columnName(cols, j)}"; every element row has ${describeColumns(cols, header)}`, columnName(cols, j), row.id || undefined)
          readOtherField(cur, slotOf[j], j, cols.labels, row, lookup, spec)
        }
        t = row.t; id = row.id
      }
      const nn = NODE_COUNTS[t]
      // room() only for a new type or a full buffer: kept out of line, once in a while.
      let g = byType[t]
      if (g === undefined || g.count === g.ids.length) g = room(grown, t)
      const base = g.count * nn
      const nodeIds = g.nodeIds
      // Fast path for the usual "<separator>digits" fields: parsed here without a call per
      // field. A field it does not take as is (blanks, signs, decimals, out of range, a bad end)
      // is left to readId below from that field on, so results and messages are the same.
      let p = cur.pos
      while (k < nn && p < byteLen && bytes[p] === SEP) {
        let q = p + 1, v = 0, nd = 0
        let c = q < byteLen ? bytes[q] : -1
        while (c >= CH_0 && c <= CH_9 && nd < 10) { v = v * 10 + (c - CH_0); nd++; c = ++q < byteLen ? bytes[q] : -1 }
        if (nd === 0 || v < 1 || v > MAX_ID || !(c === SEP || c === CH_LF || c === CH_CR || c === -1)) break
        nodeIds[base + k] = v
        k++
        p = q
      }
      cur.pos = p
      let fields = k
      while (sep(cur)) {
        if (fields >= maxNodes) fail(cur, 'node-count', `the row has more fields than the ${maxNodes} node columns of the header; ${ELEMENT_TYPE_NAMES[t]} has ${nn} nodes`, undefined, id)
        if (k === nn) {
          // Past the element's nodes only empty fields (a spreadsheet pads rows to the header).
          skip(cur)
          if (cur.status === OK && cur.tokStart === cur.tokEnd) { fields++; continue }
          failNodeCount(cur, ELEMENT_TYPE_NAMES[t], nn, firstNode, id)
        }
        const nid = id_(cur)
        if (cur.status !== OK) failField(cur, columnName(cols, firstNode + k, k), 'id', id)
        nodeIds[base + k] = nid
        k++
        fields++
      }
      if (!lineEnd(cur)) fail(cur, 'not-a-number', `unexpected text "${tokenText(cur)}"; fields are separated by ${separatorWords(cur)}`, undefined, id)
      if (k !== nn) failNodeCount(cur, ELEMENT_TYPE_NAMES[t], nn, firstNode, id, k)
      if (fields > maxNodes) fail(cur, 'node-count', `the row has more fields than the ${maxNodes} node columns of the header; ${ELEMENT_TYPE_NAMES[t]} has ${nn} nodes: list as many node columns in model.json "columns"`, undefined, id)
    } else {
      // Any other layout: field by field, nodes gathered first (the type may come after them).
      row.id = 0; row.t = -1; row.part = 0; row.gotId = false; row.gotPart = false
      rowNodes.fill(0)
      let nodeFields = 0
      for (let j = 0; ; j++) {
        if (j > 0 && !sep(cur)) break
        if (j >= slotOf.length) fail(cur, 'column-count', `the row has more fields than the ${slotOf.length} columns of the header`, undefined, row.id || undefined)
        const s = slotOf[j]
        if (s >= 0) {
          const nid = id_(cur)
          if (cur.status === EMPTY) continue
          if (cur.status !== OK) failField(cur, columnName(cols, j), 'id', row.id || undefined)
          rowNodes[s] = nid
          nodeFields++
        } else readOtherField(cur, s, j, cols.labels, row, lookup, spec)
      }
      if (!lineEnd(cur)) fail(cur, 'not-a-number', `unexpected text "${tokenText(cur)}"; fields are separated by ${separatorWords(cur)}`, undefined, row.id || undefined)
      const missing = !row.gotId ? SLOT_ID : row.t < 0 ? SLOT_TYPE : hasPart && !row.gotPart ? SLOT_PART : 0
      if (missing) {
        const j = slotOf.indexOf(missing)
        fail(cur, 'column-count', `the row ends before column "${columnName(cols, j)}"; every element row has ${describeColumns(cols, header)}`, columnName(cols, j), row.gotId ? row.id : undefined)
      }
      const nn = NODE_COUNTS[row.t]
      for (k = 0; k < nn && rowNodes[k] > 0; k++);
      if (k !== nn || nodeFields !== nn) failNodeCount(cur, ELEMENT_TYPE_NAMES[row.t], nn, -1, row.id, nodeFields)
      const g = room(grown, row.t)
      g.nodeIds.set(rowNodes.subarray(0, nn), g.count * nn)
    }
    const g = byType[row.t]!
    g.ids[g.count] = row.id
    if (hasPart) g.part[g.count] = row.part
    g.lines[g.count] = cur.line
    g.count++
    finish(cur)
  }
}

/** The element blocks being read: per type index the growing arrays, the order of first appearance. */
export interface Blocks {
  readonly byType: (Growing | undefined)[]
  readonly order: number[]
  /** Room for the next new type: the first gets room for every line, others start small and double. */
  estimate: number
  readonly hasPart: boolean
}

/** The growing arrays of type t, made or grown to hold one more element. */
function room(b: Blocks, t: number): Growing {
  let g = b.byType[t]
  const nn = NODE_COUNTS[t]
  if (!g) {
    const n = b.estimate
    g = { nodeIds: new Int32Array(n * nn), ids: new Int32Array(n), part: new Int32Array(b.hasPart ? n : 0), lines: new Int32Array(n), count: 0 }
    b.byType[t] = g
    b.order.push(t)
    b.estimate = 1024
  }
  if (g.count === g.ids.length) {
    const cap = 2 * g.count
    g.ids = growInt(g.ids, cap); g.lines = growInt(g.lines, cap); g.nodeIds = growInt(g.nodeIds, cap * nn)
    if (b.hasPart) g.part = growInt(g.part, cap)
  }
  return g
}

/** The raw blocks, trimmed to their counts, nodes in our local order. */
function finishBlocks(b: Blocks, nodeOrder: ReadonlyMap<ElementTypeName, Int32Array>): RawElementBlock[] {
  return b.order.map((t) => {
    const g = b.byType[t]!
    const type = TYPE_NAMES[t]
    const nn = NODE_COUNTS[t]
    const nodeIds = fitInt(g.nodeIds, g.count * nn)
    const perm = nodeOrder.get(type)
    if (perm) permuteNodes(nodeIds, perm)
    return { type, nodeIds, ids: fitInt(g.ids, g.count), part: b.hasPart ? fitInt(g.part, g.count) : null, lines: fitInt(g.lines, g.count) }
  })
}

/** How column j is called in messages; node columns past the header are "node k+1". */
function columnName(cols: ElementColumns, j: number, k = -1): string {
  return j < cols.labels.length ? cols.labels[j] : `node ${k + 1}`
}

/** The fields of an element row other than its nodes. */
interface RowFields {
  id: number
  /** Index into TYPE_NAMES, -1 until read. */
  t: number
  part: number
  gotId: boolean
  gotPart: boolean
}

// The field readers as module constants: under a CommonJS transform (tsx) every use of an
// imported name is a getter call; read once here, a use is a plain load.
const readIdField = readId, readCountField = readCount, skipAnyField = skipField, OK_STATUS = PARSE_OK

/**
 * Reads one field that is not a node (id, type, part, or a column left out) into `row`.
 * `labels[j]` names the column in messages (looked up only on an error).
 */
function readOtherField(cur: CsvCursor, slot: number, j: number, labels: readonly string[], row: RowFields, lookup: TypeLookup, spec: ElementTableSpec): void {
  if (slot === SLOT_ID) {
    row.id = readIdField(cur)
    row.gotId = true
    if (cur.status !== OK_STATUS) failField(cur, labels[j], 'id')
  } else if (slot === SLOT_TYPE) {
    skipAnyField(cur)
    if (cur.status !== OK_STATUS) failField(cur, labels[j], 'id', row.id || undefined)
    row.t = matchType(cur.bytes, cur.tokStart, cur.tokEnd, lookup)
    if (row.t < 0) failType(cur, labels[j], spec, row.id)
  } else if (slot === SLOT_PART) {
    row.part = readCountField(cur)
    row.gotPart = true
    if (cur.status !== OK_STATUS) failField(cur, labels[j], 'part', row.id || undefined)
  } else {
    skipAnyField(cur)
    if (cur.status !== OK_STATUS) failField(cur, labels[j], 'number', row.id || undefined)
  }
}

/** Reorders each element's nodes: new local k = the user's node column perm[k]. */
export function permuteNodes(nodeIds: Int32Array, perm: Int32Array): void {
  const nn = perm.length
  const row = new Int32Array(nn)
  for (let base = 0; base < nodeIds.length; base += nn) {
    for (let k = 0; k < nn; k++) row[k] = nodeIds[base + perm[k]]
    nodeIds.set(row, base)
  }
}

function failType(cur: CsvCursor, column: string, spec: ElementTableSpec, id: number): never {
  const tok = tokenText(cur)
  const mapped = spec.types.size ? ` (and ${[...spec.types.keys()].join(', ')} as model.json "types" maps them)` : ''
  const what = tok === '' ? 'empty element type' : `unknown element type ${tok}`
  const hint = tok === '' ? '' : `; if it is one of these under another name, map it in model.json: "types": {"${tok.replace(/^"|"$/g, '')}": "tet10"}`
  fail(cur, 'unknown-type', `${what.replace(/type ([^"].*)$/, 'type "$1"')}; known types: ${ELEMENT_TYPE_NAMES.join(', ')}${mapped}${hint}`, column, id || undefined)
}

function failNodeCount(cur: CsvCursor, type: string, nn: number, firstNode: number, id: number, listed?: number): never {
  // Count the node fields of the row that are not empty (error path only).
  const found = listed ?? countNodeFields(cur, firstNode)
  fail(cur, 'node-count', `${type} has ${nn} nodes, the row lists ${found}; if your type name means another element, map it in model.json "types", e.g. {"${type}": "tet10"}`, undefined, id)
}

function countNodeFields(cur: CsvCursor, firstNode: number): number {
  const sep = String.fromCharCode(cur.sep)
  const line = lineOf(cur)
  // The split of csvDialect, quote-aware; the leading fields before the nodes are not counted.
  const fields = splitFields(line, sep)
  return fields.slice(firstNode).filter((f) => f !== '').length
}

function splitFields(line: string, sep: string): string[] {
  return sep === ' ' ? line.trim().split(/[ \t]+/) : line.split(sep).map((f) => f.trim())
}

function describeColumns(cols: ElementColumns, header: CsvHeader): string {
  return header.present ? `the columns ${header.raw.join(', ')}` : `${cols.slotOf.length} columns`
}

/**
 * Maps the element file's columns: model.json "columns.elements" first, then our names (id,
 * type, an optional part, n1..nK).
 */
function matchElementColumns(file: string, header: CsvHeader, mapping: ColumnMap | undefined): ElementColumns {
  const [idCol, typeCol, partCol] = matchColumns(file, header, ['id', 'type', 'part'], mapping, 'elements', ['part'])
  const ref = mapping?.nodes
  const width = header.width
  let nodes: number[]
  // True when the nodes run to the end of each row (a row as long as its type needs).
  let runsToEnd: boolean
  if (Array.isArray(ref)) {
    nodes = (ref as readonly ColumnRef[]).map((r) => findColumn(file, header, 'nodes', r, 'elements'))
    runsToEnd = false
  } else if (ref !== undefined) {
    const first = findColumn(file, header, 'nodes', ref as ColumnRef, 'elements')
    for (const [f, c] of [['id', idCol], ['type', typeCol], ['part', partCol]] as const) {
      if (c > first) throw new InputError('header', `the nodes run from column ${first + 1} to the end of each row, so ${f} (column ${c + 1}) cannot come after them; list the node columns instead: "columns": {"elements": {"nodes": [...]}}`, { file, line: header.line, column: f })
    }
    nodes = Array.from({ length: Math.max(1, width - first) }, (_, k) => first + k)
    runsToEnd = true
  } else {
    nodes = defaultNodeColumns(file, header)
    runsToEnd = nodes[nodes.length - 1] === width - 1
  }
  checkDistinct(file, header, ['id', 'type', 'part', ...nodes.map((_, k) => `node ${k + 1}`)], [idCol, typeCol, partCol, ...nodes], 'elements')
  const first = nodes[0]
  const slotOf = new Int32Array(Math.max(width, first + 1)).fill(SLOT_IGNORED)
  slotOf[idCol] = SLOT_ID
  slotOf[typeCol] = SLOT_TYPE
  if (partCol >= 0) slotOf[partCol] = SLOT_PART
  nodes.forEach((c, k) => { slotOf[c] = k })
  const sideBySide = nodes.every((c, k) => c === first + k)
  const plain = sideBySide && nodes[nodes.length - 1] === slotOf.length - 1 && Math.max(idCol, typeCol, partCol) < first
  const labels = Array.from(slotOf, (s, j) => columnLabel(header, j, s >= 0 ? `n${s + 1}` : undefined))
  return { slotOf, hasPart: partCol >= 0, firstNode: first, nodeColumns: runsToEnd ? -1 : nodes.length, plain, labels }
}

/** Our node columns n1..nK: found by name, side by side and in order. */
function defaultNodeColumns(file: string, header: CsvHeader): number[] {
  const usage = 'our element header is id,type[,part],n1,n2,... with the node columns side by side'
  const where = { file, line: header.line }
  const first = header.bare.indexOf('n1')
  if (first < 0) {
    throw new InputError('header', `no node columns; ${usage}; if yours are named differently, map them in model.json: "columns": {"elements": {"nodes": "N1"}} (the first node column: the nodes run to the end of each row) or a list ["N1", "N2", ...]`, where)
  }
  const nodes: number[] = []
  for (let c = first; c < header.width && header.bare[c] === `n${nodes.length + 1}`; c++) nodes.push(c)
  for (let c = 0; c < header.width; c++) {
    if (/^n\d+$/.test(header.bare[c]) && !nodes.includes(c)) {
      const hint = c < first ? 'the node columns come in order n1, n2, ...' : `expected "n${nodes.length + 1}"`
      throw new InputError('header', `column ${c + 1} is "${header.raw[c]}": ${hint}; ${usage}`, { ...where, column: header.raw[c] })
    }
  }
  return nodes
}

const CH_LF = 10, CH_CR = 13, CH_0 = 48, CH_9 = 57
/** Largest id (2^31 - 1), as readId accepts. */
const MAX_ID = 2147483647

/** Type names and node counts by index, module constants (no getter per row, see readNumericTable). */
export const TYPE_NAMES: readonly ElementTypeName[] = [...ELEMENT_TYPE_NAMES]
export const NODE_COUNTS: readonly number[] = TYPE_NAMES.map((t) => elementType(t).nodeCount)
/** The most nodes of any type. */
const MAX_NODES = Math.max(...NODE_COUNTS)

/** The user's type names (model.json "types"), lower-case, with the index of our type. */
export interface TypeLookup {
  readonly names: readonly string[]
  readonly index: readonly number[]
}

export function typeLookup(user: ReadonlyMap<string, ElementTypeName>): TypeLookup {
  const names: string[] = [], index: number[] = []
  for (const [n, t] of user) { names.push(n); index.push(TYPE_NAMES.indexOf(t)) }
  return { names, index }
}

/**
 * Index into TYPE_NAMES of the type token bytes[s, e) (case-insensitive, optional quotes), or -1:
 * our names first (module constants, the common case, in a loop of its own so that it is
 * inlined into the row loop), then the user's.
 */
function matchType(bytes: Uint8Array, s: number, e: number, lookup: TypeLookup): number {
  if (e - s >= 2 && bytes[s] === 34 && bytes[e - 1] === 34) { s++; e-- }
  const n = e - s
  outer: for (let t = 0; t < TYPE_NAMES.length; t++) {
    const name = TYPE_NAMES[t]
    if (name.length !== n) continue
    for (let i = 0; i < n; i++) {
      let c = bytes[s + i]
      if (c >= 65 && c <= 90) c += 32
      if (c !== name.charCodeAt(i)) continue outer
    }
    return t
  }
  return lookup.names.length === 0 ? -1 : matchUserType(bytes, s, e, lookup)
}

/** The type a model.json "types" name in bytes[s, e) maps to, or -1. */
function matchUserType(bytes: Uint8Array, s: number, e: number, lookup: TypeLookup): number {
  const token = textOf(bytes, s, e).toLowerCase()
  const u = lookup.names.indexOf(token)
  return u < 0 ? -1 : lookup.index[u]
}
