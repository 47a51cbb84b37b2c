/**
 * The hex8 closed form of the element balance (hex8Balance.ts) against
 * - the plain path, computeElementBalanceGeneral: every face by the 2×2 Gauss rule of its
 *   bilinear patch and the volume by the 2×2×2 rule, both exact for these integrands (Gauss–
 *   Legendre with n points integrates degree 2n − 1 exactly, common practice), so the two agree
 *   to round-off: 1e-12 of the element's gross load;
 * - a uniform-stress patch test on parallelepipeds (common practice): with σ constant every
 *   face carries σ·a, a its area vector (the cross product of its two edges), the faces sum to 0
 *   (a closed surface) and the volume is the triple product of the edges.
 * Geometry and stress are random and seeded (the seed is printed): distorted elements, mirrored
 * ones (negative orientation), far from the origin, nodal and element-nodal stress.
 */
import { describe, expect, it } from 'vitest'
import { createMesh } from '../../../src/model/createMesh.ts'
import type { Mesh, Vec3 } from '../../../src/model/model.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { StressField } from '../../../src/model/stressField.ts'
import { allocateElementBalance, computeElementBalance, computeElementBalanceGeneral } from '../../../src/mechanics/balanceAudit.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'

const CORNERS = [[-1, -1, -1], [1, -1, -1], [1, 1, -1], [-1, 1, -1], [-1, -1, 1], [1, -1, 1], [1, 1, 1], [-1, 1, 1]]
/** hex8 mirror: the bottom and top faces swapped (elements/hexahedra.ts). */
const MIRROR = [4, 5, 6, 7, 0, 1, 2, 3]

/** A random rotation (normalised random quaternion), as a row-major 3×3 matrix. */
function rotation(rnd: () => number): number[] {
  let q = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
  const n = Math.hypot(...q)
  q = q.map((v) => v / n)
  const [w, x, y, z] = q
  return [1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y),
    2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x),
    2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y)]
}

/**
 * `count` separate hex8 elements (8 nodes each): the reference cube scaled by 0.5–2 per axis,
 * each corner moved by up to `distort` of the half-size, rotated, moved to a random centre
 * within `far` of the origin; every third element mirrored.
 */
function randomHexes(seed: number, count: number, distort: number, far: number): Mesh {
  const rnd = mulberry32(seed)
  const x = new Float64Array(24 * count), conn = new Int32Array(8 * count)
  for (let e = 0; e < count; e++) {
    const R = rotation(rnd), s = [0.5 + 1.5 * rnd(), 0.5 + 1.5 * rnd(), 0.5 + 1.5 * rnd()]
    const c = [far * (2 * rnd() - 1), far * (2 * rnd() - 1), far * (2 * rnd() - 1)]
    for (let a = 0; a < 8; a++) {
      const p = [0, 1, 2].map((k) => s[k] * (CORNERS[a][k] + distort * (2 * rnd() - 1)))
      for (let k = 0; k < 3; k++) x[24 * e + 3 * a + k] = c[k] + R[3 * k] * p[0] + R[3 * k + 1] * p[1] + R[3 * k + 2] * p[2]
    }
    for (let a = 0; a < 8; a++) conn[8 * e + a] = 8 * e + (e % 3 === 2 ? MIRROR[a] : a)
  }
  return createMesh(x, [{ type: 'hex8', conn }])
}

/** Random stress, one row per element-node (element-nodal), magnitudes up to 1e6. */
function elementNodalRandom(mesh: Mesh, rnd: () => number): StressField {
  const n = mesh.blocks[0].conn.length
  const values = new Float64Array(6 * n)
  for (let i = 0; i < values.length; i++) values[i] = 1e6 * (2 * rnd() - 1)
  return { values, rows: [Int32Array.from({ length: n }, (_, i) => i)], layout: 'element-nodal' }
}

function expectSame(fast: ReturnType<typeof allocateElementBalance>, ref: ReturnType<typeof allocateElementBalance>, E: number, rel: number): void {
  let worst = 0
  for (let e = 0; e < E; e++) {
    const scale = ref.gross[e]
    expect(scale).toBeGreaterThan(0)
    for (let k = 0; k < 3; k++) worst = Math.max(worst, Math.abs(fast.residual[3 * e + k] - ref.residual[3 * e + k]) / scale)
    worst = Math.max(worst, Math.abs(fast.gross[e] - ref.gross[e]) / scale)
    // the indicator is |residual| / gross: its error is that of the residual over the gross
    worst = Math.max(worst, Math.abs(fast.indicator[e] - ref.indicator[e]))
  }
  expect(worst).toBeLessThanOrEqual(rel)
}

describe('hex8 element balance in closed form', () => {
  for (const [seed, distort, far] of [[20261202, 0.3, 0], [7, 0.3, 1e3], [99, 0.05, 10]] as const) {
    it(`equals the general face quadrature: random distorted and mirrored hexahedra (seed ${seed}, corners moved ${distort * 100} %, centres within ${far})`, () => {
      console.log(`hex8Balance random hexahedra: seed ${seed}`)
      const mesh = randomHexes(seed, 300, distort, far)
      const rnd = mulberry32(seed + 1)
      const b: Vec3 = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5].map((v) => 1e5 * v) as Vec3
      const E = mesh.elementCount
      // element-nodal: every element-node has its own row
      const en = elementNodalRandom(mesh, rnd)
      expectSame(computeElementBalance(allocateElementBalance(E), mesh, en, b), computeElementBalanceGeneral(allocateElementBalance(E), mesh, en, b), E, 1e-12)
      // nodal, on a connected block: the same random values read through the connectivity
      const nodal = nodalStressField(mesh, en.values.subarray(0, 6 * mesh.nodeCount))
      expectSame(computeElementBalance(allocateElementBalance(E), mesh, nodal, b), computeElementBalanceGeneral(allocateElementBalance(E), mesh, nodal, b), E, 1e-12)
      // nodal stress takes its rows from the connectivity (rows === conn); the same rows as a
      // copy go the element-nodal way: the same bits either way
      const viaConn = computeElementBalance(allocateElementBalance(E), mesh, nodal, b)
      const viaCopy = computeElementBalance(allocateElementBalance(E), mesh, { ...nodal, rows: nodal.rows.map((r) => r.slice()) }, b)
      expect(viaCopy.residual).toEqual(viaConn.residual)
      expect(viaCopy.gross).toEqual(viaConn.gross)
      expect(viaCopy.indicator).toEqual(viaConn.indicator)
    })
  }

  it('uniform stress on parallelepipeds: faces carry σ·a, the residual is ρb·V (seed 31)', () => {
    console.log('hex8Balance uniform-stress patch: seed 31')
    const rnd = mulberry32(31)
    const count = 50
    const x = new Float64Array(24 * count), conn = new Int32Array(8 * count)
    const edges: number[][][] = []
    for (let e = 0; e < count; e++) {
      // three random edge vectors with a positive triple product, corner 0 anywhere
      const u = [1 + rnd(), rnd() - 0.5, rnd() - 0.5], v = [rnd() - 0.5, 1 + rnd(), rnd() - 0.5], w = [rnd() - 0.5, rnd() - 0.5, 1 + rnd()]
      const o = [100 * rnd(), -50 * rnd(), 20 * rnd()]
      edges.push([u, v, w])
      for (let a = 0; a < 8; a++) {
        const [i, j, k] = CORNERS[a].map((t) => (t + 1) / 2)
        for (let d = 0; d < 3; d++) x[24 * e + 3 * a + d] = o[d] + i * u[d] + j * v[d] + k * w[d]
        conn[8 * e + a] = 8 * e + a
      }
    }
    const mesh = createMesh(x, [{ type: 'hex8', conn }])
    const s = [3e5, -1e5, 2e5, 5e4, -7e4, 4e4]
    const values = new Float64Array(6 * mesh.nodeCount)
    for (let n = 0; n < mesh.nodeCount; n++) values.set(s, 6 * n)
    const b: Vec3 = [0, -2.5e4, 1e4]
    const r = computeElementBalance(allocateElementBalance(count), mesh, nodalStressField(mesh, values), b)
    const sigma = (a: number[]): number[] => [s[0] * a[0] + s[3] * a[1] + s[5] * a[2], s[3] * a[0] + s[1] * a[1] + s[4] * a[2], s[5] * a[0] + s[4] * a[1] + s[2] * a[2]]
    const crossV = (a: number[], c: number[]): number[] => [a[1] * c[2] - a[2] * c[1], a[2] * c[0] - a[0] * c[2], a[0] * c[1] - a[1] * c[0]]
    for (let e = 0; e < count; e++) {
      const [u, v, w] = edges[e]
      const V = u[0] * crossV(v, w)[0] + u[1] * crossV(v, w)[1] + u[2] * crossV(v, w)[2]
      // opposite faces carry equal and opposite forces: |σ(v×w)|, |σ(w×u)|, |σ(u×v)| twice each
      const faceSum = 2 * (Math.hypot(...sigma(crossV(v, w))) + Math.hypot(...sigma(crossV(w, u))) + Math.hypot(...sigma(crossV(u, v))))
      const gross = 0.5 * (faceSum + Math.hypot(...b) * V)
      expect(Math.abs(r.gross[e] - gross)).toBeLessThanOrEqual(1e-12 * gross)
      for (let k = 0; k < 3; k++) expect(Math.abs(r.residual[3 * e + k] - b[k] * V)).toBeLessThanOrEqual(1e-12 * gross)
    }
  })
})
