/**
 * elements.csv: header `id,type[,part],n1,n2,...,nK`. `id` and `type` come first, an optional
 * `part` column comes right after `type`, then the node columns n1..nK in order (K may be the
 * largest node count in the file or fewer: each row's length follows its own type). Types are
 * matched case-insensitively. Rows of several types make one block per type, in order of first
 * appearance; each block keeps the user's element ids and, here, the user's node ids (mapped to
 * indices later).
 */
import { elementType, ELEMENT_TYPE_NAMES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import { PARSE_OK, atLineEnd, createCursor, estimateRecordCount, finishLine, nextRecord, readCount, readId, skipField, takeComma, tokenText } from './csvCursor.ts'
import { countFieldsOfLine, fail, failField, fitInt, growInt, readHeader } from './csvTable.ts'

export interface RawElementBlock {
  readonly type: ElementTypeName
  /** User node ids, nodeCount per element. */
  readonly nodeIds: Int32Array
  readonly ids: Int32Array
  /** Part numbers, or null when the file has no part column. */
  readonly part: Int32Array | null
  /** 1-based line of each element's row. */
  readonly lines: Int32Array
}

interface Growing {
  nodeIds: Int32Array
  ids: Int32Array
  part: Int32Array
  lines: Int32Array
  count: number
}

/** Reads elements.csv into raw blocks (one per type). Throws InputError on any malformed row. */
export function readElementTable(file: string, text: string): RawElementBlock[] {
  const cur = createCursor(file, text)
  const header = readHeader(cur)
  const names = header.names
  const where = { file, line: header.line }
  const usage = 'expected id,type[,part],n1,n2,... (part optional, right after type)'
  if (names[0] !== 'id') throw new InputError('header', `first column must be "id"; ${usage}`, { ...where, column: names[0] })
  if (names[1] !== 'type') throw new InputError('header', `second column must be "type"; ${usage}`, { ...where, column: names[1] ?? '' })
  const hasPart = names[2] === 'part'
  const firstNode = hasPart ? 3 : 2
  if (names.length <= firstNode) throw new InputError('header', `no node columns; ${usage}`, where)
  for (let i = firstNode; i < names.length; i++) {
    const want = `n${i - firstNode + 1}`
    if (names[i] !== want) {
      const hint = names[i] === 'part' ? 'the part column must come right after type' : `expected "${want}"`
      throw new InputError('header', `column ${i + 1} is "${names[i]}": ${hint}; ${usage}`, { ...where, column: names[i] })
    }
  }
  // Imported readers once into locals (see readNumericTable: getters under a CommonJS transform).
  const next = nextRecord, comma = takeComma, id_ = readId, count_ = readCount, skip = skipField, lineEnd = atLineEnd, finish = finishLine
  const OK = PARSE_OK
  const textLen = text.length
  const byType: (Growing | undefined)[] = []
  const order: number[] = []
  // The first type seen gets room for every line; others start small and double as needed.
  let estimate = Math.max(16, estimateRecordCount(text))
  while (next(cur)) {
    const id = id_(cur)
    if (cur.status !== OK) failField(cur, 'id', 'id')
    if (!comma(cur)) fail(cur, 'column-count', `expected at least id,type and the nodes, found ${countFieldsOfLine(cur)} field`, undefined, id)
    skip(cur)
    const t = matchType(cur.text, cur.tokStart, cur.tokEnd)
    if (t < 0) {
      const tok = tokenText(cur)
      fail(cur, 'unknown-type', `${tok === '' ? 'empty element type' : `unknown element type "${tok}"`}; known types: ${ELEMENT_TYPE_NAMES.join(', ')}`, 'type', id)
    }
    const type = TYPE_NAMES[t]
    let part = 0
    if (hasPart) {
      if (!comma(cur)) fail(cur, 'column-count', 'the row ends before the part column', 'part', id)
      part = count_(cur)
      if (cur.status !== OK) failField(cur, 'part', 'part', id)
    }
    let g = byType[t]
    if (!g) {
      const nn0 = elementType(type).nodeCount
      g = { nodeIds: new Int32Array(estimate * nn0), ids: new Int32Array(estimate), part: new Int32Array(hasPart ? estimate : 0), lines: new Int32Array(estimate), count: 0 }
      byType[t] = g
      order.push(t)
      estimate = 1024
    }
    const nn = NODE_COUNTS[t]
    if (g.count === g.ids.length) {
      const cap = 2 * g.count
      g.ids = growInt(g.ids, cap); g.lines = growInt(g.lines, cap); g.nodeIds = growInt(g.nodeIds, cap * nn)
      if (hasPart) g.part = growInt(g.part, cap)
    }
    const base = g.count * nn
    const nodeIds = g.nodeIds
    // Fast path for the usual ",digits" fields: parsed here without a call per field. A field it
    // does not take as is (blanks, signs, decimals, out of range, a bad end) is left to readId
    // below from that field on, so results and messages are the same.
    let k = 0
    let p = cur.pos
    while (k < nn && p < textLen && text.charCodeAt(p) === CH_COMMA) {
      let q = p + 1, v = 0, nd = 0
      let c = q < textLen ? text.charCodeAt(q) : -1
      while (c >= CH_0 && c <= CH_9 && nd < 10) { v = v * 10 + (c - CH_0); nd++; c = ++q < textLen ? text.charCodeAt(q) : -1 }
      if (nd === 0 || v < 1 || v > MAX_ID || !(c === CH_COMMA || c === CH_LF || c === CH_CR || c === -1)) break
      nodeIds[base + k] = v
      k++
      p = q
    }
    cur.pos = p
    while (comma(cur)) {
      if (k === nn) {
        const found = countFieldsOfLine(cur) - firstNode
        fail(cur, 'node-count', `${type} has ${nn} nodes, the row lists ${found}`, undefined, id)
      }
      const nid = id_(cur)
      if (cur.status !== OK) failField(cur, `n${k + 1}`, 'id', id)
      nodeIds[base + k] = nid
      k++
    }
    if (!lineEnd(cur)) fail(cur, 'not-a-number', `unexpected text "${tokenText(cur)}"`, undefined, id)
    if (k !== nn) fail(cur, 'node-count', `${type} has ${nn} nodes, the row lists ${k}`, undefined, id)
    g.ids[g.count] = id
    if (hasPart) g.part[g.count] = part
    g.lines[g.count] = cur.line
    g.count++
    finish(cur)
  }
  if (order.length === 0) throw new InputError('no-elements', 'the file has a header but no element rows', where)
  return order.map((t) => {
    const g = byType[t]!
    const type = ELEMENT_TYPE_NAMES[t]
    const nn = elementType(type).nodeCount
    return {
      type,
      nodeIds: fitInt(g.nodeIds, g.count * nn),
      ids: fitInt(g.ids, g.count),
      part: hasPart ? fitInt(g.part, g.count) : null,
      lines: fitInt(g.lines, g.count),
    }
  })
}

const CH_LF = 10, CH_CR = 13, CH_COMMA = 44, CH_0 = 48, CH_9 = 57
/** Largest id (2^31 - 1), as readId accepts. */
const MAX_ID = 2147483647

/** Type names and node counts by index, module constants (no getter per row, see readNumericTable). */
const TYPE_NAMES: readonly ElementTypeName[] = [...ELEMENT_TYPE_NAMES]
const NODE_COUNTS: readonly number[] = TYPE_NAMES.map((t) => elementType(t).nodeCount)

/** Index into ELEMENT_TYPE_NAMES of the type token text[s, e) (case-insensitive, optional quotes), or -1. */
function matchType(text: string, s: number, e: number): number {
  if (e - s >= 2 && text.charCodeAt(s) === 34 && text.charCodeAt(e - 1) === 34) { s++; e-- }
  const n = e - s
  outer: for (let t = 0; t < TYPE_NAMES.length; t++) {
    const name = TYPE_NAMES[t]
    if (name.length !== n) continue
    for (let i = 0; i < n; i++) {
      let c = text.charCodeAt(s + i)
      if (c >= 65 && c <= 90) c += 32
      if (c !== name.charCodeAt(i)) continue outer
    }
    return t
  }
  return -1
}
