import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { Model } from '../../../src/model/model.ts'
import { extentAlong, sweepAlong } from '../../../workers/sweep.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'

describe('sweepAlong (the engine worker\'s sweep)', () => {
  // A bar 4 × 1 × 0.5 along x with σxx = 10 + 6(z − 0.25) (all other components 0; div σ = 0).
  // Elementary beam theory (Timoshenko & Goodier; common practice): N = ∫σ dA = 10·A, A = 0.5;
  // M = ∫ z'σ dA = 6·I with I = b h³ / 12 = 1 · 0.5³ / 12; no shear, no torque.
  const mesh = boxMesh({ nx: 8, ny: 2, nz: 2, lx: 4, ly: 1, lz: 0.5 }, 'hex8')
  const stress = stressField(mesh, (_x, _y, z) => [10 + 6 * (z - 0.25), 0, 0, 0, 0, 0])
  const model: Model = { name: 'bar', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress, displacement: null, bodyForce: [0, 0, 0], warnings: [] }
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, stress), faces)

  it('spans the extent of the nodes along the direction, with packed figures per section', () => {
    expect(extentAlong(mesh.coords, [2, 0, 0])).toEqual([0, 4])
    expect(extentAlong(mesh.coords, [0, 0, -1])).toEqual([-0.5, 0])
    const r = sweepAlong(model, faces, tractions, [3, 0, 0], 9)
    expect(r.normal).toEqual([1, 0, 0])
    expect(r.offsets.length).toBe(9)
    expect(r.offsets[0]).toBeGreaterThan(0)
    expect(r.offsets[0]).toBeLessThan(1e-5)
    expect(r.offsets[8]).toBeGreaterThan(4 - 1e-5)
    const I = (1 * 0.5 ** 3) / 12
    for (let k = 0; k < 9; k++) {
      expect(r.empty[k]).toBe(0)
      expect(r.axial[k]).toBeCloseTo(5, 9)
      expect(Math.hypot(r.bending1[k], r.bending2[k])).toBeCloseTo(6 * I, 9)
      expect(Math.abs(r.shear1[k]) + Math.abs(r.shear2[k]) + Math.abs(r.torque[k])).toBeLessThan(1e-9)
      expect(r.freeBodyRelative[k]).toBeLessThan(1e-9)
    }
  })

  it('takes an explicit range and marks planes that miss the body', () => {
    const r = sweepAlong(model, faces, tractions, [1, 0, 0], 3, 1, 6)
    expect(Array.from(r.offsets)).toEqual([1, 3.5, 6])
    expect(Array.from(r.empty)).toEqual([0, 0, 1])
    expect(r.axial[2]).toBe(0)
  })

  it('refuses a zero direction with a message', () => {
    expect(() => sweepAlong(model, faces, tractions, [0, 0, 0], 3)).toThrow(/the sweep direction \(0, 0, 0\) has no direction/)
  })
})
