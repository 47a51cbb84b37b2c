/**
 * The native binary container (file extension `.tractus`), our own layout:
 *
 *   bytes 0..7    magic "TRACTUS\0"
 *   bytes 8..11   uint32 LE format version (2; version 1 still reads)
 *   bytes 12..15  uint32 LE byte length H of the header
 *   bytes 16..    H bytes of UTF-8 JSON header
 *   zero padding to a multiple of 8, then the arrays, each starting at a multiple of 8 bytes
 *   (offsets are absolute from the start of the file), little-endian.
 *
 * Header: {format, name, description, units, bodyForce, warnings, nodeCount, elementCount,
 * blocks: [{type, count}], arrays: [{name, dtype, offset, length}], and from version 2
 * fields: [{kind, case, layout, count, offset}], parts} with `length` in elements.
 * Arrays: coords (f64, 3N), nodeIds (i32, N), and per block k: blockK.conn (i32, count·nodes),
 * blockK.ids (i32, count), blockK.part (i32, count, optional).
 * Fields (version 2): each entry of the field table is one stress (6 numbers a row) or
 * displacement (3 a row) field of one load case (`case` "default" for a model without cases),
 * `count` rows of f64 starting at byte `offset`; the bytes are also an entry of `arrays` (the
 * writer names them "stress" and "displacement"), so the table's checks of range, alignment and
 * overlap cover them. Layout "nodal": a row per node, in node order. Layout "elementNodal": a
 * row per element and node, in the order of the connectivity (block by block, element by
 * element, local node by local node), so no index array is stored: count = Σ blocks' count ·
 * nodes. `parts` is model.json's "parts" object ({"1": "name"} or {"1": {"name", "bodyForce"}}).
 * Version 1 has no field table: its arrays "stress" (6N) and "displacement" (3N) are nodal.
 * README.md describes the layout for users ("The `.tractus` container").
 *
 * The reader trusts nothing in the header: every field, range, alignment, count and value is
 * checked, and problems are InputErrors naming the header field. Arrays are zero-copy views on the
 * given buffer where possible (little-endian platform, aligned buffer), so the Model shares memory
 * with it; the reader never writes into the buffer (a block with inverted elements is copied first).
 */
import { createMesh } from '../model/createMesh.ts'
import type { BlockInput } from '../model/createMesh.ts'
import { elementType, isElementTypeName } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { InputErrorKind } from '../model/errors.ts'
import type { Model, PartInfo } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import { checkBlockOrientation, reorientElements, reorientedWarning } from './elementOrientation.ts'
import { firstIndexOutside } from './indexRange.ts'
import { buildIdIndex, isDuplicate, isStrictlyAscending } from './idIndex.ts'
import { DTYPE_SIZE, isDtype, readLittleEndian, writeLittleEndian } from './littleEndianArrays.ts'
import type { Dtype } from './littleEndianArrays.ts'
import { readModelMeta } from './modelJson.ts'
import { isUnitsWarning, unitsWarning } from './intakeReport.ts'
import type { ReadModel } from './intakeReport.ts'
import { checkQuadraticBlock, quadraticFindingMessage } from './quadraticElementChecks.ts'
import { partAveragedStress } from '../model/stressField.ts'
import type { Combination, LoadCase } from '../model/loadCases.ts'
import { CASE_NAME, checkCombination } from '../model/loadCases.ts'
import type { Vec3 } from '../model/model.ts'

/** "TRACTUS" and a zero byte. */
export const NATIVE_MAGIC = new Uint8Array([0x54, 0x52, 0x41, 0x43, 0x54, 0x55, 0x53, 0x00])
export const NATIVE_VERSION = 2
/** Versions this reader reads. */
export const NATIVE_READABLE_VERSIONS: readonly number[] = [1, 2]
export const NATIVE_EXTENSION = '.tractus'
/** Bytes before the header: magic, version, header length. */
export const NATIVE_PREAMBLE_BYTES = 16
const FORMAT_TAG = 'tractus-model'

interface ArrayEntry {
  name: string
  dtype: Dtype
  offset: number
  length: number
}

/** True when the bytes start with the container's magic. */
export function isNativeContainer(bytes: Uint8Array): boolean {
  if (bytes.length < NATIVE_MAGIC.length) return false
  for (let i = 0; i < NATIVE_MAGIC.length; i++) if (bytes[i] !== NATIVE_MAGIC[i]) return false
  return true
}

const align8 = (n: number): number => Math.ceil(n / 8) * 8

/** One entry of the version-2 field table (see the file's opening comment). */
export interface FieldEntry {
  readonly kind: 'stress' | 'displacement'
  readonly case: string
  readonly layout: 'nodal' | 'elementNodal'
  readonly count: number
  readonly offset: number
}

/** The case name of a model without load cases in the field table. */
export const DEFAULT_CASE = 'default'

export interface WriteNativeOptions {
  /** Format version to write (default NATIVE_VERSION); 1 only for nodal stress, for readers of version 1. */
  readonly version?: 1 | 2
}

/**
 * The values of an element-nodal field in the order of the connectivity (row i of the result is
 * element-node i counted over the blocks), so the container needs no index array.
 */
export function elementNodalValuesInOrder(field: StressField): Float64Array {
  let total = 0
  for (const r of field.rows) total += r.length
  const out = new Float64Array(6 * total)
  const v = field.values
  let at = 0
  for (const rows of field.rows) {
    for (let i = 0; i < rows.length; i++, at += 6) {
      const r = 6 * rows[i]
      out[at] = v[r]; out[at + 1] = v[r + 1]; out[at + 2] = v[r + 2]; out[at + 3] = v[r + 3]; out[at + 4] = v[r + 4]; out[at + 5] = v[r + 5]
    }
  }
  return out
}

/** model.json's "parts" object for part infos (a name alone where a part has no body force of its own). */
export function partsJson(parts: readonly PartInfo[]): Record<string, string | { name: string; bodyForce: readonly number[] }> {
  return Object.fromEntries(parts.map((p) => [String(p.part), p.bodyForce ? { name: p.name, bodyForce: p.bodyForce } : p.name]))
}

export function writeNative(model: Model, options: WriteNativeOptions = {}): Uint8Array {
  const version = options.version ?? NATIVE_VERSION
  const { mesh } = model
  const field = model.stressField
  if (version === 1 && field) throw new RangeError('a version-1 container holds nodal stress only; write version 2 for element-nodal stress')
  const stressValues = field ? elementNodalValuesInOrder(field) : model.stress
  const arrays: { name: string; data: Float64Array | Int32Array }[] = [
    { name: 'coords', data: mesh.coords },
    { name: 'nodeIds', data: mesh.nodeIds },
    { name: 'stress', data: stressValues },
  ]
  if (model.displacement) arrays.push({ name: 'displacement', data: model.displacement })
  mesh.blocks.forEach((b, k) => {
    arrays.push({ name: `block${k}.conn`, data: b.conn }, { name: `block${k}.ids`, data: b.ids })
    if (b.part) arrays.push({ name: `block${k}.part`, data: b.part })
  })
  // --- load cases: the first case's fields are "stress" and "displacement" above, case i's "stress.i" and "displacement.i" ---
  const cases = version >= 2 && model.cases && model.cases.length ? model.cases : []
  if (cases.some((c, i) => i > 0 && !c.stressField !== !field)) throw new RangeError('every load case of a model has the same stress layout (nodal or element-nodal)')
  cases.forEach((c, i) => {
    if (i === 0) return
    arrays.push({ name: `stress.${i}`, data: c.stressField ? elementNodalValuesInOrder(c.stressField) : c.stress })
    if (c.displacement) arrays.push({ name: `displacement.${i}`, data: c.displacement })
  })
  const headerBase = {
    format: FORMAT_TAG,
    name: model.name,
    description: model.description,
    units: declaredUnits(model),
    bodyForce: model.bodyForce,
    warnings: model.warnings,
    nodeCount: mesh.nodeCount,
    elementCount: mesh.elementCount,
    blocks: mesh.blocks.map((b) => ({ type: b.type, count: b.ids.length })),
    ...(version >= 2 && model.parts && model.parts.length ? { parts: partsJson(model.parts) } : {}),
    ...(cases.length ? {
      cases: cases.map((c) => ({ name: c.name, description: c.description, bodyForce: c.bodyForce ?? model.bodyForce })),
      combinations: (model.combinations ?? []).map((c) => ({ name: c.name, factors: { ...c.factors } })),
    } : {}),
  }
  // The field table points at the arrays "stress" and "displacement" (indices 2 and 3).
  const fieldsOf = (e: readonly ArrayEntry[]): FieldEntry[] | undefined => version < 2 ? undefined : (cases.length ? cases : [null]).flatMap((c, i) => {
    const s = e.find((x) => x.name === (i === 0 ? 'stress' : `stress.${i}`))!
    const d = e.find((x) => x.name === (i === 0 ? 'displacement' : `displacement.${i}`))
    const name = c ? c.name : DEFAULT_CASE
    return [
      { kind: 'stress' as const, case: name, layout: field ? 'elementNodal' as const : 'nodal' as const, count: s.length / 6, offset: s.offset },
      ...(d ? [{ kind: 'displacement' as const, case: name, layout: 'nodal' as const, count: d.length / 3, offset: d.offset }] : []),
    ]
  })
  const headerOf = (e: readonly ArrayEntry[]) => JSON.stringify({ ...headerBase, arrays: e, ...(version >= 2 ? { fields: fieldsOf(e) } : {}) })
  const enc = new TextEncoder()
  // Offsets depend on the header's length, which depends on the offsets' digits: iterate until
  // the layout is stable (two or three rounds).
  let entries: ArrayEntry[] = arrays.map((a) => ({ name: a.name, dtype: a.data instanceof Float64Array ? 'f64' : 'i32', offset: 0, length: a.data.length }))
  let headerBytes = enc.encode(headerOf(entries))
  for (let round = 0; round < 8; round++) {
    let at = align8(NATIVE_PREAMBLE_BYTES + headerBytes.length)
    const next = entries.map((e) => {
      const o = at
      at = align8(at + e.length * DTYPE_SIZE[e.dtype])
      return { ...e, offset: o }
    })
    const nextBytes = enc.encode(headerOf(next))
    const stable = nextBytes.length === headerBytes.length && next.every((e, i) => e.offset === entries[i].offset)
    entries = next
    headerBytes = nextBytes
    if (stable) break
  }
  const last = entries[entries.length - 1]
  const total = align8(last.offset + last.length * DTYPE_SIZE[last.dtype])
  const out = new Uint8Array(total)
  out.set(NATIVE_MAGIC, 0)
  const dv = new DataView(out.buffer)
  dv.setUint32(8, version, true)
  dv.setUint32(12, headerBytes.length, true)
  out.set(headerBytes, NATIVE_PREAMBLE_BYTES)
  arrays.forEach((a, i) => writeLittleEndian(out, entries[i].offset, a.data))
  return out
}

export interface ReadNativeOptions {
  /** Copy arrays out of the buffer instead of viewing it (default false: zero-copy). */
  readonly copy?: boolean
}

/**
 * The units a model declared: a model read from files whose units nobody declared keeps them
 * undeclared in the container (the header leaves them out), so its reader warns again.
 */
function declaredUnits(model: Model): Partial<Model['units']> {
  const sources = (model as Partial<ReadModel>).intake?.unitSources
  if (!sources) return model.units
  const out: { length?: Model['units']['length']; stress?: Model['units']['stress'] } = {}
  if (sources.length !== 'default') out.length = model.units.length
  if (sources.stress !== 'default') out.stress = model.units.stress
  return out
}

export function readNative(buf: ArrayBuffer | Uint8Array, fileName = 'model.tractus', options: ReadNativeOptions = {}): ReadModel {
  const bytes = buf instanceof Uint8Array ? buf : new Uint8Array(buf)
  const fail = (kind: InputErrorKind, field: string, message: string, elementId?: number): never => {
    throw new InputError(kind, message, { file: fileName, field, elementId })
  }
  const size = bytes.length
  if (size === 0) throw new InputError('empty-file', 'the file is empty', { file: fileName })
  if (size < NATIVE_PREAMBLE_BYTES) fail('container', 'magic', `only ${size} bytes: too short for a Tractus container (${NATIVE_EXTENSION})`)
  if (!isNativeContainer(bytes)) fail('container', 'magic', `does not start with the Tractus container magic "TRACTUS\\0"; is it a ${NATIVE_EXTENSION} file?`)
  const dv = new DataView(bytes.buffer, bytes.byteOffset, size)
  const version = dv.getUint32(8, true)
  if (!NATIVE_READABLE_VERSIONS.includes(version)) fail('version', 'version', `format version ${version} is not supported; this reader reads versions ${NATIVE_READABLE_VERSIONS.join(' and ')}: write the container again with this version of Tractus, or open it with the version that wrote it`)
  const headerLength = dv.getUint32(12, true)
  if (headerLength === 0 || NATIVE_PREAMBLE_BYTES + headerLength > size) fail('container', 'headerLength', `header length ${headerLength} does not fit in the file of ${size} bytes`)
  let text = ''
  try {
    const head = bytes.subarray(NATIVE_PREAMBLE_BYTES, NATIVE_PREAMBLE_BYTES + headerLength)
    // a browser's decoder refuses shared memory (a file read straight into it): the header's copy
    text = new TextDecoder('utf-8', { fatal: true }).decode(head.buffer instanceof ArrayBuffer ? head : head.slice())
  } catch {
    fail('container', 'header', 'the header is not valid UTF-8 text')
  }
  let header: unknown
  try {
    header = JSON.parse(text)
  } catch (e) {
    fail('bad-json', 'header', `the header is not valid JSON (${e instanceof Error ? e.message : String(e)})`)
  }
  if (typeof header !== 'object' || header === null || Array.isArray(header)) fail('container', 'header', 'the header is not a JSON object')
  const h = header as Record<string, unknown>
  if (h.format !== FORMAT_TAG) fail('container', 'format', `format is ${JSON.stringify(h.format)}, expected "${FORMAT_TAG}"`)
  if (version < 2 && (h.fields !== undefined || h.parts !== undefined)) fail('container', h.fields !== undefined ? 'fields' : 'parts', `a version-1 container has no ${h.fields !== undefined ? 'field table' : 'part names'}; the file says version 1 but was written as version 2: write it again`)
  const meta = readModelMeta(fileName, { name: h.name, description: h.description, units: h.units, bodyForce: h.bodyForce, ...(h.parts !== undefined ? { parts: h.parts } : {}) }, '')
  if (typeof h.name !== 'string') fail('container', 'name', 'name must be a string')
  let warnings: string[] = []
  if (h.warnings !== undefined) {
    if (!Array.isArray(h.warnings) || !h.warnings.every((w) => typeof w === 'string')) fail('container', 'warnings', 'warnings must be a list of strings')
    warnings = [...(h.warnings as string[])]
  }
  const count = (field: string, v: unknown, min: number): number => {
    if (typeof v !== 'number' || !Number.isSafeInteger(v) || v < min) fail('container', field, `${field} must be an integer ≥ ${min}, got ${JSON.stringify(v)}`)
    return v as number
  }
  const N = count('nodeCount', h.nodeCount, 1)
  const E = count('elementCount', h.elementCount, 1)
  if (!Array.isArray(h.blocks) || h.blocks.length === 0) fail('container', 'blocks', 'blocks must be a non-empty list of {type, count}')
  const blocks = (h.blocks as unknown[]).map((b, k) => {
    if (typeof b !== 'object' || b === null) fail('container', `blocks[${k}]`, 'each block must be an object {type, count}')
    const r = b as Record<string, unknown>
    if (typeof r.type !== 'string' || !isElementTypeName(r.type)) fail('unknown-type', `blocks[${k}].type`, `unknown element type ${JSON.stringify(r.type)}`)
    return { type: r.type as ElementTypeName, count: count(`blocks[${k}].count`, r.count, 1) }
  })
  const sum = blocks.reduce((s, b) => s + b.count, 0)
  if (sum !== E) fail('container', 'elementCount', `elementCount is ${E}, the blocks hold ${sum}`)

  // The array table: every entry in range, aligned, not overlapping, known dtype.
  if (!Array.isArray(h.arrays)) fail('container', 'arrays', 'arrays must be a list of {name, dtype, offset, length}')
  const dataStart = NATIVE_PREAMBLE_BYTES + headerLength
  const table = new Map<string, ArrayEntry>()
  ;(h.arrays as unknown[]).forEach((a, i) => {
    const f = `arrays[${i}]`
    if (typeof a !== 'object' || a === null) fail('container', f, 'each array entry must be an object {name, dtype, offset, length}')
    const r = a as Record<string, unknown>
    if (typeof r.name !== 'string') fail('container', `${f}.name`, 'name must be a string')
    const name = r.name as string
    if (table.has(name)) fail('container', `${f}.name`, `array "${name}" is listed twice`)
    if (!isDtype(r.dtype)) fail('container', `${f}.dtype`, `unknown dtype ${JSON.stringify(r.dtype)} for array "${name}"; known: f64, i32`)
    const dtype = r.dtype as Dtype
    const offset = count(`${f}.offset`, r.offset, 0)
    const length = count(`${f}.length`, r.length, 0)
    if (offset % 8 !== 0) fail('container', `${f}.offset`, `array "${name}" starts at byte ${offset}, not a multiple of 8`)
    if (offset < dataStart) fail('container', `${f}.offset`, `array "${name}" starts at byte ${offset}, inside the header (data starts at ${dataStart})`)
    if (offset + length * DTYPE_SIZE[dtype] > size) fail('container', `${f}.length`, `array "${name}" (${length} × ${dtype} from byte ${offset}) runs past the end of the file (${size} bytes)`)
    table.set(name, { name, dtype, offset, length })
  })
  const sorted = [...table.values()].sort((a, b) => a.offset - b.offset)
  for (let i = 1; i < sorted.length; i++) {
    const p = sorted[i - 1]
    if (p.offset + p.length * DTYPE_SIZE[p.dtype] > sorted[i].offset) fail('container', 'arrays', `arrays "${p.name}" and "${sorted[i].name}" overlap`)
  }
  const take = <T extends Float64Array | Int32Array>(name: string, dtype: Dtype, length: number, optional = false): T | null => {
    const e = table.get(name)
    if (!e) {
      if (optional) return null
      fail('container', 'arrays', `array "${name}" is missing`)
    }
    const en = e as ArrayEntry
    if (en.dtype !== dtype) fail('container', name, `array "${name}" has dtype ${en.dtype}, expected ${dtype}`)
    if (en.length !== length) fail('container', name, `array "${name}" has ${en.length} elements, expected ${length} for the counts in the header`)
    return readLittleEndian(bytes, en.offset, en.length, dtype, !options.copy) as T
  }
  const coords = take<Float64Array>('coords', 'f64', 3 * N)!
  const nodeIds = take<Int32Array>('nodeIds', 'i32', N)!
  // Element-node rows in connectivity order (version 2, layout elementNodal).
  let elementNodeRows = 0
  for (const b of blocks) elementNodeRows += b.count * elementType(b.type).nodeCount
  const fields = version >= 2 ? readFieldTable(h.fields, table, N, elementNodeRows, fail) : null
  const stressEntry = fields ? fields.stress : table.get('stress')
  const stressName = stressEntry?.name ?? 'stress'
  const elementNodal = fields?.stressLayout === 'elementNodal'
  const stress = take<Float64Array>(stressName, 'f64', 6 * (elementNodal ? elementNodeRows : N))!
  const displacement = take<Float64Array>(fields?.displacement?.name ?? 'displacement', 'f64', 3 * N, fields ? fields.displacement === null : true)
  const finite = (a: Float64Array, field: string, width: number) => {
    for (let i = 0; i < a.length; i++) {
      if (!Number.isFinite(a[i])) fail('not-finite', field, `node ${nodeIds[(i / width) | 0]} has a non-finite value (${a[i]}) at index ${i}`)
    }
  }
  checkIds(nodeIds, 'nodeIds', 'node', fail)
  finite(coords, 'coords', 3)
  if (!elementNodal) finite(stress, stressName, 6)
  else {
    for (let i = 0; i < stress.length; i++) {
      if (!Number.isFinite(stress[i])) fail('not-finite', stressName, `element-node row ${(i / 6) | 0} has a non-finite value (${stress[i]}) at index ${i}`)
    }
  }
  if (displacement) finite(displacement, 'displacement', 3)

  // All block arrays are checked against the file before anything is allocated from the counts.
  const blockArrays = blocks.map((b, k) => ({
    conn: take<Int32Array>(`block${k}.conn`, 'i32', b.count * elementType(b.type).nodeCount)!,
    ids: take<Int32Array>(`block${k}.ids`, 'i32', b.count)!,
    part: take<Int32Array>(`block${k}.part`, 'i32', b.count, true),
  }))
  const blockInputs: BlockInput[] = []
  // Element ids ascending within and across blocks are unique; only otherwise are they gathered
  // into one array and indexed.
  let idsAscending = true
  let lastId = 0
  for (const { ids } of blockArrays) {
    if (ids.length && (ids[0] <= lastId || !isStrictlyAscending(ids))) { idsAscending = false; break }
    if (ids.length) lastId = ids[ids.length - 1]
  }
  const allIds = idsAscending ? null : new Int32Array(E)
  const invertedIds: number[] = []
  let invertedTotal = 0
  let at = 0
  const rowsOf: Int32Array[] = []
  let rowAt = 0
  blocks.forEach((b, k) => {
    const nn = elementType(b.type).nodeCount
    const { ids, part } = blockArrays[k]
    let conn = blockArrays[k].conn
    // The node range is checked in the orientation pass (it reads every index); when that pass
    // stops early (an index outside, a degenerate element) the whole block's indices are scanned,
    // so the findings keep their order: index, part, degenerate element.
    const o = checkBlockOrientation(coords, b.type, conn, N)
    if (o.outside || o.degenerate >= 0) {
      const bad = firstIndexOutside(conn, N)
      if (bad >= 0) fail('missing-node', `block${k}.conn`, `node index ${conn[bad]} is outside 0..${N - 1}`, ids[(bad / nn) | 0])
    }
    if (part) for (let i = 0; i < part.length; i++) if (part[i] < 0) fail('bad-id', `block${k}.part`, `part ${part[i]} is negative`, ids[i])
    if (allIds) allIds.set(ids, at)
    at += b.count
    if (o.degenerate >= 0) fail('zero-volume', `block${k}.conn`, `degenerate ${b.type} element: volume ${o.degenerateVolume.toPrecision(3)} is about zero for its size ${o.degenerateSize.toPrecision(3)}`, ids[o.degenerate])
    let rows: Int32Array | null = null
    if (elementNodal) {
      rows = new Int32Array(conn.length)
      for (let i = 0; i < rows.length; i++) rows[i] = rowAt + i
      rowAt += rows.length
    }
    if (o.inverted.length) {
      // Never write into the caller's buffer: fix a private copy. Element-node rows follow
      // their nodes.
      conn = conn.slice()
      reorientElements(conn, b.type, o.inverted)
      if (rows) reorientElements(rows, b.type, o.inverted)
      for (let i = 0; i < o.inverted.length && invertedIds.length < 10; i++) invertedIds.push(ids[o.inverted[i]])
      invertedTotal += o.inverted.length
    }
    const q = checkQuadraticBlock(coords, b.type, conn)
    if (q) fail(q.kind === 'mid-edge' ? 'mid-edge-node' : 'negative-jacobian', `block${k}.conn`, quadraticFindingMessage(q, b.type, conn, nodeIds), ids[q.element])
    blockInputs.push({ type: b.type, conn, ids, part })
    if (rows) rowsOf.push(rows)
  })
  if (allIds) checkIds(allIds, 'block ids', 'element', fail)
  else if (blockArrays[0].ids[0] < 1) fail('bad-id', 'block ids', `element id ${blockArrays[0].ids[0]} at index 0 is not positive`)
  if (invertedTotal) warnings.push(`${fileName}: ${reorientedWarning(invertedIds, invertedTotal)}`)
  const unitSources = { length: meta.declaredUnits.length ? 'container' : 'default', stress: meta.declaredUnits.stress ? 'container' : 'default' } as const
  const unitsText = unitsWarning(meta.units, unitSources, 'native')
  // A container written from such a model carries the bundle's warning already.
  if (unitsText && !warnings.some(isUnitsWarning)) warnings.push(unitsText)
  const mesh = createMesh(coords, blockInputs, nodeIds)
  const stressField: StressField | null = elementNodal ? { values: stress, rows: rowsOf, layout: 'element-nodal' } : null
  const shown = stressField ? partAveragedStress(mesh, stressField) : stress
  // --- load cases ---
  const loadCases = fields && (fields.cases.length > 1 || h.cases !== undefined)
    ? containerCases(h, fields, fileName, { stress: shown, stressField, displacement }, meta.bodyForce, (entry, width, rows) => {
      const a = take<Float64Array>(entry.name, 'f64', width * rows)!
      for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i])) fail('not-finite', entry.name, `row ${(i / width) | 0} has a non-finite value (${a[i]}) at index ${i}`)
      return a
    }, (values) => {
      const f: StressField = { values, rows: rowsOf, layout: 'element-nodal' }
      return { stress: partAveragedStress(mesh, f), stressField: f }
    }, elementNodal ? elementNodeRows : N, N)
    : null
  return {
    name: meta.name ?? '',
    description: meta.description,
    units: meta.units,
    mesh,
    stress: shown,
    ...(stressField ? { stressField } : {}),
    displacement,
    bodyForce: meta.bodyForce,
    ...(meta.parts ? { parts: meta.parts } : {}),
    ...(loadCases ? { cases: loadCases.cases, combinations: loadCases.combinations, bodyForce: loadCases.cases[0].bodyForce ?? meta.bodyForce } : {}),
    warnings,
    intake: { format: 'native', files: [], unitSources, unitsDeclared: unitsText === null, unitsWarning: unitsText },
  }
}

function checkIds(ids: Int32Array, field: string, what: string, fail: (kind: InputErrorKind, field: string, message: string, elementId?: number) => never): void {
  for (let i = 0; i < ids.length; i++) if (ids[i] < 1) fail('bad-id', field, `${what} id ${ids[i]} at index ${i} is not positive`)
  if (isStrictlyAscending(ids)) return
  const ix = buildIdIndex(ids)
  if (isDuplicate(ix)) fail('duplicate-id', field, `${what} id ${ix.id} appears twice (indices ${ix.firstRow} and ${ix.secondRow})`)
}

/** The stress and displacement fields of a version-2 field table, each pointing at an entry of the array table. */
interface FieldTable {
  readonly stress: ArrayEntry
  readonly stressLayout: 'nodal' | 'elementNodal'
  readonly displacement: ArrayEntry | null
  // --- load cases: every case of the table in order (the first is the one above) ---
  readonly cases: readonly { readonly name: string; readonly stress: ArrayEntry; readonly displacement: ArrayEntry | null; readonly at: string }[]
}

function readFieldTable(value: unknown, arrays: ReadonlyMap<string, ArrayEntry>, N: number, elementNodeRows: number, failWith: (kind: InputErrorKind, field: string, message: string) => never): FieldTable {
  // Nothing but a damaged file or another writer makes these: the fix is to write it again.
  const fail = (kind: InputErrorKind, field: string, message: string): never =>
    failWith(kind, field, /write the container again/.test(message) ? message : `${message}; the field table is damaged: write the container again from the model's files`)
  const how = 'fields must list {kind, case, layout, count, offset} (kind "stress" or "displacement", layout "nodal" or "elementNodal")'
  if (!Array.isArray(value) || value.length === 0) fail('container', 'fields', `${how}; it is ${value === undefined ? 'missing' : 'empty or not a list'}: write the container again`)
  const byOffset = new Map<number, ArrayEntry>()
  for (const e of arrays.values()) byOffset.set(e.offset, e)
  let stress: { entry: ArrayEntry; layout: 'nodal' | 'elementNodal'; case: string } | null = null
  let displacement: { entry: ArrayEntry; case: string } | null = null
  const cases: { name: string; stress: ArrayEntry | null; displacement: ArrayEntry | null; at: string }[] = []
  ;(value as unknown[]).forEach((f, i) => {
    const at = `fields[${i}]`
    if (typeof f !== 'object' || f === null || Array.isArray(f)) fail('container', at, how)
    const r = f as Record<string, unknown>
    if (r.kind !== 'stress' && r.kind !== 'displacement') fail('container', `${at}.kind`, `kind ${JSON.stringify(r.kind)} is not "stress" or "displacement"`)
    if (typeof r.case !== 'string' || r.case === '') fail('container', `${at}.case`, `case must be a non-empty name ("${DEFAULT_CASE}" for a model without load cases), got ${JSON.stringify(r.case)}`)
    if (r.layout !== 'nodal' && r.layout !== 'elementNodal') fail('container', `${at}.layout`, `layout ${JSON.stringify(r.layout)} is not "nodal" or "elementNodal"`)
    if (r.kind === 'displacement' && r.layout !== 'nodal') fail('container', `${at}.layout`, 'a displacement field is nodal (one row per node)')
    const rows = r.layout === 'nodal' ? N : elementNodeRows
    if (r.count !== rows) fail('container', `${at}.count`, `count ${JSON.stringify(r.count)} does not match the mesh: a ${r.layout} field has ${rows} rows (${r.layout === 'nodal' ? 'one per node' : 'one per element and node'})`)
    const entry = typeof r.offset === 'number' ? byOffset.get(r.offset) : undefined
    if (!entry) fail('container', `${at}.offset`, `offset ${JSON.stringify(r.offset)} is not the start of an array of the array table`)
    const e = entry as ArrayEntry
    const width = r.kind === 'stress' ? 6 : 3
    if (e.dtype !== 'f64' || e.length !== rows * width) fail('container', `${at}.offset`, `the array "${e.name}" at offset ${e.offset} holds ${e.length} × ${e.dtype}, the field needs ${rows * width} × f64`)
    // The model shows the first stress field and the displacement of its case.
    if (r.kind === 'stress' && !stress) stress = { entry: e, layout: r.layout as 'nodal' | 'elementNodal', case: r.case as string }
    if (r.kind === 'displacement' && !displacement) displacement = { entry: e, case: r.case as string }
    // --- load cases: one stress field per case, all in one layout; a displacement per case at most ---
    const name = r.case as string
    const c = cases.find((x) => x.name.toLowerCase() === name.toLowerCase())
    if (r.kind === 'stress') {
      if (c?.stress) fail('container', `${at}.case`, `case "${name}" has two stress fields`)
      if (stress && (stress as { layout: string }).layout !== r.layout) fail('container', `${at}.layout`, `every case's stress has one layout; case "${name}" is ${r.layout}, the first ${(stress as { layout: string }).layout}`)
      if (c) c.stress = e; else cases.push({ name, stress: e, displacement: null, at })
    } else {
      if (c?.displacement) fail('container', `${at}.case`, `case "${name}" has two displacement fields`)
      if (c) c.displacement = e; else cases.push({ name, stress: null, displacement: e, at })
    }
  })
  for (const c of cases) if (!c.stress) fail('container', `${c.at}.case`, `case "${c.name}" has a displacement but no stress field`)
  const s = stress as { entry: ArrayEntry; layout: 'nodal' | 'elementNodal'; case: string } | null
  if (!s) fail('container', 'fields', 'the field table has no stress field; write the container again')
  const d = displacement as { entry: ArrayEntry; case: string } | null
  return {
    stress: s!.entry, stressLayout: s!.layout, displacement: d && d.case === s!.case ? d.entry : null,
    cases: cases.map((c) => ({ name: c.name, stress: c.stress!, displacement: c.displacement, at: c.at })),
  }
}

/**
 * The load cases of a version-2 container: one per case of the field table, in its order, with
 * the header's "cases" (name, description, bodyForce: the names must be the table's, in its
 * order) and "combinations" (checked like model.json's). `read` takes a field's array (checked
 * finite); `elementNodal` makes a case's field and display stress from its values.
 */
function containerCases(
  h: Record<string, unknown>, fields: FieldTable, file: string,
  first: { stress: Float64Array; stressField: StressField | null; displacement: Float64Array | null }, modelBodyForce: Vec3,
  read: (entry: ArrayEntry, width: number, rows: number) => Float64Array,
  elementNodal: (values: Float64Array) => { stress: Float64Array; stressField: StressField }, stressRows: number, N: number,
): { cases: LoadCase[]; combinations: Combination[] } {
  const bad = (field: string, message: string): never => { throw new InputError('container', message, { file, field }) }
  const listed = h.cases === undefined ? null : h.cases
  if (listed !== null && (!Array.isArray(listed) || listed.length !== fields.cases.length)) bad('cases', `cases must list the ${fields.cases.length} cases of the field table (${fields.cases.map((c) => c.name).join(', ')}) in its order`)
  const cases: LoadCase[] = fields.cases.map((c, i) => {
    if (!CASE_NAME.test(c.name)) bad(`${c.at}.case`, `"${c.name}" is not a load case name (letters, digits, "-" and "_")`)
    const meta = listed ? (listed as unknown[])[i] as Record<string, unknown> : null
    if (meta && (typeof meta !== 'object' || meta === null || meta.name !== c.name)) bad(`cases[${i}]`, `cases[${i}] must be {"name": "${c.name}", ...}, the field table's case ${i + 1}`)
    if (meta && meta.description !== undefined && typeof meta.description !== 'string') bad(`cases[${i}].description`, 'a case\'s description must be a string')
    let bodyForce: Vec3 | null = null
    if (meta && meta.bodyForce !== undefined) {
      const b = meta.bodyForce
      if (!Array.isArray(b) || b.length !== 3 || !b.every((x) => typeof x === 'number' && Number.isFinite(x))) bad(`cases[${i}].bodyForce`, 'a case\'s bodyForce must be three finite numbers')
      bodyForce = [(b as number[])[0], (b as number[])[1], (b as number[])[2]]
    }
    const description = meta && typeof meta.description === 'string' ? meta.description : ''
    const bf = bodyForce ?? [modelBodyForce[0], modelBodyForce[1], modelBodyForce[2]] as Vec3
    if (i === 0) return { name: c.name, description, bodyForce: bf, stress: first.stress, ...(first.stressField ? { stressField: first.stressField } : {}), displacement: first.displacement }
    const values = read(c.stress, 6, stressRows)
    const s = first.stressField ? elementNodal(values) : { stress: values }
    return { name: c.name, description, bodyForce: bf, ...s, displacement: c.displacement ? read(c.displacement, 3, N) : null }
  })
  const combinations: Combination[] = []
  if (h.combinations !== undefined) {
    if (!Array.isArray(h.combinations)) bad('combinations', 'combinations must be a list of {name, factors}')
    ;(h.combinations as unknown[]).forEach((k, i) => {
      const r = (typeof k === 'object' && k !== null ? k : {}) as Record<string, unknown>
      try {
        combinations.push(checkCombination(cases, { name: r.name, factors: r.factors }, { file, field: `combinations[${i}]` }))
      } catch (e) {
        if (e instanceof InputError) throw new InputError('container', e.message.replace(/^[^:]*field "[^"]*": /, ''), { file, field: `combinations[${i}]` })
        throw e
      }
    })
  }
  return { cases, combinations }
}
