/**
 * Mutations of valid inputs for the fuzz tests: small CSV bundles (as we write them, and in the
 * dialects solvers and spreadsheets write: semicolons and decimal commas, tabs, runs of spaces,
 * quotes, preambles, no header, mapped names, other type names and node orders, extra columns,
 * element-nodal stress in commas and in semicolons with decimal commas) and .tractus containers
 * (nodal and element-nodal), broken by truncation, byte and character flips, line deletion and
 * duplication, row shuffles, column swaps, inserted text, dropped files, header edits, swapped
 * separators and decimal marks, stray or wrapping quotes and edits of model.json's keys. One case
 * = one base input and one to three mutations, all drawn by fast-check so a seed reproduces it.
 */
import fc from 'fast-check'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { writeNative } from '../../src/io/nativeContainer.ts'
import type { InputFile } from '../../src/io/detect.ts'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import { mixedModel } from '../io/testModels.ts'
import { tinyBundle, toFiles } from '../io/tinyBundle.ts'
import { patchNative } from '../io/nativePatch.ts'
import { VARIANTS, bundleOf, variantModel } from '../io/bundleVariants.ts'
import { elementNodalCopy } from '../helpers/elementNodal.ts'

/** `sep` is the separator the base's CSV files were written with. */
type CsvBase = { kind: 'csv'; name: string; files: { name: string; text: string }[]; sep: string }
type NativeBase = { kind: 'native'; name: string; bytes: Uint8Array }
type Base = CsvBase | NativeBase

function makeBases(): Base[] {
  const tiny = toFiles(tinyBundle())
  // One cell per type keeps each case well under a millisecond.
  const mixed = writeCsvBundle(mixedModel(ELEMENT_TYPE_NAMES, 100, true, { nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }))
  const plain = bundleOf(variantModel())
  const dialects: CsvBase[] = DIALECT_BASES.map(([name, sep]) => ({ kind: 'csv', name: `${name} bundle`, files: toFiles(VARIANTS.find((v) => v.name === name)!.make(plain)), sep }))
  // Element-nodal stress (element,node,sxx,...): every type, a row per element and node, also
  // with semicolons and decimal commas.
  const enModel = mixedModel(ELEMENT_TYPE_NAMES, 100, true, { nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 })
  const en = writeCsvBundle({ ...enModel, stressField: elementNodalCopy(enModel.mesh, enModel.stress) })
  const enSemicolon = en.map((f) => (f.name.endsWith('.csv') ? { name: f.name, text: f.text.replace(/,/g, ';').replace(/\./g, ',') } : f))
  return [
    { kind: 'csv', name: 'tiny bundle', files: tiny, sep: ',' },
    { kind: 'csv', name: 'mixed bundle', files: mixed, sep: ',' },
    ...dialects,
    { kind: 'csv', name: 'element-nodal bundle', files: en, sep: ',' },
    { kind: 'csv', name: 'element-nodal semicolon bundle', files: enSemicolon, sep: ';' },
    { kind: 'native', name: 'tiny container', bytes: writeNative(readCsvBundle(tiny)) },
    { kind: 'native', name: 'mixed container', bytes: writeNative(readCsvBundle(mixed)) },
    { kind: 'native', name: 'element-nodal container', bytes: writeNative(readCsvBundle(en)) },
  ]
}

/** The dialect variants fuzzed, with their separators. */
const DIALECT_BASES: readonly (readonly [string, string])[] = [
  ['semicolon-decimal-comma', ';'], ['tab', '\t'], ['spaces', ' '], ['quoted', ','], ['d-exponents', ','], ['preamble', ','],
  ['no-header', ','], ['mapped-names', ','], ['type-names', ','], ['node-order', ','], ['extra-columns', ','], ['first-node-column', ','],
]

export const BASES: readonly Base[] = makeBases()

export type Mutation =
  | { op: 'truncate'; file: number; at: number }
  | { op: 'flip'; file: number; at: number; ch: string }
  | { op: 'deleteLine'; file: number; line: number }
  | { op: 'duplicateLine'; file: number; line: number; to: number }
  | { op: 'shuffleRows'; file: number; seed: number }
  | { op: 'swapColumns'; file: number; a: number; b: number; scope: 'all' | 'header' | 'row'; row: number }
  | { op: 'insert'; file: number; at: number; text: string }
  | { op: 'dropFile'; file: number }
  | { op: 'flipByte'; at: number; xor: number }
  | { op: 'setU32'; at: number; value: number }
  | { op: 'cutBytes'; at: number }
  | { op: 'header'; field: number; value: number | string | null }
  | { op: 'separator'; file: number; at: number; to: string; all: boolean }
  | { op: 'decimal'; file: number; at: number; all: boolean }
  | { op: 'quote'; file: number; at: number; how: 'wrap' | 'open' | 'double' }
  | { op: 'json'; key: number; value: number }

export interface FuzzCase { base: number; mutations: Mutation[] }

const CHARS = ['0', '1', '9', '-', '+', '.', 'e', 'E', 'd', 'D', ',', ';', '\n', '\r', '#', ' ', '\t', 'x', '"', 'N', 'I', '[', ']', '(', ')', '\uFEFF', 'é', '\u0000']
/** model.json keys a 'json' mutation sets or deletes, and the values it sets them to. */
const JSON_KEYS = ['csv.separator', 'csv.decimal', 'csv.skipLines', 'csv.header', 'csv.nodes.skipLines', 'csv.stress.header', 'units', 'units.length', 'columns.nodes.x', 'columns.nodes.id',
  'columns.elements.nodes', 'columns.stress.sxx', 'columns.stress.element', 'columns.stress.node', 'types.tetra4', 'nodeOrder.tet10', 'nodeOrder.hex20', 'files.nodes', 'files.stress', 'csv', 'columns', 'files']
const JSON_VALUES: readonly unknown[] = [undefined, ',', ';', '\t', ' ', 'spaces', '.', 0, 1, 3, -1, 2.5, true, false, 'X', 'n1', 'Node', 'tet4', 'mm', 'nodes.csv', 'stress.csv',
  [0, 1, 2, 3, 4, 5, 6, 7, 9, 8], [1, 0], ['n1', 'n2'], { length: 'mm' }, {}, null]
// Positions drawn without fast-check's bias toward small values, so mutations land anywhere.
const unit = fc.noBias(fc.integer({ min: 0, max: 999999 })).map((i) => i / 1e6)
const file = fc.noBias(fc.nat({ max: 4 }))

const csvMutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constant('truncate' as const), file, at: unit }),
  fc.record({ op: fc.constant('flip' as const), file, at: unit, ch: fc.constantFrom(...CHARS) }),
  fc.record({ op: fc.constant('deleteLine' as const), file, line: unit }),
  fc.record({ op: fc.constant('duplicateLine' as const), file, line: unit, to: unit }),
  fc.record({ op: fc.constant('shuffleRows' as const), file, seed: fc.nat() }),
  fc.record({ op: fc.constant('swapColumns' as const), file, a: fc.nat({ max: 9 }), b: fc.nat({ max: 9 }), scope: fc.constantFrom('all' as const, 'header' as const, 'row' as const), row: unit }),
  fc.record({ op: fc.constant('insert' as const), file, at: unit, text: fc.string({ unit: fc.constantFrom(...CHARS), maxLength: 6 }) }),
  fc.record({ op: fc.constant('dropFile' as const), file }),
  fc.record({ op: fc.constant('separator' as const), file, at: unit, to: fc.constantFrom(',', ';', '\t', ' ', '  ', '|'), all: fc.boolean() }),
  fc.record({ op: fc.constant('decimal' as const), file, at: unit, all: fc.boolean() }),
  fc.record({ op: fc.constant('quote' as const), file, at: unit, how: fc.constantFrom('wrap' as const, 'open' as const, 'double' as const) }),
  fc.record({ op: fc.constant('json' as const), key: fc.nat({ max: JSON_KEYS.length - 1 }), value: fc.nat({ max: JSON_VALUES.length - 1 }) }),
)

const SPECIAL_U32 = [0, 1, 2, 7, 8, 0x7fffffff, 0x80000000, 0xffffffff, 1000000]
const nativeMutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constant('flipByte' as const), at: unit, xor: fc.integer({ min: 1, max: 255 }) }),
  fc.record({ op: fc.constant('setU32' as const), at: unit, value: fc.oneof(fc.constantFrom(...SPECIAL_U32), fc.nat()) }),
  fc.record({ op: fc.constant('cutBytes' as const), at: unit }),
  fc.record({ op: fc.constant('header' as const), field: fc.nat({ max: 40 }), value: fc.oneof(fc.constant(null), fc.integer({ min: -10, max: 1000 }), fc.constantFrom(2 ** 31, 2 ** 40, 2 ** 53, 1e300, 0.5, -0), fc.constantFrom('f64', 'i32', 'f32', 'tet4', 'x', '')) }),
)

const csvBases = BASES.map((b, i) => (b.kind === 'csv' ? i : -1)).filter((i) => i >= 0)
const nativeBases = BASES.map((b, i) => (b.kind === 'native' ? i : -1)).filter((i) => i >= 0)

/** Two CSV cases to one container case, whatever the number of bases of each kind. */
export const fuzzCase: fc.Arbitrary<FuzzCase> = fc.oneof(
  { arbitrary: fc.constantFrom(...csvBases), weight: 2 },
  { arbitrary: fc.constantFrom(...nativeBases), weight: 1 },
).chain((base) =>
  fc.record({
    base: fc.constant(base),
    mutations: fc.array(BASES[base].kind === 'csv' ? csvMutation : nativeMutation, { minLength: 1, maxLength: 3 }),
  }))

function rng(seed: number): () => number {
  let s = seed >>> 0 || 1
  return () => { s ^= s << 13; s >>>= 0; s ^= s >>> 17; s ^= s << 5; s >>>= 0; return s / 4294967296 }
}

function mutateText(text: string, m: Mutation, sep: string): string {
  const lines = () => text.split('\n')
  switch (m.op) {
    case 'truncate': return text.slice(0, Math.floor(m.at * text.length))
    case 'flip': { const i = Math.floor(m.at * text.length); return text.slice(0, i) + m.ch + text.slice(i + 1) }
    case 'insert': { const i = Math.floor(m.at * (text.length + 1)); return text.slice(0, i) + m.text + text.slice(i) }
    case 'deleteLine': { const l = lines(); l.splice(Math.floor(m.line * l.length), 1); return l.join('\n') }
    case 'duplicateLine': { const l = lines(); const s = l[Math.floor(m.line * l.length)]; l.splice(Math.floor(m.to * (l.length + 1)), 0, s); return l.join('\n') }
    case 'shuffleRows': {
      const l = lines()
      const r = rng(m.seed)
      const body = l.slice(1)
      for (let i = body.length - 1; i > 0; i--) { const j = Math.floor(r() * (i + 1)); const t = body[i]; body[i] = body[j]; body[j] = t }
      return [l[0], ...body].join('\n')
    }
    case 'swapColumns': {
      const l = lines()
      const swap = (s: string) => { const f = s.split(sep); if (m.a < f.length && m.b < f.length) { const t = f[m.a]; f[m.a] = f[m.b]; f[m.b] = t } return f.join(sep) }
      if (m.scope === 'header') l[0] = swap(l[0])
      else if (m.scope === 'row') { const i = Math.floor(m.row * l.length); l[i] = swap(l[i]) }
      else for (let i = 0; i < l.length; i++) l[i] = swap(l[i])
      return l.join('\n')
    }
    case 'separator': {
      if (m.all) return text.split(sep).join(m.to)
      const i = text.indexOf(sep, Math.floor(m.at * text.length))
      return i < 0 ? text : text.slice(0, i) + m.to + text.slice(i + sep.length)
    }
    case 'decimal': {
      const swap = (c: string) => (c === '.' ? ',' : c === ',' ? '.' : c)
      if (m.all) return text.replace(/[.,]/g, swap)
      const i = text.slice(Math.floor(m.at * text.length)).search(/[.,]/)
      if (i < 0) return text
      const at = Math.floor(m.at * text.length) + i
      return text.slice(0, at) + swap(text[at]) + text.slice(at + 1)
    }
    case 'quote': {
      const i = Math.floor(m.at * text.length)
      if (m.how === 'open') return text.slice(0, i) + '"' + text.slice(i)
      if (m.how === 'double') return text.slice(0, i) + '""' + text.slice(i)
      // Wrap the field around i: from the separator or line start before it to the one after it.
      const isEnd = (c: string | undefined) => c === undefined || c === '\n' || c === '\r' || c === sep[0]
      let a = i, b = i
      while (a > 0 && !isEnd(text[a - 1])) a--
      while (b < text.length && !isEnd(text[b])) b++
      return text.slice(0, a) + '"' + text.slice(a, b).replace(/"/g, '""') + '"' + text.slice(b)
    }
    default: return text
  }
}

/** Sets (or deletes, for an undefined value) one key path of a model.json text; text that does not parse stays. */
function mutateJson(text: string, m: Extract<Mutation, { op: 'json' }>): string {
  let o: unknown
  try { o = JSON.parse(text) } catch { return text }
  if (!o || typeof o !== 'object' || Array.isArray(o)) return text
  const path = JSON_KEYS[m.key].split('.')
  let at = o as Record<string, unknown>
  for (const k of path.slice(0, -1)) {
    const next = at[k]
    if (!next || typeof next !== 'object' || Array.isArray(next)) at[k] = {}
    at = at[k] as Record<string, unknown>
  }
  const v = JSON_VALUES[m.value]
  if (v === undefined) delete at[path[path.length - 1]]
  else at[path[path.length - 1]] = v
  return JSON.stringify(o)
}

function mutateBytes(bytes: Uint8Array, m: Mutation): Uint8Array {
  switch (m.op) {
    case 'flipByte': { const c = bytes.slice(); if (c.length) c[Math.floor(m.at * c.length)] ^= m.xor; return c }
    case 'setU32': {
      const c = bytes.slice()
      if (c.length < 4) return c
      // Aligned positions hit the preamble and array elements; also the header length itself.
      const at = Math.min(c.length - 4, Math.floor(m.at * (c.length / 4)) * 4)
      new DataView(c.buffer).setUint32(at, m.value >>> 0, true)
      return c
    }
    case 'cutBytes': return bytes.slice(0, Math.floor(m.at * bytes.length))
    case 'header': {
      try {
        return patchNative(bytes, (h) => {
          // Walk the header's leaves in a fixed order and replace the chosen one.
          const leaves: [Record<string, unknown> | unknown[], string | number][] = []
          const walk = (o: unknown) => {
            if (Array.isArray(o)) o.forEach((v, i) => { leaves.push([o, i]); walk(v) })
            else if (o && typeof o === 'object') for (const [k, v] of Object.entries(o)) { leaves.push([o as Record<string, unknown>, k]); walk(v) }
          }
          walk(h)
          if (!leaves.length) return
          const [obj, key] = leaves[m.field % leaves.length]
          if (m.value === null) { if (Array.isArray(obj)) obj.splice(key as number, 1); else delete (obj as Record<string, unknown>)[key as string] }
          else (obj as Record<string | number, unknown>)[key] = m.value
        })
      } catch {
        // The header of an already broken container may not parse: leave it as it is.
        return bytes
      }
    }
    default: return bytes
  }
}

/** The files of a case, ready for readModelFiles. */
export function applyCase(c: FuzzCase): InputFile[] {
  const base = BASES[c.base]
  if (base.kind === 'native') {
    let bytes = base.bytes
    for (const m of c.mutations) bytes = mutateBytes(bytes, m)
    return [{ name: 'model.tractus', data: bytes }]
  }
  let files = base.files.map((f) => ({ ...f }))
  for (const m of c.mutations) {
    if (m.op === 'json') {
      const j = files.findIndex((f) => f.name === 'model.json')
      if (j >= 0) files[j] = { name: files[j].name, text: mutateJson(files[j].text, m) }
      continue
    }
    if (!('file' in m)) continue
    const i = m.file % files.length
    if (m.op === 'dropFile') { files = files.filter((_, k) => k !== i); if (!files.length) break; continue }
    files[i] = { name: files[i].name, text: mutateText(files[i].text, m, base.sep) }
  }
  const enc = new TextEncoder()
  return files.map((f) => ({ name: f.name, data: enc.encode(f.text) }))
}

export function describeCase(c: FuzzCase): string {
  return `${BASES[c.base].name}: ${c.mutations.map((m) => JSON.stringify(m)).join(' then ')}`
}
