/**
 * Faces between parts that share nodes, for every part at once: the interior faces of the mesh
 * whose two elements have different part numbers, each taken once per side (that side's element,
 * its local face, its nodes in that element's outward order). With the whole body's boundary
 * faces they make every part's boundary (partBalance.ts) without one face extraction per part.
 *
 * Where the boundary extraction of this mesh recorded the pairs between parts (partPairs.ts), the
 * sides are those pairs, sorted. Otherwise one pass marks the corner nodes touched by more than one part; a second lists the elements
 * with three corners or more so marked (an element's first corners usually tell it has not). Only their faces whose corners are all marked can lie
 * between parts, and those few are paired by their sorted corners in an open-addressing table
 * over typed arrays (a triangle pads its fourth corner, so it never pairs with a quadrilateral).
 * A pair of the same part is an interior face of that part and is dropped. The work arrays are
 * kept from one call to the next (keptInt32...: a model's load makes one call, and fresh memory
 * costs a page fault per 4 KiB on first touch); with `reuse` the sides' arrays are kept ones too,
 * valid until the next such call (assemblyBalance reads them within its own call).
 *
 * Part numbers come from the blocks (0 without; they are ≥ 0, so -1 and -2 can mark nodes). Returns
 * the sides as BoundaryFaces (slots = faceSlotsOf(mesh.blocks), as extractBoundaryFaces gives the
 * whole body), ordered by (element, local face) like extractBoundaryFaces, and `twin` Int32Array(F)
 * the index of each side's other side. Lengths in model units.
 */
import { ELEMENT_TYPES, FACE_KIND_CODE } from '../model/elementTypes.ts'
import type { Mesh } from '../model/model.ts'
import { computeFaceGeometry, faceSlotsOf } from './boundaryFaces.ts'
import type { BoundaryFaces } from './types.ts'
import { recordedPartPairs } from './partPairs.ts'

/** A face reference is globalElement·8 + localFace (at most 6 faces per element), as boundaryFaces.ts. */
const REF_STRIDE = 8

export interface PartSides {
  readonly faces: BoundaryFaces
  readonly twin: Int32Array
}

export function facesBetweenParts(mesh: Mesh, marked: Int32Array | null = null, reuse = false): PartSides {
  const recorded = recordedPartPairs(mesh)
  let C: number, partner: Int32Array, at: Int32Array, P = 0
  // (no loop here: the loops are functions of their own, whose compiled code outlives the model)
  if (recorded) {
    // the pairs the boundary extraction found (partPairs.ts): every reference is a side
    C = recorded.length
    partner = sidesFromPairs(recorded)
    at = keptInt32('at', C)
    P = numberSides(at, partner, C)
  } else {
    const mark = marked ?? markSharedNodes(mesh)
    const listed = listElements(mesh, mark)
    C = candidateFaces(mesh, listed, mark)
    partner = pairFaces(C)
    // the sides: candidates with a twin, already in (element, local face) order
    at = keptInt32('at', C)
    P = numberSides(at, partner, C)
  }
  const blocks = mesh.blocks, S = faceSlotsOf(blocks)
  const twin = sideArray('twin', P, reuse), elem = sideArray('elem', P, reuse), nodes = sideArray('nodes', S * P, reuse)
  const localFace = reuse ? keptUint8('localFace', P) : new Uint8Array(P), kind = reuse ? keptUint8('kind', P) : new Uint8Array(P)
  const area = reuse ? keptFloat64('area', P) : new Float64Array(P), normal = reuse ? keptFloat64('normal', 3 * P) : new Float64Array(3 * P)
  const centroid = reuse ? keptFloat64('centroid', 3 * P) : new Float64Array(3 * P)
  writeSides(twin, elem, localFace, kind, nodes, S, mesh, C, partner, at)
  computeFaceGeometry(area, normal, centroid, mesh.coords, kind, nodes, S)
  return { faces: { count: P, slots: S, elem, localFace, kind, nodes, area, normal, centroid }, twin }
}

/** Numbers the candidates with a twin (partner ≥ 0) in order into `at`; returns their count. */
function numberSides(at: Int32Array, partner: Int32Array, C: number): number {
  let P = 0
  for (let i = 0; i < C; i++) if (partner[i] >= 0) at[i] = P++
  return P
}

/** A side array of n numbers: a kept one with `reuse`, else new. */
function sideArray(key: string, n: number, reuse: boolean): Int32Array {
  return reuse ? keptInt32(key, n) : new Int32Array(n)
}

/**
 * Arrays kept from one call to the next, by name, grown as needed (a view of the first n): fresh
 * memory costs a page fault per 4 KiB on first touch, about as much as the loops here. A view is
 * valid until the next call that asks for the same name; nothing here is re-entered.
 */
const keptArrays = new Map<string, Int32Array | Uint8Array | Float64Array>()
function kept<T extends Int32Array | Uint8Array | Float64Array>(key: string, n: number, make: (n: number) => T): T {
  let a = keptArrays.get(key) as T | undefined
  if (!a || a.length < n) { a = make(Math.max(n, 1024)); keptArrays.set(key, a) }
  return a.subarray(0, n) as T
}
export const keptInt32 = (key: string, n: number): Int32Array => kept(key, n, (m) => new Int32Array(m))
export const keptUint8 = (key: string, n: number): Uint8Array => kept(key, n, (m) => new Uint8Array(m))
export const keptFloat64 = (key: string, n: number): Float64Array => kept(key, n, (m) => new Float64Array(m))

/** The sides' arrays from the paired candidates (`at[i]` candidate i's side when partner[i] ≥ 0); nodes in each element's outward order. */
function writeSides(
  twin: Int32Array, elem: Int32Array, localFace: Uint8Array, kind: Uint8Array, nodes: Int32Array, S: number, mesh: Mesh,
  C: number, partner: Int32Array, at: Int32Array,
): void {
  const refs = keptInt32('refs', C), blocks = mesh.blocks
  nodes.fill(-1)
  let bi = 0
  for (let i = 0; i < C; i++) {
    if (partner[i] < 0) continue
    const k = at[i], g = (refs[i] / REF_STRIDE) | 0, f = refs[i] - g * REF_STRIDE
    twin[k] = at[partner[i]]
    while (g >= blocks[bi].offset + blocks[bi].ids.length) bi++
    const b = blocks[bi], topo = ELEMENT_TYPES[b.type], face = topo.faces[f], eb = (g - b.offset) * topo.nodeCount
    elem[k] = g; localFace[k] = f; kind[k] = FACE_KIND_CODE[topo.faceKinds[f]]
    for (let a = 0; a < face.length; a++) nodes[S * k + a] = b.conn[eb + face[a]]
  }
}

/**
 * The sides of recorded pairs (partPairs.ts: two face references each) in (element, local face)
 * order, into the kept 'refs' (as candidateFaces leaves them), and each side's twin (its index in
 * that order) in the kept 'partner', returned: a sort of the references, then each pair's two
 * sides found by binary search.
 */
function sidesFromPairs(pairs: Int32Array): Int32Array {
  const C = pairs.length, refs = keptInt32('refs', C), partner = keptInt32('partner', C)
  refs.set(pairs)
  refs.sort()
  for (let q = 0; q < C; q += 2) {
    const a = sortedIndex(refs, pairs[q]), b = sortedIndex(refs, pairs[q + 1])
    partner[a] = b; partner[b] = a
  }
  return partner
}

/** The index of `v` in the ascending array `a` (present). */
function sortedIndex(a: Int32Array, v: number): number {
  let lo = 0, hi = a.length - 1
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (a[mid] < v) lo = mid + 1
    else hi = mid
  }
  return lo
}

/**
 * Per node (`mark`, filled with -1 first): -1 no element; p ≥ 0 elements of part p only; -2
 * elements of two parts or more (corner nodes). `facesBetweenParts` takes the marks from a pass
 * over the elements that a caller makes anyway (partBalance.ts sums the volumes in it).
 */
export function markSharedNodes(mesh: Mesh, mark = new Int32Array(mesh.nodeCount).fill(-1)): Int32Array {
  for (const b of mesh.blocks) {
    const topo = ELEMENT_TYPES[b.type]
    markNodes(mark, b.conn, topo.nodeCount, topo.cornerCount, b.part, 0, b.conn.length / topo.nodeCount)
  }
  return mark
}

/** Marks the corners of elements [from, to) of one block (connectivity `conn`, `nn` nodes each, parts `part` or 0). */
export function markNodes(mark: Int32Array, conn: Int32Array, nn: number, cc: number, part: Int32Array | null, from: number, to: number): void {
  for (let e = from; e < to; e++) {
    const r = part ? part[e] : 0, eb = e * nn
    for (let k = 0; k < cc; k++) {
      const n = conn[eb + k], m = mark[n]
      if (m !== r) mark[n] = m === -1 ? r : -2
    }
  }
}

/**
 * The elements with three corners or more on nodes of several parts (a face between parts has all
 * its corners there), by global index ascending: the only ones read again. An element whose first
 * cornerCount - 2 corners have none is passed at once (it can have two at most).
 */
function listElements(mesh: Mesh, mark: Int32Array): Int32Array {
  let listed = (keptArrays.get('listed') as Int32Array | undefined) ?? new Int32Array(1024), n = 0
  for (const b of mesh.blocks) {
    const topo = ELEMENT_TYPES[b.type], nn = topo.nodeCount, cc = topo.cornerCount, conn = b.conn, off = b.offset
    const count = conn.length / nn, first = cc - 2
    for (let e = 0; e < count; e++) {
      const eb = e * nn
      let mixed = 0, k = 0
      for (; k < first; k++) if (mark[conn[eb + k]] === -2) mixed++
      if (mixed === 0) continue
      for (; k < cc; k++) if (mark[conn[eb + k]] === -2) mixed++
      if (mixed < 3) continue
      if (n === listed.length) { const grown = new Int32Array(2 * n); grown.set(listed); listed = grown }
      listed[n++] = off + e
    }
  }
  keptArrays.set('listed', listed)
  return listed.subarray(0, n)
}

/**
 * The listed elements' faces with every corner on nodes of several parts, in (element, local
 * face) order, into kept arrays (their count is returned): 'refs' their references, 'keys' 4
 * sorted corners each (a triangle's missing fourth is the node count, so it sorts last and never
 * equals a node), 'part' their element's part. One pass, into arrays sized for every face of the
 * listed elements.
 */
function candidateFaces(mesh: Mesh, listed: Int32Array, mark: Int32Array): number {
  const blocks = mesh.blocks, none = mesh.nodeCount
  let faces = 0
  for (const b of blocks) faces = Math.max(faces, ELEMENT_TYPES[b.type].faces.length)
  const most = faces * listed.length
  const refs = keptInt32('refs', most), keys = keptInt32('keys', 4 * most), part = keptInt32('part', most)
  let C = 0, bi = 0
  for (let i = 0; i < listed.length; i++) {
    const g = listed[i]
    while (g >= blocks[bi].offset + blocks[bi].ids.length) bi++
    const b = blocks[bi], topo = ELEMENT_TYPES[b.type], nf = topo.faces.length, fc = topo.cornerFaces, conn = b.conn
    const eb = (g - b.offset) * topo.nodeCount, p = b.part ? b.part[g - b.offset] : 0
    for (let f = 0; f < nf; f++) {
      let c0 = conn[eb + fc[4 * f]], c1 = conn[eb + fc[4 * f + 1]], c2 = conn[eb + fc[4 * f + 2]]
      const l3 = fc[4 * f + 3]
      let c3 = l3 >= 0 ? conn[eb + l3] : none
      if (mark[c0] !== -2 || mark[c1] !== -2 || mark[c2] !== -2 || (l3 >= 0 && mark[c3] !== -2)) continue
      // five-compare sorting network
      let x = 0
      if (c0 > c1) { x = c0; c0 = c1; c1 = x }
      if (c2 > c3) { x = c2; c2 = c3; c3 = x }
      if (c0 > c2) { x = c0; c0 = c2; c2 = x }
      if (c1 > c3) { x = c1; c1 = c3; c3 = x }
      if (c1 > c2) { x = c1; c1 = c2; c2 = x }
      refs[C] = g * REF_STRIDE + f
      part[C] = p
      keys[4 * C] = c0; keys[4 * C + 1] = c1; keys[4 * C + 2] = c2; keys[4 * C + 3] = c3
      C++
    }
  }
  return C
}

/**
 * Each candidate's twin of another part (-1 for none), for the C candidates in the kept 'keys' and
 * 'part' (candidateFaces): candidates with the same sorted corners,
 * paired in an open-addressing table. Two of one part are an interior face of that part; a face
 * of three elements is refused by the whole body's extraction, here the first pair stands.
 */
function pairFaces(C: number): Int32Array {
  const keys = keptInt32('keys', 4 * C), part = keptInt32('part', C)
  let slots = 16
  while (slots < 2 * C) slots *= 2
  const mask = slots - 1
  // per slot: -1 free; w ≥ 0 candidate w waits for its twin; -2 - w candidate w was paired
  const slot = keptInt32('slot', slots).fill(-1), partner = keptInt32('partner', C).fill(-1)
  for (let i = 0; i < C; i++) {
    const c0 = keys[4 * i], c1 = keys[4 * i + 1], c2 = keys[4 * i + 2], c3 = keys[4 * i + 3]
    let h = (Math.imul(c0, 0x9e3779b1) + Math.imul(c1, 0x85ebca77) + Math.imul(c2, 0xc2b2ae3d) + Math.imul(c3, 0x27d4eb2f)) | 0
    h = (h ^ (h >>> 15)) & mask
    for (; ; h = (h + 1) & mask) {
      const w = slot[h]
      if (w === -1) { slot[h] = i; break }
      const o = 4 * (w >= 0 ? w : -2 - w)
      if (keys[o] !== c0 || keys[o + 1] !== c1 || keys[o + 2] !== c2 || keys[o + 3] !== c3) continue
      if (w >= 0) {
        if (part[w] !== part[i]) { partner[w] = i; partner[i] = w }
        slot[h] = -2 - w
      }
      break
    }
  }
  return partner
}
