import { describe, expect, it } from 'vitest'
import { colourMapTable } from '../../../src/scene/colourMaps.ts'

const hex = (h: string): [number, number, number] => [parseInt(h.slice(1, 3), 16), parseInt(h.slice(3, 5), 16), parseInt(h.slice(5, 7), 16)]
const entry = (t: Uint8Array, i: number): [number, number, number] => [t[4 * i], t[4 * i + 1], t[4 * i + 2]]
const near = (a: number[], b: number[], tol: number) => a.every((v, k) => Math.abs(v - b[k]) <= tol)

// The shader texture and the colour bar both sample colourMapTable(name, 256); these checks
// compare its ends with the published tables.
describe('colour map tables shared by the surface shader and the colour bar', () => {
  it('viridis runs #440154 → #fde725 (van der Walt & Smith, matplotlib 2015; from memory)', () => {
    const t = colourMapTable('viridis', 256)
    expect(entry(t, 0)).toEqual(hex('#440154'))
    expect(entry(t, 255)).toEqual(hex('#fde725'))
  })

  it('cividis runs ≈ #00204d → #ffea46 (Nuñez, Anderton & Renslow 2018; from memory, approximate)', () => {
    // The library behind the table fits cividis with a polynomial, so allow a few units.
    const t = colourMapTable('cividis', 256)
    expect(near(entry(t, 0), hex('#00204d'), 6)).toBe(true)
    expect(near(entry(t, 255), hex('#ffea46'), 6)).toBe(true)
  })

  it('RdBu (ColorBrewer 11-class ends #053061 and #67001f; from memory) runs blue (low) to red (high)', () => {
    // Brewer's scheme is listed red → blue; the app reverses it so tension (positive) is warm.
    const t = colourMapTable('RdBu', 256)
    expect(entry(t, 0)).toEqual(hex('#053061'))
    expect(entry(t, 255)).toEqual(hex('#67001f'))
    // The centre is near Brewer's light grey #f7f7f7; the smooth interpolation rounds it a little.
    const mid = entry(t, 128).map((v, k) => (v + entry(t, 127)[k]) / 2)
    expect(near(mid, hex('#f7f7f7'), 10)).toBe(true)
  })

  it('every table is opaque and 256 entries long', () => {
    for (const name of ['viridis', 'cividis', 'RdBu', 'PuOr'] as const) {
      const t = colourMapTable(name, 256)
      expect(t.length).toBe(1024)
      for (let i = 0; i < 256; i++) expect(t[4 * i + 3]).toBe(255)
    }
  })
})
