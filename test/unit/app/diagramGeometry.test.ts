import { describe, expect, it } from 'vitest'
import { diagramGeometry, niceTicks } from '../../../src/app/diagramGeometry.ts'

describe('diagram geometry', () => {
  // 1-2-5 tick ladders (common practice for chart axes).
  it('puts ticks on a 1-2-5 ladder near five steps', () => {
    expect(niceTicks(0, 10)).toEqual([0, 2, 4, 6, 8, 10])
    expect(niceTicks(0, 0.28).map((v) => +v.toFixed(12))).toEqual([0, 0.05, 0.1, 0.15, 0.2, 0.25])
    expect(niceTicks(-3.7, 1.2).map((v) => +v.toFixed(12))).toEqual([-3, -2, -1, 0, 1])
    expect(niceTicks(2, 2)).toEqual([2])
    // a range at round-off of its values (a constant force along a bar) ends; it once grew its list without end
    expect(niceTicks(0.004999999999999996, 0.004999999999999997)).toEqual([0.004999999999999996])
    expect(diagramGeometry([0, 1], [{ label: 'N', colour: '#000', values: [0.004999999999999996, 0.004999999999999997] }], 200, 100).yTicks.length).toBeGreaterThan(1)
    expect(niceTicks(NaN, 1)).toEqual([])
  })

  it('maps values into the plot box, breaks lines at gaps and marks zero', () => {
    const g = diagramGeometry([0, 1, 2, 3], [{ label: 'a', colour: '#000', values: [-1, 1, NaN, 1] }], 200, 100,
      { left: 20, right: 10, top: 10, bottom: 20 })
    expect(g.plot).toEqual({ x: 20, y: 10, w: 170, h: 70 })
    expect(g.lines[0].runs).toHaveLength(2)
    const first = g.lines[0].runs[0].split(' ').map((p) => p.split(',').map(Number))
    expect(first[0][0]).toBe(20)
    expect(first[1][0]).toBeCloseTo(20 + 170 / 3, 1)
    // -1 and 1 padded by 5 % of the range: y(-1) = 10 + 70·(1 - 0.1/2.2)
    expect(first[0][1]).toBeCloseTo(10 + 70 * (1 - 0.1 / 2.2), 1)
    expect(g.zeroY).toBeCloseTo(45, 6)
    expect(g.xTicks.map((t) => t.label)).toContain('3')
  })
})

describe('diagram domain', () => {
  it('widens the horizontal range to a given domain', () => {
    const g = diagramGeometry([0.1, 2.9], [{ label: 'a', colour: '#000', values: [1, 2] }], 200, 100,
      { left: 0, right: 0, top: 0, bottom: 0 }, [0, 3])
    expect(g.xTicks[0].label).toBe('0')
    expect(g.xTicks[g.xTicks.length - 1].label).toBe('3')
    expect(Number(g.lines[0].runs[0].split(',')[0])).toBeCloseTo((0.1 / 3) * 200, 1)
  })
})
