/**
 * The hex8 traction pass in monomial form (accumulateTraction, elementSection.ts) against the
 * plain sums written here with the registry's shape functions, t(ξ) = Σ N_a(ξ) t_a
 * (elements/hexahedra.ts): the same trilinear polynomial, so the same sums to round-off. Random
 * nodal tractions, points (inside and a little outside the cube, as Newton's extrapolated ξ can
 * be), weights and plane coordinates, seeded (the seed is printed).
 */
import { describe, expect, it } from 'vitest'
import { ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'
import { accumulateTraction } from '../../../src/mechanics/elementSection.ts'
import { ACC_AT, ACC_BT, ACC_FORCE, ACC_GROSS, ACC_SIZE } from '../../../src/mechanics/sectionPolygon.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'
import { trilinearMonomials } from '../../../src/mechanics/trilinearMonomials.ts'

describe('hex8 traction pass in monomial form', () => {
  const seed = 20261203
  it(`equals the shape-function sums on random points and tractions (seed ${seed})`, () => {
    console.log(`hex8Traction: seed ${seed}`)
    const rnd = mulberry32(seed)
    const N = new Float64Array(20)
    for (let trial = 0; trial < 50; trial++) {
      const tn = Float64Array.from({ length: 24 }, () => 1e6 * (2 * rnd() - 1))
      const n = 1 + Math.floor(12 * rnd())
      const ref = Float64Array.from({ length: 3 * n }, () => 2.4 * rnd() - 1.2)
      const w = Float64Array.from({ length: n }, () => rnd())
      const a = Float64Array.from({ length: n }, () => 10 * rnd() - 5), b = Float64Array.from({ length: n }, () => 10 * rnd() - 5)
      const acc = new Float64Array(ACC_SIZE), force = new Float64Array(3)
      accumulateTraction(acc, 0, 'hex8', 8, tn, ref, w, a, b, 0, n, N, force, 0)
      // plain: the shape functions at every point
      const want = new Float64Array(10)
      let scale = 0
      for (let q = 0; q < n; q++) {
        ELEMENT_TYPES.hex8.shapeValues(ref[3 * q], ref[3 * q + 1], ref[3 * q + 2], N)
        for (let c = 0; c < 3; c++) {
          let t = 0, ta = 0
          for (let k = 0; k < 8; k++) { t += N[k] * tn[3 * k + c]; ta += Math.abs(N[k] * tn[3 * k + c]) }
          want[c] += w[q] * t; want[3 + c] += w[q] * a[q] * t; want[6 + c] += w[q] * b[q] * t
          scale = Math.max(scale, ta * w[q] * (1 + Math.abs(a[q]) + Math.abs(b[q])))
        }
      }
      want[9] = Math.hypot(want[0], want[1], want[2])
      const got = [...acc.subarray(ACC_FORCE, ACC_FORCE + 3), ...acc.subarray(ACC_AT, ACC_AT + 3), ...acc.subarray(ACC_BT, ACC_BT + 3), acc[ACC_GROSS]]
      for (let i = 0; i < 10; i++) expect(Math.abs(got[i] - want[i])).toBeLessThanOrEqual(1e-12 * n * scale)
      for (let c = 0; c < 3; c++) expect(force[c]).toBe(acc[ACC_FORCE + c])
    }
  })

  it('trilinearMonomials: the coefficients reproduce Σ N_a v_a at random ξ, and the corner values', () => {
    const rnd = mulberry32(seed + 1)
    const v = Float64Array.from({ length: 24 }, () => 2 * rnd() - 1)
    const c = trilinearMonomials(new Float64Array(24), v)
    const N = new Float64Array(8)
    const at = (u: number, s: number, t: number, k: number): number => {
      const m = [1, u, s, t, u * s, s * t, u * t, u * s * t]
      let f = 0
      for (let j = 0; j < 8; j++) f += c[3 * j + k] * m[j]
      return f
    }
    const R = ELEMENT_TYPES.hex8.refCoords
    for (let a = 0; a < 8; a++) for (let k = 0; k < 3; k++) expect(at(R[a][0], R[a][1], R[a][2], k)).toBeCloseTo(v[3 * a + k], 14)
    for (let i = 0; i < 20; i++) {
      const p = [2 * rnd() - 1, 2 * rnd() - 1, 2 * rnd() - 1]
      ELEMENT_TYPES.hex8.shapeValues(p[0], p[1], p[2], N)
      for (let k = 0; k < 3; k++) {
        let f = 0
        for (let a = 0; a < 8; a++) f += N[a] * v[3 * a + k]
        expect(Math.abs(at(p[0], p[1], p[2], k) - f)).toBeLessThan(1e-14)
      }
    }
  })
})
