/**
 * Percentiles by selection (percentiles.ts) against their definition: linear interpolation
 * between the order statistics of the sorted values, the "type 7" of Hyndman & Fan, Am. Stat.
 * 50(4), 1996 (common practice: the default of most statistics packages). Selection must give
 * the very numbers sorting gives, also with many equal values and with NaN left out.
 */
import { describe, expect, it } from 'vitest'
import { percentiles } from '../../../src/mechanics/percentiles.ts'
import { mulberry32 } from '../../helpers/rotation.ts'

/** The definition, by a full sort. */
function bySort(values: ArrayLike<number>, ps: readonly number[]): number[] {
  const s = Float64Array.from(Array.from(values).filter((v) => !Number.isNaN(v))).sort()
  const n = s.length
  return ps.map((p) => {
    if (n === 0) return NaN
    const h = (Math.min(100, Math.max(0, p)) / 100) * (n - 1)
    const lo = Math.floor(h), hi = Math.min(n - 1, lo + 1)
    return s[lo] + (h - lo) * (s[hi] - s[lo])
  })
}

describe('percentiles by selection', () => {
  it('a small worked example: 1..10 (type 7: p50 = 5.5, p95 = 9.55, p0 = 1, p100 = 10)', () => {
    // h = p/100 · (n - 1): p50 → 4.5 → 5 + 0.5 (6 - 5); p95 → 8.55 → 9 + 0.55 (10 - 9)
    const r = percentiles([7, 3, 10, 1, 5, 9, 2, 8, 6, 4], [50, 95, 0, 100])
    expect(r[0]).toBe(5.5)
    expect(r[1]).toBeCloseTo(9.55, 14)
    expect(r[2]).toBe(1)
    expect(r[3]).toBe(10)
  })

  it('equals the sorted definition on seeded random arrays (sizes, ties, NaN, constant runs)', () => {
    const seed = 17_500
    console.log(`seed ${seed}`)
    const rand = mulberry32(seed)
    const ps = [0, 1, 5, 25, 50, 75, 90, 95, 99, 100, 37.3]
    for (let t = 0; t < 200; t++) {
      const n = t < 20 ? t : Math.floor(rand() * 5000)
      const levels = 1 + Math.floor(rand() * (t % 3 === 0 ? 3 : 1000)) // few distinct values: many ties
      const v = Float64Array.from({ length: n }, () => (rand() < 0.02 ? NaN : Math.floor(rand() * levels) / levels - 0.3))
      const got = percentiles(v, ps), want = bySort(v, ps)
      got.forEach((g, i) => (Number.isNaN(want[i]) ? expect(g).toBeNaN() : expect(g).toBe(want[i])))
    }
  })

  it('all values equal, and none at all', () => {
    expect(percentiles(new Float64Array(100_000), [50, 95, 100])).toEqual([0, 0, 0])
    expect(percentiles([NaN, NaN], [50])[0]).toBeNaN()
    expect(percentiles([], [50])[0]).toBeNaN()
  })
})
