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
import { cellKey, cornersCoincide } from './sectionRegions.ts'

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
  mesh.blocks.forEach((b, bi) => {
    const nn = ELEMENT_TYPES[b.type].nodeCount, count = b.ids.length
    const keep: number[] = []
    for (let e = 0; e < count; e++) if (wanted.has(b.part ? b.part[e] : 0)) keep.push(e)
    if (keep.length === 0) return
    const conn = new Int32Array(keep.length * nn), ids = new Int32Array(keep.length), r = new Int32Array(keep.length * nn)
    keep.forEach((e, k) => {
      conn.set(b.conn.subarray(e * nn, (e + 1) * nn), k * nn)
      r.set(field.rows[bi].subarray(e * nn, (e + 1) * nn), k * nn)
      ids[k] = b.ids[e]
    })
    const part = new Int32Array(keep.length)
    if (b.part) keep.forEach((e, k) => { part[k] = b.part![e] })
    blocks.push({ type: b.type, conn, ids, part, offset })
    rows.push(field.layout === 'nodal' ? conn : r)
    offset += keep.length
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
  // every boundary face: owner part index, face index; keyed by sorted corners, else geometric
  const byNodes = new Map<string, [number, number]>()
  const pairs: [number, number, number, number][] = [] // [pa, fa, pb, fb]
  const open: [number, number][] = []
  parts.forEach((p, pi) => {
    const { faces } = p
    for (let f = 0; f < faces.count; f++) {
      const nc = faceCornerCount(faces.kind[f])
      const ids: number[] = []
      for (let k = 0; k < nc; k++) ids.push(faces.nodes[faces.slots * f + k])
      ids.sort((x, y) => x - y)
      const key = ids.join(',')
      const other = byNodes.get(key)
      if (other && other[0] !== pi) { pairs.push([other[0], other[1], pi, f]); byNodes.delete(key) } else byNodes.set(key, [pi, f])
    }
  })
  for (const v of byNodes.values()) open.push(v)
  // geometric: faces whose corners coincide within INTERFACE_TOL × size
  if (open.length > 1) {
    const cen = (pf: [number, number]): Vec3 => {
      const fc = parts[pf[0]].faces.centroid, f = pf[1]
      return [fc[3 * f], fc[3 * f + 1], fc[3 * f + 2]]
    }
    const size = (pf: [number, number]) => Math.sqrt(parts[pf[0]].faces.area[pf[1]])
    let cell = 0
    for (const o of open) cell = Math.max(cell, INTERFACE_TOL * size(o))
    if (cell > 0) {
      const q = (x: number) => Math.floor(x / cell)
      const key = cellKey
      const grid = new Map<number, number[]>()
      open.forEach((o, i) => {
        const c = cen(o), k = key(q(c[0]), q(c[1]), q(c[2]))
        const l = grid.get(k)
        if (l) l.push(i); else grid.set(k, [i])
      })
      const used = new Uint8Array(open.length)
      open.forEach((o, i) => {
        if (used[i]) return
        const c = cen(o)
        const qx = q(c[0]), qy = q(c[1]), qz = q(c[2])
        for (let dx = -1; dx <= 1; dx++) for (let dy = -1; dy <= 1; dy++) for (let dz = -1; dz <= 1; dz++) {
          for (const j of grid.get(key(qx + dx, qy + dy, qz + dz)) ?? []) {
            if (j === i || used[j] || used[i] || open[j][0] === o[0]) continue
            const tol = INTERFACE_TOL * Math.min(size(o), size(open[j]))
            const cj = cen(open[j])
            if (Math.hypot(c[0] - cj[0], c[1] - cj[1], c[2] - cj[2]) > tol) continue
            if (!faceCornersCoincide(coords, parts, o, open[j], tol)) continue
            used[i] = 1; used[j] = 1
            pairs.push([o[0], o[1], open[j][0], open[j][1]])
          }
        }
      })
    }
  }
  // sums per pair of parts
  interface Acc { a: number; b: number; faces: number; area: number; cx: number; cy: number; cz: number; fb: Vec3; fa: Vec3; m0: Vec3; gross: number; drawn: number[] }
  const accs = new Map<string, Acc>()
  for (const [p1, f1, p2, f2] of pairs) {
    // orient: a is the lower part number
    const [pa, fa, pb, fb] = parts[p1].part < parts[p2].part ? [p1, f1, p2, f2] : [p2, f2, p1, f1]
    const k = `${parts[pa].part},${parts[pb].part}`
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
        for (const v of [f.nodes[base], f.nodes[base + c], f.nodes[base + c + 1]]) {
          positions[3 * t] = coords[3 * v]; positions[3 * t + 1] = coords[3 * v + 1]; positions[3 * t + 2] = coords[3 * v + 2]
          t++
        }
      }
    }
    offsets[i + 1] = t / 3
  })
  return { positions, offsets }
}

function faceCornersCoincide(coords: Float64Array, parts: readonly PartFaces[], a: [number, number], b: [number, number], tol: number): boolean {
  const corners = (pf: [number, number]): number[] => {
    const f = parts[pf[0]].faces, nc = faceCornerCount(f.kind[pf[1]])
    return Array.from(f.nodes.subarray(f.slots * pf[1], f.slots * pf[1] + nc))
  }
  const ca = corners(a), cb = corners(b)
  return ca.length === cb.length && cornersCoincide(coords, ca, cb, tol)
}
