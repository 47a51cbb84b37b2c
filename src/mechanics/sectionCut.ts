/**
 * One section cut: the resultant force and moment that the material on the +m side of a plane
 * exerts on the material on the -m side (DESIGN.md), the section's area properties, and the
 * free-body check of the - piece.
 *
 * One pass over the nodes computes d = (x - p)·m (snapped to 0 within round-off, SNAP_EPS); one pass over the elements rejects those whose
 * corners all lie on one side (d == 0 is the + side, see sectionPolygon.ts) and integrates the
 * polygon of each cut element. Boundary faces and their tractions are needed only for the
 * free body; pass them in `options` when cutting repeatedly (dragging the plane), else they are
 * computed here each call.
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { checkPoint, unitNormal } from './plane.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import { extractBoundaryFaces } from './boundaryFaces.ts'
import { addClippedFace, addWholeFace, closeFreeBody, faceCornerCount, FB_SIZE } from './freeBody.ts'
import {
  ACC_AREA, ACC_FORCE, ACC_ORIGIN, ACC_SIZE, createPolygonScratch, crossingCases, elementPolygon,
  integratePolygon, sectionFrame, sectionMomentAtOrigin,
} from './sectionPolygon.ts'
import type { PolygonScratch } from './sectionPolygon.ts'
import { emptySection, sectionCentroid, sectionRecord } from './sectionProperties.ts'
import type { SectionAxesChoice } from './sectionAxes.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from './tractions.ts'
import { nodalStressField } from '../model/stressField.ts'
import type { BoundaryFaces, SectionPlane, SectionPolygons, SectionResult, SurfaceTractions } from './types.ts'

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
  /** Section axes: principal (the default) or reference, with the reference direction (sectionAxes.ts). */
  readonly axes?: SectionAxesChoice
}

/**
 * Snap band, relative to the size of the numbers that make d: nodes within
 * SNAP_EPS · Σ (|x_i| + |p_i|)|m_i| of the plane count as lying on it (d = 0). Without it, a node
 * layer that lies in the plane only up to round-off (a rotated or scaled mesh) gets random signs,
 * and a hexahedron face with alternating corner signs would give overlapping polygons on both
 * sides. 64 ε (≈ 1.4e-14) is far above round-off and far below any real geometry.
 */
export const SNAP_EPS = 64 * Number.EPSILON

/** Grows-only scratch for node distances: dragging the plane re-cuts the same mesh many times. */
let distScratch = new Float64Array(0)

export function cutSection(
  mesh: Mesh, stress: Float64Array, bodyForce: Vec3, plane: SectionPlane, options: CutSectionOptions = {},
): { result: SectionResult; polygons: SectionPolygons | null } {
  const m = unitNormal(plane.normal)
  checkPoint(plane.point, 'section point')
  if (options.about) checkPoint(options.about, 'moment point')
  const point: Vec3 = [plane.point[0], plane.point[1], plane.point[2]]
  const frame = sectionFrame(new Float64Array(9), m[0], m[1], m[2])
  const coords = mesh.coords, N = mesh.nodeCount
  if (distScratch.length < N) distScratch = new Float64Array(N)
  const d = distScratch
  nodeDistances(d, coords, N, point, m)

  const acc = new Float64Array(ACC_SIZE)
  const sc = createPolygonScratch()
  const collect = options.polygons ? createPolygonCollector() : null
  for (const block of mesh.blocks) cutBlock(acc, sc, d, coords, stress, block.type, block.conn, block.offset, frame, collect, m)
  const polygons = collect ? collect.finish() : null
  const about = options.about ? [options.about[0], options.about[1], options.about[2]] as Vec3 : null
  if (!(acc[ACC_AREA] > 0)) return { result: emptySection(point, m, frame, about, options.axes), polygons }

  const c = sectionCentroid(new Float64Array(3), acc, 0, frame)
  const faces = options.faces ?? extractBoundaryFaces(mesh)
  const tractions = options.tractions ?? computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, stress), faces)
  const fb = new Float64Array(FB_SIZE)
  // volume terms about the section centroid: the section itself then adds no volume term
  freeBodyFaces(fb, 0, coords, stress, faces, tractions, d, sc, c, c)
  const Fs: Vec3 = [acc[ACC_FORCE], acc[ACC_FORCE + 1], acc[ACC_FORCE + 2]]
  const Ms = momentAboutCentroid(acc, 0, c, frame)
  const freeBody = closeFreeBody(fb, 0, c, c, acc[ACC_AREA], m, Fs, Ms, bodyForce)
  return { result: sectionRecord(acc, 0, point, m, frame, about, freeBody, options.axes), polygons }
}

// The passes below are separate functions so that each is optimised with its own type feedback:
// inside one long function, the optimiser compiles the first loop while it runs (on-stack) and
// then gives the code up at every later pass it has not seen run yet, for the first few calls.

/** Snapped signed distances d = (x - p)·m of the first N nodes (see SNAP_EPS). */
function nodeDistances(d: Float64Array, coords: Float64Array, N: number, point: Vec3, m: Vec3): void {
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

/** Adds the section polygons of one block's cut elements to `acc` (and to `collect` when drawing). */
function cutBlock(
  acc: Float64Array, sc: PolygonScratch, d: Float64Array, coords: Float64Array, stress: Float64Array,
  type: ElementTypeName, conn: Int32Array, offset: number, frame: Float64Array, collect: PolygonCollector | null, m: Vec3,
): void {
  const topo = ELEMENT_TYPES[type]
  const nn = topo.nodeCount, cc = topo.cornerCount
  const cases = crossingCases(type)
  const count = conn.length / nn
  const dist = sc.dist
  // Imported kernels once into locals: under a CommonJS transform (tsx) each use of an imported
  // name is otherwise a getter call per element.
  const polygon = elementPolygon, integrate = integratePolygon
  if (cc === 4) {
    // Tetrahedra (4 corners), the bulk of large models: a small scan finds the cut elements (quick to optimise,
    // so the first cut pays little for the warm-up), then only those are clipped, in element order.
    const n = findCutTets(d, conn, count, nn)
    const list = tetCutList
    for (let i = 0; i < n; i++) {
      const base = nn * list[i]
      dist[0] = d[conn[base]]; dist[1] = d[conn[base + 1]]; dist[2] = d[conn[base + 2]]; dist[3] = d[conn[base + 3]]
      if (polygon(sc, acc, 0, coords, stress, 6, conn, base, cases, frame) < 3) continue
      integrate(acc, 0, sc, frame, 6)
      if (collect) collect.add(sc, m, offset + list[i])
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
    if (polygon(sc, acc, 0, coords, stress, 6, conn, base, cases, frame) < 3) continue
    integrate(acc, 0, sc, frame, 6)
    if (collect) collect.add(sc, m, offset + e)
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
  fb: Float64Array, off: number, coords: Float64Array, stress: Float64Array, faces: BoundaryFaces,
  tractions: SurfaceTractions, d: Float64Array, sc: PolygonScratch, c: ArrayLike<number>, g: ArrayLike<number>,
): void {
  const nodes = faces.nodes, kind = faces.kind, dist = sc.dist, S = faces.slots
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
    if (neg === nc) whole(fb, off, faces, tractions, f, gx, gy, gz)
    else clipped(fb, off, coords, stress, faces, f, sc, cx, cy, cz, gx, gy, gz)
  }
}

type PolygonCollector = ReturnType<typeof createPolygonCollector>

/** Collects drawn polygons into typed arrays that double when full (drawing is not the hot path). */
function createPolygonCollector() {
  let start = new Int32Array(1024), elem = new Int32Array(1024)
  let positions = new Float64Array(8192), traction = new Float64Array(8192)
  let count = 0, verts = 0
  return {
    add(sc: PolygonScratch, m: Vec3, e: number): void {
      const n = sc.count
      if (count + 2 > start.length) { start = growInt(start); elem = growInt(elem) }
      if (3 * (verts + n) > positions.length) { positions = growFloat(positions); traction = growFloat(traction) }
      const sig = sc.sig, pos = sc.pos, order = sc.order
      const mx = m[0], my = m[1], mz = m[2]
      for (let i = 0; i < n; i++) {
        const k = order[i], s = 6 * k, o = 3 * (verts + i)
        positions[o] = pos[3 * k]; positions[o + 1] = pos[3 * k + 1]; positions[o + 2] = pos[3 * k + 2]
        traction[o] = sig[s] * mx + sig[s + 3] * my + sig[s + 5] * mz
        traction[o + 1] = sig[s + 3] * mx + sig[s + 1] * my + sig[s + 4] * mz
        traction[o + 2] = sig[s + 5] * mx + sig[s + 4] * my + sig[s + 2] * mz
      }
      verts += n
      elem[count++] = e
      start[count] = verts
    },
    finish(): SectionPolygons {
      return {
        count, start: start.slice(0, count + 1), positions: positions.slice(0, 3 * verts),
        traction: traction.slice(0, 3 * verts), elem: elem.slice(0, count),
      }
    },
  }
}

function growInt(a: Int32Array<ArrayBuffer>): Int32Array<ArrayBuffer> {
  const b = new Int32Array(2 * a.length)
  b.set(a)
  return b
}

function growFloat(a: Float64Array<ArrayBuffer>): Float64Array<ArrayBuffer> {
  const b = new Float64Array(2 * a.length)
  b.set(a)
  return b
}
