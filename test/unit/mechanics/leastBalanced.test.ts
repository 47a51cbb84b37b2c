import { describe, expect, it } from 'vitest'
import { topIndices } from '../../../src/mechanics/leastBalanced.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'

describe('topIndices (the least balanced elements)', () => {
  it('gives the k largest positive values, largest first, ties by index; zero and NaN never', () => {
    const v = [0.1, 0, 0.5, NaN, 0.5, 0.3, -1, 0.05]
    expect(topIndices(v, 3)).toEqual([2, 4, 5])
    expect(topIndices(v, 10)).toEqual([2, 4, 5, 0, 7])
    expect(topIndices(v, 0)).toEqual([])
    expect(topIndices(new Float32Array(0), 5)).toEqual([])
  })

  it('agrees with a full sort on random data (seed 20261203)', () => {
    const random = mulberry32(20261203)
    const v = Float64Array.from({ length: 5000 }, () => random())
    const sorted = Array.from(v.keys()).sort((a, b) => v[b] - v[a] || a - b)
    expect(topIndices(v, 5)).toEqual(sorted.slice(0, 5))
  })
})
