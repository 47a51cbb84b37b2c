/**
 * Surface clusters and the clusters a pass draws (src/mechanics/surfaceClusters.ts,
 * src/scene/clusterVisibility.ts) on seeded jittered blocks of three element types, against the
 * plain per-triangle rules (common practice in rasterisation): a triangle wound counter-clockwise
 * from outside faces a perspective camera at e when n·(e − p) > 0 for a point p of it, a parallel
 * view along d when n·d < 0; a clipping plane keeps n·x + c ≥ 0 (three.js's convention).
 * Checked: the clusters tile the triangles, respect the ranges and the size, hold their vertices
 * and their normals; no triangle a pass could draw lies in a cluster it leaves out; and on a box
 * seen from outside, a pass leaves out a good share. Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { CLUSTER_STRIDE, sortTrianglesSpatially, surfaceClusters } from '../../src/mechanics/surfaceClusters.ts'
import { visibleClusterRuns } from '../../src/scene/clusterVisibility.ts'
import type { ClusterView } from '../../src/scene/clusterVisibility.ts'
import { mulberry32 } from '../../src/mechanics/seededRandom.ts'
import { surfaceOf } from '../helpers/surfaceOf.ts'

const SEED = 2718

/** Unit normal (float64) and vertices of triangle t. */
function triangle(positions: Float32Array, index: Uint32Array, t: number) {
  const p = [0, 1, 2].map((c) => { const v = 3 * index[3 * t + c]; return [positions[v], positions[v + 1], positions[v + 2]] })
  const u = p[1].map((v, i) => v - p[0][i]), w = p[2].map((v, i) => v - p[0][i])
  const n = [u[1] * w[2] - u[2] * w[1], u[2] * w[0] - u[0] * w[2], u[0] * w[1] - u[1] * w[0]]
  const l = Math.hypot(...n)
  return { p, n: l > 0 ? n.map((v) => v / l) : null }
}

describe(`surface clusters (seed ${SEED})`, () => {
  console.log(`surface clusters seed ${SEED}`)
  for (const [type, elements] of [['tet4', 3000], ['tet10', 1500], ['hex8', 2000]] as const) {
    it(`${type}: clusters tile the triangles, hold their vertices and normals; passes leave out only what cannot show`, () => {
      const rnd = mulberry32(SEED + elements)
      const s = surfaceOf(type, elements, SEED)
      const { positions, index } = s
      const T = index.length / 3
      const before = new Map<string, number>()
      const key = (t: number): string => Array.from(index.subarray(3 * t, 3 * t + 3)).join(',')
      for (let t = 0; t < T; t++) before.set(key(t), t)
      const carried = Uint32Array.from({ length: T }, (_, t) => t)
      sortTrianglesSpatially(positions, index, [carried])
      // a permutation, the carried array moved with it
      for (let t = 0; t < T; t++) expect(before.get(key(t))).toBe(carried[t])
      // three ranges of random lengths
      const a = Math.floor(rnd() * T), b = a + Math.floor(rnd() * (T - a))
      const ranges = Int32Array.of(0, a, b, T)
      const size = 64
      const c = surfaceClusters(positions, index, ranges, size)
      const K = c.start.length - 1
      expect(c.start[0]).toBe(0)
      expect(c.start[K]).toBe(T)
      for (let k = 0; k < K; k++) {
        const lo = c.start[k], hi = c.start[k + 1]
        expect(hi).toBeGreaterThan(lo)
        expect(hi - lo).toBeLessThanOrEqual(size)
        // never across a range's edge
        for (const r of [a, b]) expect(lo < r && r < hi).toBe(false)
        const o = CLUSTER_STRIDE * k, B = c.bounds
        for (let t = lo; t < hi; t++) {
          const { p, n } = triangle(positions, index, t)
          for (const q of p) expect(Math.hypot(q[0] - B[o], q[1] - B[o + 1], q[2] - B[o + 2])).toBeLessThanOrEqual(B[o + 3])
          if (n && B[o + 7] > 0) expect(n[0] * B[o + 4] + n[1] * B[o + 5] + n[2] * B[o + 6]).toBeGreaterThanOrEqual(B[o + 7])
        }
      }
      // random views: perspective from outside and inside the box, parallel; both passes; with and without a plane
      const runs = new Int32Array(2 * K)
      let drawnShare = 0, views = 0
      for (let v = 0; v < 40; v++) {
        const dir = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
        const dl = Math.hypot(...dir)
        const eye = v % 5 === 4 ? null : v % 5 === 3 ? [0.5, 0.5, 0.5] : dir.map((x) => 0.5 + (4 * x) / dl)
        const direction = dir.map((x) => -x / dl)
        const facing = v % 2 === 0 ? 1 : -1
        const nrm = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5], nl = Math.hypot(...nrm)
        const plane = v % 3 === 0 ? null : [nrm[0] / nl, nrm[1] / nl, nrm[2] / nl, -(nrm[0] + nrm[1] + nrm[2]) / (2 * nl) + 0.3 * (rnd() - 0.5)]
        const shown = v % 4 === 1 ? Uint8Array.from({ length: K }, () => (rnd() < 0.7 ? 1 : 0)) : null
        const view: ClusterView = { eye, direction, facing, plane }
        const n = visibleClusterRuns(c.start, c.bounds, view, shown, runs)
        const drawn = new Uint8Array(T)
        for (let r = 0; r < n; r++) for (let t = runs[2 * r]; t < runs[2 * r] + runs[2 * r + 1]; t++) drawn[t] = 1
        for (let k = 0; k < K; k++) {
          for (let t = c.start[k]; t < c.start[k + 1]; t++) {
            const { p, n: nt } = triangle(positions, index, t)
            const kept = !plane || p.some((q) => plane[0] * q[0] + plane[1] * q[1] + plane[2] * q[2] + plane[3] >= 0)
            const facesCamera = nt === null ? null : eye ? nt[0] * (eye[0] - p[0][0]) + nt[1] * (eye[1] - p[0][1]) + nt[2] * (eye[2] - p[0][2]) : -(nt[0] * direction[0] + nt[1] * direction[1] + nt[2] * direction[2])
            const passDraws = facesCamera === null || (facing > 0 ? facesCamera > 0 : facesCamera < 0)
            const wanted = (shown === null || shown[k] === 1) && kept && passDraws
            if (wanted) expect(drawn[t], `view ${v}, triangle ${t}`).toBe(1)
            if (shown && shown[k] === 0) expect(drawn[t]).toBe(0)
          }
        }
        if (eye && v % 5 < 3 && !plane && !shown) { drawnShare += drawn.reduce((x, y) => x + y, 0) / T; views++ }
      }
      // a box seen from outside shows at most three of its six sides: each pass leaves out a good share
      console.log(`${type}: a pass draws ${(100 * drawnShare / views).toFixed(0)} % of the triangles on average over ${views} views from outside`)
      expect(drawnShare / views).toBeLessThan(0.65)
    })
  }
})
