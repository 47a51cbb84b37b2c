import { describe, expect, it } from 'vitest'
import { Plane, Vector3 } from 'three'
import { sectionClipPlane } from '../../../src/scene/sectionClipPlane.ts'
import { DEFAULT_SECTION } from '../../../src/state/store.ts'

// three.js clips points whose signed distance to a clipping plane is negative (three.js docs,
// Material.clippingPlanes).
describe('sectionClipPlane', () => {
  const p = new Plane()
  const base = { ...DEFAULT_SECTION, enabled: true, point: [1, 2, 3] as [number, number, number], normal: [0, 0, 2] as [number, number, number], offset: 1 }

  it("'positive' hides the +m side beyond point + offset·m", () => {
    sectionClipPlane(p, { ...base, hide: 'positive' })
    expect(p.distanceToPoint(new Vector3(0, 0, 4.5))).toBeLessThan(0)
    expect(p.distanceToPoint(new Vector3(0, 0, 3.5))).toBeGreaterThan(0)
    expect(p.distanceToPoint(new Vector3(9, 9, 4))).toBeCloseTo(0, 12)
  })

  it("'negative' hides the -m side", () => {
    sectionClipPlane(p, { ...base, hide: 'negative' })
    expect(p.distanceToPoint(new Vector3(0, 0, 3.5))).toBeLessThan(0)
    expect(p.distanceToPoint(new Vector3(0, 0, 4.5))).toBeGreaterThan(0)
  })

  it("'none' or a disabled section clip nothing", () => {
    for (const s of [{ ...base, hide: 'none' as const }, { ...base, hide: 'positive' as const, enabled: false }]) {
      sectionClipPlane(p, s)
      expect(p.distanceToPoint(new Vector3(1e6, -1e6, -1e6))).toBeGreaterThan(0)
    }
  })
})
