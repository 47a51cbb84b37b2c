import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { sampleSectionArrows, sampleSurfaceArrows, stratifiedByArea } from '../../../src/mechanics/arrowSampling.ts'
import type { BoundaryFaces, SurfaceTractions } from '../../../src/mechanics/types.ts'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { cutSection } from '../../../src/mechanics/sectionCut.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { Vec3 } from '../../../src/model/model.ts'

/** F faces with given areas along x, normal +z, force = t·area (t per face). */
function faceSet(areas: number[], traction: (f: number) => Vec3): { faces: BoundaryFaces; tractions: SurfaceTractions } {
  const F = areas.length
  const force = new Float64Array(3 * F)
  areas.forEach((a, f) => { const t = traction(f); force[3 * f] = t[0] * a; force[3 * f + 1] = t[1] * a; force[3 * f + 2] = t[2] * a })
  return {
    faces: {
      count: F, slots: 3, elem: new Int32Array(F), localFace: new Uint8Array(F), kind: new Uint8Array(F), nodes: new Int32Array(3 * F),
      area: new Float64Array(areas), normal: new Float64Array(areas.flatMap(() => [0, 0, 1])),
      centroid: new Float64Array(areas.flatMap((_, f) => [f, 0, 0])),
    },
    tractions: {
      nodeNormal: new Float64Array(0), nodeTraction: new Float64Array(0), nodeNormalTraction: new Float64Array(0),
      nodeShear: new Float64Array(0), nodeMagnitude: new Float64Array(0), force, moment: new Float64Array(3 * F),
      meanNormal: new Float64Array(F), meanShear: new Float64Array(F), meanMagnitude: new Float64Array(F),
    },
  }
}

/** Σ vector · weight over the arrows: the resultant the arrows stand for. */
function weightedSum(a: { count: number; vectors: Float32Array; weights: Float32Array }): Vec3 {
  const s: Vec3 = [0, 0, 0]
  for (let i = 0; i < a.count; i++) for (let k = 0; k < 3; k++) s[k] += a.vectors[3 * i + k] * a.weights[i]
  return s
}

describe('stratifiedByArea', () => {
  it('keeps every positive-area item when they fit the budget', () => {
    const item = new Int32Array(5), w = new Float64Array(5)
    const n = stratifiedByArea(item, w, [1, 0, 2, NaN, 3], 10)
    expect(n).toBe(3)
    expect(Array.from(item.subarray(0, n))).toEqual([0, 2, 4])
    expect(Array.from(w.subarray(0, n))).toEqual([1, 2, 3])
  })

  it('property: count ≤ budget, items ascending with positive area, weights sum to the total area', () => {
    // Stratified sampling over the cumulative area (common practice): each of the K strata has
    // area A/K, so the weights add up to A whatever the jitter.
    fc.assert(fc.property(
      fc.array(fc.double({ min: 0, max: 100, noNaN: true }), { minLength: 1, maxLength: 300 }),
      fc.integer({ min: 1, max: 50 }), fc.integer(),
      (areas, budget, seed) => {
        const item = new Int32Array(areas.length), w = new Float64Array(areas.length)
        const n = stratifiedByArea(item, w, areas, budget, seed)
        const total = areas.reduce((s, a) => s + (a > 0 ? a : 0), 0)
        expect(n).toBeLessThanOrEqual(budget)
        let sum = 0
        for (let i = 0; i < n; i++) {
          expect(areas[item[i]]).toBeGreaterThan(0)
          if (i > 0) expect(item[i]).toBeGreaterThan(item[i - 1])
          sum += w[i]
        }
        if (total > 0) expect(Math.abs(sum - total)).toBeLessThanOrEqual(1e-9 * total)
        else expect(n).toBe(0)
      },
    ), { seed: 20261201 })
  })

  it('is deterministic for a seed', () => {
    const areas = Array.from({ length: 1000 }, (_, i) => 1 + (i % 7))
    const a = new Int32Array(1000), b = new Int32Array(1000), w = new Float64Array(1000)
    const na = stratifiedByArea(a, w, areas, 100, 42), nb = stratifiedByArea(b, w, areas, 100, 42)
    expect(na).toBe(nb)
    expect(Array.from(a.subarray(0, na))).toEqual(Array.from(b.subarray(0, nb)))
  })
})

describe('sampleSurfaceArrows', () => {
  it('uniform traction: decimated arrows still sum to ∫ t dA = t·A exactly', () => {
    // Cauchy's formula on a uniform traction field (Malvern 1969, ch. 3): the resultant is t·A.
    const areas = Array.from({ length: 5000 }, (_, i) => 0.5 + ((i * 7919) % 13) / 13)
    const t: Vec3 = [3, -2, 5]
    const { faces, tractions } = faceSet(areas, () => t)
    const A = areas.reduce((s, a) => s + a, 0)
    const arrows = sampleSurfaceArrows(faces, tractions, { budget: 400 })
    expect(arrows.count).toBeLessThanOrEqual(400)
    expect(arrows.count).toBeGreaterThan(300)
    const s = weightedSum(arrows)
    // Float32 buffers: agreement to single-precision round-off.
    for (let k = 0; k < 3; k++) expect(Math.abs(s[k] - t[k] * A)).toBeLessThan(1e-6 * Math.abs(t[k] * A))
  })

  it('all faces kept: arrows sum to the face forces; normal + shear parts add up to full', () => {
    const areas = [1, 2, 0.5, 4]
    const { faces, tractions } = faceSet(areas, (f) => [f, 2 * f - 1, 3 - f])
    const full = sampleSurfaceArrows(faces, tractions, { mode: 'full' })
    const normal = sampleSurfaceArrows(faces, tractions, { mode: 'normal' })
    const shear = sampleSurfaceArrows(faces, tractions, { mode: 'shear' })
    expect(full.count).toBe(4)
    const s = weightedSum(full)
    const F: Vec3 = [0, 0, 0]
    for (let f = 0; f < 4; f++) for (let k = 0; k < 3; k++) F[k] += tractions.force[3 * f + k]
    for (let k = 0; k < 3; k++) expect(s[k]).toBeCloseTo(F[k], 12)
    for (let i = 0; i < 4; i++) {
      // Normal is +z: the normal part is the z component, the shear part the x-y components.
      expect(normal.vectors[3 * i]).toBe(0)
      expect(shear.vectors[3 * i + 2]).toBe(0)
      for (let k = 0; k < 3; k++) expect(normal.vectors[3 * i + k] + shear.vectors[3 * i + k]).toBeCloseTo(full.vectors[3 * i + k], 6)
      expect(full.magnitudes[i]).toBeCloseTo(Math.hypot(full.vectors[3 * i], full.vectors[3 * i + 1], full.vectors[3 * i + 2]), 5)
      expect(Array.from(full.origins.subarray(3 * i, 3 * i + 3))).toEqual([full.item[i], 0, 0])
      // The signed normal traction t·n (here t_z = 3 − f) colours the arrows in every mode.
      for (const a of [full, normal, shear]) expect(a.normalTraction[i]).toBe(3 - full.item[i])
    }
    expect(full.maxMagnitude).toBe(Math.max(...full.magnitudes))
  })

  it('stratified estimate of a varying traction is close to the exact resultant', () => {
    // Smooth traction t_z = 1 + x over 20 000 equal faces; 1 000 strata (budget) estimate the
    // integral with stratified-sampling error well under 1 % (common practice).
    const n = 20000
    const { faces, tractions } = faceSet(Array(n).fill(1), (f) => [0, 0, 1 + f / n])
    const exact = n * 1.5 - 0.5
    const s = weightedSum(sampleSurfaceArrows(faces, tractions, { budget: 1000, seed: 7 }))
    expect(Math.abs(s[2] - exact) / exact).toBeLessThan(1e-2)
  })
})

describe('sampleSectionArrows', () => {
  it('sums to the section resultant: one arrow per polygon with its own ∫ σm dA', () => {
    // Two hex8 cells [0,2]×[0,1]×[0,1], σzz = x·y (bilinear, exact in hex8), plane z = 0.5:
    // ∫∫ x y dx dy over [0,2]×[0,1] = 2 · 1/2 = 1 (elementary calculus).
    const mesh = boxMesh({ nx: 2, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1 }, 'hex8')
    const stress = new Float64Array(6 * mesh.nodeCount)
    for (let i = 0; i < mesh.nodeCount; i++) stress[6 * i + 2] = mesh.coords[3 * i] * mesh.coords[3 * i + 1]
    const { result, polygons } = cutSection(mesh, nodalStressField(mesh, stress), [0, 0, 0], { point: [0, 0, 0.5], normal: [0, 0, 1] }, { polygons: true })
    const a = sampleSectionArrows(polygons!, [0, 0, 2])
    expect(a.count).toBe(2)
    const s = weightedSum(a)
    expect(s[2]).toBeCloseTo(1, 12)
    expect(s[2]).toBeCloseTo(result.force[2], 12)
    expect(Array.from(a.weights)).toEqual([1, 1])
    expect(Array.from(a.origins)).toEqual([0.5, 0.5, 0.5, 1.5, 0.5, 0.5])
    expect(sampleSectionArrows(polygons!, [0, 0, 1], { mode: 'shear' }).maxMagnitude).toBe(0)
  })
})
