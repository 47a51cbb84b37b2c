import { describe, expect, it } from 'vitest'
import { roundDown125 } from '../../../src/scene/arrowColouring.ts'

describe('roundDown125 (the scale arrow\'s round value, common practice for scale bars)', () => {
  it.each([[73.2, 50], [50, 50], [49.9, 20], [1, 1], [0.0031, 0.002], [9.99, 5], [1e6, 1e6], [0, 0], [-3, 0]])('%f → %f', (v, want) => {
    expect(roundDown125(v)).toBeCloseTo(want, 12)
  })
})
