/**
 * The one store's named actions that carry a rule (not plain field writes): a section normal with
 * no direction is refused and the previous plane kept, with the reason for the card; a new model
 * clears the last sweep (the sweep slice folded into the store); the map family follows the
 * quantity's sign; software WebGL lowers the arrow budget once.
 */
import { describe, expect, it } from 'vitest'
import { createTractusStore, SOFTWARE_ARROW_BUDGET } from '../../../src/state/store.ts'
import { resolvedHide, sectionPlaneOf, sectionShown } from '../../../src/state/selectors.ts'
import type { AuditSummary, LoadedModel, SurfaceBuffers, SweepReply } from '../../../workers/protocol.ts'

const MODEL: LoadedModel = {
  summary: {
    name: 'box', description: '', units: { length: 'm', stress: 'Pa' }, nodeCount: 8, elementCount: 1, boundaryFaceCount: 6,
    elementTypes: { hex8: 1 }, bounds: { min: [0, 0, 0], max: [2, 2, 2] }, bodyForce: [0, 0, 0], warnings: [], source: 'synthetic:box',
  },
  surface: {} as SurfaceBuffers,
  audit: {} as AuditSummary,
}

describe('store actions', () => {
  it('refuses a section normal with no direction, keeps the plane and says why; a good one clears it', () => {
    const store = createTractusStore()
    const st = store.getState()
    st.setSection({ enabled: true, normal: [0, 3, 4] })
    const before = store.getState().section
    for (const bad of [[0, 0, 0], [Number.NaN, 1, 0], [Infinity, 0, 0]] as [number, number, number][]) {
      store.getState().setSection({ normal: bad, offset: 1 })
      expect(store.getState().section).toBe(before)
      expect(store.getState().sectionInputError?.field).toBe('normal')
      expect(store.getState().sectionInputError?.message).toContain('has no direction')
    }
    // 3-4-5 triangle: the unit normal is (0, 0.6, 0.8).
    expect(sectionPlaneOf(store.getState().section).normal).toEqual([0, 0.6, 0.8])
    store.getState().setSection({ normal: [1, 0, 0] })
    expect(store.getState().sectionInputError).toBeNull()
    expect(store.getState().section.normal).toEqual([1, 0, 0])
  })

  it('a new model clears the last sweep and frames the model; the section moves to its centre', () => {
    const store = createTractusStore()
    store.getState().sweepEnded({ normal: [1, 0, 0] } as unknown as SweepReply)
    expect(store.getState().sweep).not.toBeNull()
    store.getState().modelLoaded(MODEL)
    const s = store.getState()
    expect(s.sweep).toBeNull()
    expect(s.section.point).toEqual([1, 1, 1])
    expect(s.viewRequest?.frame?.center).toEqual([1, 1, 1])
    expect(s.viewRequest?.frame?.radius).toBeCloseTo(Math.sqrt(3), 12)
  })

  it('a new model is cut across its longest extent; "the model\'s own units" follow the model', () => {
    const store = createTractusStore()
    store.getState().setUnitPreset('model')
    store.getState().modelLoaded({ ...MODEL, summary: { ...MODEL.summary, units: { length: 'mm', stress: 'MPa' }, bounds: { min: [0, 0, 0], max: [200, 280, 20] } } })
    const s = store.getState()
    expect(s.section.normal).toEqual([0, 1, 0])
    // MPa·mm² = N (common practice: the consistent unit set of mm and MPa).
    expect(s.units).toEqual({ length: 'mm', force: 'N', stress: 'MPa' })
    store.getState().modelLoaded({ ...MODEL, summary: { ...MODEL.summary, units: { length: 'm', stress: 'kPa' } } })
    expect(store.getState().units).toEqual({ length: 'm', force: 'kN', stress: 'kPa' })
    store.getState().setUnitPreset('US')
    expect(store.getState().units).toBe('US')
  })

  it("'auto' hides the side of the plane the camera is on", () => {
    const section = { enabled: true, point: [0, 0, 0] as [number, number, number], normal: [0, 0, 1] as [number, number, number], offset: 2, hide: 'auto' as const, traction: 'normalTraction' as const, dragging: false }
    const cam = (z: number) => ({ position: [0, 0, z] as [number, number, number], target: [0, 0, 0] as [number, number, number], up: [0, 1, 0] as [number, number, number], fov: 35 })
    expect(resolvedHide(section, cam(5))).toBe('positive')
    expect(resolvedHide(section, cam(1))).toBe('negative') // below the plane at z = 2
    expect(resolvedHide(section, null)).toBe('positive')
    expect(resolvedHide({ ...section, hide: 'none' }, cam(5))).toBe('none')
  })

  it('the scene shows the section once its first cut has arrived, and keeps it while the next is computed', () => {
    const store = createTractusStore()
    store.getState().modelLoaded(MODEL)
    store.getState().setSection({ enabled: true })
    expect(sectionShown(store.getState())).toBe(false)
    const result = { empty: true } as Parameters<ReturnType<typeof store.getState>['cutShown']>[0]
    store.getState().cutShown(result, null)
    expect(sectionShown(store.getState())).toBe(true)
    store.getState().setSection({ offset: 0.5 })
    expect(sectionShown(store.getState())).toBe(true)
    store.getState().setSection({ enabled: false })
    expect(sectionShown(store.getState())).toBe(false)
  })

  it('the map family follows the quantity: diverging for signed, sequential for magnitudes', () => {
    const store = createTractusStore()
    store.getState().setColourMap('PuOr')
    store.getState().setQuantity('principal1')
    expect(store.getState().colourMap).toBe('PuOr')
    store.getState().setQuantity('vonMises')
    expect(store.getState()).toMatchObject({ colourMap: 'viridis', range: 'auto' })
  })

  it('software WebGL lowers the arrow budget when it is first reported', () => {
    const store = createTractusStore()
    store.getState().setRenderer('software')
    expect(store.getState().arrowSettings.budget).toBe(SOFTWARE_ARROW_BUDGET)
    store.getState().setArrowSettings({ budget: 400 })
    store.getState().setRenderer('software')
    expect(store.getState().arrowSettings.budget).toBe(400)
  })
})
