/**
 * The out-first 3-vector helpers against the identities of vector algebra (any vector-calculus
 * text; common practice): the right-handed basis, anticommutativity, a × b ⟂ a and b, Lagrange's
 * identity |a × b|² = |a|²|b|² − (a·b)², and the moment transfer M_p = M_0 − p × F checked against
 * the moment of a point force computed directly about p.
 */
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { cross, crossAt, dot, dotAt, momentAbout } from '../../../src/mechanics/vec3.ts'

const SEED = Number(process.env.TRACTUS_SEED ?? 20261201)
const num = fc.double({ min: -1e3, max: 1e3, noNaN: true })
const vec = fc.tuple(num, num, num)

describe(`vec3 (fast-check seed ${SEED})`, () => {
  it('the basis: x × y = z, y × z = x, z × x = y; out is returned', () => {
    const out = [0, 0, 0]
    expect(cross(out, [1, 0, 0], [0, 1, 0])).toBe(out)
    expect(out).toEqual([0, 0, 1])
    expect(cross([0, 0, 0], [0, 1, 0], [0, 0, 1])).toEqual([1, 0, 0])
    expect(cross(new Float64Array(3), [0, 0, 1], [1, 0, 0])).toEqual(Float64Array.from([0, 1, 0]))
    expect(dot([1, 2, 3], [4, -5, 6])).toBe(12)
  })

  it('anticommutative, orthogonal to both factors, Lagrange\'s identity; offset forms agree; out may alias', () => {
    console.log(`vec3.test fast-check seed ${SEED} (set TRACTUS_SEED to replay)`)
    fc.assert(fc.property(vec, vec, (a, b) => {
      const c = cross([0, 0, 0], a, b), d = cross([0, 0, 0], b, a)
      const scale = (dot(a, a) + 1) * (dot(b, b) + 1)
      const lagrange = dot(c, c) - (dot(a, a) * dot(b, b) - dot(a, b) ** 2)
      const packed = Float64Array.from([9, ...a, ...b, 9, 9, 9])
      crossAt(packed, 7, packed, 1, packed, 4)
      const aliased: number[] = [...a]
      cross(aliased, aliased, b)
      return c.every((v, k) => v === -d[k])
        && Math.abs(dot(c, a)) <= 1e-9 * scale && Math.abs(dot(c, b)) <= 1e-9 * scale
        && Math.abs(lagrange) <= 1e-9 * scale * scale
        && [0, 1, 2].every((k) => packed[7 + k] === c[k] && aliased[k] === c[k])
        && dotAt(packed, 1, packed, 4) === dot(a, b)
    }), { seed: SEED, numRuns: 300 })
  })

  it('momentAbout: M_0 − p × F equals the moment of the force about p', () => {
    fc.assert(fc.property(vec, vec, vec, (x, p, F) => {
      // A force F at x: M_0 = x × F about the origin, (x − p) × F about p.
      const m0 = cross([0, 0, 0], x, F)
      const direct = cross([0, 0, 0], [x[0] - p[0], x[1] - p[1], x[2] - p[2]], F)
      const got = momentAbout([0, 0, 0], m0, p, F)
      const scale = (dot(x, x) + dot(p, p) + 1) * (dot(F, F) + 1)
      return got.every((v, k) => Math.abs(v - direct[k]) <= 1e-12 * scale)
    }), { seed: SEED, numRuns: 300 })
  })
})
