/**
 * Section regions and bounded sections: the per-element record of one cut, its split into
 * connected regions, and its limit to chosen parts and/or a disc.
 *
 * The cut (sectionCut.ts) integrates every cut element's polygon into its own accumulator block
 * (ACC_SIZE slots, sectionPolygon.ts; all blocks share the whole section's local origin o, so
 * they add without any shift) and adds that block to the whole section. Here:
 * - `selectCutElements` keeps the polygons of chosen parts and/or whose area centroid lies in a
 *   disc (centre projected onto the plane, radius in model length);
 * - `labelRegions` joins polygons of neighbouring cut elements of the same part into regions:
 *   two cut elements whose shared face is itself crossed by the plane (corners on both sides,
 *   d < 0 and d ≥ 0, the rule of sectionPolygon.ts) have polygons that share an edge. Shared
 *   faces are matched through their corner node numbers; faces of the same part whose corners
 *   only coincide (meshed apart) are matched geometrically: a hash of the face centroid
 *   quantised at a tolerance relative to the face size, with the neighbouring cells checked,
 *   then every corner within that tolerance. Never by floating-point equality.
 * - `regionAccumulators` sums the element blocks per region.
 * Elements of different parts never share a region; the plane lying exactly on a face between
 * two parts takes the section in the element on the -m side (d == 0 is the + side), so the
 * polygon, its region and `--parts` all belong to that element's part.
 *
 * Units: model length; accumulator layout as sectionPolygon.ts. Arrays grow only.
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import { ACC_AREA, ACC_CUT, ACC_FORCE, ACC_GROSS, ACC_ORIGIN, ACC_ORIGIN_SET, ACC_SA, ACC_SAB, ACC_SB, ACC_SIZE } from './sectionPolygon.ts'

/** Relative tolerance of geometric face matching (fraction of the face's largest corner-to-centroid distance). */
export const COINCIDENT_TOL = 1e-6

/**
 * The per-element record of one cut: cut element i is element `local[i]` of block `block[i]`,
 * its integrals in `acc[ACC_SIZE·i ..]` (about the section's shared origin). `geoRec[j]` maps
 * the j-th element of the quadrature geometry (elementSection.ts) to its record.
 */
export interface CutRecord {
  n: number
  block: Int32Array
  local: Int32Array
  acc: Float64Array
  geoRec: Int32Array
  /**
   * 1 where the element's block is not computed yet (`recordElement(.., false)`: linear
   * simplices, whose closed forms are cheap to run again). Most cuts have one region, whose
   * figures are the whole section's, so the hot loop records only what labelling needs and the
   * blocks are filled (`fillPending` in sectionCut.ts) only for several regions or a limit.
   */
  pending: Uint8Array
}

export function createCutRecord(): CutRecord {
  const e = 256
  return { n: 0, block: new Int32Array(e), local: new Int32Array(e), acc: new Float64Array(e * ACC_SIZE), geoRec: new Int32Array(e), pending: new Uint8Array(e) }
}

/**
 * Opens the record of a new cut element; with `withBlock` (the default) its accumulator block is
 * zeroed to be filled now, else it is marked pending. Returns the block's offset.
 */
export function recordElement(r: CutRecord, block: number, local: number, withBlock = true): number {
  if (r.n === r.block.length) {
    const cap = 2 * r.n
    r.block = growInt(r.block, cap); r.local = growInt(r.local, cap)
    const acc = new Float64Array(cap * ACC_SIZE)
    acc.set(r.acc)
    r.acc = acc
    const pending = new Uint8Array(cap)
    pending.set(r.pending)
    r.pending = pending
  }
  const i = r.n++
  r.block[i] = block; r.local[i] = local
  if (!withBlock) { r.pending[i] = 1; return i * ACC_SIZE }
  r.pending[i] = 0
  const off = i * ACC_SIZE, acc = r.acc
  // a plain loop: TypedArray.prototype.fill on 21 slots costs more than the writes (a call per element)
  for (let k = off, end = off + ACC_SIZE; k < end; k++) acc[k] = 0
  return off
}

/** Notes that quadrature-geometry element j belongs to the last recorded element. */
export function recordGeometry(r: CutRecord, j: number): void {
  if (j >= r.geoRec.length) r.geoRec = growInt(r.geoRec, Math.max(2 * r.geoRec.length, j + 1))
  r.geoRec[j] = r.n - 1
}

/** acc[off ..] += src[so ..] over the summable slots (area and traction integrals, counts). */
export function addAccumulator(acc: Float64Array, off: number, src: Float64Array, so: number): void {
  for (let k = ACC_AREA; k <= ACC_SAB; k++) acc[off + k] += src[so + k]
  for (let k = ACC_FORCE; k < ACC_ORIGIN; k++) acc[off + k] += src[so + k]
  acc[off + ACC_CUT] += src[so + ACC_CUT]
  acc[off + ACC_GROSS] += src[so + ACC_GROSS]
}

/** Copies the section's local origin from acc[from ..] to acc[to ..]. */
export function copyOrigin(dst: Float64Array, to: number, src: Float64Array, from: number): void {
  for (let k = 0; k < 3; k++) dst[to + ACC_ORIGIN + k] = src[from + ACC_ORIGIN + k]
  dst[to + ACC_ORIGIN_SET] = src[from + ACC_ORIGIN_SET]
}

/** A limit on a cut: parts (numbers) and/or a disc (centre, projected onto the plane; radius > 0). */
export interface SectionLimit {
  readonly parts?: readonly number[]
  readonly within?: { readonly center: Vec3; readonly radius: number }
}

/** Part number of a recorded element (0 when the mesh has none). */
export function recordPart(mesh: Mesh, r: CutRecord, i: number): number {
  const p = mesh.blocks[r.block[i]].part
  return p ? p[r.local[i]] : 0
}

/**
 * Writes the recorded elements the limit keeps to `out` (record indices, in order); returns
 * their count. `frame` is the section frame (u, v, m), the origin that of `acc` (the whole section).
 */
export function selectCutElements(
  out: Int32Array, r: CutRecord, mesh: Mesh, limit: SectionLimit | null, acc: Float64Array, frame: Float64Array,
): number {
  const parts = limit?.parts ? new Set(limit.parts) : null
  const disc = limit?.within ?? null
  let ca = 0, cb = 0, r2 = 0
  if (disc) {
    const dx = disc.center[0] - acc[ACC_ORIGIN], dy = disc.center[1] - acc[ACC_ORIGIN + 1], dz = disc.center[2] - acc[ACC_ORIGIN + 2]
    ca = dx * frame[0] + dy * frame[1] + dz * frame[2]
    cb = dx * frame[3] + dy * frame[4] + dz * frame[5]
    r2 = disc.radius * disc.radius
  }
  let n = 0
  for (let i = 0; i < r.n; i++) {
    if (parts && !parts.has(recordPart(mesh, r, i))) continue
    if (disc) {
      const o = i * ACC_SIZE, A = r.acc[o + ACC_AREA]
      const a = r.acc[o + ACC_SA] / A - ca, b = r.acc[o + ACC_SB] / A - cb
      if (!(a * a + b * b <= r2)) continue
    }
    out[n++] = i
  }
  return n
}

/**
 * Labels the selected cut elements `sel[0..n-1]` with region numbers 0..count-1 (written to
 * `label`, indexed like `sel`); returns the region count. Regions are numbered in order of their
 * first element. `d` holds the cut's snapped node distances.
 */
export function labelRegions(label: Int32Array, sel: Int32Array, n: number, r: CutRecord, mesh: Mesh, d: Float64Array): number {
  const parent = new Int32Array(n)
  for (let i = 0; i < n; i++) parent[i] = i
  const find = (i: number): number => {
    while (parent[i] !== i) { parent[i] = parent[parent[i]]; i = parent[i] }
    return i
  }
  const union = (a: number, b: number): void => {
    const ra = find(a), rb = find(b)
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb)
  }
  const partOf = new Int32Array(n)
  // crossed faces by their three smallest corner numbers (enough to tell faces of a conforming
  // mesh apart), listed per smallest corner node: a node-indexed head (small, cache-friendly)
  // and the faces appended in order. A face's owner becomes -1 once its twin is met.
  const t = faceLists(mesh.nodeCount, 6 * n)
  const head = t.head
  let list = t.list, faces = 0
  // The hot loop: records come in block order, so each block's tables are read once per run;
  // corners sorted in locals (no scratch array); the part read straight from the block.
  let lastBlock = -1, conn = mesh.blocks[0].conn, cf = ELEMENT_TYPES[mesh.blocks[0].type].cornerFaces, nn = 0, nf = 0, cc = 0
  let part: Int32Array | null = null, masks = faceMasks(cf)
  for (let s = 0; s < n; s++) {
    const i = sel[s]
    const bi = r.block[i]
    if (bi !== lastBlock) {
      const block = mesh.blocks[bi], topo = ELEMENT_TYPES[block.type]
      conn = block.conn; cf = topo.cornerFaces; nn = topo.nodeCount; nf = cf.length >> 2; part = block.part; lastBlock = bi
      cc = topo.cornerCount; masks = faceMasks(cf)
    }
    const local = r.local[i], base = nn * local
    const ps = part ? part[local] : 0
    partOf[s] = ps
    // which corners lie on the - side, read once per element (bit k: corner k)
    let below = 0
    for (let k = 0; k < cc; k++) if (d[conn[base + k]] < 0) below |= 1 << k
    for (let f = 0; f < nf; f++) {
      const m = masks[f], hit = below & m
      if (hit === 0 || hit === m) continue // the plane does not cross this face
      const o4 = 4 * f
      let c0 = conn[base + cf[o4]], c1 = conn[base + cf[o4 + 1]], c2 = conn[base + cf[o4 + 2]]
      const tri = cf[o4 + 3] < 0
      let c3 = tri ? -1 : conn[base + cf[o4 + 3]]
      // sort ascending (five compares; a triangle's -1 sorts first)
      let x
      if (c0 > c1) { x = c0; c0 = c1; c1 = x }
      if (c2 > c3) { x = c2; c2 = c3; c3 = x }
      if (c0 > c2) { x = c0; c0 = c2; c2 = x }
      if (c1 > c3) { x = c1; c1 = c3; c3 = x }
      if (c1 > c2) { x = c1; c1 = c2; c2 = x }
      const k0 = tri ? c1 : c0, k1 = tri ? c2 : c1, k2 = tri ? c3 : c2
      let e = head[k0]
      while (e >= 0 && !(list[FL * e + 1] === k1 && list[FL * e + 2] === k2)) e = list[FL * e + 5]
      if (e >= 0) {
        const other = list[FL * e + 4]
        if (other >= 0 && partOf[other] === ps) union(other, s)
        list[FL * e + 4] = -1
        continue
      }
      if (FL * (faces + 1) > list.length) { list = growInt(list, 2 * list.length); t.list = list }
      const o = FL * faces
      list[o] = k0; list[o + 1] = k1; list[o + 2] = k2; list[o + 3] = tri ? -1 : c3; list[o + 4] = s; list[o + 5] = head[k0]
      head[k0] = faces++
    }
  }
  // faces left unmatched by node numbers: the section's outline, or faces whose nodes only coincide
  const open: number[] = []
  for (let e = 0; e < faces; e++) {
    const o = FL * e
    if (list[o + 4] >= 0) open.push(list[o + 4], list[o], list[o + 1], list[o + 2], list[o + 3])
    head[list[o]] = -1
  }
  matchCoincident(open, mesh.coords, (a, b) => {
    if (partOf[a] === partOf[b]) union(a, b)
  })
  const id = new Int32Array(n).fill(-1)
  let count = 0
  for (let s = 0; s < n; s++) {
    const root = find(s)
    if (id[root] < 0) id[root] = count++
    label[s] = id[root]
  }
  return count
}

/** Bit masks of each corner face's corners (cornerFaces layout: 4 per face, -1 for a triangle's fourth), cached per table. */
const maskCache = new WeakMap<ArrayLike<number>, Int32Array>()
function faceMasks(cf: ArrayLike<number>): Int32Array {
  let m = maskCache.get(cf)
  if (!m) {
    m = new Int32Array(cf.length >> 2)
    for (let f = 0; f < m.length; f++) for (let k = 0; k < 4; k++) if (cf[4 * f + k] >= 0) m[f] |= 1 << cf[4 * f + k]
    maskCache.set(cf, m)
  }
  return m
}

/** Face list stride: three smallest corners, the fourth (or -1), owner (-1 once matched), next face of the same smallest corner. */
const FL = 6
interface FaceLists { head: Int32Array; list: Int32Array }
let lists: FaceLists | null = null

/** The grows-only face lists: a head per node (all -1) and room for about `faces` faces. */
function faceLists(nodes: number, faces: number): FaceLists {
  if (!lists || lists.head.length < nodes) lists = { head: new Int32Array(nodes).fill(-1), list: lists?.list ?? new Int32Array(FL * 1024) }
  if (lists.list.length < FL * faces) lists.list = new Int32Array(FL * faces)
  return lists
}

/**
 * Pairs faces whose corners coincide within COINCIDENT_TOL times their size. `open` holds, per
 * face, its owner then 4 corner node numbers (-1 in the fourth for a triangle).
 */
function matchCoincident(open: number[], coords: Float64Array, pair: (a: number, b: number) => void): void {
  interface F { owner: number; nodes: number[]; c: Vec3; tol: number }
  const faces: F[] = []
  for (let k = 0; k < open.length; k += 5) {
    const owner = open[k]
    const nc = open[k + 4] < 0 ? 3 : 4
    const nodes = open.slice(k + 1, k + 1 + nc)
    const c: Vec3 = [0, 0, 0]
    for (const v of nodes) for (let j = 0; j < 3; j++) c[j] += coords[3 * v + j] / nc
    let size = 0
    for (const v of nodes) size = Math.max(size, Math.hypot(coords[3 * v] - c[0], coords[3 * v + 1] - c[1], coords[3 * v + 2] - c[2]))
    faces.push({ owner, nodes, c, tol: COINCIDENT_TOL * size })
  }
  if (faces.length < 2) return
  let cell = 0
  for (const f of faces) cell = Math.max(cell, f.tol)
  if (!(cell > 0)) return
  const grid = new Map<number, number[]>()
  const q = (x: number) => Math.floor(x / cell)
  faces.forEach((f, i) => {
    const key = cellKey(q(f.c[0]), q(f.c[1]), q(f.c[2]))
    const list = grid.get(key)
    if (list) list.push(i); else grid.set(key, [i])
  })
  faces.forEach((f, i) => {
    const qx = q(f.c[0]), qy = q(f.c[1]), qz = q(f.c[2])
    for (let dx = -1; dx <= 1; dx++) for (let dy = -1; dy <= 1; dy++) for (let dz = -1; dz <= 1; dz++) {
      const list = grid.get(cellKey(qx + dx, qy + dy, qz + dz))
      if (!list) continue
      for (const j of list) {
        if (j <= i) continue
        const g = faces[j]
        if (g.nodes.length !== f.nodes.length || f.owner === g.owner) continue
        const tol = Math.min(f.tol, g.tol)
        if (Math.hypot(f.c[0] - g.c[0], f.c[1] - g.c[1], f.c[2] - g.c[2]) > tol) continue
        if (cornersCoincide(coords, f.nodes, g.nodes, tol)) pair(f.owner, g.owner)
      }
    }
  })
}

/** A numeric key of a quantised cell (collisions only cost a few extra distance tests). */
export function cellKey(x: number, y: number, z: number): number {
  return (Math.imul(x, 73856093) ^ Math.imul(y, 19349663) ^ Math.imul(z, 83492791)) | 0
}

/** Every corner of face a lies within tol of some corner of face b (node numbers into coords). */
export function cornersCoincide(coords: Float64Array, a: number[], b: number[], tol: number): boolean {
  for (const u of a) {
    let hit = false
    for (const v of b) {
      if (Math.hypot(coords[3 * u] - coords[3 * v], coords[3 * u + 1] - coords[3 * v + 1], coords[3 * u + 2] - coords[3 * v + 2]) <= tol) { hit = true; break }
    }
    if (!hit) return false
  }
  return true
}

/**
 * Region accumulators: for each region, the sum of its elements' blocks, with the section's
 * origin. Returns Float64Array(count · ACC_SIZE) and each region's part numbers.
 */
export function regionAccumulators(
  count: number, label: Int32Array, sel: Int32Array, n: number, r: CutRecord, mesh: Mesh, acc: Float64Array,
): { acc: Float64Array; parts: number[][] } {
  // one region holding every recorded element is the whole section (its sums in the same order)
  if (count === 1 && n === r.n) return { acc: acc.slice(0, ACC_SIZE), parts: [[recordPart(mesh, r, sel[0])]] }
  const out = new Float64Array(count * ACC_SIZE)
  // a region lies in one part by construction (labelRegions joins only elements of one part)
  const part = new Int32Array(count).fill(-1)
  for (let g = 0; g < count; g++) copyOrigin(out, g * ACC_SIZE, acc, 0)
  for (let s = 0; s < n; s++) {
    const g = label[s]
    addAccumulator(out, g * ACC_SIZE, r.acc, sel[s] * ACC_SIZE)
    if (part[g] < 0) part[g] = recordPart(mesh, r, sel[s])
  }
  return { acc: out, parts: Array.from(part, (p) => [p]) }
}

/** The accumulator of the selected elements only (the whole section's origin). */
export function selectionAccumulator(out: Float64Array, sel: Int32Array, n: number, r: CutRecord, acc: Float64Array): Float64Array {
  out.fill(0, 0, ACC_SIZE)
  copyOrigin(out, 0, acc, 0)
  for (let s = 0; s < n; s++) addAccumulator(out, 0, r.acc, sel[s] * ACC_SIZE)
  return out
}

function growInt(a: Int32Array, n: number): Int32Array {
  const b = new Int32Array(n)
  b.set(a)
  return b
}

