/**
 * Parts of an assembly: each part's own free body and the interfaces between parts.
 *
 * A part is the set of elements with one part number. Its boundary faces are those of the
 * sub-mesh of its elements (boundaryFaces.ts), so they include the faces it shares with other
 * parts. Its balance is that of computeBodyBalance over those faces with its own ρb: the residual
 * of ∮ t dA + ∫ ρb dV, moment about the part's volume centroid.
 *
 * Interfaces: a face of part b's boundary is an interface with part a when part a's boundary has
 * the same face: the same corner nodes (shared nodes), or corners that coincide within
 * INTERFACE_TOL times the face size (parts meshed apart on matching grids; a hash of the face
 * centroid quantised at that tolerance, neighbouring cells checked, then every corner). For a
 * pair a < b: `force` = F_ab, what a exerts on b = ∫ t dA over b's faces (b's outward normal,
 * b's stress); `moment` about the interface centroid; `mismatch` = |F_ab + F_ba| / (∫|t| dA,
 * the mean of both sides): zero for nodal stress with shared nodes (Newton's third law holds by
 * construction), a quality figure for element-nodal stress.
 *
 * Units: model units; forces stress·length², moments stress·length³. Not a per-drag kernel:
 * it runs once per load (O(elements), one boundary pass per part).
 */
import type { ElementBlock, Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import { extractBoundaryFaces } from './boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from './tractions.ts'
import { computeBodyBalance } from './balanceAudit.ts'
import { faceCornerCount } from './freeBody.ts'
import type { BodyBalance, BoundaryFaces, SurfaceTractions } from './types.ts'
import { cornersCoincide } from './sectionRegions.ts'
import { nearPoints } from './coincidentSweep.ts'

/** Relative tolerance for corners of two parts' faces to coincide (fraction of the face size). */
export const INTERFACE_TOL = 1e-6

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
}

/** The part numbers of the mesh, ascending (0 for elements without one). */
export function partNumbers(mesh: Mesh): number[] {
  const s = new Set<number>()
  for (const b of mesh.blocks) {
    if (!b.part) s.add(0)
    else for (let e = 0; e < b.part.length; e++) s.add(b.part[e])
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

/**
 * Parts and interfaces of an assembly. `bodyForce(part)` gives each part's ρb (a part's own or
 * the model's); `names` the part names (empty when none).
 */
export function assemblyBalance(
  mesh: Mesh, field: StressField, bodyForce: (part: number) => Vec3, names: ReadonlyMap<number, string> = new Map(),
): AssemblyBalance {
  const numbers = partNumbers(mesh)
  const each = numbers.map((p) => {
    const sub = partSubmesh(mesh, field, p)
    const faces = extractBoundaryFaces(sub.mesh)
    const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), sub.mesh, sub.field, faces)
    const balance = computeBodyBalance(sub.mesh, faces, tractions, bodyForce(p))
    return { part: p, faces, tractions, record: { part: p, name: names.get(p) ?? '', elements: sub.mesh.elementCount, volume: balance.volume, balance } }
  })
  return { parts: each.map((e) => e.record), ...matchInterfaces(mesh.coords, each) }
}

interface PartFaces { part: number; faces: BoundaryFaces; tractions: SurfaceTractions }

/** Pairs boundary faces of different parts by shared corner nodes or coinciding corners; sums per pair. */
function matchInterfaces(coords: Float64Array, parts: readonly PartFaces[]): Pick<AssemblyBalance, 'interfaces' | 'interfaceMesh'> {
  // every boundary face: owner part index, face index; keyed by its sorted corners, else geometric
  const pairs: [number, number, number, number][] = [] // [pa, fa, pb, fb]
  const open = matchByNodes(parts, pairs)
  // geometric: faces whose corners coincide within INTERFACE_TOL × size; candidates from a sweep
  // of their centroids (coincidentSweep.ts)
  if (open.length > 1) {
    const size = (pf: [number, number]) => Math.sqrt(parts[pf[0]].faces.area[pf[1]])
    let cell = 0
    for (const o of open) cell = Math.max(cell, INTERFACE_TOL * size(o))
    if (cell > 0) {
      const points = new Float64Array(3 * open.length)
      open.forEach((o, i) => { for (let k = 0; k < 3; k++) points[3 * i + k] = parts[o[0]].faces.centroid[3 * o[1] + k] })
      const near = nearPoints(points, open.length, 2 * cell)
      const used = new Uint8Array(open.length)
      open.forEach((o, i) => {
        for (let k = near.start[i]; k < near.start[i + 1] && !used[i]; k++) {
          const j = near.list[k]
          if (used[j] || open[j][0] === o[0]) continue
          const tol = INTERFACE_TOL * Math.min(size(o), size(open[j]))
          if (Math.hypot(points[3 * i] - points[3 * j], points[3 * i + 1] - points[3 * j + 1], points[3 * i + 2] - points[3 * j + 2]) > tol) continue
          if (!faceCornersCoincide(coords, parts, o, open[j], tol)) continue
          used[i] = 1; used[j] = 1
          pairs.push([o[0], o[1], open[j][0], open[j][1]])
        }
      })
    }
  }
  // sums per pair of parts
  interface Acc { a: number; b: number; faces: number; area: number; cx: number; cy: number; cz: number; fb: Vec3; fa: Vec3; m0: Vec3; gross: number; drawn: number[] }
  const accs = new Map<number, Acc>() // by pa · (part count) + pb (part indices; numbers ascend with them)
  for (const [p1, f1, p2, f2] of pairs) {
    // orient: a is the lower part number
    const [pa, fa, pb, fb] = parts[p1].part < parts[p2].part ? [p1, f1, p2, f2] : [p2, f2, p1, f1]
    const k = pa * parts.length + pb
    let acc = accs.get(k)
    if (!acc) { acc = { a: parts[pa].part, b: parts[pb].part, faces: 0, area: 0, cx: 0, cy: 0, cz: 0, fb: [0, 0, 0], fa: [0, 0, 0], m0: [0, 0, 0], gross: 0, drawn: [] }; accs.set(k, acc) }
    const B = parts[pb], A = parts[pa]
    const ar = B.faces.area[fb]
    acc.faces++
    acc.area += ar
    acc.cx += ar * B.faces.centroid[3 * fb]; acc.cy += ar * B.faces.centroid[3 * fb + 1]; acc.cz += ar * B.faces.centroid[3 * fb + 2]
    for (let c = 0; c < 3; c++) {
      acc.fb[c] += B.tractions.force[3 * fb + c]
      acc.fa[c] += A.tractions.force[3 * fa + c]
      acc.m0[c] += B.tractions.moment[3 * fb + c]
    }
    acc.gross += 0.5 * (B.tractions.meanMagnitude[fb] * ar + A.tractions.meanMagnitude[fa] * A.faces.area[fa])
    acc.drawn.push(pb, fb)
  }
  const sorted = [...accs.values()].sort((x, y) => x.a - y.a || x.b - y.b)
  const interfaces = sorted.map((s) => {
    const c: Vec3 = s.area > 0 ? [s.cx / s.area, s.cy / s.area, s.cz / s.area] : [0, 0, 0]
    const F = s.fb
    // M_c = M_0 - c × F
    const moment: Vec3 = [s.m0[0] - (c[1] * F[2] - c[2] * F[1]), s.m0[1] - (c[2] * F[0] - c[0] * F[2]), s.m0[2] - (c[0] * F[1] - c[1] * F[0])]
    const sum = Math.hypot(F[0] + s.fa[0], F[1] + s.fa[1], F[2] + s.fa[2])
    return {
      parts: [s.a, s.b] as [number, number], faces: s.faces, area: s.area, centroid: c, force: [F[0], F[1], F[2]] as Vec3, moment,
      reverseForce: [s.fa[0], s.fa[1], s.fa[2]] as Vec3, mismatch: s.gross > 0 ? sum / s.gross : 0, gross: s.gross,
    }
  })
  return { interfaces, interfaceMesh: interfaceTriangles(coords, parts, sorted.map((s) => s.drawn)) }
}

/** Corner triangles of each interface's faces (pairs [part index, face index]), for drawing. */
function interfaceTriangles(coords: Float64Array, parts: readonly PartFaces[], drawn: readonly number[][]): AssemblyBalance['interfaceMesh'] {
  let T = 0
  for (const list of drawn) for (let k = 0; k < list.length; k += 2) T += faceCornerCount(parts[list[k]].faces.kind[list[k + 1]]) - 2
  const positions = new Float32Array(9 * T), offsets = new Int32Array(drawn.length + 1)
  let t = 0
  drawn.forEach((list, i) => {
    for (let k = 0; k < list.length; k += 2) {
      const f = parts[list[k]].faces, face = list[k + 1], nc = faceCornerCount(f.kind[face]), base = f.slots * face
      for (let c = 1; c + 1 < nc; c++) {
        for (let q = 0; q < 3; q++) {
          const v = f.nodes[base + (q === 0 ? 0 : c + q - 1)]
          positions[3 * t] = coords[3 * v]; positions[3 * t + 1] = coords[3 * v + 1]; positions[3 * t + 2] = coords[3 * v + 2]
          t++
        }
      }
    }
    offsets[i + 1] = t / 3
  })
  return { positions, offsets }
}

/**
 * Pairs boundary faces of different parts with the same corner nodes (pushed to `pairs` in the
 * order the second is met); returns the faces left, in the order first met. A table keyed by the
 * sorted corners (open addressing over typed arrays: no string per face).
 */
function matchByNodes(parts: readonly PartFaces[], pairs: [number, number, number, number][]): [number, number][] {
  let total = 0
  for (const p of parts) total += p.faces.count
  let slots = 1024
  while (slots < 2 * total) slots *= 2
  const mask = slots - 1
  // per slot: 4 sorted corners (-1 pads a triangle), owner part index, face index (-1: free or matched away)
  const key = new Int32Array(4 * slots), owner = new Int32Array(slots).fill(-1), face = new Int32Array(slots).fill(-1)
  const used = new Uint8Array(slots), last = new Int32Array(slots)
  const order: number[] = [] // slots in the order filled (a slot filled again after its pair: listed again)
  parts.forEach((p, pi) => {
    const { faces } = p
    for (let f = 0; f < faces.count; f++) {
      const nc = faceCornerCount(faces.kind[f])
      const o = faces.slots * f
      // sorted by a five-compare network (a triangle's missing fourth sorts last)
      let c0 = faces.nodes[o], c1 = faces.nodes[o + 1], c2 = faces.nodes[o + 2], c3 = nc > 3 ? faces.nodes[o + 3] : 0x7fffffff, x
      if (c0 > c1) { x = c0; c0 = c1; c1 = x }
      if (c2 > c3) { x = c2; c2 = c3; c3 = x }
      if (c0 > c2) { x = c0; c0 = c2; c2 = x }
      if (c1 > c3) { x = c1; c1 = c3; c3 = x }
      if (c1 > c2) { x = c1; c1 = c2; c2 = x }
      let h = (Math.imul(c0, 0x9e3779b1) + Math.imul(c1, 0x85ebca77) + Math.imul(c2, 0xc2b2ae3d) + Math.imul(c3, 0x27d4eb2f)) | 0
      h = (h ^ (h >>> 15)) & mask
      while (used[h] && !(key[4 * h] === c0 && key[4 * h + 1] === c1 && key[4 * h + 2] === c2 && key[4 * h + 3] === c3)) h = (h + 1) & mask
      if (!used[h]) {
        used[h] = 1
        key[4 * h] = c0; key[4 * h + 1] = c1; key[4 * h + 2] = c2; key[4 * h + 3] = c3
        owner[h] = pi; face[h] = f
        last[h] = order.length; order.push(h)
      } else if (owner[h] >= 0 && owner[h] !== pi) {
        pairs.push([owner[h], face[h], pi, f])
        owner[h] = -1
      } else if (owner[h] < 0) {
        // met again after its pair was taken: open again, now last in order (as a map entry set anew)
        owner[h] = pi; face[h] = f
        last[h] = order.length; order.push(h)
      } else face[h] = f // the same part again: the later face stands for the key
    }
  })
  const open: [number, number][] = []
  for (let k = 0; k < order.length; k++) {
    const h = order[k]
    // a slot reopened later is listed at its last filling only
    if (owner[h] >= 0 && last[h] === k) open.push([owner[h], face[h]])
  }
  return open
}

function faceCornersCoincide(coords: Float64Array, parts: readonly PartFaces[], a: [number, number], b: [number, number], tol: number): boolean {
  const corners = (pf: [number, number]): number[] => {
    const f = parts[pf[0]].faces, nc = faceCornerCount(f.kind[pf[1]])
    return Array.from(f.nodes.subarray(f.slots * pf[1], f.slots * pf[1] + nc))
  }
  const ca = corners(a), cb = corners(b)
  return ca.length === cb.length && cornersCoincide(coords, ca, cb, tol)
}
