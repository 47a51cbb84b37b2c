import { describe, expect, it } from 'vitest'
import type { SweepReply } from '../../../workers/protocol.ts'
import { nearestIndex, offsetForPosition, positionAlong, seriesInDisplay, sweepTable, worstResidual, zeroAlignedRanges } from '../../../src/app/sweepSeries.ts'

const mmMPa = { length: 'mm', stress: 'MPa' } as const

function reply(): SweepReply {
  const f = (...v: number[]): Float64Array => Float64Array.from(v)
  return {
    normal: [0, 1, 0], extent: [0, 200], offsets: f(10, 100, 190),
    axial: f(43290, 43000, 0), shear1: f(0, 1, 0), shear2: f(25000, 25000, 0),
    torque: f(0, 0, 0), bending1: f(-3.589e6, -1e6, 0), bending2: f(0, 0, 0),
    freeBodyRelative: f(0.006, 0.011, 0), freeBodyMomentRelative: f(0.002, 0.004, 0), empty: Uint8Array.from([0, 0, 1]), axes: { kind: 'principal', reference: [1, 0, 0] },
  }
}

describe('sweep series', () => {
  // Model units mm and MPa give force in N (MPa·mm²) and moment in N·mm (common practice).
  // NIST SP 811 App. B: 1 lbf = 4.448 222 N, 1 in = 0.0254 m exactly.
  it('converts to the display system', () => {
    const r = reply()
    expect(seriesInDisplay(r, 'axial', mmMPa, 'SI')[0]).toBeCloseTo(43.29, 12) // kN
    expect(seriesInDisplay(r, 'bending1', mmMPa, 'SI')[0]).toBeCloseTo(-3.589, 12) // kN·m
    expect(seriesInDisplay(r, 'axial', mmMPa, 'US')[0]).toBeCloseTo(43290 / 4448.222, 9) // kip
    expect(seriesInDisplay(r, 'bending1', mmMPa, 'US')[0]).toBeCloseTo(-3.589e6 / (4448.222 * 25.4), 6) // kip·in
    expect(r.axial[0]).toBe(43290) // the reply itself stays in model units
  })

  it('tabulates every section with units in the header and marks planes that miss the body', () => {
    const t = sweepTable(reply(), mmMPa, 'SI')
    expect(t.head[0]).toBe('Position [m]')
    expect(t.head).toContain('N [kN]')
    expect(t.head).toContain('M₁ [kN·m]')
    expect(t.rows).toHaveLength(3)
    expect(t.rows[0][0]).toBe('0.01')
    expect(t.rows[0][1]).toBe('43.29')
    expect(t.rows[0][5]).toBe('−3.589')
    expect(t.rows[2][1]).toBe('—')
    expect(t.rows[2][7]).toBe('misses the body')
    expect(worstResidual(reply())).toBe(0.011)
  })

  it('shows rounding noise as 0, row by row, forces against forces (format.ts NOISE_FRACTION)', () => {
    const r = reply()
    r.shear1[0] = 1e-5 // N, beside 43 290 N of axial force in the same row
    r.torque[0] = 3e-3 // N·mm, beside −3.589e6 N·mm of bending
    const t = sweepTable(r, mmMPa, 'SI')
    expect(t.rows[0][2]).toBe('0')
    expect(t.rows[0][4]).toBe('0')
    expect(t.rows[1][2]).toBe('0.001') // 1 N of 43 000 N: 2e-5, data
  })

  it('finds the nearest section', () => {
    const x = Float64Array.from([0, 1, 2, 3])
    expect(nearestIndex(x, 1.4)).toBe(1)
    expect(nearestIndex(x, 1.6)).toBe(2)
    expect(nearestIndex(x, -9)).toBe(0)
    expect(nearestIndex(new Float64Array(0), 1)).toBe(-1)
  })

  it('maps a position along m to the section offset and back (plane = point + offset·m)', () => {
    const point: [number, number, number] = [5, 20, -3]
    const m: [number, number, number] = [0, 1, 0]
    const off = offsetForPosition(140, point, m)
    expect(off).toBe(120)
    const planePoint: [number, number, number] = [point[0], point[1] + off, point[2]]
    expect(positionAlong(planePoint, m, m)).toBe(140)
    // a flipped plane normal is still parallel; a tilted one gets no marker
    expect(positionAlong(planePoint, [0, -2, 0], m)).toBe(140)
    expect(positionAlong(planePoint, [0.1, 1, 0], m)).toBeNull()
  })
})

describe('zero-aligned axis ranges', () => {
  // Two y axes over one plot share their zero line (common practice for dual-axis charts).
  it('puts zero at the same height on every axis and keeps each axis\'s data inside', () => {
    const input: [number, number][] = [[0, 43], [-4.9, 0.1], [-2, 6]]
    const out = zeroAlignedRanges(input)
    const share = out.map(([lo, hi]) => -lo / (hi - lo))
    for (const s of share) expect(s).toBeCloseTo(share[0], 12)
    out.forEach(([lo, hi], i) => { expect(lo).toBeLessThanOrEqual(input[i][0]); expect(hi).toBeGreaterThanOrEqual(input[i][1]) })
    // an empty axis gets a symmetric range
    expect(zeroAlignedRanges([[Infinity, -Infinity]])).toEqual([[-1.05, 1.05]])
  })
})
