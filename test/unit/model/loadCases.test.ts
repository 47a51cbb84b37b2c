/**
 * Combinations by superposition (src/model/loadCases.ts): a combination's tractions, section force
 * and moment, and element and body residuals equal the factored sum of its cases' (linear in the
 * stress: Cauchy's formula and the integrals that follow), to 1e-9 relative; its von Mises field
 * is that of the summed stress, not the sum of the cases' von Mises (not linear).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import type { Model, Vec3 } from '../../../src/model/model.ts'
import { caseNames, checkCombination, describeFactors, findCase, firstCaseName, modelForCase } from '../../../src/model/loadCases.ts'
import { InputError } from '../../../src/model/errors.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { cutSection } from '../../../src/mechanics/sectionCut.ts'
import { makePlane } from '../../../src/mechanics/plane.ts'
import { vonMises } from '../../../src/mechanics/invariants.ts'
import { runCore } from '../../helpers/pipeline.ts'
import { mulberry32 } from '../../helpers/rotation.ts'
import { nodalStress } from '../../helpers/sectionMeshes.ts'

function relErr(got: ArrayLike<number>, want: ArrayLike<number>): number {
  let d = 0, s = 0
  for (let i = 0; i < want.length; i++) { d = Math.max(d, Math.abs(got[i] - want[i])); s = Math.max(s, Math.abs(want[i])) }
  return d / (s || 1)
}

function model(): Model {
  const seed = 1515
  console.log(`seed ${seed}`)
  const r = mulberry32(seed)
  const mesh = boxMesh({ nx: 3, ny: 2, nz: 4, lx: 1.5, ly: 1, lz: 2 }, 'hex8')
  const field = () => {
    const c = Array.from({ length: 24 }, () => 2 * r() - 1)
    return nodalStress(mesh, (x, y, z) => [0, 1, 2, 3, 4, 5].map((k) => c[4 * k] + c[4 * k + 1] * x + c[4 * k + 2] * y + c[4 * k + 3] * z * z))
  }
  const cases = ['dead', 'imposed', 'wind'].map((name, k) => ({
    name, description: '', bodyForce: [0, k, -1 - k] as Vec3, stress: field(), displacement: null,
  }))
  return {
    name: 'box', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress: cases[0].stress, displacement: null,
    bodyForce: [0, 0, -1], warnings: [], cases, combinations: [{ name: 'ULS', factors: { dead: 1.35, imposed: 1.5, wind: -0.9 } }],
  }
}

describe('load combinations', () => {
  const m = model()
  const f = [1.35, 1.5, -0.9]
  const parts = ['dead', 'imposed', 'wind'].map((n) => modelForCase(m, n))
  const combo = modelForCase(m, 'uls')
  const sum = (get: (x: Model) => ArrayLike<number>): Float64Array => {
    const out = new Float64Array(get(parts[0]).length)
    parts.forEach((p, k) => { const a = get(p); for (let i = 0; i < out.length; i++) out[i] += f[k] * a[i] })
    return out
  }

  it('tractions, element and body residuals are the factored sum (superposition, 1e-9)', () => {
    const runs = new Map(parts.map((p) => [p, runCore(p.mesh, p.stress, p.bodyForce)]))
    const rc = runCore(combo.mesh, combo.stress, combo.bodyForce)
    expect(combo.bodyForce).toEqual([0, 1.35 * 0 + 1.5 * 1 - 0.9 * 2, 1.35 * -1 + 1.5 * -2 - 0.9 * -3].map((v) => expect.closeTo(v, 14)))
    const of = (get: (r: ReturnType<typeof runCore>) => ArrayLike<number>) => sum((p) => get(runs.get(p)!))
    expect(relErr(rc.tractions.nodeTraction, of((r) => r.tractions.nodeTraction))).toBeLessThan(1e-9)
    expect(relErr(rc.tractions.force, of((r) => r.tractions.force))).toBeLessThan(1e-9)
    expect(relErr(rc.elements.residual, of((r) => r.elements.residual))).toBeLessThan(1e-9)
    expect(relErr(rc.body.force, of((r) => r.body.force))).toBeLessThan(1e-9)
    expect(relErr(rc.body.moment, of((r) => r.body.moment))).toBeLessThan(1e-9)
  })

  it('section force and moment are the factored sum (1e-9)', () => {
    const plane = makePlane([0.7, 0.4, 1.1], [0.2, 0.1, 1])
    const cut = (x: Model) => cutSection(x.mesh, nodalStressField(x.mesh, x.stress), x.bodyForce, plane).result
    const c = cut(combo)
    expect(relErr(c.force, sum((p) => cut(p).force))).toBeLessThan(1e-9)
    expect(relErr(c.moment, sum((p) => cut(p).moment))).toBeLessThan(1e-9)
    expect(relErr(c.freeBody.force, sum((p) => cut(p).freeBody.force))).toBeLessThan(1e-9)
  })

  it('von Mises comes from the combined stress, not the sum of von Mises', () => {
    const rc = runCore(combo.mesh, combo.stress, combo.bodyForce)
    const vm = rc.invariants.vonMises
    let wrong = 0
    for (let n = 0; n < combo.mesh.nodeCount; n++) {
      const s = [0, 1, 2, 3, 4, 5].map((k) => f.reduce((acc, fk, j) => acc + fk * parts[j].stress[6 * n + k], 0))
      // von Mises of the summed tensor (Hill, The Mathematical Theory of Plasticity (1950): √(3 J2))
      const j2 = ((s[0] - s[1]) ** 2 + (s[1] - s[2]) ** 2 + (s[2] - s[0]) ** 2) / 6 + s[3] ** 2 + s[4] ** 2 + s[5] ** 2
      expect(vm[n]).toBeCloseTo(Math.sqrt(3 * j2), 9)
      const summed = f.reduce((acc, fk, j) => acc + fk * vonMises(parts[j].stress.subarray(6 * n, 6 * n + 6)), 0)
      wrong = Math.max(wrong, Math.abs(summed - vm[n]) / vm[n])
    }
    // the sum of von Mises is far off: a check that passed for it would be wrong
    expect(wrong).toBeGreaterThan(0.1)
  })

  it('names: cases then combinations, case-insensitive; an unknown name lists the known ones', () => {
    expect(caseNames(m)).toEqual(['dead', 'imposed', 'wind', 'ULS'])
    expect(firstCaseName(m)).toBe('dead')
    expect(findCase(m, 'WIND').kind).toBe('case')
    expect(() => findCase(m, 'snow')).toThrow(InputError)
    expect(() => findCase(m, 'snow')).toThrow(/cases dead, imposed, wind; combination ULS/)
    expect(describeFactors(m.combinations![0])).toBe('1.35 × dead + 1.5 × imposed − 0.9 × wind')
    expect(() => checkCombination(m.cases!, { name: 'K', factors: { dead: Number.NaN } }, { field: 'combination' })).toThrow(/finite/)
    // a model without cases has one, "default"
    const { cases: _c, combinations: _k, ...plain } = m
    expect(caseNames(plain)).toEqual(['default'])
    expect(modelForCase(plain, 'default').stress).toBe(m.stress)
  })
})
