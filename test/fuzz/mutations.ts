/**
 * Mutations of valid inputs for the fuzz tests: small CSV bundles and .tractus containers,
 * broken by truncation, byte and character flips, line deletion and duplication, row shuffles,
 * column swaps, inserted text, dropped files and header edits. One case = one base input and one
 * to three mutations, all drawn by fast-check so a seed reproduces a case.
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

type CsvBase = { kind: 'csv'; name: string; files: { name: string; text: string }[] }
type NativeBase = { kind: 'native'; name: string; bytes: Uint8Array }
type Base = CsvBase | NativeBase

function makeBases(): Base[] {
  const tiny = toFiles(tinyBundle())
  // One cell per type keeps each case well under a millisecond.
  const mixed = writeCsvBundle(mixedModel(ELEMENT_TYPE_NAMES, 100, true, { nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }))
  return [
    { kind: 'csv', name: 'tiny bundle', files: tiny },
    { kind: 'csv', name: 'mixed bundle', files: mixed },
    { kind: 'native', name: 'tiny container', bytes: writeNative(readCsvBundle(tiny)) },
    { kind: 'native', name: 'mixed container', bytes: writeNative(readCsvBundle(mixed)) },
  ]
}

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

export interface FuzzCase { base: number; mutations: Mutation[] }

const CHARS = ['0', '1', '9', '-', '+', '.', 'e', 'E', ',', '\n', '\r', '#', ' ', '\t', 'x', '"', 'N', 'I', '\uFEFF', 'é', '\u0000']
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
)

const SPECIAL_U32 = [0, 1, 2, 7, 8, 0x7fffffff, 0x80000000, 0xffffffff, 1000000]
const nativeMutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constant('flipByte' as const), at: unit, xor: fc.integer({ min: 1, max: 255 }) }),
  fc.record({ op: fc.constant('setU32' as const), at: unit, value: fc.oneof(fc.constantFrom(...SPECIAL_U32), fc.nat()) }),
  fc.record({ op: fc.constant('cutBytes' as const), at: unit }),
  fc.record({ op: fc.constant('header' as const), field: fc.nat({ max: 40 }), value: fc.oneof(fc.constant(null), fc.integer({ min: -10, max: 1000 }), fc.constantFrom(2 ** 31, 2 ** 40, 2 ** 53, 1e300, 0.5, -0), fc.constantFrom('f64', 'i32', 'f32', 'tet4', 'x', '')) }),
)

export const fuzzCase: fc.Arbitrary<FuzzCase> = fc.nat({ max: BASES.length - 1 }).chain((base) =>
  fc.record({
    base: fc.constant(base),
    mutations: fc.array(BASES[base].kind === 'csv' ? csvMutation : nativeMutation, { minLength: 1, maxLength: 3 }),
  }))

function rng(seed: number): () => number {
  let s = seed >>> 0 || 1
  return () => { s ^= s << 13; s >>>= 0; s ^= s >>> 17; s ^= s << 5; s >>>= 0; return s / 4294967296 }
}

function mutateText(text: string, m: Mutation): string {
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
      const swap = (s: string) => { const f = s.split(','); if (m.a < f.length && m.b < f.length) { const t = f[m.a]; f[m.a] = f[m.b]; f[m.b] = t } return f.join(',') }
      if (m.scope === 'header') l[0] = swap(l[0])
      else if (m.scope === 'row') { const i = Math.floor(m.row * l.length); l[i] = swap(l[i]) }
      else for (let i = 0; i < l.length; i++) l[i] = swap(l[i])
      return l.join('\n')
    }
    default: return text
  }
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
    if (!('file' in m)) continue
    const i = m.file % files.length
    if (m.op === 'dropFile') { files = files.filter((_, k) => k !== i); if (!files.length) break; continue }
    files[i] = { name: files[i].name, text: mutateText(files[i].text, m) }
  }
  const enc = new TextEncoder()
  return files.map((f) => ({ name: f.name, data: enc.encode(f.text) }))
}

export function describeCase(c: FuzzCase): string {
  return `${BASES[c.base].name}: ${c.mutations.map((m) => JSON.stringify(m)).join(' then ')}`
}
