import { describe, expect, it } from 'vitest'
import { cssGradient } from '../../../src/scene/colourGradient.ts'

describe('cssGradient', () => {
  it('runs the table from its first to its last entry (viridis #440154 → #fde725, from memory)', () => {
    const g = cssGradient('viridis', 3)
    expect(g.startsWith('linear-gradient(to right, rgb(68 1 84) 0%')).toBe(true)
    expect(g.endsWith('rgb(253 231 37) 100%)')).toBe(true)
    expect(cssGradient('RdBu', 32).split('%').length - 1).toBe(32)
  })
})
