import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { SectionResult } from '../../src/mechanics/types.ts'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import type { Vec3 } from '../../src/model/model.ts'
import { quarterCylinder } from '../helpers/mappedMeshes.ts'
import {
  anyBox, cutNodal, nodalStress, norm, sweepNodal,
} from '../helpers/sectionMeshes.ts'
import type { BoxKind } from '../helpers/sectionMeshes.ts'

// A sweep is N single cuts done in one pass: every figure must equal the single cut at the same
// offset (plane point offset·m) to 1e-9 relative (the only difference is the rounding of d).
// Stress: a linear field in equilibrium with ρb = (0, 0, -2) would need div σ = (0, 0, 2); this
// one is not balanced on purpose, so the free-body figures are non-trivial numbers to compare.
const field = (x: number, y: number, z: number) => [10 + 3 * x - y, -4 + 2 * y - z, 1 + x + 2 * z, 2 * z, -1 + y, 0.5 * x - z]
const bodyForce: Vec3 = [0.3, -0.1, -2]
const SEED = 7011

function expectSame(a: SectionResult, b: SectionResult, scale: { F: number; M: number; L: number; A: number }): void {
  expect(a.empty).toBe(b.empty)
  expect(a.cutElements).toBe(b.cutElements)
  expect(Math.abs(a.area - b.area)).toBeLessThan(1e-9 * scale.A)
  for (let k = 0; k < 3; k++) {
    expect(Math.abs(a.centroid[k] - b.centroid[k])).toBeLessThan(1e-9 * scale.L)
    expect(Math.abs(a.force[k] - b.force[k])).toBeLessThan(1e-9 * scale.F)
    expect(Math.abs(a.moment[k] - b.moment[k])).toBeLessThan(1e-9 * scale.M)
    expect(Math.abs(a.freeBody.force[k] - b.freeBody.force[k])).toBeLessThan(1e-9 * Math.max(a.freeBody.gross, scale.F))
    expect(Math.abs(a.freeBody.moment[k] - b.freeBody.moment[k])).toBeLessThan(1e-9 * Math.max(a.freeBody.gross * scale.L, scale.M))
  }
  expect(Math.abs(a.freeBody.momentRelative - b.freeBody.momentRelative)).toBeLessThan(1e-9 * Math.max(a.freeBody.momentRelative, 1e-3))
  expect(a.unmappedPoints).toBe(b.unmappedPoints)
  expect(Math.abs(a.secondMoments.I1 - b.secondMoments.I1)).toBeLessThan(1e-9 * scale.A * scale.L ** 2)
  expect(Math.abs(a.secondMoments.I2 - b.secondMoments.I2)).toBeLessThan(1e-9 * scale.A * scale.L ** 2)
  expect(Math.abs(a.axial - b.axial)).toBeLessThan(1e-9 * scale.F)
  expect(Math.abs(a.torque - b.torque)).toBeLessThan(1e-9 * scale.M)
  expect(Math.abs(a.freeBody.gross - b.freeBody.gross)).toBeLessThan(1e-9 * Math.max(a.freeBody.gross, scale.F))
}

describe.each([...ELEMENT_TYPE_NAMES, 'mixed'] as BoxKind[])('sweep = single cuts (%s)', (kind) => {
  const mesh = anyBox(kind, 3, 3, 3, 3, 2, 1.5)
  const stress = nodalStress(mesh, field)
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, stress), faces)
  const scale = { F: 30 * 6, M: 30 * 6 * 3, L: 3, A: 6 }

  const compare = (normal: Vec3, from: number, to: number, count: number) => {
    const { offsets, results } = sweepNodal(mesh, stress, bodyForce, normal, from, to, count, { faces, tractions })
    expect(results.length).toBe(count)
    const m = normal.map((v) => v / norm(normal))
    results.forEach((r, k) => {
      const single = cutNodal(mesh, stress, bodyForce, { point: [offsets[k] * m[0], offsets[k] * m[1], offsets[k] * m[2]], normal }, { faces, tractions }).result
      expectSame(r, single, scale)
    })
  }

  it('random directions and ranges, including empty ends', () => {
    fc.assert(fc.property(
      fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 3, maxLength: 3 }).filter((v) => norm(v) > 0.1),
      fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true }), fc.integer({ min: 1, max: 25 }),
      (n, from, to, count) => compare(n as Vec3, from, to, count),
    ), { seed: SEED, numRuns: 12 })
  })

  it('planes on node layers (axis sweep hitting every layer, ascending and descending)', () => {
    compare([0, 0, 1], 0, 1.5, 7) // node layers at z = 0, 0.5, 1, 1.5 among the offsets
    compare([1, 0, 0], 3, 0, 7) // descending, layers at x = 3, 2, 1, 0
    compare([1, 1, 0], -1, 6, 15)
  })
})

describe('sweep bookkeeping', () => {
  const mesh = anyBox('tet4', 2, 2, 2, 1, 1, 1)
  const stress = nodalStress(mesh, field)
  it('offsets run from `from` to `to` inclusive; a single section sits at `from`', () => {
    expect(Array.from(sweepNodal(mesh, stress, bodyForce, [0, 0, 2], 0.1, 0.9, 5).offsets)).toEqual([0.1, 0.30000000000000004, 0.5, 0.7000000000000001, 0.9])
    const one = sweepNodal(mesh, stress, bodyForce, [0, 0, 1], 0.25, 0.75, 1)
    expect(Array.from(one.offsets)).toEqual([0.25])
    expect(one.results[0].plane.point[2]).toBe(0.25)
  })
})

describe.each(['tet10', 'hex20'] as const)('sweep = single cuts on a curved %s ring', (type) => {
  // Curved elements go through the Newton inversion in both; the sweep takes the mid-edge nodes'
  // distances unsnapped (D - o), the single cut snapped, which only moves round-off. No body
  // force here: the piece's volume comes from whole curved faces by their area, mean normal and
  // centroid (freeBody.ts), which depends a little on the volume origin, and sweep and cut use
  // different origins.
  const mesh = quarterCylinder({ a: 1, b: 2, length: 0.5, nr: 2, ntheta: 5, nz: 2 }, type)
  const stress = nodalStress(mesh, (x, y, z) => [1 + x * y, 2 - y * y, z * x, x + y, 0.5 * z, -x * x])
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, stress), faces)
  it('oblique direction across the ring', () => {
    const normal: Vec3 = [0.6, 0.7, 0.2]
    const none: Vec3 = [0, 0, 0]
    const { offsets, results } = sweepNodal(mesh, stress, none, normal, 0.8, 1.95, 9, { faces, tractions })
    const m = normal.map((v) => v / norm(normal))
    results.forEach((r, k) => {
      expect(r.empty).toBe(false)
      expect(r.unmappedPoints).toBe(0)
      const single = cutNodal(mesh, stress, none, { point: [offsets[k] * m[0], offsets[k] * m[1], offsets[k] * m[2]], normal }, { faces, tractions }).result
      expectSame(r, single, { F: 20, M: 40, L: 2, A: 1 })
    })
  })
})
