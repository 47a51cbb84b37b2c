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
 *   only coincide (meshed apart) are matched geometrically: candidates from a sweep of the face
 *   centroids (coincidentSweep.ts), then every corner within a tolerance relative to the face
 *   size. Never by floating-point equality. A plane through a layer of nodes makes polygons of
 *   element faces, and neighbouring in-plane triangles of split cells may lie in elements that
 *   share only an edge: cut elements with an edge on the plane (both corners snapped to d == 0)
 *   are also joined through that edge's two node numbers.
 * - `regionAccumulators` sums the element blocks per region.
 * Elements of different parts never share a region; the plane lying exactly on a face between
 * two parts takes the section in the element on the -m side (d == 0 is the + side), so the
 * polygon, its region and `--parts` all belong to that element's part.
 *
 * Units: model length; accumulator layout as sectionPolygon.ts. Arrays grow only.
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import { nearPoints } from './coincidentSweep.ts'
import { ACC_AREA, ACC_CUT, ACC_FORCE, ACC_GROSS, ACC_ORIGIN, ACC_ORIGIN_SET, ACC_SA, ACC_SAB, ACC_SB, ACC_SIZE } from './sectionPolygon.ts'

/** Relative tolerance of geometric face matching (fraction of the face's largest corner-to-centroid distance). */
export const COINCIDENT_TOL = 1e-6

/**
 * The per-element record of one cut: cut element i is element `local[i]` of block `block[i]`,
 * its integrals in `acc[ACC_SIZE·i ..]` (about the section's shared origin).
 */
export interface CutRecord {
  n: number
  block: Int32Array
  local: Int32Array
  acc: Float64Array
  /**
   * 1 where the element's block is not computed yet (`recordElement(.., false)`: linear
   * simplices, whose closed forms are cheap to run again). Most cuts have one region, whose
   * figures are the whole section's, so the hot loop records only what labelling needs and the
   * blocks are filled (`fillPending` in sectionCut.ts) only for several regions or a limit.
   */
  pending: Uint8Array
  /**
   * Tetrahedra recorded by `recordTet` (the cut of linear tetrahedra, while their connectivity
   * rows are in cache): their four corner nodes ascending in `corners[4i ..]` and `tetCode[i]`,
   * bit k set when sorted corner k lies on the - side (d < 0), bit 4 + k when on the plane
   * (d == 0). NO_CORNERS where not recorded: labelRegions then reads the connectivity.
   */
  corners: Int32Array
  tetCode: Uint8Array
}

/** tetCode of an entry whose corners were not recorded (no tetrahedron has this code: a corner is below or on the plane, not both). */
export const NO_CORNERS = 255

export function createCutRecord(): CutRecord {
  const e = 256
  return {
    n: 0, block: new Int32Array(e), local: new Int32Array(e), acc: new Float64Array(e * ACC_SIZE), pending: new Uint8Array(e),
    corners: new Int32Array(4 * e), tetCode: new Uint8Array(e),
  }
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
    r.corners = growInt(r.corners, 4 * cap)
    const code = new Uint8Array(cap)
    code.set(r.tetCode)
    r.tetCode = code
  }
  const i = r.n++
  r.block[i] = block; r.local[i] = local; r.tetCode[i] = NO_CORNERS
  if (!withBlock) { r.pending[i] = 1; return i * ACC_SIZE }
  r.pending[i] = 0
  const off = i * ACC_SIZE, acc = r.acc
  // a plain loop: TypedArray.prototype.fill on 21 slots costs more than the writes (a call per element)
  for (let k = off, end = off + ACC_SIZE; k < end; k++) acc[k] = 0
  return off
}

/**
 * Opens a pending record of a tetrahedron (corners a, b, c, e with snapped distances da .. de)
 * with its corners sorted and their sides (tetCode): labelling then never reads the
 * connectivity again. The same as recordElement(r, block, local, false) otherwise.
 */
export function recordTet(
  r: CutRecord, block: number, local: number, a: number, b: number, c: number, e: number, da: number, db: number, dc: number, de: number,
): void {
  recordElement(r, block, local, false)
  const i = r.n - 1
  r.tetCode[i] = sortTet(r.corners, 4 * i, a, b, c, e, da, db, dc, de)
}

/**
 * Writes the corners a, b, c, e ascending to out[o .. o + 3] and returns their code: bit k when
 * sorted corner k has d < 0, bit 4 + k when d == 0 (five compares, each corner's sides moving
 * with it).
 */
function sortTet(out: Int32Array, o: number, a: number, b: number, c: number, e: number, da: number, db: number, dc: number, de: number): number {
  let sa = (da < 0 ? 1 : 0) | (da === 0 ? 16 : 0), sb = (db < 0 ? 1 : 0) | (db === 0 ? 16 : 0)
  let sc = (dc < 0 ? 1 : 0) | (dc === 0 ? 16 : 0), se = (de < 0 ? 1 : 0) | (de === 0 ? 16 : 0), x
  if (a > b) { x = a; a = b; b = x; x = sa; sa = sb; sb = x }
  if (c > e) { x = c; c = e; e = x; x = sc; sc = se; se = x }
  if (a > c) { x = a; a = c; c = x; x = sa; sa = sc; sc = x }
  if (b > e) { x = b; b = e; e = x; x = sb; sb = se; se = x }
  if (b > c) { x = b; b = c; c = x; x = sb; sb = sc; sc = x }
  out[o] = a; out[o + 1] = b; out[o + 2] = c; out[o + 3] = e
  return sa | (sb << 1) | (sc << 2) | (se << 3)
}

/**
 * Per code of the corners below (bits 0-3 of tetCode): bit k set when face k of the sorted
 * corners (the other three) is crossed, i.e. its corners lie on both sides.
 */
const TET_CROSSED = (() => {
  const t = new Uint8Array(16)
  for (let below = 0; below < 16; below++) {
    for (let k = 0; k < 4; k++) {
      const m = 15 & ~(1 << k), hit = below & m
      if (hit !== 0 && hit !== m) t[below] |= 1 << k
    }
  }
  return t
})()

/** Face k of a tetrahedron's sorted corners: the other three, ascending. */
const TET_FACE = new Int32Array([1, 2, 3, 0, 2, 3, 0, 1, 3, 0, 1, 2])


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
  if (parentScratch.length < n) { parentScratch = new Int32Array(n + (n >> 2)); partScratch = new Int32Array(parentScratch.length) }
  const parent = parentScratch, partOf = partScratch
  for (let i = 0; i < n; i++) parent[i] = i
  // Crossed faces keyed by their three smallest corner numbers (enough to tell faces of a
  // conforming mesh apart) in an open-addressing table: a face goes in when first met and out
  // when its twin meets it. Cut elements come in element order, so the faces waiting for their
  // twin are a thin front of the cut and the table stays small enough to live in the cache (a
  // table of every crossed face, or one indexed by node, is mostly cache misses). Beside the key
  // each face keeps 8·s + f (cut element s, its corner face f): its owner and the order it was met.
  // the table in locals (meet never grows it: room is made before each element, for its faces)
  const t = faceTable()
  let keys = t.keys, mask = t.mask, shift = t.shift, live = 0
  // The hot loop: records come in block order, so each block's tables are read once per run;
  // the part read straight from the block. Tetrahedra recorded by the cut come with their
  // corners sorted and their sides (recordTet): no connectivity row or distance is read again.
  let lastBlock = -1, conn = mesh.blocks[0].conn, cf = ELEMENT_TYPES[mesh.blocks[0].type].cornerFaces, nn = 0, nf = 0, cc = 0
  let part: Int32Array | null = null, masks = faceMasks(cf), tet = false
  const blockOf = r.block, localOf = r.local
  for (let s = 0; s < n; s++) {
    const i = sel[s]
    const bi = blockOf[i]
    if (live + MAX_FACES > t.room) { growFaceTable(t, live); keys = t.keys; mask = t.mask; shift = t.shift }
    if (bi !== lastBlock) {
      const block = mesh.blocks[bi], topo = ELEMENT_TYPES[block.type]
      conn = block.conn; cf = topo.cornerFaces; nn = topo.nodeCount; nf = cf.length >> 2; part = block.part; lastBlock = bi
      cc = topo.cornerCount; masks = faceMasks(cf); tet = isTetrahedron(topo)
    }
    const local = localOf[i], base = nn * local
    if (tet) {
      // the run of tetrahedra of this block at once, in a loop of their own
      runLive = live
      s = labelTets(s, n, bi, sel, r, part, conn, nn, d, t, parent, partOf) - 1
      live = runLive; keys = t.keys; mask = t.mask; shift = t.shift
      continue
    }
    const ps = part ? part[local] : 0
    partOf[s] = ps
    // corners on the plane (d == 0 exactly: snapped): two or more, and the polygon may share an
    // in-plane edge with a polygon of an element that is no face neighbour (a plane through a
    // layer of nodes: the in-plane triangles of neighbouring cells), matched by that edge
    let onPlane = 0
    for (let k = 0; k < cc; k++) if (d[conn[base + k]] === 0) onPlane |= 1 << k
    if (onPlane & (onPlane - 1)) meetInPlaneEdges(ELEMENT_TYPES[mesh.blocks[bi].type].edges, onPlane, conn, base, s, ps, parent)
    // which corners lie on the - side, read once per element (bit k: corner k)
    let below = 0
    for (let k = 0; k < cc; k++) if (d[conn[base + k]] < 0) below |= 1 << k
    for (let f = 0; f < nf; f++) {
      const m = masks[f], hit = below & m
      if (hit === 0 || hit === m) continue // the plane does not cross this face
      const o4 = 4 * f
      let c0 = conn[base + cf[o4]], c1 = conn[base + cf[o4 + 1]], c2 = conn[base + cf[o4 + 2]], x
      if (cf[o4 + 3] < 0) {
        // a triangle: three compares
        if (c0 > c1) { x = c0; c0 = c1; c1 = x }
        if (c1 > c2) { x = c1; c1 = c2; c2 = x }
        if (c0 > c1) { x = c0; c0 = c1; c1 = x }
      } else {
        // a quadrilateral: its three smallest corners (five compares)
        let c3 = conn[base + cf[o4 + 3]]
        if (c0 > c1) { x = c0; c0 = c1; c1 = x }
        if (c2 > c3) { x = c2; c2 = c3; c3 = x }
        if (c0 > c2) { x = c0; c0 = c2; c2 = x }
        if (c1 > c3) { x = c1; c1 = c3; c3 = x }
        if (c1 > c2) { x = c1; c1 = c2; c2 = x }
      }
      live += meet(keys, mask, shift, c0, c1, c2, 8 * s + f, s, ps, parent, partOf)
    }
  }
  clearEdgeTable()
  // faces left unmatched by node numbers: the section's outline, or faces whose nodes only coincide
  if (live > 1) {
    openFaces(table!, live, sel, r, mesh)
    matchCoincident(live, mesh.coords, parent, partOf)
  }
  else if (live === 1) clearFaceTable(table!)
  // a tree's root is its first element, so it is labelled before the rest of its tree
  let count = 0
  for (let s = 0; s < n; s++) {
    const root = find(parent, s)
    label[s] = root === s ? count++ : label[root]
  }
  return count
}

/** The face table's live count across labelTets (its second result). */
let runLive = 0

/**
 * labelRegions over the run of tetrahedra from sel[s0] on while they lie in block bi (part
 * numbers `part`, connectivity `conn` of nn nodes per element); returns where the run ends,
 * the table's live count in runLive. A tetrahedron's corners come sorted from the record
 * (recordTet) or are sorted here once; face k is the other three (sorted corner k left out),
 * already in order, its code 8·s + k.
 */
function labelTets(
  s0: number, n: number, bi: number, sel: Int32Array, r: CutRecord, part: Int32Array | null, conn: Int32Array, nn: number, d: Float64Array,
  t: FaceTable, parent: Int32Array, partOf: Int32Array,
): number {
  const blockOf = r.block, localOf = r.local, tetCode = r.tetCode, corners = r.corners
  // the table fixed for the run (its locals stay in registers): the run stops where it is full
  // enough to grow, and labelRegions grows it and starts the rest of the run
  const keys = t.keys, mask = t.mask, shift = t.shift, room = t.room - MAX_FACES
  let live = runLive, s = s0
  for (; s < n; s++) {
    const i = sel[s]
    if (blockOf[i] !== bi || live > room) break
    const local = localOf[i]
    const ps = part ? part[local] : 0
    partOf[s] = ps
    let code = tetCode[i], o = 4 * i, cs = corners
    if (code === NO_CORNERS) {
      const base = nn * local
      code = sortTet(tetScratch, 0, conn[base], conn[base + 1], conn[base + 2], conn[base + 3], d[conn[base]], d[conn[base + 1]], d[conn[base + 2]], d[conn[base + 3]])
      cs = tetScratch; o = 0
    }
    // two or more corners on the plane: every pair is an edge of the tetrahedron (see labelRegions)
    const zero = code >> 4
    if (zero & (zero - 1)) meetTetEdges(zero, cs[o], cs[o + 1], cs[o + 2], cs[o + 3], s, ps, parent)
    // the crossed faces in order, lowest bit first (one loop, not four guesses of a branch)
    for (let x = TET_CROSSED[code & 15]; x !== 0; x &= x - 1) {
      const k = 31 - Math.clz32(x & -x), f = 3 * k
      live += meet(keys, mask, shift, cs[o + TET_FACE[f]], cs[o + TET_FACE[f + 1]], cs[o + TET_FACE[f + 2]], 8 * s + k, s, ps, parent, partOf)
    }
  }
  runLive = live
  return s
}

/** Four corners and four triangular faces (tet4, tet10): labelRegions sorts the corners once. */
function isTetrahedron(topo: { cornerCount: number; cornerFaces: Int32Array }): boolean {
  return topo.cornerCount === 4 && topo.cornerFaces.length === 16
}

let parentScratch = new Int32Array(0), partScratch = new Int32Array(0)
/** Sorted corners of a tetrahedron whose record has none (tetCode NO_CORNERS). */
const tetScratch = new Int32Array(4)

/** The root of i in a union-find forest (path halving). */
function find(parent: Int32Array, i: number): number {
  while (parent[i] !== i) { parent[i] = parent[parent[i]]; i = parent[i] }
  return i
}

/** Joins the trees of a and b under the smaller root (so a tree's root is its first element). */
function union(parent: Int32Array, a: number, b: number): void {
  const ra = find(parent, a), rb = find(parent, b)
  if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb)
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

/**
 * The crossed-face table of labelRegions (grows only, reused across cuts): per slot a face's
 * three smallest corners and 8·s + f, k0 = -1 on a free slot (linear probing, removal by
 * backward shift, so no tombstones). A face's home slot is the top bits of its hash
 * (faceSlot): node numbers of a structured mesh differ in regular steps, and the low bits of
 * their products repeat, which made long probe runs. At most `room` faces (half the slots);
 * 16384 slots (256 KB) keep the front of a 10^6-element cut (some 650 faces) at a
 * load of 4 %, where most probes and removals end at the first slot.
 */
interface FaceTable { keys: Int32Array; mask: number; shift: number; room: number }
let table: FaceTable | null = null

function newFaceTable(slots: number): FaceTable {
  return { keys: new Int32Array(4 * slots).fill(-1), mask: slots - 1, shift: 32 - Math.log2(slots), room: slots >> 1 }
}

function faceTable(): FaceTable {
  if (!table) table = newFaceTable(16384)
  return table
}

/** Twice the slots, the `live` faces moved over (in place: `t` stays the table). */
function growFaceTable(t: FaceTable, live: number): void {
  const old = t.keys, keys = new Int32Array(2 * old.length).fill(-1), mask = 2 * t.mask + 1, shift = t.shift - 1
  for (let o = 0, moved = 0; o < old.length && moved < live; o += 4) {
    if (old[o] < 0) continue
    let h = faceSlot(old[o], old[o + 1], old[o + 2], shift)
    while (keys[h << 2] >= 0) h = (h + 1) & mask
    for (let k = 0; k < 4; k++) keys[(h << 2) + k] = old[o + k]
    moved++
  }
  t.keys = keys; t.mask = mask; t.shift = shift; t.room = (mask + 1) >> 1
}

/** The most faces one element has (a hexahedron): room for them is made before each element. */
const MAX_FACES = 6

/**
 * Cut element s (part ps) meets its crossed face (c0 < c1 < c2 its three smallest corners, code
 * 8·s + face) in the face table (`keys`, `mask`, `shift` of FaceTable): the twin found joins the
 * two elements when they are of one part and leaves the table (returns -1); else the face goes
 * in (returns 1).
 */
function meet(keys: Int32Array, mask: number, shift: number, c0: number, c1: number, c2: number, code: number, s: number, ps: number, parent: Int32Array, partOf: Int32Array): number {
  // faceSlot written out: called here, it was not inlined, and the call cost a third of the loop
  for (let h = ((Math.imul(c0, 0x9e3779b1) + Math.imul(c1, 0x85ebca77) + Math.imul(c2, 0xc2b2ae3d)) | 0) >>> shift; ; h = (h + 1) & mask) {
    const o = h << 2, k0 = keys[o]
    if (k0 < 0) {
      keys[o] = c0; keys[o + 1] = c1; keys[o + 2] = c2; keys[o + 3] = code
      return 1
    }
    if (k0 === c0 && keys[o + 1] === c1 && keys[o + 2] === c2) {
      const other = keys[o + 3] >> 3
      if (partOf[other] === ps) {
        // union(parent, other, s) written out (not inlined when called)
        let a = other, b = s
        while (parent[a] !== a) { parent[a] = parent[parent[a]]; a = parent[a] }
        while (parent[b] !== b) { parent[b] = parent[parent[b]]; b = parent[b] }
        if (a < b) parent[b] = a
        else if (b < a) parent[a] = b
      }
      // the next slot free (the common case): nothing to move back
      if (keys[((h + 1) & mask) << 2] < 0) keys[o] = -1
      else removeFace(keys, mask, shift, h)
      return -1
    }
  }
}

/** A hash of three node numbers (multiplicative, then the high bits folded in). */
function faceHash(a: number, b: number, c: number): number {
  const h = (Math.imul(a, 0x9e3779b1) + Math.imul(b, 0x85ebca77) + Math.imul(c, 0xc2b2ae3d)) | 0
  return h ^ (h >>> 15)
}

/** The home slot of a face in a table of 2^(32 - shift) slots: the top bits of the multiplicative hash (also written out in meet). */
function faceSlot(a: number, b: number, c: number, shift: number): number {
  return ((Math.imul(a, 0x9e3779b1) + Math.imul(b, 0x85ebca77) + Math.imul(c, 0xc2b2ae3d)) | 0) >>> shift
}

/** Empties slot i: later faces of its probe run move back so every face stays reachable from its hash. */
function removeFace(keys: Int32Array, mask: number, shift: number, i: number): void {
  for (let j = (i + 1) & mask; ; j = (j + 1) & mask) {
    const oj = j << 2
    if (keys[oj] < 0) break
    // the face at j may fill i unless its home slot lies cyclically in (i, j]
    const home = faceSlot(keys[oj], keys[oj + 1], keys[oj + 2], shift)
    if (((j - home) & mask) < ((j - i) & mask)) continue
    const oi = i << 2
    keys[oi] = keys[oj]; keys[oi + 1] = keys[oj + 1]; keys[oi + 2] = keys[oj + 2]; keys[oi + 3] = keys[oj + 3]
    i = j
  }
  keys[i << 2] = -1
}

function clearFaceTable(t: FaceTable): void {
  const keys = t.keys
  for (let o = 0; o < keys.length; o += 4) keys[o] = -1
}

/**
 * In-plane edges of the cut elements (plane through nodes): per slot the edge's two corner nodes
 * (ascending), the part and the first cut element met with it; later elements of the same part
 * with the same edge join it. Grows only; emptied after each cut through the slots it used.
 */
let edgeKeys = new Int32Array(4 * 256).fill(-1), edgeMask = 255, edgeUsed = new Int32Array(256), edgeLive = 0

function meetInPlaneEdges(edges: readonly (readonly [number, number, number])[], onPlane: number, conn: Int32Array, base: number, s: number, ps: number, parent: Int32Array): void {
  for (const [a, b] of edges) {
    if (((onPlane >> a) & 1) === 0 || ((onPlane >> b) & 1) === 0) continue
    const u = conn[base + a], v = conn[base + b]
    meetEdge(u < v ? u : v, u < v ? v : u, s, ps, parent)
  }
}

/** meetInPlaneEdges for a tetrahedron (every corner pair is an edge): sorted corners a < b < c < e, bit k of `zero` when corner k is on the plane. */
function meetTetEdges(zero: number, a: number, b: number, c: number, e: number, s: number, ps: number, parent: Int32Array): void {
  const z0 = zero & 1, z1 = zero & 2, z2 = zero & 4, z3 = zero & 8
  if (z0 && z1) meetEdge(a, b, s, ps, parent)
  if (z0 && z2) meetEdge(a, c, s, ps, parent)
  if (z0 && z3) meetEdge(a, e, s, ps, parent)
  if (z1 && z2) meetEdge(b, c, s, ps, parent)
  if (z1 && z3) meetEdge(b, e, s, ps, parent)
  if (z2 && z3) meetEdge(c, e, s, ps, parent)
}

/** Cut element s (part ps) has the in-plane edge u < v: it joins the first element of its part met with that edge, or is that element. */
function meetEdge(u: number, v: number, s: number, ps: number, parent: Int32Array): void {
  if (2 * (edgeLive + 1) > edgeMask + 1) growEdgeTable()
  for (let h = faceHash(u, v, ps) & edgeMask; ; h = (h + 1) & edgeMask) {
    const o = h << 2
    if (edgeKeys[o] < 0) {
      edgeKeys[o] = u; edgeKeys[o + 1] = v; edgeKeys[o + 2] = ps; edgeKeys[o + 3] = s
      edgeUsed[edgeLive++] = h
      return
    }
    if (edgeKeys[o] === u && edgeKeys[o + 1] === v && edgeKeys[o + 2] === ps) { union(parent, edgeKeys[o + 3], s); return }
  }
}

function growEdgeTable(): void {
  const old = edgeKeys, oldUsed = edgeUsed, n = edgeLive
  const slots = 2 * (edgeMask + 1)
  edgeKeys = new Int32Array(4 * slots).fill(-1); edgeMask = slots - 1; edgeUsed = new Int32Array(slots); edgeLive = 0
  for (let i = 0; i < n; i++) {
    const o = oldUsed[i] << 2
    let h = faceHash(old[o], old[o + 1], old[o + 2]) & edgeMask
    while (edgeKeys[h << 2] >= 0) h = (h + 1) & edgeMask
    for (let k = 0; k < 4; k++) edgeKeys[(h << 2) + k] = old[o + k]
    edgeUsed[edgeLive++] = h
  }
}

function clearEdgeTable(): void {
  for (let i = 0; i < edgeLive; i++) edgeKeys[edgeUsed[i] << 2] = -1
  edgeLive = 0
}

/**
 * The open faces of labelRegions (grows only): face j is owned by cut element `openOwner[j]`, its
 * `openSize[j]` corner nodes ascending in `openNodes[4j ..]`.
 */
let openOwner = new Int32Array(256), openNodes = new Int32Array(4 * 256), openSize = new Uint8Array(256)

/**
 * Writes the `live` faces left in the table to the open faces, in the order they were met;
 * empties the table. Typed arrays and no comparator: at 10^6 tet4 the section's outline is some
 * hundreds of faces, met on every cut.
 */
function openFaces(t: FaceTable, live: number, sel: Int32Array, r: CutRecord, mesh: Mesh): void {
  const keys = t.keys
  if (openOwner.length < live) { openOwner = new Int32Array(2 * live); openNodes = new Int32Array(8 * live); openSize = new Uint8Array(2 * live) }
  const codes = openOwner
  let n = 0
  for (let o = 0; o < keys.length && n < live; o += 4) {
    if (keys[o] < 0) continue
    codes[n++] = keys[o + 3]
    keys[o] = -1
  }
  codes.subarray(0, n).sort()
  const nodes = openNodes
  for (let j = 0; j < n; j++) {
    const code = codes[j], owner = code >> 3, f = code & 7, i = sel[owner], block = mesh.blocks[r.block[i]], topo = ELEMENT_TYPES[block.type]
    const base = topo.nodeCount * r.local[i], cf = topo.cornerFaces, conn = block.conn, o = 4 * j
    codes[j] = owner
    if (isTetrahedron(topo)) {
      // face f of the sorted corners leaves the f-th out (labelRegions)
      let cs = r.corners, c0 = 4 * i
      if (r.tetCode[i] === NO_CORNERS) { sortTet(tetScratch, 0, conn[base], conn[base + 1], conn[base + 2], conn[base + 3], 0, 0, 0, 0); cs = tetScratch; c0 = 0 }
      for (let k = 0, m = 0; k < 4; k++) if (k !== f) nodes[o + m++] = cs[c0 + k]
      openSize[j] = 3
      continue
    }
    let m = 0
    for (let k = 0; k < 4; k++) {
      if (cf[4 * f + k] < 0) continue
      // insertion into the ascending corners so far
      const v = conn[base + cf[4 * f + k]]
      let p = m++
      while (p > 0 && nodes[o + p - 1] > v) { nodes[o + p] = nodes[o + p - 1]; p-- }
      nodes[o + p] = v
    }
    openSize[j] = m
  }
}

/**
 * Joins the owners (of one part) of the F open faces whose corners coincide within
 * COINCIDENT_TOL times their size: candidates from a sweep of the centroids
 * (coincidentSweep.ts), then the centroids within the tolerance, then every corner.
 */
function matchCoincident(F: number, coords: Float64Array, parent: Int32Array, partOf: Int32Array): void {
  const owner = openOwner, nodes = openNodes, size = openSize
  if (centroidScratch.length < 3 * F) { centroidScratch = new Float64Array(6 * F); tolScratch = new Float64Array(2 * F) }
  const c = centroidScratch, tol = tolScratch
  let cell = 0
  for (let i = 0; i < F; i++) {
    const o = 4 * i, nc = size[i]
    let x = 0, y = 0, z = 0
    for (let k = 0; k < nc; k++) { const v = nodes[o + k]; x += coords[3 * v] / nc; y += coords[3 * v + 1] / nc; z += coords[3 * v + 2] / nc }
    let h = 0
    for (let k = 0; k < nc; k++) { const v = nodes[o + k]; h = Math.max(h, Math.hypot(coords[3 * v] - x, coords[3 * v + 1] - y, coords[3 * v + 2] - z)) }
    c[3 * i] = x; c[3 * i + 1] = y; c[3 * i + 2] = z
    tol[i] = COINCIDENT_TOL * h
    cell = Math.max(cell, tol[i])
  }
  if (!(cell > 0)) return
  // twice the largest tolerance: round-off in the projections cannot hide a pair
  const near = nearPoints(c, F, 2 * cell)
  for (let i = 0; i < F; i++) {
    for (let k = near.start[i]; k < near.start[i + 1]; k++) {
      // each pair once, the earlier face first (the corner test reads the first face's corners)
      const j = near.list[k]
      if (j <= i) continue
      if (size[j] !== size[i] || owner[i] === owner[j] || partOf[owner[i]] !== partOf[owner[j]]) continue
      const t = Math.min(tol[i], tol[j])
      if (Math.hypot(c[3 * i] - c[3 * j], c[3 * i + 1] - c[3 * j + 1], c[3 * i + 2] - c[3 * j + 2]) > t) continue
      if (cornersCoincide(coords, Array.from(nodes.subarray(4 * i, 4 * i + size[i])), Array.from(nodes.subarray(4 * j, 4 * j + size[j])), t)) union(parent, owner[i], owner[j])
    }
  }
}

let centroidScratch = new Float64Array(0), tolScratch = new Float64Array(0)

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

