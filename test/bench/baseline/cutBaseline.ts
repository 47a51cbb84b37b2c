/**
 * Plain baseline for a section cut, written the way a first attempt usually is: every element is
 * visited, its corners become objects, crossing edges give intersection point objects with the
 * stress interpolated linearly along the edge, the polygon is ordered by angle and fanned into
 * triangle objects, and the resultants are summed in a second pass over those triangles.
 *
 * Over each triangle σ is taken linear between its vertices (exact for tet4, whose stress is
 * linear inside the element); force uses the vertex mean, the moment about the centroid the
 * three edge-midpoint rule, exact for quadratics on a triangle (Dunavant, IJNME 21, 1985, degree 2).
 * Linear element types only (tet4, hex8, wedge6); resultants only, no free-body check.
 */
import { ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../../src/model/model.ts'

export interface BaselineSection {
  area: number
  centroid: number[]
  force: number[]
  moment: number[]
  cutElements: number
}

interface Vertex { pos: number[]; traction: number[] }
interface Triangle { a: Vertex; b: Vertex; c: Vertex; area: number }

export function baselineCut(mesh: Mesh, stress: Float64Array, point: Vec3, normal: Vec3): BaselineSection {
  const len = Math.hypot(normal[0], normal[1], normal[2])
  const m = normal.map((v) => v / len)
  // An in-plane basis for ordering polygon vertices by angle.
  const helper = Math.abs(m[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0]
  const u = normalize(cross(m, helper))
  const w = cross(m, u)
  const triangles: Triangle[] = []
  let cutElements = 0
  for (const block of mesh.blocks) {
    const topo = ELEMENT_TYPES[block.type]
    const count = block.conn.length / topo.nodeCount
    for (let e = 0; e < count; e++) {
      const corners = Array.from(block.conn.subarray(e * topo.nodeCount, e * topo.nodeCount + topo.cornerCount)).map((n) => {
        const pos = [mesh.coords[3 * n], mesh.coords[3 * n + 1], mesh.coords[3 * n + 2]]
        return { pos, d: dot(sub(pos, point), m), sigma: Array.from(stress.subarray(6 * n, 6 * n + 6)) }
      })
      const points: Vertex[] = []
      for (const [a, b] of topo.edges) {
        const A = corners[a], B = corners[b]
        if ((A.d < 0) === (B.d < 0)) continue
        const t = A.d / (A.d - B.d)
        const pos = A.pos.map((v, k) => v + t * (B.pos[k] - v))
        const sigma = A.sigma.map((v, k) => v + t * (B.sigma[k] - v))
        points.push({ pos, traction: sigmaTimes(sigma, m) })
      }
      if (points.length < 3) continue
      cutElements++
      const mid = [0, 1, 2].map((k) => points.reduce((s, p) => s + p.pos[k], 0) / points.length)
      points.sort((p, q) => angle(p.pos, mid, u, w) - angle(q.pos, mid, u, w))
      for (let i = 1; i + 1 < points.length; i++) {
        const a = points[0], b = points[i], c = points[i + 1]
        const area = norm(cross(sub(b.pos, a.pos), sub(c.pos, a.pos))) / 2
        triangles.push({ a, b, c, area })
      }
    }
  }
  let area = 0
  const first = [0, 0, 0]
  const force = [0, 0, 0]
  for (const t of triangles) {
    area += t.area
    for (let k = 0; k < 3; k++) {
      first[k] += (t.area * (t.a.pos[k] + t.b.pos[k] + t.c.pos[k])) / 3
      force[k] += (t.area * (t.a.traction[k] + t.b.traction[k] + t.c.traction[k])) / 3
    }
  }
  const centroid = area > 0 ? first.map((v) => v / area) : [...point]
  const moment = [0, 0, 0]
  for (const t of triangles) {
    for (const [p, q] of [[t.a, t.b], [t.b, t.c], [t.c, t.a]]) {
      const x = p.pos.map((v, k) => (v + q.pos[k]) / 2 - centroid[k])
      const tr = p.traction.map((v, k) => (v + q.traction[k]) / 2)
      const r = cross(x, tr)
      for (let k = 0; k < 3; k++) moment[k] += (t.area * r[k]) / 3
    }
  }
  return { area, centroid, force, moment, cutElements }
}

function angle(p: number[], c: number[], u: number[], w: number[]): number {
  const d = sub(p, c)
  return Math.atan2(dot(d, w), dot(d, u))
}
function sub(a: readonly number[], b: readonly number[]): number[] { return [a[0] - b[0], a[1] - b[1], a[2] - b[2]] }
function dot(a: readonly number[], b: readonly number[]): number { return a[0] * b[0] + a[1] * b[1] + a[2] * b[2] }
function cross(a: readonly number[], b: readonly number[]): number[] { return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]] }
function norm(a: number[]): number { return Math.sqrt(dot(a, a)) }
function normalize(a: number[]): number[] { const l = norm(a); return a.map((v) => v / l) }
function sigmaTimes(s: number[], v: number[]): number[] {
  return [s[0] * v[0] + s[3] * v[1] + s[5] * v[2], s[3] * v[0] + s[1] * v[1] + s[4] * v[2], s[5] * v[0] + s[4] * v[1] + s[2] * v[2]]
}
