import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { Model } from '../../../src/model/model.ts'
import { extentAlong, sweepAlong, sweepCasesAlong, withCombinations } from '../../../workers/sweep.ts'
import { modelForCase } from '../../../src/model/loadCases.ts'
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

describe('sweepCasesAlong (every case along the sweep, tractus sweep --case all\'s code)', () => {
  // The bar above under three cases, each with a closed form by elementary beam theory
  // (Timoshenko & Goodier; common practice), A = 0.5, I = 1 · 0.5³ / 12:
  // pull σxx = 10 (N = 5), bend σxx = 6(z − 0.25) (|M| = 6 I, N = 0), press σxx = −4 (N = −2);
  // the model's combination K = 1.5 pull + bend (N = 7.5) and the app's U = 2 press (N = −4).
  const mesh = boxMesh({ nx: 8, ny: 2, nz: 2, lx: 4, ly: 1, lz: 0.5 }, 'hex8')
  const field = (f: (z: number) => number) => stressField(mesh, (_x, _y, z) => [f(z), 0, 0, 0, 0, 0])
  const cases = [
    { name: 'pull', description: '', bodyForce: null, stress: field(() => 10), displacement: null },
    { name: 'bend', description: '', bodyForce: null, stress: field((z) => 6 * (z - 0.25)), displacement: null },
    { name: 'press', description: '', bodyForce: null, stress: field(() => -4), displacement: null },
  ]
  const base: Model = {
    name: 'bar', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress: cases[0].stress, displacement: null, bodyForce: [0, 0, 0], warnings: [],
    cases, combinations: [{ name: 'K', factors: { pull: 1.5, bend: 1 } }],
  }
  const faces = extractBoundaryFaces(mesh)
  const sweepOf = (m: Model) => sweepAlong(m, faces, computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, m.stress), faces), [1, 0, 0], 5)

  it('gives each case and combination the single sweep\'s figures (1e-9) and the envelope with its governing case', () => {
    const shown = sweepOf(base)
    const all = sweepCasesAlong(base, shown, { combinations: [{ name: 'U', factors: { press: 2 } }] })!
    expect(all.cases.map((c) => [c.name, c.kind])).toEqual([['pull', 'case'], ['bend', 'case'], ['press', 'case'], ['K', 'combination'], ['U', 'combination']])
    const withU = withCombinations(base, [{ name: 'U', factors: { press: 2 } }])
    const keys = ['axial', 'shear1', 'shear2', 'torque', 'bending1', 'bending2'] as const
    const scale = 6 * (0.5 ** 3 / 12)
    all.cases.forEach((c) => {
      const single = sweepOf(modelForCase(withU, c.name))
      for (const key of keys) for (let k = 0; k < 5; k++) expect(Math.abs(c[key][k] - single[key][k])).toBeLessThan(1e-9 * Math.max(1, scale))
    })
    const I = 0.5 ** 3 / 12
    for (let k = 0; k < 5; k++) {
      expect(all.cases[0].axial[k]).toBeCloseTo(5, 9)
      expect(Math.hypot(all.cases[1].bending1[k], all.cases[1].bending2[k])).toBeCloseTo(6 * I, 9)
      // axial: largest the model's combination K (7.5), smallest the app's U (−4)
      expect(all.envelope.axial.max[k]).toBeCloseTo(7.5, 9)
      expect(all.cases[all.envelope.axial.maxCase[k]].name).toBe('K')
      expect(all.envelope.axial.min[k]).toBeCloseTo(-4, 9)
      expect(all.cases[all.envelope.axial.minCase[k]].name).toBe('U')
      // every component: the extremes over the series, the first in order on a tie
      for (const key of keys) {
        const v = all.cases.map((c) => c[key][k])
        expect(all.envelope[key].max[k]).toBe(Math.max(...v))
        expect(all.envelope[key].maxCase[k]).toBe(v.indexOf(Math.max(...v)))
        expect(all.envelope[key].min[k]).toBe(Math.min(...v))
        expect(all.envelope[key].minCase[k]).toBe(v.indexOf(Math.min(...v)))
      }
    }
    // combinations only: the envelope ranges over K and U
    const only = sweepCasesAlong(base, shown, { combinations: [{ name: 'U', factors: { press: 2 } }], combinationsOnly: true })!
    expect(only.combinationsOnly).toBe(true)
    expect(Array.from(only.envelope.bending1.maxCase).every((i) => i >= 3)).toBe(true)
  })

  it('is null for a model of one case without combinations, and marks planes that miss the body', () => {
    const one: Model = { ...base, cases: [cases[0]], combinations: [] }
    expect(sweepCasesAlong(one, sweepOf(one), { combinations: [] })).toBeNull()
    const off = sweepAlong(base, faces, computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, base.stress), faces), [1, 0, 0], 3, 1, 6)
    const all = sweepCasesAlong(base, off, { combinations: [] })!
    expect(all.envelope.axial.maxCase[2]).toBe(-1)
    expect(Number.isNaN(all.envelope.axial.max[2])).toBe(true)
    expect(all.envelope.axial.maxCase[0]).toBe(3)
  })
})
