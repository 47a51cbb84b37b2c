/**
 * The sweep's candidates (coincidentSweep.ts) hold every pair of points within the reach of each
 * other: checked against all pairs compared directly (the definition) on random points, grid
 * points (a box's faces, whose projections must not pile up) and exact and near duplicates.
 * Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { nearPoints } from '../../src/mechanics/coincidentSweep.ts'
import { mulberry32 } from '../helpers/rotation.ts'

const SEED = 7321

describe(`coincident sweep (seed ${SEED})`, () => {
  console.log(`coincident sweep seed ${SEED}`)
  const rnd = mulberry32(SEED)
  for (let trial = 0; trial < 12; trial++) {
    it(`trial ${trial}: every pair within the reach is a candidate, both ways, in order`, () => {
      const P = 50 + Math.floor(300 * rnd())
      const reach = 1e-6
      const p = new Float64Array(3 * P)
      for (let i = 0; i < P; i++) {
        const kind = rnd()
        if (i > 0 && kind < 0.2) {
          // a copy of an earlier point, exact or moved by less than the reach
          const j = Math.floor(rnd() * i), shift = kind < 0.1 ? 0 : 0.5 * reach / Math.sqrt(3)
          for (let k = 0; k < 3; k++) p[3 * i + k] = p[3 * j + k] + shift * (rnd() - 0.5)
        } else if (kind < 0.6) {
          // a grid point on the plane z = 0 (a box face)
          p[3 * i] = Math.floor(10 * rnd()) / 10; p[3 * i + 1] = Math.floor(10 * rnd()) / 10; p[3 * i + 2] = 0
        } else for (let k = 0; k < 3; k++) p[3 * i + k] = rnd()
      }
      const near = nearPoints(p, P, reach)
      for (let i = 0; i < P; i++) {
        const got = Array.from(near.list.subarray(near.start[i], near.start[i + 1]))
        expect(got).toEqual([...got].sort((a, b) => a - b))
        for (let j = 0; j < P; j++) {
          if (j === i) continue
          const d = Math.hypot(p[3 * i] - p[3 * j], p[3 * i + 1] - p[3 * j + 1], p[3 * i + 2] - p[3 * j + 2])
          if (d <= reach) expect(got).toContain(j)
        }
        expect(got).not.toContain(i)
      }
      // grid points stay apart: candidates are few beyond the true pairs
      let truePairs = 0
      for (let i = 0; i < P; i++) for (let j = i + 1; j < P; j++) if (Math.hypot(p[3 * i] - p[3 * j], p[3 * i + 1] - p[3 * j + 1], p[3 * i + 2] - p[3 * j + 2]) <= 2 * reach) truePairs++
      expect(near.list.length / 2).toBeLessThanOrEqual(truePairs + P)
    })
  }
  it('a point with a non-finite coordinate gets no candidates', () => {
    const p = new Float64Array([0, 0, 0, NaN, 0, 0, 0, 0, 0])
    const near = nearPoints(p, 3, 1)
    expect(Array.from(near.list.subarray(near.start[1], near.start[2]))).toEqual([])
    expect(Array.from(near.list.subarray(near.start[0], near.start[1]))).toEqual([2])
  })
})
