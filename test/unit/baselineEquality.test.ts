/**
 * The fast kernels give the same results as the plain baselines of the benchmarks
 * (test/bench/baseline) on small seeded models: the same set of boundary faces with the same
 * face forces, and the same section resultant. The baselines are straightforward first-attempt
 * codes (string-keyed Map, objects per element), so agreement checks the fast code's
 * bookkeeping; the mechanics itself is Cauchy's formula t = σn (Malvern 1969, ch. 3).
 */
import { describe, expect, it } from 'vitest'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { baselineBoundary } from '../bench/baseline/boundaryBaseline.ts'
import { baselineCut } from '../bench/baseline/cutBaseline.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'
import type { Vec3 } from '../../src/model/model.ts'

const SEED = 7
const scale = (v: ArrayLike<number>) => Math.max(...Array.from(v, Math.abs))

describe.each(['tet4', 'hex8'] as const)('fast kernels equal the plain baselines on a %s block (seed 7)', (type) => {
  const model = syntheticModel(type, 3000, SEED)
  const { mesh, stress } = model
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, stress), faces)

  it('finds the same boundary faces with the same face forces', () => {
    const base = baselineBoundary(mesh, stress)
    expect(faces.count).toBe(base.length)
    const byKey = new Map(base.map((f) => [`${f.elem}/${f.localFace}`, f]))
    const fscale = Math.max(...base.map((f) => scale(f.force)))
    for (let i = 0; i < faces.count; i++) {
      const b = byKey.get(`${faces.elem[i]}/${faces.localFace[i]}`)
      expect(b, `face ${faces.elem[i]}/${faces.localFace[i]}`).toBeDefined()
      for (let k = 0; k < 3; k++) expect(Math.abs(tractions.force[3 * i + k] - b!.force[k])).toBeLessThanOrEqual(1e-9 * fscale)
      expect(faces.area[i]).toBeCloseTo(b!.area, 12)
    }
  })

  // Planes oblique to the grid, each checked with its normal reversed too.
  const planes: { point: Vec3; normal: Vec3 }[] = [
    { point: [0.5037, 0.4969, 0.5013], normal: [0.3, 0.4, 0.866] },
    { point: [0.31, 0.72, 0.44], normal: [-0.7, 0.2, 0.1] },
    { point: [0.5, 0.5, 0.2731], normal: [0.05, -0.02, 1] },
  ]
  // Inside a cut hex8 the two codes interpolate differently (the baseline takes σ linear over its
  // fan triangles), so the hex8 cut is compared on a linear stress field, which every
  // isoparametric element reproduces exactly: both are then exact and must agree.
  const cutStress = type === 'tet4' ? stress : linearField(mesh.coords)
  it.each(planes)('gives the same section resultant for the plane through $point', ({ point, normal }) => {
    for (const sign of [1, -1]) {
      const n: Vec3 = [sign * normal[0], sign * normal[1], sign * normal[2]]
      const fast = cutSection(mesh, nodalStressField(mesh, cutStress), model.bodyForce, { point, normal: n }).result
      const base = baselineCut(mesh, cutStress, point, n)
      expect(fast.cutElements).toBe(base.cutElements)
      expect(Math.abs(fast.area - base.area)).toBeLessThanOrEqual(1e-9 * base.area)
      const fs = scale(base.force)
      for (let k = 0; k < 3; k++) {
        expect(Math.abs(fast.force[k] - base.force[k])).toBeLessThanOrEqual(1e-9 * fs)
        expect(Math.abs(fast.centroid[k] - base.centroid[k])).toBeLessThanOrEqual(1e-9)
      }
      // Stress linear over the cut polygon: both integrate the moment exactly.
      const ms = Math.max(scale(base.moment), fs * 1e-3)
      for (let k = 0; k < 3; k++) expect(Math.abs(fast.moment[k] - base.moment[k])).toBeLessThanOrEqual(1e-9 * ms)
    }
  })
})

/** A linear stress field (invented, Pa with x in m). */
function linearField(x: Float64Array): Float64Array {
  const n = x.length / 3
  const s = new Float64Array(6 * n)
  for (let i = 0; i < n; i++) {
    const px = x[3 * i], py = x[3 * i + 1], pz = x[3 * i + 2]
    s[6 * i] = 1e6 + 2e5 * py - 1e5 * pz
    s[6 * i + 1] = -3e5 + 4e5 * px
    s[6 * i + 2] = 5e5 * pz - 2e5 * px
    s[6 * i + 3] = 1e5 * pz
    s[6 * i + 4] = -2e5 * px + 3e4
    s[6 * i + 5] = 6e4 * py
  }
  return s
}
