/**
 * Boundary faces of a mesh: faces used by exactly one element, oriented outward.
 *
 * Matching without strings or per-face maps, so that 10^6 elements take a fraction of a second:
 * every element face is bucketed by its smallest corner node (counting sort into CSR arrays),
 * with its remaining corners sorted beside it; inside a bucket (a few dozen faces at most for
 * sane meshes) faces are ordered by that tuple and equal runs are found in one scan. A run of one
 * is a boundary face, a run of two an interior face, a run of three or more is a mesh error.
 *
 * On a mesh with two part numbers or more, a run of two whose elements have different parts is a
 * face between parts: those pairs are recorded for the mesh (partPairs.ts), for the parts'
 * boundaries (partFaces.ts).
 *
 * Output faces are ordered by global element index, then local face number, so the result does
 * not depend on node numbering. Faces keep the element's local face node order, which is outward
 * for positively oriented elements (the readers reorient inverted ones).
 */
import { ELEMENT_TYPES, FACE_KIND_CODE, FACE_KINDS, FACE_NODE_COUNT } from '../model/elementTypes.ts'
import { elementIdOf } from '../model/elementId.ts'
import { InputError } from '../model/errors.ts'
import type { ElementBlock, Mesh } from '../model/model.ts'
import { elementParts, recordPartPairs } from './partPairs.ts'
import { FQP_AREA, FQP_SIZE, FQP_X, createFacePoints, faceQuadraturePoints } from './faceQuadraturePoint.ts'
import { tabulateFace } from './shapeFunctions.ts'
import type { FaceTable } from './shapeFunctions.ts'
import { FACE_SLOTS } from './types.ts'
import type { BoundaryFaces } from './types.ts'

/** Faces per element are at most 6; a face reference is globalElement·8 + localFace. */
const REF_STRIDE = 8

/**
 * Faces matched per part of the node range: 16 bytes of temporaries each, 8 MB in all. Fresh
 * memory costs page faults; more parts cost more passes over the elements (each pass reads every
 * element's corners to skip those outside its part).
 */
const PART_FACES = 1 << 19
/**
 * At most this many parts: every part re-reads all elements' corners, so a fixed part size would
 * make the extraction grow as E² (10^7 tet4: 77 passes over 160 MB of connectivity, 5 of its 6
 * seconds). Above 8 × PART_FACES faces the parts grow instead, to 2 bytes of temporaries per face
 * (80 MB at 10^7 tet4, a quarter of the model's own arrays), and the time stays linear.
 */
const MAX_PARTS = 8

/**
 * Stride of the per-face-node arrays for these blocks: the largest node count of any face kind of
 * an element type that has elements here (tri3 3, quad4 4, tri6 6, quad8 8). Blocks without
 * elements add nothing, and a mesh without elements gets 3, the smallest face.
 */
export function faceSlotsOf(blocks: readonly ElementBlock[]): number {
  let slots = FACE_NODE_COUNT.tri3
  for (const b of blocks) {
    const topo = ELEMENT_TYPES[b.type]
    if (b.conn.length === 0) continue
    for (const kd of topo.faceKinds) slots = Math.max(slots, FACE_NODE_COUNT[kd])
  }
  return slots
}

export function extractBoundaryFaces(mesh: Mesh): BoundaryFaces {
  return extractBoundaryFacesInParts(mesh, PART_FACES)
}

/**
 * extractBoundaryFaces with a chosen part size (faces matched per pass, raised so that there are
 * at most `maxParts` parts); the result depends on neither.
 */
export function extractBoundaryFacesInParts(mesh: Mesh, partFaces: number, maxParts = MAX_PARTS): BoundaryFaces {
  const N = mesh.nodeCount, E = mesh.elementCount
  const blocks = mesh.blocks
  // Each pass is a function of its own over typed arrays and numbers: a function with several hot
  // loops is compiled while its first loop runs, then dropped at the next loop (no feedback there
  // yet) and compiled again, six or seven times per extraction (about 0.1 s of compiling at 10^6).

  // Pass 1: count faces per smallest corner node.
  const bucketStart = new Int32Array(N + 1)
  let total = 0
  for (const b of blocks) {
    const topo = ELEMENT_TYPES[b.type], nn = topo.nodeCount, nf = topo.faces.length
    total += countFaces(bucketStart, b.conn, nn, nf, topo.cornerFaces, b.conn.length / nn)
  }
  const maxBucket = prefixSum(bucketStart, N)

  // Passes 2 and 3 run over parts of the node range, each holding at most PART_FACES faces (or one
  // bucket), so the temporaries stay at 16 bytes × PART_FACES however large the mesh: a face
  // belongs to the part of its smallest corner, and the buckets of a part are consecutive.
  const cap = Math.min(total, Math.max(partFaces, maxBucket, Math.ceil(total / maxParts)))
  const t: MatchTable = { ref: new Int32Array(cap), k1: new Int32Array(cap), k2: new Int32Array(cap), k3: new Int32Array(cap) }
  const cursor = bucketStart.slice(0, N)
  // Boundary flags, one bit per local face of each element.
  const isBoundary = new Uint8Array(E)
  // With two parts or more: the interior faces between parts, recorded for the parts' boundaries (partPairs.ts).
  const partOf = elementParts(mesh)
  const found: Matched = { boundary: 0, between: partOf ? new Int32Array(1024) : EMPTY_PAIRS, pairs: 0, badFrom: -1, badTo: -1, badNode: -1 }
  for (let lo = 0; lo < N;) {
    const base = bucketStart[lo]
    const hi = partEnd(bucketStart, lo, N, base, cap)
    const span = hi - lo

    // Pass 2: place each face of this part in its bucket with its other corners sorted ascending
    // (k3 = -1 for triangles, so a triangle never matches a quadrilateral).
    for (const b of blocks) {
      const topo = ELEMENT_TYPES[b.type], nn = topo.nodeCount
      placeFaces(t, cursor, base, b.conn, nn, topo.faces.length, topo.cornerFaces, topo.cornerCount, b.offset, b.conn.length / nn, lo, hi, span, N)
    }

    // Pass 3: order each bucket by (k1, k2, k3) (insertion sort: buckets are small) and flag runs of one.
    if (!matchBuckets(t, bucketStart, base, lo, hi, isBoundary, partOf, found)) {
      const i = found.badFrom
      throw sharedFaceError(mesh, t.ref, i, found.badTo, found.badNode, t.k1[i], t.k2[i], t.k3[i])
    }
    lo = hi
  }

  // Pass 4: emit boundary faces in element order.
  const F = found.boundary
  const elem = new Int32Array(F), localFace = new Uint8Array(F), kind = new Uint8Array(F)
  const S = faceSlotsOf(blocks)
  const nodes = new Int32Array(S * F).fill(-1)
  let k = 0
  for (const b of blocks) {
    const topo = ELEMENT_TYPES[b.type], nn = topo.nodeCount
    const codes = Uint8Array.from(topo.faceKinds, (kd) => FACE_KIND_CODE[kd])
    k = emitFaces(elem, localFace, kind, nodes, S, k, isBoundary, b.conn, nn, topo.faces, codes, b.offset, b.conn.length / nn)
  }

  const area = new Float64Array(F), normal = new Float64Array(3 * F), centroid = new Float64Array(3 * F)
  computeFaceGeometry(area, normal, centroid, mesh.coords, kind, nodes, S)
  if (partOf) recordPartPairs(mesh, found.between.slice(0, found.pairs))
  return { count: F, slots: S, elem, localFace, kind, nodes, area, normal, centroid }
}

const EMPTY_PAIRS = new Int32Array(0)

/** The matching's temporaries: per face of a part, its reference and its other three corners sorted. */
interface MatchTable { readonly ref: Int32Array; readonly k1: Int32Array; readonly k2: Int32Array; readonly k3: Int32Array }

/** What pass 3 found: boundary faces, the pairs between parts, and a face of three elements or more (its run and bucket). */
interface Matched { boundary: number; between: Int32Array; pairs: number; badFrom: number; badTo: number; badNode: number }

/** Pass 1 for one block: each face counted in the bucket of its smallest corner (bucketStart[m + 1]); returns the faces. */
function countFaces(bucketStart: Int32Array, conn: Int32Array, nn: number, nf: number, fc: Int32Array, count: number): number {
  for (let e = 0; e < count; e++) {
    const base = e * nn
    for (let f = 0; f < nf; f++) {
      let m = conn[base + fc[4 * f]]
      const c1 = conn[base + fc[4 * f + 1]], c2 = conn[base + fc[4 * f + 2]]
      if (c1 < m) m = c1
      if (c2 < m) m = c2
      const l3 = fc[4 * f + 3]
      if (l3 >= 0) { const c3 = conn[base + l3]; if (c3 < m) m = c3 }
      bucketStart[m + 1]++
    }
  }
  return count * nf
}

/** The counts into bucket starts (in place); returns the largest bucket. */
function prefixSum(bucketStart: Int32Array, N: number): number {
  let maxBucket = 0
  for (let i = 0; i < N; i++) {
    const c = bucketStart[i + 1]
    if (c > maxBucket) maxBucket = c
    bucketStart[i + 1] += bucketStart[i]
  }
  return maxBucket
}

/** The end of the part of the node range from lo: the buckets that fit in `cap` faces (one at least). */
function partEnd(bucketStart: Int32Array, lo: number, N: number, base: number, cap: number): number {
  let hi = lo + 1
  while (hi < N && bucketStart[hi + 1] - base <= cap) hi++
  return hi
}

/** Pass 2 for one block: its faces whose smallest corner lies in [lo, hi) into their buckets, the other corners sorted. */
function placeFaces(
  t: MatchTable, cursor: Int32Array, base: number, conn: Int32Array, nn: number, nf: number, fc: Int32Array, cc: number, off: number, count: number,
  lo: number, hi: number, span: number, N: number,
): void {
  const ref = t.ref, k1 = t.k1, k2 = t.k2, k3 = t.k3
  for (let e = 0; e < count; e++) {
    const eb = e * nn
    if (span < N) {
      // Several parts: an element whose corners all lie outside this part's node range has
      // no face here (every face's smallest corner lies between its own smallest and largest).
      let eMin = conn[eb], eMax = eMin
      for (let k = 1; k < cc; k++) { const v = conn[eb + k]; eMin = Math.min(eMin, v); eMax = Math.max(eMax, v) }
      if (eMin >= hi || eMax < lo) continue
    }
    for (let f = 0; f < nf; f++) {
      let a = conn[eb + fc[4 * f]], bb = conn[eb + fc[4 * f + 1]], c = conn[eb + fc[4 * f + 2]]
      const l3 = fc[4 * f + 3]
      let d = l3 >= 0 ? conn[eb + l3] : 0x7fffffff
      // Faces of other parts are skipped before sorting (unsigned compare: one test for both ends).
      if (((Math.min(Math.min(a, bb), Math.min(c, d)) - lo) >>> 0) >= span) continue
      // Sorting network for four values (d = +∞ for triangles stays last).
      let x: number
      if (a > bb) { x = a; a = bb; bb = x }
      if (c > d) { x = c; c = d; d = x }
      if (a > c) { x = a; a = c; c = x }
      if (bb > d) { x = bb; bb = d; d = x }
      if (bb > c) { x = bb; bb = c; c = x }
      const p = cursor[a]++ - base
      ref[p] = (off + e) * REF_STRIDE + f
      k1[p] = bb; k2[p] = c; k3[p] = d === 0x7fffffff ? -1 : d
    }
  }
}

/**
 * Pass 3 over the buckets [lo, hi): each ordered by (k1, k2, k3) (insertion sort: buckets are
 * small), runs of one flagged as boundary faces, runs of two between parts recorded. Returns
 * false at a run of three or more (a face of three elements; its run and bucket in `found`).
 */
function matchBuckets(
  t: MatchTable, bucketStart: Int32Array, base: number, lo: number, hi: number, isBoundary: Uint8Array, partOf: Int32Array | null, found: Matched,
): boolean {
  const ref = t.ref, k1 = t.k1, k2 = t.k2, k3 = t.k3
  let boundary = found.boundary
  for (let n = lo; n < hi; n++) {
    const s = bucketStart[n] - base, e = bucketStart[n + 1] - base
    if (e - s > 64) sortLargeBucket(ref, k1, k2, k3, s, e)
    else sortBucket(ref, k1, k2, k3, s, e)
    let i = s
    while (i < e) {
      let j = i + 1
      while (j < e && k1[j] === k1[i] && k2[j] === k2[i] && k3[j] === k3[i]) j++
      const run = j - i
      if (run === 1) { const r = ref[i]; isBoundary[r >> 3] |= 1 << (r & 7); boundary++ }
      else if (run > 2) { found.boundary = boundary; found.badFrom = i; found.badTo = j; found.badNode = n; return false }
      else if (partOf !== null) {
        const ra = ref[i], rb = ref[i + 1]
        if (partOf[ra >> 3] !== partOf[rb >> 3]) addPair(found, Math.min(ra, rb), Math.max(ra, rb))
      }
      i = j
    }
  }
  found.boundary = boundary
  return true
}

/** Orders a small bucket [s, e) by (k1, k2, k3): insertion sort. */
function sortBucket(ref: Int32Array, k1: Int32Array, k2: Int32Array, k3: Int32Array, s: number, e: number): void {
  for (let i = s + 1; i < e; i++) {
    const r = ref[i], a = k1[i], b = k2[i], c = k3[i]
    let j = i - 1
    while (j >= s && (k1[j] > a || (k1[j] === a && (k2[j] > b || (k2[j] === b && k3[j] > c))))) {
      ref[j + 1] = ref[j]; k1[j + 1] = k1[j]; k2[j + 1] = k2[j]; k3[j + 1] = k3[j]
      j--
    }
    ref[j + 1] = r; k1[j + 1] = a; k2[j + 1] = b; k3[j + 1] = c
  }
}

/** Records a pair of face references between parts (the lower first), growing the list as needed. */
function addPair(found: Matched, a: number, b: number): void {
  if (found.pairs === found.between.length) { const grown = new Int32Array(2 * found.pairs); grown.set(found.between); found.between = grown }
  found.between[found.pairs++] = a; found.between[found.pairs++] = b
}

/** Pass 4 for one block: its flagged faces in element order from index k on; returns the next index. */
function emitFaces(
  elem: Int32Array, localFace: Uint8Array, kind: Uint8Array, nodes: Int32Array, S: number, k: number, isBoundary: Uint8Array,
  conn: Int32Array, nn: number, faces: readonly (readonly number[])[], codes: Uint8Array, off: number, count: number,
): number {
  const nf = faces.length
  for (let e = 0; e < count; e++) {
    const g = off + e, flags = isBoundary[g]
    if (flags === 0) continue
    for (let f = 0; f < nf; f++) {
      if (!(flags & (1 << f))) continue
      const face = faces[f]
      elem[k] = g; localFace[k] = f; kind[k] = codes[f]
      for (let a = 0; a < face.length; a++) nodes[S * k + a] = conn[e * nn + face[a]]
      k++
    }
  }
  return k
}


/** Orders a big bucket (a node shared by very many elements) without the quadratic insertion sort. */
function sortLargeBucket(ref: Int32Array, k1: Int32Array, k2: Int32Array, k3: Int32Array, s: number, t: number): void {
  const idx = Array.from({ length: t - s }, (_, i) => s + i)
  idx.sort((x, y) => k1[x] - k1[y] || k2[x] - k2[y] || k3[x] - k3[y])
  const r = idx.map((i) => ref[i]), a = idx.map((i) => k1[i]), b = idx.map((i) => k2[i]), c = idx.map((i) => k3[i])
  for (let i = 0; i < idx.length; i++) { ref[s + i] = r[i]; k1[s + i] = a[i]; k2[s + i] = b[i]; k3[s + i] = c[i] }
}

let faceTables: FaceTable[] | null = null
/** Face tables at the face quadrature points, indexed by FACE_KIND_CODE; built once. */
export function faceQuadratureTables(): FaceTable[] {
  if (!faceTables) faceTables = FACE_KINDS.map((kd) => tabulateFace(kd.name, kd.rule))
  return faceTables
}

/**
 * Area, unit mean outward normal and area centroid of faces given by kind code and node slots
 * (`slots` per face in `nodes`, at least the node count of the largest face present) into
 * `outArea` (F), `outNormal` (3·F) and `outCentroid` (3·F), with the face quadrature (curved
 * quadratic faces included; flat triangles in closed form). A zero-area face gets a zero normal
 * and its corner mean as centroid.
 */
export function computeFaceGeometry(outArea: Float64Array, outNormal: Float64Array, outCentroid: Float64Array, coords: Float64Array, kind: Uint8Array, nodes: Int32Array, slots: number): void {
  // imported names once into locals (getter calls under tsx's CommonJS transform, see tractions.ts)
  const points = faceQuadraturePoints, X = FQP_X, AREA = FQP_AREA, SIZE = FQP_SIZE
  const tables = faceQuadratureTables()
  const F = kind.length
  const xs = new Float64Array(3 * FACE_SLOTS), qp = createFacePoints(tables)
  for (let f = 0; f < F; f++) {
    const kc = kind[f]
    const o = slots * f
    if (kc === 0) {
      // Flat triangle: exact in closed form (scalar locals: one pass over every boundary face).
      const a = 3 * nodes[o], b = 3 * nodes[o + 1], c = 3 * nodes[o + 2]
      const ax = coords[a], ay = coords[a + 1], az = coords[a + 2]
      const ux = coords[b] - ax, uy = coords[b + 1] - ay, uz = coords[b + 2] - az
      const vx = coords[c] - ax, vy = coords[c + 1] - ay, vz = coords[c + 2] - az
      const nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx
      const len = Math.sqrt(nx * nx + ny * ny + nz * nz)
      outArea[f] = 0.5 * len
      const inv = len > 0 ? 1 / len : 0
      outNormal[3 * f] = nx * inv; outNormal[3 * f + 1] = ny * inv; outNormal[3 * f + 2] = nz * inv
      outCentroid[3 * f] = (coords[a] + coords[b] + coords[c]) / 3
      outCentroid[3 * f + 1] = (coords[a + 1] + coords[b + 1] + coords[c + 1]) / 3
      outCentroid[3 * f + 2] = (coords[a + 2] + coords[b + 2] + coords[c + 2]) / 3
      continue
    }
    const t = tables[kc]
    const nn = t.nodeCount, nq = t.pointCount, W = t.weights
    for (let a = 0; a < nn; a++) {
      const p = 3 * nodes[o + a]
      xs[3 * a] = coords[p]; xs[3 * a + 1] = coords[p + 1]; xs[3 * a + 2] = coords[p + 2]
    }
    let A = 0, sx = 0, sy = 0, sz = 0, cx = 0, cy = 0, cz = 0
    points(qp, t, xs, null, true)
    for (let q = 0; q < nq; q++) {
      const r = SIZE * q, w = W[q]
      const nx = qp[r + AREA], ny = qp[r + AREA + 1], nz = qp[r + AREA + 2]
      const dA = Math.sqrt(nx * nx + ny * ny + nz * nz) * w
      A += dA; sx += nx * w; sy += ny * w; sz += nz * w
      cx += qp[r + X] * dA; cy += qp[r + X + 1] * dA; cz += qp[r + X + 2] * dA
    }
    outArea[f] = A
    const len = Math.sqrt(sx * sx + sy * sy + sz * sz)
    const inv = len > 0 ? 1 / len : 0
    outNormal[3 * f] = sx * inv; outNormal[3 * f + 1] = sy * inv; outNormal[3 * f + 2] = sz * inv
    if (A > 0) {
      outCentroid[3 * f] = cx / A; outCentroid[3 * f + 1] = cy / A; outCentroid[3 * f + 2] = cz / A
    } else {
      // Degenerate face: fall back to the node mean so the centroid is still finite.
      let mx = 0, my = 0, mz = 0
      for (let a = 0; a < nn; a++) { mx += xs[3 * a]; my += xs[3 * a + 1]; mz += xs[3 * a + 2] }
      outCentroid[3 * f] = mx / nn; outCentroid[3 * f + 1] = my / nn; outCentroid[3 * f + 2] = mz / nn
    }
  }
}

function sharedFaceError(mesh: Mesh, ref: Int32Array, i: number, j: number, n0: number, a: number, b: number, c: number): InputError {
  const ids: number[] = []
  for (let p = i; p < j; p++) ids.push(elementIdOf(mesh, Math.floor(ref[p] / REF_STRIDE)))
  const corners = [n0, a, b, c].filter((x) => x >= 0).map((x) => mesh.nodeIds[x])
  return new InputError('shared-face',
    `the face with corner nodes ${corners.join(', ')} is shared by ${j - i} elements (${ids.join(', ')}); ` +
    'a face may belong to at most two elements, so the mesh overlaps itself or has duplicate elements there',
    { elementId: ids[0] })
}
