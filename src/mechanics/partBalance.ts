/**
 * Parts of an assembly: each part's own free body and the interfaces between parts.
 *
 * A part is the set of elements with one part number. Its boundary faces are those of the
 * sub-mesh of its elements, so they include the faces it shares with other parts; every part's
 * are built at once from the whole body's boundary faces and the faces between parts
 * (partFaces.ts), not by one extraction per part. Its balance is that of computeBodyBalance over
 * those faces with its own ρb: the residual of ∮ t dA + ∫ ρb dV, moment about the part's volume
 * centroid.
 *
 * Interfaces: a face of part b's boundary is an interface with part a when part a's boundary has
 * the same face: the same corner nodes (shared nodes: the faces between parts), or corners that
 * coincide within INTERFACE_TOL times the face size (parts meshed apart on matching grids: both
 * are faces of the whole body's boundary, paired by interfaceFaces.ts). For a pair a < b:
 * `force` = F_ab, what a exerts on b = ∫ t dA over b's faces (b's outward normal, b's stress); `moment` about the interface centroid; `mismatch` = |F_ab + F_ba| / (∫|t| dA,
 * the mean of both sides): zero for nodal stress with shared nodes (Newton's third law holds by
 * construction), a quality figure for element-nodal stress.
 *
 * Units: model units; forces stress·length², moments stress·length³. Not a per-drag kernel:
 * it runs once per load (O(elements): one pass for the element counts per part and the nodes
 * between parts, one for the elements on those nodes; the faces and tractions of the whole body
 * come from the load where it has them). A part's volume and centroid come from its boundary
 * faces (boundaryVolume.ts), as the whole body's do at load.
 */
import type { ElementBlock, Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import { extractBoundaryFaces } from './boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from './tractions.ts'
import { volumeChunks } from './elementVolume.ts'
import { faceCornerCount } from './freeBody.ts'
import { momentAbout } from './vec3.ts'
import type { BodyBalance, BoundaryFaces, SurfaceTractions } from './types.ts'
import { coincidentFacePairs } from './interfaceFaces.ts'
import { facesBetweenParts, keptFloat64, keptInt32, markNodes } from './partFaces.ts'
import { addBoundaryVolumes, volumeOfSums, volumeSums } from './boundaryVolume.ts'
import { recordedPartPairs } from './partPairs.ts'
export { hasSeveralParts } from './partPairs.ts'

export { INTERFACE_TOL } from './interfaceFaces.ts'

export interface PartRecord {
  readonly part: number
  readonly name: string
  readonly elements: number
  readonly volume: number
  readonly balance: BodyBalance
}

export interface InterfaceRecord {
  /** [a, b] with a < b. */
  readonly parts: [number, number]
  readonly faces: number
  readonly area: number
  readonly centroid: Vec3
  /** Force part a exerts on part b (from b's faces and stress). */
  readonly force: Vec3
  /** Moment of that force about the interface centroid. */
  readonly moment: Vec3
  /** The same from a's side: what b exerts on a. */
  readonly reverseForce: Vec3
  readonly mismatch: number
  readonly gross: number
}

export interface AssemblyBalance {
  readonly parts: readonly PartRecord[]
  readonly interfaces: readonly InterfaceRecord[]
  /**
   * The interfaces' faces for drawing: corner triangles (quads split in two) of part b's faces,
   * `positions` Float32Array(9·T) length units, interface i's triangles from `offsets[i]` to
   * `offsets[i + 1]` (interfaces in the order of `interfaces`).
   */
  readonly interfaceMesh: { readonly positions: Float32Array; readonly offsets: Int32Array }
  /** Each of the whole body's boundary faces' part index (its part's place in `parts`), Int32Array(F). */
  readonly facePart: Int32Array
}

/** The part numbers of the mesh, ascending (0 for elements without one). */
export function partNumbers(mesh: Mesh): number[] {
  const s = new Set<number>()
  for (const b of mesh.blocks) {
    if (!b.part) s.add(0)
    else {
      // runs of one part are the rule: a Set lookup only where the part changes
      let last = NaN
      for (let e = 0; e < b.part.length; e++) { const p = b.part[e]; if (p !== last) { s.add(p); last = p } }
    }
  }
  return [...s].sort((a, b) => a - b)
}

/** The sub-mesh of one part's elements (same nodes) and its stress field. */
export function partSubmesh(mesh: Mesh, field: StressField, part: number): { mesh: Mesh; field: StressField } {
  return partsSubmesh(mesh, field, [part])
}

/** The sub-mesh of the elements of the given parts (same nodes, part numbers kept) and its stress field. */
export function partsSubmesh(mesh: Mesh, field: StressField, parts: readonly number[]): { mesh: Mesh; field: StressField } {
  const wanted = new Set(parts)
  const blocks: ElementBlock[] = []
  const rows: Int32Array[] = []
  let offset = 0
  // typed copies row by row (no per-element closures or views: this runs over every element once per part)
  mesh.blocks.forEach((b, bi) => {
    const nn = ELEMENT_TYPES[b.type].nodeCount, count = b.ids.length, bp = b.part
    const keep = new Int32Array(count)
    let kept = 0
    if (bp) {
      // parts are few: the test is a short list (a Set lookup per element costs more)
      const list = [...wanted]
      for (let e = 0; e < count; e++) if (list.includes(bp[e])) keep[kept++] = e
    } else if (wanted.has(0)) {
      for (let e = 0; e < count; e++) keep[kept++] = e
    }
    if (kept === 0) return
    const src = b.conn, from = field.rows[bi], nodal = field.layout === 'nodal'
    const conn = new Int32Array(kept * nn), ids = new Int32Array(kept), r = nodal ? conn : new Int32Array(kept * nn), part = new Int32Array(kept)
    for (let k = 0; k < kept; k++) {
      const e = keep[k], o = k * nn, so = e * nn
      for (let c = 0; c < nn; c++) conn[o + c] = src[so + c]
      if (!nodal) for (let c = 0; c < nn; c++) r[o + c] = from[so + c]
      ids[k] = b.ids[e]
      if (bp) part[k] = bp[e]
    }
    blocks.push({ type: b.type, conn, ids, part, offset })
    rows.push(r)
    offset += kept
  })
  const sub: Mesh = { coords: mesh.coords, nodeIds: mesh.nodeIds, nodeCount: mesh.nodeCount, elementCount: offset, blocks }
  return { mesh: sub, field: { values: field.values, rows, layout: field.layout } }
}

/** What a load already computed on the whole body (the analysis pipeline): reused, not recomputed. */
export interface BodyFaces {
  /** The whole body's boundary faces (extractBoundaryFaces). */
  readonly faces: BoundaryFaces
  /** Their tractions from the same stress field as the assembly's (computeSurfaceTractions; the face integrals are read). */
  readonly tractions: FaceLoads
  /**
   * Per face, nonzero on a face against a part meshed apart (coincidentInterfaceFaces; the load
   * patches' label -2): those faces are then paired among themselves only. Without it every
   * boundary face is searched.
   */
  readonly against?: ArrayLike<number> | null
}

/**
 * Every part's boundary at once. Part k's boundary faces are the whole body's boundary faces of
 * its elements (`outer`) and the sides of the faces it shares with other parts (`inner`,
 * partFaces.ts), in (element, local face) order: the faces, in the order, that extracting the
 * boundary of its own sub-mesh gives. Sides are numbered outer first: side s < outer.count is
 * outer face s, else inner face s - outer.count.
 */
export interface PartBoundaries {
  /** Part numbers, ascending: a part's index is its place here. */
  readonly numbers: readonly number[]
  readonly outer: BoundaryFaces
  readonly outerTractions: FaceLoads
  /** Each outer face's part index. */
  readonly outerPart: Int32Array
  /** Each outer face's twin on a part meshed apart (-1 for none), null with one part. */
  readonly outerTwin: Int32Array | null
  readonly inner: BoundaryFaces
  readonly innerTractions: FaceLoads
  readonly innerPart: Int32Array
  /** Each inner face's other side. */
  readonly innerTwin: Int32Array
}

/**
 * Each face's part index (`index`: part number → index); faces in element order (a cursor over
 * the blocks, started over if the order goes back), the index looked up where the part changes.
 */
export function facePartIndex(mesh: Mesh, faces: BoundaryFaces, index: ReadonlyMap<number, number>): Int32Array {
  const out = new Int32Array(faces.count), blocks = mesh.blocks
  let bi = 0, last = -1, k = 0
  for (let f = 0; f < faces.count; f++) {
    const g = faces.elem[f]
    if (g < blocks[bi].offset) bi = 0
    while (g >= blocks[bi].offset + blocks[bi].ids.length) bi++
    const b = blocks[bi], p = b.part ? b.part[g - b.offset] : 0
    if (p !== last) { last = p; k = index.get(p) ?? 0 }
    out[f] = k
  }
  return out
}

/** What the parts read of a face's tractions (see SurfaceTractions): force, moment about the origin, mean |t|. */
export type FaceLoads = Pick<SurfaceTractions, 'force' | 'moment' | 'meanMagnitude'>

/** Faces per call of computeSurfaceTractions in faceLoads. */
const LOAD_CHUNK = 2048
/**
 * faceLoads' scratch for the per-node outputs that the parts do not read (9 numbers per face node
 * slot), kept from one load to the next: about 0.5 MB for triangles instead of 300 bytes per face
 * (10 MB at 10^6 tet4 in four slabs), whose first touch costs a page fault per 4 KiB.
 */
let loadScratch: SurfaceTractions | null = null

/**
 * The tractions' face integrals of `faces` (computeSurfaceTractions, the same numbers), LOAD_CHUNK
 * faces at a time through a reused scratch, so only 7 numbers per face are new memory; with
 * `reuse`, none: they are kept arrays (partFaces.ts), valid until the next such call.
 */
export function faceLoads(mesh: Mesh, field: StressField, faces: BoundaryFaces, reuse = false): FaceLoads {
  const F = faces.count, S = faces.slots
  const out: FaceLoads = reuse
    ? { force: keptFloat64('loadForce', 3 * F), moment: keptFloat64('loadMoment', 3 * F), meanMagnitude: keptFloat64('loadMagnitude', F) }
    : { force: new Float64Array(3 * F), moment: new Float64Array(3 * F), meanMagnitude: new Float64Array(F) }
  if (!loadScratch || loadScratch.nodeMagnitude.length < S * LOAD_CHUNK) {
    loadScratch = allocateSurfaceTractions({ ...faces, count: LOAD_CHUNK })
  }
  const t = loadScratch
  for (let s = 0; s < F; s += LOAD_CHUNK) {
    const n = Math.min(LOAD_CHUNK, F - s)
    // a view of faces [s, s + n), its fields in BoundaryFaces order (one object shape for the kernel)
    const piece: BoundaryFaces = {
      count: n, slots: S, elem: faces.elem.subarray(s, s + n), localFace: faces.localFace.subarray(s, s + n), kind: faces.kind.subarray(s, s + n),
      nodes: faces.nodes.subarray(S * s, S * (s + n)), area: faces.area.subarray(s, s + n), normal: faces.normal.subarray(3 * s, 3 * (s + n)),
      centroid: faces.centroid.subarray(3 * s, 3 * (s + n)),
    }
    computeSurfaceTractions(t, mesh, field, piece)
    out.force.set(t.force.subarray(0, 3 * n), 3 * s)
    out.moment.set(t.moment.subarray(0, 3 * n), 3 * s)
    out.meanMagnitude.set(t.meanMagnitude.subarray(0, n), s)
  }
  return out
}

/**
 * The boundaries of every part, from the whole body's faces and tractions when a load has them;
 * `marked` the nodes' part marks and `numbers` the part numbers (partNumbers) when the caller has
 * them; with `reuse` the faces between parts and their loads are in kept arrays (partFaces.ts),
 * valid until the next such call.
 */
export function partBoundaries(
  mesh: Mesh, field: StressField, body?: BodyFaces, marked: Int32Array | null = null, numbers: readonly number[] = partNumbers(mesh), reuse = false,
): PartBoundaries {
  const index = new Map(numbers.map((p, k) => [p, k]))
  const outer = body?.faces ?? extractBoundaryFaces(mesh)
  const outerTractions = body?.tractions ?? faceLoads(mesh, field, outer)
  const sides = facesBetweenParts(mesh, marked, reuse)
  const inner = sides.faces
  const innerTractions = faceLoads(mesh, field, inner, reuse)
  const outerPart = facePartIndex(mesh, outer, index), innerPart = facePartIndex(mesh, inner, index)
  // no face labelled against a part meshed apart: no pairs to search for
  const against = body?.against ?? null
  const outerTwin = against && !anyNonzero(against) ? null : coincidentFacePairs(mesh.coords, outer, outerPart, against)
  return { numbers, outer, outerTractions, outerPart, outerTwin, inner, innerTractions, innerPart, innerTwin: sides.twin }
}

function anyNonzero(a: ArrayLike<number>): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== 0) return true
  return false
}

/**
 * The sides of `b` in each part's boundary order, merged from outer and inner by (element, local
 * face): calls `visit(k, side)` with part index k.
 */
function forEachSide(b: PartBoundaries, visit: (k: number, side: number) => void): void {
  const { outer, inner, outerPart, innerPart } = b, Fo = outer.count, Fi = inner.count
  let i = 0, j = 0
  while (i < Fo || j < Fi) {
    const takeOuter = j >= Fi || (i < Fo && (outer.elem[i] < inner.elem[j] || (outer.elem[i] === inner.elem[j] && outer.localFace[i] < inner.localFace[j])))
    if (takeOuter) { visit(outerPart[i], i); i++ } else { visit(innerPart[j], Fo + j); j++ }
  }
}

/** Part index k's boundary sides (see PartBoundaries), in its boundary order. */
export function partSides(b: PartBoundaries, k: number): Int32Array {
  const out: number[] = []
  forEachSide(b, (p, s) => { if (p === k) out.push(s) })
  return Int32Array.from(out)
}

/**
 * Parts and interfaces of an assembly. `bodyForce(part)` gives each part's ρb (a part's own or
 * the model's); `names` the part names (empty when none); `body` the whole body's faces and
 * tractions when a load has them (the engine), else they are computed here (the command line).
 * Each part's balance is computeBodyBalance's over its own elements and boundary, with the sums
 * in the same order (balanceAudit.ts).
 *
 * The loops over elements, faces and pairs are small functions over typed arrays: this runs once
 * per load, so each is compiled afresh at every load (the compiler's time counts as much as the
 * loops' own at 10^6 elements), and small monomorphic loops compile quickly.
 */
export function assemblyBalance(
  mesh: Mesh, field: StressField, bodyForce: (part: number) => Vec3, names: ReadonlyMap<number, string> = new Map(), body?: BodyFaces,
): AssemblyBalance {
  // the whole body's faces first: their extraction records the faces between parts (partPairs.ts)
  const faces = body?.faces ?? extractBoundaryFaces(mesh)
  const whole: BodyFaces = { faces, tractions: body?.tractions ?? faceLoads(mesh, field, faces), against: body?.against }
  // one pass over the elements: the part numbers, the elements per part, and, without that
  // record, the nodes' part marks for the faces between parts
  const mark = recordedPartPairs(mesh) ? null : nodeMarks(mesh.nodeCount)
  const { numbers, elements } = countAndMark(mark, mesh), K = numbers.length
  const b = partBoundaries(mesh, field, whole, mark, numbers, true)
  const sums = partVolumes(mesh, b)
  const surf = partSurfaceSums(new Float64Array(7 * K), b)
  const parts = b.numbers.map((p, k): PartRecord => {
    const V = sums[4 * k], o = 7 * k, w = bodyForce(p)
    // computeBodyBalance's figures (balanceAudit.ts): moment about the volume centroid
    const c: Vec3 = V !== 0 ? [sums[4 * k + 1], sums[4 * k + 2], sums[4 * k + 3]] : [0, 0, 0]
    const surfaceForce: Vec3 = [surf[o], surf[o + 1], surf[o + 2]]
    const bodyForceTotal: Vec3 = [w[0] * V, w[1] * V, w[2] * V]
    const force: Vec3 = [surfaceForce[0] + bodyForceTotal[0], surfaceForce[1] + bodyForceTotal[1], surfaceForce[2] + bodyForceTotal[2]]
    const moment = momentAbout<Vec3>([0, 0, 0], [surf[o + 3], surf[o + 4], surf[o + 5]], c, surfaceForce)
    const gross = 0.5 * (surf[o + 6] + Math.hypot(...bodyForceTotal))
    const balance: BodyBalance = { force, moment, relative: gross > 0 ? Math.hypot(...force) / gross : 0, gross, about: c, volume: V, centroid: c, surfaceForce, bodyForceTotal }
    return { part: p, name: names.get(p) ?? '', elements: elements[k], volume: V, balance }
  })
  return { parts, ...matchInterfaces(mesh.coords, b), facePart: b.outerPart }
}

/**
 * Int32Array(N) filled with -1 for the nodes' part marks (markNodes), a kept array (partFaces.ts;
 * a model-size array is fresh memory otherwise): valid until the next call, and assemblyBalance
 * reads it within its own call only.
 */
function nodeMarks(N: number): Int32Array {
  return keptInt32('nodeMarks', N).fill(-1)
}

/**
 * The part numbers (ascending, as partNumbers) and each part's element count, from one pass over
 * the elements, which also puts their corners into the nodes' part marks `mark` when given (-1 no
 * element, p ≥ 0 part p only, -2 several parts: markNodes, partFaces.ts). Runs of one part are the rule:
 * the part's slot is looked up only where the part changes.
 */
function countAndMark(mark: Int32Array | null, mesh: Mesh): { numbers: number[]; elements: Int32Array } {
  const acc: PartCounts = { met: [], slotOf: new Map(), counts: new Int32Array(8) }
  for (const b of mesh.blocks) {
    const topo = ELEMENT_TYPES[b.type], count = b.ids.length
    // a block without part numbers is part 0, even without elements (partNumbers)
    if (!b.part) { acc.counts[partSlot(acc, 0)] += count; if (mark) markNodes(mark, b.conn, topo.nodeCount, topo.cornerCount, null, 0, count); continue }
    countRuns(acc, b.part, count, mark, b.conn, topo.nodeCount, topo.cornerCount)
  }
  const { met, counts } = acc
  const order = met.map((_, i) => i).sort((x, y) => met[x] - met[y])
  return { numbers: order.map((r) => met[r]), elements: Int32Array.from(order, (r) => counts[r]) }
}

/** Part numbers in the order met, their slots, and the element count per slot. */
interface PartCounts { readonly met: number[]; readonly slotOf: Map<number, number>; counts: Int32Array }

/** Part p's slot in `acc` (a new one for a part not met before). */
function partSlot(acc: PartCounts, p: number): number {
  let r = acc.slotOf.get(p)
  if (r === undefined) {
    r = acc.met.length; acc.met.push(p); acc.slotOf.set(p, r)
    if (r === acc.counts.length) { const grown = new Int32Array(2 * r); grown.set(acc.counts); acc.counts = grown }
  }
  return r
}

/**
 * The runs of one part in a block's part numbers: each run's element count into its part's slot,
 * and its corners into the marks when given. A loop of its own with no closure in it: its
 * compiled code then outlives the model it ran on (code that holds a closure made per call is
 * dropped with it, and compiled again at the next load).
 */
function countRuns(acc: PartCounts, part: Int32Array, count: number, mark: Int32Array | null, conn: Int32Array, nn: number, cc: number): void {
  for (let s = 0; s < count;) {
    const p = part[s], e = runEnd(part, s, count)
    acc.counts[partSlot(acc, p)] += e - s
    if (mark) markRun(mark, conn, nn, cc, p, s, e)
    s = e
  }
}

/** The end of the run of part[s]'s number from s (a loop of its own: see countRuns). */
function runEnd(part: Int32Array, s: number, count: number): number {
  const p = part[s]
  let e = s + 1
  while (e < count && part[e] === p) e++
  return e
}

/** Marks the corners of elements [from, to) of one block, all of part p (as markNodes). */
function markRun(mark: Int32Array, conn: Int32Array, nn: number, cc: number, p: number, from: number, to: number): void {
  for (let e = from; e < to; e++) {
    const eb = e * nn
    for (let k = 0; k < cc; k++) {
      const node = conn[eb + k], m = mark[node]
      if (m !== p) mark[node] = m === -1 ? p : -2
    }
  }
}

/**
 * Per part index (4 per part): volume and volume centroid x, y, z. From each part's boundary
 * faces (its outer faces and its sides against other parts: boundaryVolume.ts, the divergence
 * theorem, as the whole body's at load), or, where a quadratic face is curved, from the element
 * sums in element order (elementVolume.ts), as bodyVolume sums the whole body.
 */
function partVolumes(mesh: Mesh, b: PartBoundaries): Float64Array {
  const K = b.numbers.length, out = new Float64Array(4 * K)
  const faceSums = volumeSums(K)
  if (addBoundaryVolumes(faceSums, mesh.coords, b.outer, b.outerPart) && addBoundaryVolumes(faceSums, mesh.coords, b.inner, b.innerPart)) {
    for (let k = 0; k < K; k++) {
      const v = volumeOfSums(faceSums, k)
      out[4 * k] = v.volume; out[4 * k + 1] = v.centroid[0]; out[4 * k + 2] = v.centroid[1]; out[4 * k + 3] = v.centroid[2]
    }
    return out
  }
  const index = new Map(b.numbers.map((p, k) => [p, k]))
  volumeChunks(mesh, (blk, s, n, vol, cen) => sumVolumes(out, index, vol, cen, n, blk.part, s))
  for (let k = 0; k < K; k++) {
    const V = out[4 * k]
    if (V !== 0) { out[4 * k + 1] /= V; out[4 * k + 2] /= V; out[4 * k + 3] /= V }
  }
  return out
}

/** One chunk of `n` elements from `first` of a block (parts `part` or 0): volume and volume × centroid into `out` by part index. */
function sumVolumes(out: Float64Array, index: ReadonlyMap<number, number>, vol: Float64Array, cen: Float64Array, n: number, part: Int32Array | null, first: number): void {
  let last = NaN, o = 0
  for (let e = 0; e < n; e++) {
    const p = part ? part[first + e] : 0
    if (p !== last) { last = p; o = 4 * (index.get(p) ?? 0) }
    const v = vol[e]
    out[o] += v; out[o + 1] += v * cen[3 * e]; out[o + 2] += v * cen[3 * e + 1]; out[o + 3] += v * cen[3 * e + 2]
  }
}

/** (element, local face) as one number, REF · element + local face (at most 6 faces an element). */
const REF = 8

/**
 * Per part index (7 per part in `out`): surface force x, y, z, moment about the origin x, y, z,
 * and the sum of |face force|, over its sides in its boundary order (forEachSide's merge, inline).
 */
function partSurfaceSums(out: Float64Array, b: PartBoundaries): Float64Array {
  const { outer, inner } = b
  // the loop takes typed arrays only: code compiled for one model's objects is dropped when they
  // die and compiled again at the next load (countRuns)
  return surfaceSums(out, outer.count, outer.elem, outer.localFace, b.outerPart, b.outerTractions.force, b.outerTractions.moment,
    inner.count, inner.elem, inner.localFace, b.innerPart, b.innerTractions.force, b.innerTractions.moment)
}

function surfaceSums(
  out: Float64Array, Fo: number, oElem: Int32Array, oLocal: Uint8Array, outerPart: Int32Array, oF: Float64Array, oM: Float64Array,
  Fi: number, iElem: Int32Array, iLocal: Uint8Array, innerPart: Int32Array, iF: Float64Array, iM: Float64Array,
): Float64Array {
  // one site per array read, whichever side comes next: a site first reached after the loop was
  // compiled would send it back to the interpreter (the outer faces run alone for long stretches)
  let i = 0, j = 0
  while (i < Fo || j < Fi) {
    const ko = i < Fo ? REF * oElem[i] + oLocal[i] : Infinity, ki = j < Fi ? REF * iElem[j] + iLocal[j] : Infinity
    const takeOuter = ko < ki, t = takeOuter ? 1 : 0
    const F = takeOuter ? oF : iF, M = takeOuter ? oM : iM, P = takeOuter ? outerPart : innerPart, f = takeOuter ? i : j
    i += t; j += 1 - t
    const o = 7 * P[f]
    const x = F[3 * f], y = F[3 * f + 1], z = F[3 * f + 2]
    out[o] += x; out[o + 1] += y; out[o + 2] += z
    out[o + 3] += M[3 * f]; out[o + 4] += M[3 * f + 1]; out[o + 5] += M[3 * f + 2]
    out[o + 6] += Math.sqrt(x * x + y * y + z * z)
  }
  return out
}

/** Per interface (a slot), in `acc`: faces, area, area·centroid (3), F_ab (3), F_ba (3), moment of F_ab about the origin (3), gross. */
const ACC = 15

/** Pairs of sides (shared nodes, then meshed apart), the side in the lower part first, as Int32Array(2·pairs). */
function sidePairs(b: PartBoundaries): Int32Array {
  return pairsOfSides(b.outer.count, b.outerPart, b.outerTwin, b.inner.count, b.innerPart, b.innerTwin)
}

function pairsOfSides(Fo: number, outerPart: Int32Array, outerTwin: Int32Array | null, Fi: number, innerPart: Int32Array, innerTwin: Int32Array): Int32Array {
  let n = 0
  for (let i = 0; i < Fi; i++) if (i < innerTwin[i]) n++
  if (outerTwin) for (let f = 0; f < Fo; f++) if (f < outerTwin[f]) n++
  const pairs = new Int32Array(2 * n)
  let q = 0
  for (let i = 0; i < Fi; i++) {
    const t = innerTwin[i]
    if (i >= t) continue
    const low = innerPart[i] < innerPart[t]
    pairs[q++] = Fo + (low ? i : t); pairs[q++] = Fo + (low ? t : i)
  }
  if (outerTwin) for (let f = 0; f < Fo; f++) {
    const t = outerTwin[f]
    if (f >= t) continue
    const low = outerPart[f] < outerPart[t]
    pairs[q++] = low ? f : t; pairs[q++] = low ? t : f
  }
  return pairs
}

/** Sums the pairs into `acc` (ACC per slot; slot[q] is pair q's interface). */
function sumPairs(acc: Float64Array, pairs: Int32Array, slot: Int32Array, b: PartBoundaries): void {
  const { outer, inner, outerTractions: oT, innerTractions: iT } = b
  sumSides(acc, pairs, slot, outer.count, outer.area, outer.centroid, oT.force, oT.moment, oT.meanMagnitude, inner.area, inner.centroid, iT.force, iT.moment, iT.meanMagnitude)
}

function sumSides(
  acc: Float64Array, pairs: Int32Array, slot: Int32Array, Fo: number,
  oArea: Float64Array, oCentroid: Float64Array, oForce: Float64Array, oMoment: Float64Array, oMag: Float64Array,
  iArea: Float64Array, iCentroid: Float64Array, iForce: Float64Array, iMoment: Float64Array, iMag: Float64Array,
): void {
  for (let q = 0; q < slot.length; q++) {
    const sa = pairs[2 * q], sb = pairs[2 * q + 1], o = ACC * slot[q]
    const outerA = sa < Fo, outerB = sb < Fo
    const fa = outerA ? sa : sa - Fo, fb = outerB ? sb : sb - Fo
    const areaA = outerA ? oArea : iArea, forceA = outerA ? oForce : iForce, magA = outerA ? oMag : iMag
    const areaB = outerB ? oArea : iArea, centB = outerB ? oCentroid : iCentroid, forceB = outerB ? oForce : iForce
    const momB = outerB ? oMoment : iMoment, magB = outerB ? oMag : iMag
    const ar = areaB[fb]
    acc[o]++
    acc[o + 1] += ar
    acc[o + 2] += ar * centB[3 * fb]; acc[o + 3] += ar * centB[3 * fb + 1]; acc[o + 4] += ar * centB[3 * fb + 2]
    acc[o + 5] += forceB[3 * fb]; acc[o + 6] += forceB[3 * fb + 1]; acc[o + 7] += forceB[3 * fb + 2]
    acc[o + 8] += forceA[3 * fa]; acc[o + 9] += forceA[3 * fa + 1]; acc[o + 10] += forceA[3 * fa + 2]
    acc[o + 11] += momB[3 * fb]; acc[o + 12] += momB[3 * fb + 1]; acc[o + 13] += momB[3 * fb + 2]
    acc[o + 14] += 0.5 * (magB[fb] * ar + magA[fa] * areaA[fa])
  }
}

/** Each pair's interface slot into `slot`, the slots' keys ka · K + kb into `keys` in the order first met. */
function pairSlots(slot: Int32Array, keys: number[], pairs: Int32Array, Fo: number, outerPart: Int32Array, innerPart: Int32Array, K: number): void {
  const slotOf = new Map<number, number>()
  let lastKey = -1, last = -1
  for (let q = 0; q < slot.length; q++) {
    const sa = pairs[2 * q], sb = pairs[2 * q + 1]
    const key = (sa < Fo ? outerPart[sa] : innerPart[sa - Fo]) * K + (sb < Fo ? outerPart[sb] : innerPart[sb - Fo])
    if (key !== lastKey) {
      lastKey = key
      last = slotOf.get(key) ?? -1
      if (last < 0) { last = keys.length; slotOf.set(key, last); keys.push(key) }
    }
    slot[q] = last
  }
}

/** Sums the pairs of sides per pair of parts. */
function matchInterfaces(coords: Float64Array, b: PartBoundaries): Pick<AssemblyBalance, 'interfaces' | 'interfaceMesh'> {
  const { outer, numbers, outerPart, innerPart } = b, Fo = outer.count, K = numbers.length
  const pairs = sidePairs(b), P = pairs.length / 2
  // (the loops are functions of their own, this one has none: see countRuns)
  // each pair's interface: slots by key ka · K + kb (part indices ascend with the numbers), in the
  // order first met; the map only where the pair of parts changes (pairs come in runs)
  const slot = new Int32Array(P), keys: number[] = []
  pairSlots(slot, keys, pairs, Fo, outerPart, innerPart, K)
  const acc = new Float64Array(ACC * keys.length)
  sumPairs(acc, pairs, slot, b)
  const order = keys.map((_, i) => i).sort((x, y) => keys[x] - keys[y])
  const interfaces = order.map((i): InterfaceRecord => {
    const o = ACC * i, area = acc[o + 1], ka = Math.floor(keys[i] / K), kb = keys[i] % K
    const c: Vec3 = area > 0 ? [acc[o + 2] / area, acc[o + 3] / area, acc[o + 4] / area] : [0, 0, 0]
    const F: Vec3 = [acc[o + 5], acc[o + 6], acc[o + 7]], R: Vec3 = [acc[o + 8], acc[o + 9], acc[o + 10]], gross = acc[o + 14]
    // M_c = M_0 - c × F
    const moment: Vec3 = [acc[o + 11] - (c[1] * F[2] - c[2] * F[1]), acc[o + 12] - (c[2] * F[0] - c[0] * F[2]), acc[o + 13] - (c[0] * F[1] - c[1] * F[0])]
    const sum = Math.hypot(F[0] + R[0], F[1] + R[1], F[2] + R[2])
    return {
      parts: [numbers[ka], numbers[kb]], faces: acc[o], area, centroid: c, force: F, moment,
      reverseForce: R, mismatch: gross > 0 ? sum / gross : 0, gross,
    }
  })
  return { interfaces, interfaceMesh: interfaceTriangles(coords, b, pairs, slot, order) }
}

/**
 * Corner triangles of each interface's faces (the second side of each pair, interfaces in
 * `order` of their slots, each one's faces in pair order), for drawing.
 */
function interfaceTriangles(coords: Float64Array, b: PartBoundaries, pairs: Int32Array, slot: Int32Array, order: readonly number[]): AssemblyBalance['interfaceMesh'] {
  const { outer, inner } = b, S = order.length
  const rankOf = new Int32Array(S)
  for (let r = 0; r < S; r++) rankOf[order[r]] = r
  return trianglesOfPairs(coords, pairs, slot, rankOf, outer.count, outer.kind, outer.nodes, outer.slots, inner.kind, inner.nodes, inner.slots)
}

function trianglesOfPairs(
  coords: Float64Array, pairs: Int32Array, slot: Int32Array, rankOf: Int32Array, Fo: number,
  oKind: Uint8Array, oNodes: Int32Array, oSlots: number, iKind: Uint8Array, iNodes: Int32Array, iSlots: number,
): AssemblyBalance['interfaceMesh'] {
  const S = rankOf.length, P = slot.length
  // triangles per slot, then each slot's first triangle in the drawing order
  const offsets = new Int32Array(S + 1)
  for (let q = 0; q < P; q++) {
    const s = pairs[2 * q + 1]
    offsets[rankOf[slot[q]] + 1] += faceCornerCount(s < Fo ? oKind[s] : iKind[s - Fo]) - 2
  }
  for (let r = 0; r < S; r++) offsets[r + 1] += offsets[r]
  const T = offsets[S], positions = new Float32Array(9 * T), next = offsets.slice(0, S)
  for (let q = 0; q < P; q++) {
    const s = pairs[2 * q + 1], isOuter = s < Fo, face = isOuter ? s : s - Fo
    const nodes = isOuter ? oNodes : iNodes, nc = faceCornerCount(isOuter ? oKind[face] : iKind[face]), base = (isOuter ? oSlots : iSlots) * face
    let t = 3 * next[rankOf[slot[q]]]
    for (let c = 1; c + 1 < nc; c++) {
      for (let k = 0; k < 3; k++) {
        const v = nodes[base + (k === 0 ? 0 : c + k - 1)]
        positions[3 * t] = coords[3 * v]; positions[3 * t + 1] = coords[3 * v + 1]; positions[3 * t + 2] = coords[3 * v + 2]
        t++
      }
    }
    next[rankOf[slot[q]]] = t / 3
  }
  return { positions, offsets }
}
