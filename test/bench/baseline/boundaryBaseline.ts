/**
 * Plain baseline for boundary faces with tractions, written the way a first attempt usually is:
 * a Map keyed by the sorted corner ids joined into a string, arrays of arrays for points, and a
 * fresh object per face and per quadrature point. It is the yardstick the fast kernel
 * (src/mechanics/boundaryFaces.ts + tractions.ts) is compared with, for speed and for equality.
 *
 * Linear faces only (tri3, quad4): the benchmark models are tet4 and hex8.
 */
import { ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'
import type { Mesh } from '../../../src/model/model.ts'

export interface BaselineFace {
  elem: number
  localFace: number
  nodes: number[]
  area: number
  normal: number[]
  /** ∫ σn dA over the face. */
  force: number[]
}

interface Seen { elem: number; localFace: number; nodes: number[]; count: number }

export function baselineBoundary(mesh: Mesh, stress: Float64Array): BaselineFace[] {
  const seen = new Map<string, Seen>()
  for (const block of mesh.blocks) {
    const topo = ELEMENT_TYPES[block.type]
    const count = block.conn.length / topo.nodeCount
    for (let e = 0; e < count; e++) {
      const elementNodes = Array.from(block.conn.subarray(e * topo.nodeCount, (e + 1) * topo.nodeCount))
      topo.faces.forEach((face, f) => {
        const nodes = face.map((a) => elementNodes[a])
        const key = [...nodes].sort((a, b) => a - b).join(',')
        const s = seen.get(key)
        if (s) s.count++
        else seen.set(key, { elem: block.offset + e, localFace: f, nodes, count: 1 })
      })
    }
  }
  const out: BaselineFace[] = []
  for (const s of seen.values()) {
    if (s.count !== 1) continue
    const pts = s.nodes.map((n) => [mesh.coords[3 * n], mesh.coords[3 * n + 1], mesh.coords[3 * n + 2]])
    const sig = s.nodes.map((n) => Array.from(stress.subarray(6 * n, 6 * n + 6)))
    const r = s.nodes.length === 3 ? triangleFace(pts, sig) : quadFace(pts, sig)
    out.push({ elem: s.elem, localFace: s.localFace, nodes: s.nodes, area: r.area, normal: r.normal, force: r.force })
  }
  return out
}

function sub(a: number[], b: number[]): number[] { return [a[0] - b[0], a[1] - b[1], a[2] - b[2]] }
function cross(a: number[], b: number[]): number[] { return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]] }
function norm(a: number[]): number { return Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]) }
/** σ·v with σ as [xx, yy, zz, xy, yz, xz]. */
function sigmaTimes(s: number[], v: number[]): number[] {
  return [s[0] * v[0] + s[3] * v[1] + s[5] * v[2], s[3] * v[0] + s[1] * v[1] + s[4] * v[2], s[5] * v[0] + s[4] * v[1] + s[2] * v[2]]
}

/** Flat triangle, σ linear over it: ∫ σn dA = A · mean(σ_i) n exactly. */
function triangleFace(p: number[][], s: number[][]) {
  const c = cross(sub(p[1], p[0]), sub(p[2], p[0]))
  const l = norm(c)
  const n = c.map((v) => v / l)
  const mean = [0, 1, 2, 3, 4, 5].map((k) => (s[0][k] + s[1][k] + s[2][k]) / 3)
  const area = l / 2
  return { area, normal: n, force: sigmaTimes(mean, n).map((v) => v * area) }
}

/** Bilinear quadrilateral, 2×2 Gauss–Legendre (Abramowitz & Stegun Table 25.4): ∫ σ (x_u × x_v) du dv. */
function quadFace(p: number[][], s: number[][]) {
  const g = 1 / Math.sqrt(3)
  const ref = [[-1, -1], [1, -1], [1, 1], [-1, 1]]
  let area = 0
  const force = [0, 0, 0]
  const nsum = [0, 0, 0]
  for (const [u, v] of [[-g, -g], [g, -g], [g, g], [-g, g]]) {
    const N = ref.map(([a, b]) => ((1 + a * u) * (1 + b * v)) / 4)
    const dNu = ref.map(([a, b]) => (a * (1 + b * v)) / 4)
    const dNv = ref.map(([a, b]) => (b * (1 + a * u)) / 4)
    const xu = [0, 1, 2].map((k) => p.reduce((acc, pt, i) => acc + dNu[i] * pt[k], 0))
    const xv = [0, 1, 2].map((k) => p.reduce((acc, pt, i) => acc + dNv[i] * pt[k], 0))
    const da = cross(xu, xv)
    const sig = [0, 1, 2, 3, 4, 5].map((k) => s.reduce((acc, si, i) => acc + N[i] * si[k], 0))
    const t = sigmaTimes(sig, da)
    for (let k = 0; k < 3; k++) { force[k] += t[k]; nsum[k] += da[k] }
    area += norm(da)
  }
  const l = norm(nsum)
  return { area, normal: nsum.map((v) => v / l), force }
}
