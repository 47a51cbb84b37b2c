/**
 * Reads a CSV bundle (nodes.csv, elements.csv, stress.csv, optional displacement.csv and
 * model.json, matched by base name, case-insensitively) into a Model. Every problem is an
 * InputError naming file, line and column or element id; nothing half-loaded is returned.
 * Numbers are stored as written: units in model.json label them, they do not convert them.
 * Nodes keep the order of nodes.csv; elements are grouped into one block per type.
 */
import { createMesh } from '../model/createMesh.ts'
import type { BlockInput } from '../model/createMesh.ts'
import { elementType } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { Model } from '../model/model.ts'
import { DEFAULT_UNITS } from '../model/units.ts'
import { readNumericTable } from './csvTable.ts'
import type { NumericTable } from './csvTable.ts'
import { checkBlockOrientation, reorientElements, reorientedWarning } from './elementOrientation.ts'
import { buildIdIndex, isDuplicate, isStrictlyAscending, rowOfId } from './idIndex.ts'
import type { IdIndex } from './idIndex.ts'
import { parseJsonText, readModelMeta } from './modelJson.ts'
import { readElementTable } from './readElementTable.ts'
import type { RawElementBlock } from './readElementTable.ts'
import { MAX_MODEL_BYTES, assertWithinLimit } from './sizeGuard.ts'

export interface CsvFile {
  /** File name, possibly with folders ("run3/nodes.csv"); only the base name matters. */
  readonly name: string
  readonly text: string
}

export interface CsvBundleOptions {
  /** Model name when model.json gives none (default "model"). */
  readonly name?: string
  /** Largest accepted file, in characters (default MAX_MODEL_BYTES). */
  readonly maxBytes?: number
}

export const BUNDLE_FILES = ['nodes.csv', 'elements.csv', 'stress.csv', 'displacement.csv', 'model.json'] as const
export const REQUIRED_BUNDLE_FILES = ['nodes.csv', 'elements.csv', 'stress.csv'] as const
type BundleFile = (typeof BUNDLE_FILES)[number]

export const NODE_COLUMNS = ['id', 'x', 'y', 'z'] as const
export const STRESS_COLUMNS = ['id', 'sxx', 'syy', 'szz', 'sxy', 'syz', 'sxz'] as const
export const DISPLACEMENT_COLUMNS = ['id', 'ux', 'uy', 'uz'] as const

export function baseName(name: string): string {
  const i = Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\'))
  return name.slice(i + 1)
}

/** Sorts the given files into the bundle's roles; missing required files are an error listing what was given. */
export function sortBundleFiles<T extends { readonly name: string }>(files: readonly T[]): { byRole: Map<BundleFile, T>; ignored: string[] } {
  const byRole = new Map<BundleFile, T>()
  const ignored: string[] = []
  for (const f of files) {
    const b = baseName(f.name).toLowerCase()
    const role = (BUNDLE_FILES as readonly string[]).includes(b) ? (b as BundleFile) : null
    if (!role) { ignored.push(f.name); continue }
    const prev = byRole.get(role)
    if (prev) throw new InputError('bad-argument', `two files named ${role} were given: ${prev.name} and ${f.name}; give one model at a time`, { file: f.name })
    byRole.set(role, f)
  }
  const missing = REQUIRED_BUNDLE_FILES.filter((r) => !byRole.has(r))
  if (missing.length) {
    const got = files.length ? files.map((f) => f.name).join(', ') : 'no files'
    throw new InputError('missing-file', `missing ${missing.join(', ')}; got: ${got}. A CSV bundle needs nodes.csv, elements.csv and stress.csv (displacement.csv and model.json are optional)`)
  }
  return { byRole, ignored }
}

export function readCsvBundle(files: readonly CsvFile[], options: CsvBundleOptions = {}): Model {
  const { byRole, ignored } = sortBundleFiles(files)
  const limit = options.maxBytes ?? MAX_MODEL_BYTES
  for (const f of byRole.values()) assertWithinLimit(f.name, f.text.length, limit)
  const warnings: string[] = ignored.map((n) => `ignored ${n}: not part of a CSV bundle`)
  const nodesFile = byRole.get('nodes.csv')!
  const elementsFile = byRole.get('elements.csv')!
  const stressFile = byRole.get('stress.csv')!
  const dispFile = byRole.get('displacement.csv')
  const jsonFile = byRole.get('model.json')

  const meta = jsonFile ? readModelMeta(jsonFile.name, parseJsonText(jsonFile.name, jsonFile.text)) : null
  if (meta) warnings.push(...meta.warnings)

  // Nodes: order of nodes.csv; ids checked unique.
  const nodes = readNumericTable(nodesFile.name, nodesFile.text, NODE_COLUMNS)
  const nodeIndex = indexOrFail(nodes, nodesFile.name, 'node')
  const coords = nodes.values
  const nodeIds = nodes.ids
  const N = nodes.rows

  // Elements: node ids → indices, element ids unique across blocks, orientation.
  const raw = readElementTable(elementsFile.name, elementsFile.text)
  checkElementIdsUnique(raw, elementsFile.name)
  const used = new Uint8Array(N)
  const blocks: BlockInput[] = []
  const invertedIds: number[] = []
  let invertedTotal = 0
  for (const rb of raw) {
    const conn = resolveNodes(rb, nodeIndex, nodesFile.name, elementsFile.name, used)
    const o = checkBlockOrientation(coords, rb.type, conn)
    if (o.degenerate >= 0) {
      const e = o.degenerate
      throw new InputError('zero-volume', `degenerate ${rb.type} element: volume ${o.degenerateVolume.toPrecision(3)} is about zero for its size ${o.degenerateSize.toPrecision(3)} (coincident or flat corners)`, { file: elementsFile.name, line: rb.lines[e], elementId: rb.ids[e] })
    }
    if (o.inverted.length) {
      reorientElements(conn, rb.type, o.inverted)
      for (let i = 0; i < o.inverted.length && invertedIds.length < 10; i++) invertedIds.push(rb.ids[o.inverted[i]])
      invertedTotal += o.inverted.length
    }
    blocks.push({ type: rb.type, conn, ids: rb.ids, part: rb.part })
  }
  if (invertedTotal) warnings.push(`${elementsFile.name}: ${reorientedWarning(invertedIds, invertedTotal)}`)

  // Stress: one row per node used by an element.
  const stressTable = readNumericTable(stressFile.name, stressFile.text, STRESS_COLUMNS)
  // Rows in the order of nodes.csv (the usual layout) are the stress array as read; otherwise
  // each row goes to its node's slot.
  const inNodeOrder = sameIds(stressTable.ids, nodeIds)
  const stress = inNodeOrder ? stressTable.values : new Float64Array(6 * N)
  const hasStress = inNodeOrder ? null : scatterRows(stressTable, 6, stress, nodeIndex, nodesFile.name, stressFile.name)
  const noStress = hasStress ? firstUsedWithout(used, hasStress) : -1
  if (noStress >= 0) {
    const el = findElementUsing(raw, blocks, noStress)
    throw new InputError('missing-stress', `no stress row for node ${nodeIds[noStress]}, which element ${el.id} uses`, { file: stressFile.name, elementId: el.id })
  }
  const unusedWithout = hasStress ? countUnusedWithout(used, hasStress) : 0
  if (unusedWithout) warnings.push(`${stressFile.name}: ${unusedWithout} node${unusedWithout === 1 ? '' : 's'} used by no element ha${unusedWithout === 1 ? 's' : 've'} no stress row; stress set to zero there`)

  let displacement: Float64Array | null = null
  if (dispFile) {
    const dt = readNumericTable(dispFile.name, dispFile.text, DISPLACEMENT_COLUMNS)
    const dispInOrder = sameIds(dt.ids, nodeIds)
    displacement = dispInOrder ? dt.values : new Float64Array(3 * N)
    const hasDisp = dispInOrder ? null : scatterRows(dt, 3, displacement, nodeIndex, nodesFile.name, dispFile.name)
    const noDisp = hasDisp ? firstUsedWithout(used, hasDisp) : -1
    if (noDisp >= 0) {
      const el = findElementUsing(raw, blocks, noDisp)
      throw new InputError('missing-displacement', `no displacement row for node ${nodeIds[noDisp]}, which element ${el.id} uses`, { file: dispFile.name, elementId: el.id })
    }
  }

  const mesh = createMesh(coords, blocks, nodeIds)
  return {
    name: meta?.name ?? options.name ?? 'model',
    description: meta?.description ?? '',
    units: meta?.units ?? DEFAULT_UNITS,
    mesh,
    stress,
    displacement,
    bodyForce: meta?.bodyForce ?? [0, 0, 0],
    ...(meta?.parts ? { parts: meta.parts } : {}),
    warnings,
  }
}

function indexOrFail(t: NumericTable, file: string, what: string): IdIndex {
  const ix = buildIdIndex(t.ids)
  if (isDuplicate(ix)) {
    throw new InputError('duplicate-id', `${what} id ${ix.id} appears twice (lines ${t.lines[ix.firstRow]} and ${t.lines[ix.secondRow]})`, { file, line: t.lines[ix.secondRow], column: 'id' })
  }
  return ix
}

function checkElementIdsUnique(raw: readonly RawElementBlock[], file: string): void {
  // Ids ascending within and across blocks (the usual numbering) are unique: no index needed.
  let ascending = true, last = 0
  for (const b of raw) {
    if (b.ids.length && (b.ids[0] <= last || !isStrictlyAscending(b.ids))) { ascending = false; break }
    if (b.ids.length) last = b.ids[b.ids.length - 1]
  }
  if (ascending) return
  let total = 0
  for (const b of raw) total += b.ids.length
  const ids = new Int32Array(total)
  const lines = new Int32Array(total)
  let k = 0
  for (const b of raw) { ids.set(b.ids, k); lines.set(b.lines, k); k += b.ids.length }
  const ix = buildIdIndex(ids)
  if (isDuplicate(ix)) {
    const [l1, l2] = [lines[ix.firstRow], lines[ix.secondRow]].sort((a, b) => a - b)
    throw new InputError('duplicate-id', `element id ${ix.id} appears twice (lines ${l1} and ${l2})`, { file, line: l2, column: 'id', elementId: ix.id })
  }
}

/** Replaces user node ids by node indices (in place) and marks used nodes. */
function resolveNodes(rb: RawElementBlock, nodeIndex: IdIndex, nodesName: string, file: string, used: Uint8Array): Int32Array {
  const conn = rb.nodeIds
  const nn = elementType(rb.type).nodeCount
  // The dense table looked up here directly (a call per entry otherwise); same result as rowOfId.
  const dense = nodeIndex.dense, rowOf = rowOfId
  const dn = dense ? dense.length : 0
  for (let i = 0; i < conn.length; i++) {
    const id = conn[i]
    const r = dense ? (id >= 0 && id < dn ? dense[id] : -1) : rowOf(nodeIndex, id)
    if (r < 0) {
      const e = (i / nn) | 0
      throw new InputError('missing-node', `node ${conn[i]} is not in ${nodesName}`, { file, line: rb.lines[e], column: `n${(i % nn) + 1}`, elementId: rb.ids[e] })
    }
    conn[i] = r
    used[r] = 1
  }
  return conn
}

/** Copies each row's values to its node's slot; a row for an unknown node or a second row for a node is an error. */
function scatterRows(t: NumericTable, width: number, out: Float64Array, nodeIndex: IdIndex, nodesName: string, file: string): Uint8Array {
  const has = new Uint8Array(out.length / width)
  const v = t.values
  for (let r = 0; r < t.rows; r++) {
    const id = t.ids[r]
    const n = rowOfId(nodeIndex, id)
    if (n < 0) throw new InputError('missing-node', `node ${id} is not in ${nodesName}`, { file, line: t.lines[r], column: 'id' })
    if (has[n]) {
      const first = t.ids.indexOf(id)
      throw new InputError('duplicate-id', `node ${id} has two rows (lines ${t.lines[first]} and ${t.lines[r]})`, { file, line: t.lines[r], column: 'id' })
    }
    has[n] = 1
    for (let k = 0; k < width; k++) out[n * width + k] = v[r * width + k]
  }
  return has
}

/** True when the two id lists are equal entry by entry. */
function sameIds(a: Int32Array, b: Int32Array): boolean {
  if (a.length !== b.length) return false
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false
  return true
}

function firstUsedWithout(used: Uint8Array, has: Uint8Array): number {
  for (let i = 0; i < used.length; i++) if (used[i] && !has[i]) return i
  return -1
}

function countUnusedWithout(used: Uint8Array, has: Uint8Array): number {
  let n = 0
  for (let i = 0; i < used.length; i++) if (!used[i] && !has[i]) n++
  return n
}

/** The first element that uses node index `node` (error path only). */
function findElementUsing(raw: readonly RawElementBlock[], blocks: readonly BlockInput[], node: number): { id: number } {
  for (let b = 0; b < blocks.length; b++) {
    const conn = blocks[b].conn
    const nn = elementType(blocks[b].type).nodeCount
    const i = conn.indexOf(node)
    if (i >= 0) return { id: raw[b].ids[(i / nn) | 0] }
  }
  return { id: 0 }
}
