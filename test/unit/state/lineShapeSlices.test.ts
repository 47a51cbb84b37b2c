/**
 * The line and shape slices of the store (src/state/lineSlice.ts, shapeSlice.ts): two clicks set
 * a line's start then its end, a new model clears the line and brings its own displacement and
 * components, a zero cylinder axis is refused with the reason, a typed deformation scale must be
 * a finite non-negative number, and the automatic scale draws the largest displacement as 5 % of
 * the diagonal (deformScaleOf).
 */
import { describe, expect, it } from 'vitest'
import { createTractusStore } from '../../../src/state/store.ts'
import { deformScaleOf, isSignedQuantity, quantityScalars } from '../../../src/state/selectors.ts'
import type { AuditSummary, ComponentBuffers, LoadedModel, SurfaceBuffers } from '../../../workers/protocol.ts'

const components: ComponentBuffers = { axes: { kind: 'global' }, scalars: { sxx: new Float32Array(3) }, ranges: { sxx: [0, 1] }, extremes: {} }
const MODEL: LoadedModel = {
  summary: {
    name: 'box', description: '', units: { length: 'm', stress: 'Pa' }, nodeCount: 8, elementCount: 1, boundaryFaceCount: 6,
    elementTypes: { hex8: 1 }, bounds: { min: [0, 0, 0], max: [3, 4, 0] }, bodyForce: [0, 0, 0], warnings: [], source: 'synthetic:box',
  },
  surface: {} as SurfaceBuffers,
  audit: {} as AuditSummary,
  extras: { deformation: { surface: new Float32Array(9), edges: new Float32Array(0), max: 0.01 }, components, extremes: {} as never },
}

describe('line and shape slices', () => {
  it('two clicks set the start and then the end; a new model clears the line', () => {
    const store = createTractusStore()
    store.getState().modelLoaded(MODEL)
    store.getState().startLinePick()
    expect(store.getState().linePicking).toBe('from')
    store.getState().linePointPicked([1, 2, 3])
    expect(store.getState().line.from).toEqual([1, 2, 3])
    expect(store.getState().linePicking).toBe('to')
    store.getState().linePointPicked([4, 5, 6])
    expect(store.getState().line.to).toEqual([4, 5, 6])
    expect(store.getState().linePicking).toBe('off')
    store.getState().setLine({ points: 1e9 })
    expect(store.getState().line.points).toBe(2000)
    store.getState().setLine({ from: [Number.NaN, 0, 0] })
    expect(store.getState().lineError).toMatch(/finite/)
    expect(store.getState().line.from).toEqual([1, 2, 3])
    store.getState().modelLoaded(MODEL)
    expect(store.getState().line.from).toBeNull()
    expect(store.getState().lineResult).toBeNull()
  })

  it('a model brings its displacement and components; the automatic scale is 5 % of the diagonal', () => {
    const store = createTractusStore()
    store.getState().modelLoaded(MODEL)
    expect(store.getState().components).toBe(components)
    expect(deformScaleOf(store.getState())).toBe(0)
    store.getState().setDeformation({ shown: true })
    // Diagonal of a 3 × 4 × 0 box: 5; 5 % of it is 0.25, over |u|max = 0.01: 25.
    expect(deformScaleOf(store.getState())).toBeCloseTo(25, 12)
    store.getState().setDeformation({ scale: -1 })
    expect(store.getState().deformation.scale).toBe('auto')
    store.getState().setDeformation({ scale: 7 })
    expect(deformScaleOf(store.getState())).toBe(7)
    store.getState().setQuantity('sxx')
    expect(quantityScalars(store.getState())).toBe(components.scalars.sxx)
    expect(isSignedQuantity('sxx')).toBe(true)
    expect(isSignedQuantity('displacement')).toBe(false)
  })

  it('refuses a cylinder axis with no direction and says why', () => {
    const store = createTractusStore()
    store.getState().setComponentAxes({ kind: 'cylindrical', origin: [0, 0, 0], axis: [0, 0, 2] })
    expect(store.getState().componentAxes).toEqual({ kind: 'cylindrical', origin: [0, 0, 0], axis: [0, 0, 1] })
    const before = store.getState().componentAxes
    store.getState().setComponentAxes({ kind: 'cylindrical', origin: [0, 0, 0], axis: [0, 0, 0] })
    expect(store.getState().componentAxes).toBe(before)
    expect(store.getState().axesError).toMatch(/has no direction/)
  })
})
