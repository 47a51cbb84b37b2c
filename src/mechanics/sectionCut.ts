/**
 * One section cut: the resultant force and moment that the material on the +m side of a plane
 * exerts on the material on the -m side (the README's convention), the section's area properties, and the
 * free-body check of the - piece.
 *
 * One pass over the nodes computes d = (x - p)·m (snapped to 0 within round-off, SNAP_EPS); one
 * pass over the elements rejects those whose corners all lie on one side (d == 0 is the + side,
 * see sectionPolygon.ts) and builds the polygon of each cut element. Linear simplices (tet4) are
 * integrated at once in closed form; the other types' polygons leave their quadrature points
 * (reference coordinates and weights, elementSection.ts) in a per-cut geometry, and one stress
 * pass then integrates σm over them with each element's own shape functions. Stress is read
 * through the StressField's element-node rows. Boundary faces and their tractions are needed
 * only for the free body; pass them in `options` when cutting repeatedly (dragging the plane),
 * else they are computed here each call (nodal stress only, see freeBodyTractions).
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import { extractBoundaryFaces } from './boundaryFaces.ts'
import {
  addClippedFace, addWholeFace, closeFreeBody, createClipScratch, faceCornerCount, FB_SIZE, freeBodyTractions, initFreeBody,
} from './freeBody.ts'
import type { ClipScratch } from './freeBody.ts'
import { accumulateTraction, addTractionSlots, createSectionPoints, nodalTraction, polygonPoints } from './elementSection.ts'
import type { ElementMap } from './inverseMap.ts'
import { createElementMap, loadElementMap, MAX_ELEMENT_NODES, referenceDomain } from './inverseMap.ts'
import {
  ACC_AREA, ACC_FORCE, ACC_GROSS, ACC_ORIGIN, ACC_SIZE, addPolygonArea, createPolygonScratch, crossingCases, elementPolygon,
  elementPolygonRef, integratePolygon, sectionBasis, sectionMomentAtOrigin,
} from './sectionPolygon.ts'
import type { PolygonScratch } from './sectionPolygon.ts'
import { createPolygonCollector } from './sectionDrawing.ts'
import type { PolygonCollector } from './sectionDrawing.ts'
import { emptySection, sectionCentroid, sectionRecord } from './sectionProperties.ts'
import { sectionRule, shapeDegree } from './sectionRule.ts'
import type { CutRecord, SectionLimit } from './sectionRegions.ts'
import {
  addAccumulator, createCutRecord, labelRegions, recordElement, recordTet, regionAccumulators, selectCutElements, selectionAccumulator,
} from './sectionRegions.ts'
import type { SectionAxesChoice } from './sectionAxes.ts'
import type { BoundaryFaces, FreeBodyFigure, SectionPlane, SectionPolygons, SectionRegion, SectionResult, SurfaceTractions } from './types.ts'
import { partsSubmesh } from './partBalance.ts'
import { chunksMet, findCutInChunks } from './elementChunks.ts'
import type { ElementChunks } from './elementChunks.ts'
import { ZERO_FREE_BODY } from './freeBody.ts'

export { unitNormal } from './plane.ts'

export interface CutSectionOptions {
  /** Point the moment is taken about (model length); default the section centroid. */
  readonly about?: Vec3
  /** Precomputed boundary faces of `mesh` (extractBoundaryFaces), reused across cuts. */
  readonly faces?: BoundaryFaces
  /** Precomputed tractions on `faces` (computeSurfaceTractions), reused across cuts. */
  readonly tractions?: SurfaceTractions
  /** Also return the section polygons for drawing (off by default: it allocates). */
  readonly polygons?: boolean
  /**
   * The polygons as views of the cut's kept arrays, not copies: valid until the cut after next,
   * never to be transferred (sectionDrawing.ts createPolygonCollector). For a caller that keeps
   * only its latest cut's polygons, as the engine does while a section is dragged.
   */
  readonly polygonViews?: boolean
  // --- assemblies: regions and bounded sections (sectionRegions.ts) ---
  /** Split the cut into connected regions (SectionResult.regions). */
  readonly regions?: boolean
  /** Limit the cut to parts and/or a disc; the top-level figures are then the selection's. */
  readonly limit?: SectionLimit | null
  /**
   * For a cut limited to whole parts (no disc): the boundary faces and tractions of those parts'
   * sub-mesh (partsSubmesh, faces against other parts included), reused across cuts; computed
   * here when absent.
   */
  readonly partPiece?: PartPiece
  /** Section axes: principal (the default) or reference, with the reference direction (sectionAxes.ts). */
  readonly axes?: SectionAxesChoice
  /**
   * The mesh's elements in chunks with their boxes (elementChunks.ts): only the chunks the plane
   * meets are scanned (the same cut elements, in the same order, as a scan of all).
   */
  readonly chunks?: ElementChunks | null
}

/**
 * Snap band, relative to the size of the numbers that make d: nodes within
 * SNAP_EPS · Σ (|x_i| + |p_i|)|m_i| of the plane count as lying on it (d = 0). Without it, a node
 * layer that lies in the plane only up to round-off (a rotated or scaled mesh) gets random signs,
 * and a hexahedron face with alternating corner signs would give overlapping polygons on both
 * sides. 64 ε (≈ 1.4e-14) is far above round-off and far below any real geometry.
 */
export const SNAP_EPS = 64 * Number.EPSILON

/**
 * Grows-only scratch for node distances: dragging the plane re-cuts the same mesh many times.
 * The case stencil (sectionStencil.ts) shares it through planeDistances.
 */
let distScratch = new Float64Array(0)

/**
 * The plane's basis (sectionBasis) and every node's snapped signed distance to it, in the shared
 * grows-only scratch: valid until the next call (the cut and the stencil use it synchronously).
 */
export function planeDistances(mesh: Mesh, plane: SectionPlane, about?: readonly number[]): { m: Vec3; point: Vec3; frame: Float64Array; d: Float64Array } {
  const basis = sectionBasis(plane, about)
  const N = mesh.nodeCount
  if (distScratch.length < N) distScratch = new Float64Array(N)
  nodeDistances(distScratch, mesh.coords, N, basis.point, basis.m)
  return { ...basis, d: distScratch }
}
/** One element's quadrature points, nodal tractions, shape values and force (cutBlock's scratch). */
const POINTS = createSectionPoints(), NODAL_TRACTION = new Float64Array(3 * MAX_ELEMENT_NODES), SHAPE = new Float64Array(MAX_ELEMENT_NODES), FORCE3 = new Float64Array(3)
/** The per-element record of the latest cut with regions or a limit (grows only). */
const record = createCutRecord()
let selScratch = new Int32Array(0), labelScratch = new Int32Array(0)

/**
 * Cuts the body with `plane`. `stress` is read through its element-node rows, so nodal and
 * element-nodal stress take the same path. Linear simplices (shape-function degree 1: tet4) are
 * integrated by the closed forms of sectionPolygon.ts; every other type by its shape functions
 * (elementSection.ts): a geometry pass over the cut elements stores the quadrature points' ξ
 * and weights, then one stress pass integrates the traction over them.
 */
export function cutSection(
  mesh: Mesh, stress: StressField, bodyForce: Vec3, plane: SectionPlane, options: CutSectionOptions = {},
): { result: SectionResult; polygons: SectionPolygons | null; labels: RegionLabels | null } {
  const { m, point, frame, d } = planeDistances(mesh, plane, options.about)
  const coords = mesh.coords

  const acc = new Float64Array(ACC_SIZE)
  const sc = createPolygonScratch()
  const collect = options.polygons ? createPolygonCollector(m, options.polygonViews === true) : null
  const em = createElementMap()
  const limit = options.limit ?? null
  const rec = options.regions || limit ? record : null
  if (rec) rec.n = 0
  const near = options.chunks ? { chunks: options.chunks, ...chunksMet(options.chunks, m, point) } : null
  mesh.blocks.forEach((block, bi) => {
    const rows = stress.rows[bi]
    if (shapeDegree(block.type) <= 1) cutLinearBlock(acc, sc, d, coords, stress.values, block.type, block.conn, rows, bi, block.offset, frame, collect, rec, near)
    else cutBlock(acc, sc, em, d, coords, stress.values, rows, block.type, block.conn, bi, block.offset, frame, collect, rec, near, point)
  })
  const polygons = collect ? collect.finish(mesh, stress) : null
  const about = options.about ? [options.about[0], options.about[1], options.about[2]] as Vec3 : null
  const labels: RegionLabels | null = rec && options.polygons ? { element: new Int32Array(0), region: new Int32Array(0) } : null
  if (rec && !(acc[ACC_AREA] > 0)) return { result: { ...emptySection(point, m, frame, about, options.axes), regions: [], limited: limit !== null, freeBodyDefined: limit === null }, polygons, labels }
  if (rec && limit) {
    const recorded = recordedSection(rec, mesh, acc, limit, point, m, frame, about, d, em.failures, options.axes, labels, stress)
    const sel = recorded.selection
    if (!wholeParts(limit) || !sel) return { result: recorded.result!, polygons, labels }
    // a cut limited to whole parts bounds a piece: the selected parts' elements on the -m side,
    // whose boundary includes their faces against the other parts
    const piece = options.partPiece ?? partPiece(mesh, stress, limit.parts!)
    const fb = pieceFreeBody(sel, piece.mesh, piece.field, piece.faces, piece.tractions, d, m, frame, bodyForce)
    const result = sectionRecord(sel, 0, point, m, frame, about, fb.freeBody, em.failures + fb.unmapped, options.axes)
    return { result: { ...result, regions: recorded.regions, limited: true, freeBodyDefined: true }, polygons, labels }
  }
  if (!(acc[ACC_AREA] > 0)) return { result: emptySection(point, m, frame, about, options.axes), polygons, labels }

  const faces = options.faces ?? extractBoundaryFaces(mesh)
  const tractions = options.tractions ?? freeBodyTractions(mesh, stress, faces)
  const fb = pieceFreeBody(acc, mesh, stress, faces, tractions, d, m, frame, bodyForce)
  const result = sectionRecord(acc, 0, point, m, frame, about, fb.freeBody, em.failures + fb.unmapped, options.axes)
  if (!rec) return { result, polygons, labels }
  // the regions after the free body (they are independent): labelling walks the record and its
  // tables, which would push the boundary faces and distances the free body reads out of cache
  const regions = recordedSection(rec, mesh, acc, null, point, m, frame, about, d, em.failures, options.axes, labels, stress).regions
  return { result: { ...result, regions, limited: false, freeBodyDefined: true }, polygons, labels }
}

/**
 * Which region each selected cut element lies in, for drawing (only when the cut was asked for
 * polygons and regions): `element[s]` its global element index, `region[s]` the index of its
 * region in SectionResult.regions (largest force first). Unselected elements are not listed.
 */
export interface RegionLabels {
  element: Int32Array
  region: Int32Array
}

/** The part of a mesh a parts-limited cut bounds: the parts' sub-mesh, its stress, boundary faces and tractions. */
export interface PartPiece {
  readonly parts: readonly number[]
  readonly mesh: Mesh
  readonly field: StressField
  readonly faces: BoundaryFaces
  readonly tractions: SurfaceTractions
}

/** The piece of `parts` (O(elements): build it once per parts set when cutting repeatedly). */
export function partPiece(mesh: Mesh, stress: StressField, parts: readonly number[]): PartPiece {
  const sub = partsSubmesh(mesh, stress, parts)
  const faces = extractBoundaryFaces(sub.mesh)
  return { parts: [...parts], mesh: sub.mesh, field: sub.field, faces, tractions: freeBodyTractions(sub.mesh, sub.field, faces) }
}

/** A limit of whole parts only (no disc): its cut bounds a piece of the body, so the free body is defined. */
export function wholeParts(limit: SectionLimit | null | undefined): boolean {
  return !!limit && !!limit.parts && limit.parts.length > 0 && !limit.within
}

/**
 * The free body of the -m piece of (a sub-mesh of) the body: its boundary faces on the -m side
 * (whole and clipped), the section (acc), and the body force; moments about the section centroid.
 */
function pieceFreeBody(
  acc: Float64Array, mesh: Mesh, stress: StressField, faces: BoundaryFaces, tractions: SurfaceTractions, d: Float64Array,
  m: Vec3, frame: Float64Array, bodyForce: Vec3,
): { freeBody: FreeBodyFigure; unmapped: number } {
  const c = sectionCentroid(new Float64Array(3), acc, 0, frame)
  const fb = new Float64Array(FB_SIZE)
  initFreeBody(fb, 0)
  const cs = createClipScratch()
  // volume terms about the section centroid: the section itself then adds no volume term
  freeBodyFaces(fb, 0, mesh, stress, faces, tractions, d, cs, c, c)
  const Fs: Vec3 = [acc[ACC_FORCE], acc[ACC_FORCE + 1], acc[ACC_FORCE + 2]]
  const Ms = momentAboutCentroid(acc, 0, c, frame)
  return { freeBody: closeFreeBody(fb, 0, c, c, acc[ACC_AREA], m, Fs, Ms, bodyForce, acc[ACC_GROSS]), unmapped: cs.em.failures }
}

/**
 * The regions of a recorded cut (largest force first) and, with a limit, the selection's own
 * record and accumulator: its figures are those of the selected polygons only, and its free body
 * is marked as not defined (a disc does not bound a piece of the body; the caller replaces it
 * for a limit of whole parts).
 */
function recordedSection(
  rec: CutRecord, mesh: Mesh, acc: Float64Array, limit: SectionLimit | null, point: Vec3, m: Vec3, frame: Float64Array,
  about: Vec3 | null, d: Float64Array, unmapped: number, choice: SectionAxesChoice | undefined, labelsOut: RegionLabels | null,
  stress: StressField,
): { regions: SectionRegion[]; result: SectionResult | null; selection: Float64Array | null } {
  if (selScratch.length < rec.n) { selScratch = new Int32Array(rec.n); labelScratch = new Int32Array(rec.n) }
  const sel = selScratch, label = labelScratch
  if (limit) fillPending(rec, mesh, stress, d, acc, frame) // the disc reads each polygon's centroid
  const n = selectCutElements(sel, rec, mesh, limit, acc, frame)
  const count = labelRegions(label, sel, n, rec, mesh, d)
  // one region of every element is the whole section (regionAccumulators): no blocks needed
  if (count > 1 || n !== rec.n) fillPending(rec, mesh, stress, d, acc, frame)
  const ra = regionAccumulators(count, label, sel, n, rec, mesh, acc)
  const unsorted: SectionRegion[] = []
  for (let g = 0; g < count; g++) {
    const r = sectionRecord(ra.acc, g * ACC_SIZE, point, m, frame, null, ZERO_FREE_BODY, 0, choice)
    unsorted.push({
      area: r.area, centroid: r.centroid, force: r.force, moment: r.moment, axes: r.axes, secondMoments: r.secondMoments,
      axial: r.axial, shear: r.shear, torque: r.torque, bending: r.bending, parts: ra.parts[g], cutElements: r.cutElements,
    })
  }
  // largest force first (stable: equal forces keep the order of their first element)
  const order = unsorted.map((_, g) => g).sort((a, b) => Math.hypot(...unsorted[b].force) - Math.hypot(...unsorted[a].force) || a - b)
  const regions = order.map((g) => unsorted[g])
  if (labelsOut) {
    const rank = new Int32Array(count)
    order.forEach((g, k) => { rank[g] = k })
    const element = new Int32Array(n), region = new Int32Array(n)
    for (let s = 0; s < n; s++) { element[s] = mesh.blocks[rec.block[sel[s]]].offset + rec.local[sel[s]]; region[s] = rank[label[s]] }
    labelsOut.element = element; labelsOut.region = region
  }
  if (!limit) return { regions, result: null, selection: null }
  const selAcc = selectionAccumulator(new Float64Array(ACC_SIZE), sel, n, rec, acc)
  if (!(selAcc[ACC_AREA] > 0)) return { regions, result: { ...emptySection(point, m, frame, about, choice), regions: [], limited: true, freeBodyDefined: false }, selection: null }
  return { regions, result: { ...sectionRecord(selAcc, 0, point, m, frame, about, ZERO_FREE_BODY, unmapped, choice), regions, limited: true, freeBodyDefined: false }, selection: selAcc }
}

// The passes below are separate functions so that each is optimised with its own type feedback:
// inside one long function, the optimiser compiles the first loop while it runs (on-stack) and
// then gives the code up at every later pass it has not seen run yet, for the first few calls.

/** Snapped signed distances d = (x - p)·m of the first N nodes (see SNAP_EPS). */
export function nodeDistances(d: Float64Array, coords: Float64Array, N: number, point: Vec3, m: Vec3): void {
  const px = point[0], py = point[1], pz = point[2], mx = m[0], my = m[1], mz = m[2]
  const amx = Math.abs(mx), amy = Math.abs(my), amz = Math.abs(mz)
  const pAbs = Math.abs(px) * amx + Math.abs(py) * amy + Math.abs(pz) * amz
  for (let i = 0; i < N; i++) {
    const x = coords[3 * i], y = coords[3 * i + 1], z = coords[3 * i + 2]
    const r = (x - px) * mx + (y - py) * my + (z - pz) * mz
    const band = SNAP_EPS * (Math.abs(x) * amx + Math.abs(y) * amy + Math.abs(z) * amz + pAbs)
    // |r| > band is r < -band || r > band (band ≥ 0) in one compare that every node takes.
    d[i] = Math.abs(r) > band ? r : 0
  }
}

/**
 * Adds the section polygons of one block of linear simplices (tet4) to `acc` (and to `collect`
 * when drawing): vertex values interpolated along the edges and the closed forms, exact there.
 */
function cutLinearBlock(
  acc: Float64Array, sc: PolygonScratch, d: Float64Array, coords: Float64Array, values: Float64Array, type: ElementTypeName,
  conn: Int32Array, rows: Int32Array, bi: number, offset: number, frame: Float64Array, collect: PolygonCollector | null,
  rec: CutRecord | null, near: Candidates | null,
): void {
  const nn = ELEMENT_TYPES[type].nodeCount
  const cases = crossingCases(type)
  const ref = referenceDomain(type).ref
  // Imported kernels once into locals: under a CommonJS transform (tsx) each use of an imported
  // name is otherwise a getter call per element.
  const polygon = elementPolygon, integrate = integratePolygon, record = recordTet
  // A small scan finds the cut elements (quick to optimise, so the first cut pays little for
  // the warm-up), then only those are clipped, in element order.
  const n = near ? findCutNear(d, conn, nn, 4, near, bi) : findCutTets(d, conn, conn.length / nn, nn)
  const list = tetCutList, dist = sc.dist
  for (let i = 0; i < n; i++) {
    const base = nn * list[i]
    dist[0] = d[conn[base]]; dist[1] = d[conn[base + 1]]; dist[2] = d[conn[base + 2]]; dist[3] = d[conn[base + 3]]
    if (polygon(sc, acc, 0, coords, values, 6, conn, rows, base, cases, frame) < 3) continue
    // the record notes the element only (its block is filled later if needed: fillPending) with
    // its corners sorted for labelRegions while they are at hand, and the whole section is
    // integrated as without it
    if (rec) record(rec, bi, list[i], conn[base], conn[base + 1], conn[base + 2], conn[base + 3], dist[0], dist[1], dist[2], dist[3])
    integrate(acc, 0, sc, frame, 6)
    if (collect) {
      // the drawn polygon needs its vertices' ξ: the linear path has the edge parameters only
      // implicitly, so map back through the (affine) element
      linearVertexReference(sc, coords, conn, base, ref)
      collect.add(sc, bi, list[i], offset + list[i], sc.force, null, false, true)
    }
  }
}

/**
 * Computes the pending accumulator blocks of a record (linear simplices noted by cutLinearBlock):
 * each element's polygon and closed-form integrals again, about the whole section's origin.
 */
function fillPending(rec: CutRecord, mesh: Mesh, stress: StressField, d: Float64Array, acc: Float64Array, frame: Float64Array): void {
  const sc = createPolygonScratch(), dist = sc.dist, coords = mesh.coords, values = stress.values
  for (let i = 0; i < rec.n; i++) {
    if (!rec.pending[i]) continue
    const bi = rec.block[i], block = mesh.blocks[bi], nn = ELEMENT_TYPES[block.type].nodeCount
    const conn = block.conn, base = nn * rec.local[i], o = i * ACC_SIZE
    for (let k = o; k < o + ACC_SIZE; k++) rec.acc[k] = 0
    dist[0] = d[conn[base]]; dist[1] = d[conn[base + 1]]; dist[2] = d[conn[base + 2]]; dist[3] = d[conn[base + 3]]
    // the whole section's origin is set: elementPolygon only reads it
    if (elementPolygon(sc, acc, 0, coords, values, 6, conn, stress.rows[bi], base, crossingCases(block.type), frame) >= 3) integratePolygon(rec.acc, o, sc, frame, 6)
    rec.pending[i] = 0
  }
}

/** ξ of the vertices in sc for a linear simplex: ξ = Σ λ_k ξ_k with λ its barycentric coordinates. */
function linearVertexReference(sc: PolygonScratch, coords: Float64Array, conn: Int32Array, base: number, ref: Float64Array): void {
  const p0 = 3 * conn[base], p1 = 3 * conn[base + 1], p2 = 3 * conn[base + 2], p3 = 3 * conn[base + 3]
  const x0 = coords[p0], y0 = coords[p0 + 1], z0 = coords[p0 + 2]
  const ax = coords[p1] - x0, ay = coords[p1 + 1] - y0, az = coords[p1 + 2] - z0
  const bx = coords[p2] - x0, by = coords[p2 + 1] - y0, bz = coords[p2 + 2] - z0
  const cx = coords[p3] - x0, cy = coords[p3 + 1] - y0, cz = coords[p3 + 2] - z0
  // λ1 = r·(b × c)/V6, λ2 = r·(c × a)/V6, λ3 = r·(a × b)/V6 with V6 = a·(b × c)
  const bcx = by * cz - bz * cy, bcy = bz * cx - bx * cz, bcz = bx * cy - by * cx
  const cax = cy * az - cz * ay, cay = cz * ax - cx * az, caz = cx * ay - cy * ax
  const abx = ay * bz - az * by, aby = az * bx - ax * bz, abz = ax * by - ay * bx
  const v6 = ax * bcx + ay * bcy + az * bcz
  for (let k = 0; k < sc.count; k++) {
    const rx = sc.pos[3 * k] - x0, ry = sc.pos[3 * k + 1] - y0, rz = sc.pos[3 * k + 2] - z0
    const l1 = (rx * bcx + ry * bcy + rz * bcz) / v6
    const l2 = (rx * cax + ry * cay + rz * caz) / v6
    const l3 = (rx * abx + ry * aby + rz * abz) / v6
    const l0 = 1 - l1 - l2 - l3
    for (let c = 0; c < 3; c++) sc.ref[3 * k + c] = l0 * ref[c] + l1 * ref[3 + c] + l2 * ref[6 + c] + l3 * ref[9 + c]
  }
}

/**
 * One block of any other type: each cut element's polygon (vertices with exact ξ), its area
 * integrals, its quadrature points (ξ inverted on curved elements, elementSection.ts) and at
 * once the traction integrals over them from the element's nodal σm, into `acc` (and into the
 * element's record with regions or a limit); drawn polygons, with their force, to `collect`.
 * Element by element, geometry then stress: the points of one element stay in a small scratch
 * the stress reads while it is in cache (at 10^6 hex8, a separate stress pass over the stored
 * points of a whole cut wrote and read 9 MB more a cut). Each sum gets its terms in the same
 * order as that two-pass form gave them within a block.
 */
function cutBlock(
  acc: Float64Array, sc: PolygonScratch, em: ElementMap, d: Float64Array,
  coords: Float64Array, values: Float64Array, rows: Int32Array, type: ElementTypeName, conn: Int32Array, bi: number, offset: number, frame: Float64Array,
  collect: PolygonCollector | null, rec: CutRecord | null, near: Candidates | null, point: Vec3,
): void {
  const topo = ELEMENT_TYPES[type]
  const nn = topo.nodeCount, cc = topo.cornerCount
  const cases = crossingCases(type), domain = referenceDomain(type), rule = sectionRule(type)
  const subdivide = shapeDegree(type) > 1
  const count = conn.length / nn
  const dist = sc.dist
  const mx = frame[6], my = frame[7], mz = frame[8]
  const P = POINTS, tn = NODAL_TRACTION, N = SHAPE, f3 = FORCE3
  // imported kernels once into locals (getter calls per element under tsx, see cutLinearBlock)
  const polygon = elementPolygonRef, area = addPolygonArea, points = polygonPoints, load = loadElementMap
  const traction = nodalTraction, integrate = accumulateTraction, addSlots = addTractionSlots
  const one = (e: number): void => {
    const base = nn * e
    if (polygon(sc, acc, 0, coords, d, 0, conn, base, cases, frame, domain.ref) < 3) return
    let o = -1
    if (rec) {
      o = recordElement(rec, bi, e)
      area(rec.acc, o, sc)
      addAccumulator(acc, 0, rec.acc, o)
    } else area(acc, 0, sc)
    load(em, domain, coords, conn, base)
    const q = points(P.ref, P.w, P.a, P.b, 0, sc, rule, em)
    traction(tn, values, rows, base, nn, mx, my, mz)
    if (rec) {
      // into the element's own record (sectionRegions.ts), then the same sums into the whole
      integrate(rec.acc, o, type, nn, tn, P.ref, P.w, P.a, P.b, 0, q, N, f3, 0)
      addSlots(acc, 0, rec.acc, o)
    } else integrate(acc, 0, type, nn, tn, P.ref, P.w, P.a, P.b, 0, q, N, f3, 0)
    if (collect) collect.add(sc, bi, e, offset + e, f3, em, subdivide)
  }
  if (cc === 4 || cc === 8 || near) {
    // tetrahedra and hexahedra: a quick branch-free scan as on the linear path (or the elements
    // of the chunks the plane meets only), then the cut ones
    const n = near ? findCutNear(d, conn, nn, cc, near, bi) : cc === 4 ? findCutTets(d, conn, count, nn) : scanHexes(d, conn, count, nn, coords, frame, point)
    const list = tetCutList
    for (let i = 0; i < n; i++) {
      const base = nn * list[i]
      for (let c = 0; c < cc; c++) dist[c] = d[conn[base + c]]
      one(list[i])
    }
    return
  }
  for (let e = 0, base = 0; e < count; e++, base += nn) {
    let neg = 0
    for (let c = 0; c < cc; c++) {
      const dc = d[conn[base + c]]
      dist[c] = dc
      if (dc < 0) neg++
    }
    if (neg === 0 || neg === cc) continue // all corners on one side
    one(e)
  }
}

/**
 * Grows-only list of cut tetrahedra (local indices), reused across cuts like distScratch. It has
 * room for a whole block, so the scan has no growth branch (code that has not run yet makes the
 * optimised scan fall back to the interpreter); only the entries written are touched memory.
 */
let tetCutList = new Int32Array(0)

/**
 * Writes the tetrahedra (tet4 or tet10: corners first, nn nodes each) of a block with corners on
 * both sides (d < 0 and d ≥ 0) to tetCutList, in order; returns their count.
 */
function findCutTets(d: Float64Array, conn: Int32Array, count: number, nn: number): number {
  if (tetCutList.length < count) tetCutList = new Int32Array(count)
  const list = tetCutList
  let n = 0
  for (let e = 0, base = 0; e < count; e++, base += nn) {
    const neg = (d[conn[base]] < 0 ? 1 : 0) + (d[conn[base + 1]] < 0 ? 1 : 0) + (d[conn[base + 2]] < 0 ? 1 : 0) + (d[conn[base + 3]] < 0 ? 1 : 0)
    // Stored always, kept only when cut: the store has run from the first element on.
    list[n] = e
    n += (neg & 3) !== 0 ? 1 : 0
  }
  return n
}

/** The chunks of elements the plane meets (chunksMet), in ascending order. */
interface Candidates { readonly chunks: ElementChunks; readonly items: Int32Array; readonly n: number }

/** The cut elements of block bi in the met chunks, local indices in order into tetCutList; returns their count. */
function findCutNear(d: Float64Array, conn: Int32Array, nn: number, cc: number, near: Candidates, bi: number): number {
  const count = conn.length / nn
  if (tetCutList.length < count) tetCutList = new Int32Array(count)
  return findCutInChunks(tetCutList, d, conn, nn, cc, near.chunks, near.items, near.n, bi)
}

/**
 * The hexahedra (hex8 or hex20: 8 corners first, nn nodes each) of a block with corners on both
 * sides, written to tetCutList in order like findCutTets; returns their count. Counting the
 * negative corners without a branch keeps the scan (every element, every cut) at the pace of a
 * read of the corners' distances.
 */
function findCutHexes(d: Float64Array, conn: Int32Array, count: number, nn: number): number {
  if (tetCutList.length < count) tetCutList = new Int32Array(count)
  const list = tetCutList
  let n = 0
  for (let e = 0, base = 0; e < count; e++, base += nn) {
    const neg = (d[conn[base]] < 0 ? 1 : 0) + (d[conn[base + 1]] < 0 ? 1 : 0) + (d[conn[base + 2]] < 0 ? 1 : 0) + (d[conn[base + 3]] < 0 ? 1 : 0)
      + (d[conn[base + 4]] < 0 ? 1 : 0) + (d[conn[base + 5]] < 0 ? 1 : 0) + (d[conn[base + 6]] < 0 ? 1 : 0) + (d[conn[base + 7]] < 0 ? 1 : 0)
    list[n] = e
    n += (neg & 7) !== 0 ? 1 : 0
  }
  return n
}

/**
 * What a block of hexahedra keeps between cuts along one normal (see scanHexes): the coordinates
 * and normal it was measured for, the largest spread |d_c − d_0| of an element's corner distances
 * about its first corner, per run of HEX_RUN elements the range of their first corners' distances
 * at the measuring cut, that cut's offset p·m, and the sizes that bound the snap band (SNAP_EPS):
 * the largest Σ |x_k m_k| over the nodes and Σ |p_k m_k| of the measuring cut's point.
 */
interface HexSpread {
  coords: Float64Array
  m0: number
  m1: number
  m2: number
  /** 0: this normal seen once (not measured yet); 1: measured. */
  measured: number
  spread: number
  xAbs: number
  pAbs: number
  offset: number
  /** Per run r: the least and the largest first-corner distance, at 2r and 2r + 1. */
  runs: Float64Array
}
const HEX_SPREADS = new WeakMap<Int32Array, HexSpread>()
/** Elements per run of scanHexes' ranges: small enough that a run near the plane is short, large enough that the ranges are a small array. */
const HEX_RUN = 32

/**
 * The cut hexahedra of a block (findCutHexes' list, the same elements in the same order), reading
 * few corner distances when the block was cut along the same normal before. Moving the plane
 * along its normal (the offset slider, a drag, a repeated cut) shifts every distance by the same
 * amount Δ, the change of p·m: the spread S of an element's corner distances about its first
 * corner does not change, and an element whose first corner lies farther than S from the plane
 * has all its corners on that corner's side, so it is not cut; and the first corners of a run of
 * HEX_RUN elements lie in the run's measured range shifted by Δ, so a run whose range is wholly
 * farther than S is not read at all. The second cut along a normal measures S and the ranges (one
 * pass, folded into the full scan); later cuts read the runs near the plane only, their elements'
 * first corners, and all eight corners of the few within S. Snapped distances (SNAP_EPS) move by
 * at most the band and the distances' rounding is a small part of it, so S and the ranges are
 * widened by 2.5 times the largest band of either cut on each side. The entry belongs to the
 * block's connectivity and coordinates arrays (a mesh's arrays are not changed after it is made;
 * other arrays start a new entry) and to one normal, bit for bit.
 */
function scanHexes(d: Float64Array, conn: Int32Array, count: number, nn: number, coords: Float64Array, frame: Float64Array, point: Vec3): number {
  const m0 = frame[6], m1 = frame[7], m2 = frame[8]
  const pAbs = Math.abs(point[0] * m0) + Math.abs(point[1] * m1) + Math.abs(point[2] * m2)
  const offset = point[0] * m0 + point[1] * m1 + point[2] * m2
  let s = HEX_SPREADS.get(conn)
  if (!s || s.coords !== coords || s.m0 !== m0 || s.m1 !== m1 || s.m2 !== m2) {
    // a new normal: the plain scan, and the normal noted (a plane turned at every cut pays nothing more)
    s = { coords, m0, m1, m2, measured: 0, spread: 0, xAbs: 0, pAbs, offset, runs: new Float64Array(0) }
    HEX_SPREADS.set(conn, s)
    return findCutHexes(d, conn, count, nn)
  }
  if (s.measured === 0) {
    const runs = new Float64Array(2 * Math.ceil(count / HEX_RUN))
    const spread = findCutHexesSpread(d, conn, count, nn, runs)
    s.spread = spread.spread
    s.runs = runs
    s.xAbs = largestNodeScale(coords, coords.length / 3, m0, m1, m2)
    s.pAbs = pAbs
    s.offset = offset
    s.measured = 1
    return spread.n
  }
  const band = 2.5 * SNAP_EPS * (2 * s.xAbs + s.pAbs + pAbs)
  const bound = (s.spread + band) * (1 + 1e-12)
  // a run's first corners now lie in its measured range minus Δ, within the band
  const shift = offset - s.offset, widen = band + 1e-12 * (Math.abs(shift) + s.spread)
  if (!(bound < Infinity && widen < Infinity)) return findCutHexes(d, conn, count, nn)
  return findCutHexesNear(d, conn, count, nn, bound, s.runs, shift, widen)
}

/**
 * findCutHexes, the largest |d_c − d_0| over the block's elements, and per run of HEX_RUN
 * elements the least and largest d_0 (into runs) (scanHexes).
 */
function findCutHexesSpread(d: Float64Array, conn: Int32Array, count: number, nn: number, runs: Float64Array): { n: number; spread: number } {
  if (tetCutList.length < count) tetCutList = new Int32Array(count)
  const list = tetCutList
  let n = 0, spread = 0
  for (let e = 0, base = 0; e < count; e++, base += nn) {
    const d0 = d[conn[base]], d1 = d[conn[base + 1]], d2 = d[conn[base + 2]], d3 = d[conn[base + 3]]
    const d4 = d[conn[base + 4]], d5 = d[conn[base + 5]], d6 = d[conn[base + 6]], d7 = d[conn[base + 7]]
    const neg = (d0 < 0 ? 1 : 0) + (d1 < 0 ? 1 : 0) + (d2 < 0 ? 1 : 0) + (d3 < 0 ? 1 : 0) + (d4 < 0 ? 1 : 0) + (d5 < 0 ? 1 : 0) + (d6 < 0 ? 1 : 0) + (d7 < 0 ? 1 : 0)
    list[n] = e
    n += (neg & 7) !== 0 ? 1 : 0
    const hi = Math.max(d1, d2, d3, d4, d5, d6, d7) - d0, lo = d0 - Math.min(d1, d2, d3, d4, d5, d6, d7)
    // NaN distances make the spread NaN, which turns the bound off (scanHexes)
    spread = Math.max(spread, hi, lo)
    const r = 2 * ((e / HEX_RUN) | 0)
    if (e % HEX_RUN === 0) { runs[r] = d0; runs[r + 1] = d0 } else { runs[r] = Math.min(runs[r], d0); runs[r + 1] = Math.max(runs[r + 1], d0) }
  }
  return { n, spread }
}

/** The largest Σ_k |x_k m_k| over the first N nodes: the scale of the snap band (SNAP_EPS). */
function largestNodeScale(coords: Float64Array, N: number, m0: number, m1: number, m2: number): number {
  const a0 = Math.abs(m0), a1 = Math.abs(m1), a2 = Math.abs(m2)
  let big = 0
  for (let i = 0; i < N; i++) big = Math.max(big, Math.abs(coords[3 * i]) * a0 + Math.abs(coords[3 * i + 1]) * a1 + Math.abs(coords[3 * i + 2]) * a2)
  return big
}

/**
 * findCutHexes for the elements whose first corner lies within `bound` of the plane (|d_0| ≤
 * bound; every other element lies on one side, scanHexes), in the runs whose measured range of
 * first-corner distances, shifted by −shift and widened by `widen`, meets [−bound, bound]: one
 * distance read per element of those runs, all eight for the few near the plane. Same list,
 * same order.
 */
function findCutHexesNear(
  d: Float64Array, conn: Int32Array, count: number, nn: number, bound: number, runs: Float64Array, shift: number, widen: number,
): number {
  if (tetCutList.length < count) tetCutList = new Int32Array(count)
  const list = tetCutList
  const lo = shift - bound - widen, hi = shift + bound + widen
  let n = 0
  for (let r = 0, first = 0; first < count; r += 2, first += HEX_RUN) {
    // measured distances d' relate to today's by d = d' − shift: skip the run unless d' can reach [lo, hi]
    if (runs[r + 1] < lo || runs[r] > hi) continue
    const last = Math.min(count, first + HEX_RUN)
    for (let e = first, base = nn * first; e < last; e++, base += nn) {
      const d0 = d[conn[base]]
      if (d0 < -bound || d0 > bound) continue
      const neg = (d0 < 0 ? 1 : 0) + (d[conn[base + 1]] < 0 ? 1 : 0) + (d[conn[base + 2]] < 0 ? 1 : 0) + (d[conn[base + 3]] < 0 ? 1 : 0)
        + (d[conn[base + 4]] < 0 ? 1 : 0) + (d[conn[base + 5]] < 0 ? 1 : 0) + (d[conn[base + 6]] < 0 ? 1 : 0) + (d[conn[base + 7]] < 0 ? 1 : 0)
      list[n] = e
      n += (neg & 7) !== 0 ? 1 : 0
    }
  }
  return n
}

/**
 * The elements of a block (cc corners first, nn nodes each) with corners on both sides of the
 * plane, in order, in the grows-only list shared with the cut (valid until the next scan):
 * tetrahedra and hexahedra by the branch-free scans above, other types corner by corner.
 */
export function cutElements(d: Float64Array, conn: Int32Array, count: number, nn: number, cc: number): { items: Int32Array; n: number } {
  // the scans may grow tetCutList: read it after them
  if (cc === 4) { const n = findCutTets(d, conn, count, nn); return { items: tetCutList, n } }
  if (cc === 8) { const n = findCutHexes(d, conn, count, nn); return { items: tetCutList, n } }
  if (tetCutList.length < count) tetCutList = new Int32Array(count)
  const list = tetCutList
  let n = 0
  for (let e = 0, base = 0; e < count; e++, base += nn) {
    let neg = 0
    for (let c = 0; c < cc; c++) neg += d[conn[base + c]] < 0 ? 1 : 0
    if (neg !== 0 && neg !== cc) list[n++] = e
  }
  return { items: list, n }
}

/** Section moment about its centroid c from the accumulator's moment about its local origin. */
export function momentAboutCentroid(acc: Float64Array, off: number, c: ArrayLike<number>, frame: Float64Array): Vec3 {
  const Mo = sectionMomentAtOrigin(new Float64Array(3), acc, off, frame)
  const F0 = acc[off + ACC_FORCE], F1 = acc[off + ACC_FORCE + 1], F2 = acc[off + ACC_FORCE + 2]
  const dx = acc[off + ACC_ORIGIN] - c[0], dy = acc[off + ACC_ORIGIN + 1] - c[1], dz = acc[off + ACC_ORIGIN + 2] - c[2]
  return [
    Mo[0] + dy * F2 - dz * F1,
    Mo[1] + dz * F0 - dx * F2,
    Mo[2] + dx * F1 - dy * F0,
  ]
}

/**
 * Boundary faces of the - piece for one plane: whole faces (all corners d < 0) and clipped faces.
 * `d` holds the snapped per-node distances. c: section centroid, g: volume origin.
 */
function freeBodyFaces(
  fb: Float64Array, off: number, mesh: Mesh, stress: StressField, faces: BoundaryFaces,
  tractions: SurfaceTractions, d: Float64Array, cs: ClipScratch, c: ArrayLike<number>, g: ArrayLike<number>,
): void {
  const nodes = faces.nodes, kind = faces.kind, dist = cs.sc.dist, S = faces.slots, coords = mesh.coords
  const cx = c[0], cy = c[1], cz = c[2], gx = g[0], gy = g[1], gz = g[2]
  const corners = faceCornerCount, whole = addWholeFace, clipped = addClippedFace
  for (let f = 0; f < faces.count; f++) {
    const nc = corners(kind[f])
    let neg = 0
    for (let k = 0; k < nc; k++) {
      const dk = d[nodes[S * f + k]]
      dist[k] = dk
      if (dk < 0) neg++
    }
    if (neg === 0) continue // wholly on the + side (or lying in the plane)
    if (neg === nc) whole(fb, off, coords, faces, tractions, f, gx, gy, gz)
    else clipped(fb, off, mesh, stress, faces, f, d, 0, cs, cx, cy, cz, gx, gy, gz)
  }
}
