/**
 * All cases of a cut at once (sectionStencil.ts, sectionEnvelope.ts): every case's figures equal
 * the single cut's, combinations equal the factored sum, and the envelope names the governing
 * case of each component on a model built so that each is governed by a different case.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../../src/model/model.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { cutSection } from '../../../src/mechanics/sectionCut.ts'
import { sectionEnvelope } from '../../../src/mechanics/sectionEnvelope.ts'
import { makePlane } from '../../../src/mechanics/plane.ts'
import { mulberry32 } from '../../helpers/rotation.ts'
import { assembly } from '../../helpers/assemblies.ts'
import { nodalStress } from '../../helpers/sectionMeshes.ts'
import { elementNodalCopy } from '../../helpers/elementNodal.ts'

const rel = (a: readonly number[], b: readonly number[]) => {
  let d = 0, s = 0
  for (let i = 0; i < a.length; i++) { d = Math.max(d, Math.abs(a[i] - b[i])); s = Math.max(s, Math.abs(b[i])) }
  return d / (s || 1)
}

function randomLinearStress(mesh: Mesh, seed: number): Float64Array {
  const r = mulberry32(seed)
  const c = Array.from({ length: 24 }, () => 2 * r() - 1)
  return nodalStress(mesh, (x, y, z) => [0, 1, 2, 3, 4, 5].map((k) => c[4 * k] + c[4 * k + 1] * x + c[4 * k + 2] * y + c[4 * k + 3] * z))
}

describe('section envelope: one stencil, every case', () => {
  const types: ElementTypeName[] = ['tet4', 'hex8', 'tet10', 'hex20', 'wedge6', 'pyramid13']
  it.each(types)('%s: each case and combination equals its own single cut (regions included) to 1e-9', (type) => {
    const seed = 15_000 + types.indexOf(type)
    console.log(`seed ${seed}`)
    // two parts meshed apart: two regions
    const mesh = assembly([
      { box: { nx: 2, ny: 2, nz: 3, lx: 1, ly: 1, lz: 3 }, type, part: 1 },
      { box: { nx: 2, ny: 1, nz: 3, lx: 1, ly: 0.5, lz: 3, x0: 2 }, type, part: 2 },
    ], false)
    const fields = [0, 1, 2].map((k) => randomLinearStress(mesh, seed + 100 * k))
    const cases = fields.map((v, k) => ({ name: `c${k}`, field: nodalStressField(mesh, v) }))
    const combos = [{ name: 'K', factors: { c0: 1.35, C2: -0.5 } }]
    const plane = makePlane([0.3, 0.4, 1.37], [0.1, -0.2, 1])
    const env = sectionEnvelope(mesh, cases, combos, plane, { regions: true })
    expect(env.cases.map((c) => c.name)).toEqual(['c0', 'c1', 'c2', 'K'])
    expect(env.regions.length).toBe(2)
    const combined = new Float64Array(fields[0].length)
    for (let i = 0; i < combined.length; i++) combined[i] = 1.35 * fields[0][i] - 0.5 * fields[2][i]
    const single = [...fields, combined].map((v) => cutSection(mesh, nodalStressField(mesh, v), [0, 0, 0], plane, { regions: true }).result)
    single.forEach((r, k) => {
      const e = env.cases[k]
      expect(rel(e.section.force, r.force)).toBeLessThan(1e-9)
      expect(rel(e.section.moment, r.moment)).toBeLessThan(1e-9)
      expect(rel([e.section.axial, ...e.section.shear, e.section.torque, ...e.section.bending], [r.axial, ...r.shear, r.torque, ...r.bending])).toBeLessThan(1e-9)
      expect(e.section.area).toBeCloseTo(r.area, 12)
      // regions: the single cut orders them by force, the envelope by area; match by centroid
      for (const g of e.regions) {
        const twin = r.regions!.find((x) => Math.hypot(x.centroid[0] - g.centroid[0], x.centroid[1] - g.centroid[1], x.centroid[2] - g.centroid[2]) < 1e-9)!
        expect(twin).toBeDefined()
        expect(rel(g.force, twin.force)).toBeLessThan(1e-9)
        expect(rel(g.moment, twin.moment)).toBeLessThan(1e-9)
      }
    })
    expect(env.regions[0].area).toBeGreaterThan(env.regions[1].area)
  })

  it('element-nodal fields and a part limit take the same path (equal to the single cut, 1e-9)', () => {
    const seed = 15_100
    console.log(`seed ${seed}`)
    const mesh = assembly([
      { box: { nx: 2, ny: 2, nz: 3, lx: 1, ly: 1, lz: 3 }, type: 'hex8', part: 1 },
      { box: { nx: 2, ny: 2, nz: 3, lx: 1, ly: 1, lz: 3, x0: 1 }, type: 'tet4', part: 2 },
    ], true)
    // the same row order for both (as a reader gives every case of a model), so the combined values below are a sum row by row
    const fields = [0, 1].map((k) => elementNodalCopy(mesh, randomLinearStress(mesh, seed + k), seed))
    const plane = makePlane([0.9, 0.5, 1.3], [0.3, 0, 1])
    const limit = { parts: [2] }
    const env = sectionEnvelope(mesh, fields.map((field, k) => ({ name: `e${k}`, field })), [{ name: 'K', factors: { e0: 2, e1: -1 } }], plane, { regions: true, limit })
    const combined = { ...fields[0], values: fields[0].values.map((v, i) => 2 * v - fields[1].values[i]) }
    ;[...fields, combined].forEach((field, k) => {
      const r = cutSection(mesh, field, [0, 0, 0], plane, { regions: true, limit }).result
      expect(r.limited).toBe(true)
      expect(rel(env.cases[k].section.force, r.force)).toBeLessThan(1e-9)
      expect(rel(env.cases[k].section.moment, r.moment)).toBeLessThan(1e-9)
      expect(env.cases[k].section.area).toBeCloseTo(r.area, 12)
    })
  })

  /**
   * A 2 × 1 rectangle (section plane z = 1.5 of a box 2 × 1 × 3): six pure traction fields, each
   * giving one component of the resultant in section axes alone. With t = σm, m = e3 and r from
   * the centroid (common practice, beam theory):
   *   σzz = c                → N  = c A
   *   t = c e1, t = c e2     → V1 = c A, V2 = c A
   *   t = c (m × r)          → T  = c J,  J = I1 + I2
   *   σzz = c (r·e2)         → M1 = c I1 (about e1)
   *   σzz = −c (r·e1)        → M2 = c I2 (about e2)
   * with A = 2, and for the rectangle b × h about its centroid I = b h³ / 12. Case k is
   * (+1) × pure k and (−2) × pure k+1 (mod 6), so the maximum of component k is governed by case
   * k and its minimum by case k−1: a different case for each.
   */
  it('names the governing case of each component (each a different case), with concurrent values', () => {
    for (const type of ['hex8', 'tet4'] as ElementTypeName[]) {
      const mesh = boxMesh({ nx: 4, ny: 2, nz: 3, lx: 2, ly: 1, lz: 3 }, type)
      const plane = makePlane([1, 0.5, 1.5], [0, 0, 1])
      const axes = cutSection(mesh, nodalStressField(mesh, new Float64Array(6 * mesh.nodeCount)), [0, 0, 0], plane).result.axes
      const e1 = axes.e1, e2 = axes.e2, cx = 1, cy = 0.5
      const I = { about: (d: Vec3) => (Math.abs(d[0]) > 0.5 ? (2 * 1 ** 3) / 12 : (1 * 2 ** 3) / 12) }
      const I1 = I.about(e1), I2 = I.about(e2), A = 2
      const pure: ((x: number, y: number) => number[])[] = [
        () => [0, 0, 1, 0, 0, 0],
        () => [0, 0, 0, 0, e1[1], e1[0]],
        () => [0, 0, 0, 0, e2[1], e2[0]],
        (x, y) => [0, 0, 0, 0, x - cx, -(y - cy)],
        (x, y) => [0, 0, (x - cx) * e2[0] + (y - cy) * e2[1], 0, 0, 0],
        (x, y) => [0, 0, -((x - cx) * e1[0] + (y - cy) * e1[1]), 0, 0, 0],
      ]
      const size = [A, A, A, I1 + I2, I1, I2]
      const names = ['N', 'V1', 'V2', 'T', 'M1', 'M2']
      const cases = names.map((name, k) => ({
        name: `case-${name}`,
        field: nodalStressField(mesh, nodalStress(mesh, (x, y) => {
          const a = pure[k](x, y), b = pure[(k + 1) % 6](x, y)
          return a.map((v, i) => v - 2 * b[i])
        })),
      }))
      const env = sectionEnvelope(mesh, cases, [], plane)
      const e = env.envelope!
      const comps = [e.axial, e.shear[0], e.shear[1], e.torque, e.bending[0], e.bending[1]]
      comps.forEach((c, k) => {
        expect(c.maxCase, `${type} ${names[k]} max`).toBe(`case-${names[k]}`)
        expect(c.minCase, `${type} ${names[k]} min`).toBe(`case-${names[(k + 5) % 6]}`)
        expect(c.max).toBeCloseTo(size[k], 10)
        expect(c.min).toBeCloseTo(-2 * size[k], 10)
      })
      // concurrent values: the governing case's whole resultant
      const gov = env.cases.find((c) => c.name === e.torque.maxCase)!.section
      expect(gov.torque).toBeCloseTo(I1 + I2, 10)
      expect(gov.bending[0]).toBeCloseTo(-2 * I1, 10)
      expect(gov.axial).toBeCloseTo(0, 10)
    }
  })

  it('combinations only: the envelope ranges over the combinations, every case still reported', () => {
    const mesh = boxMesh({ nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 2 }, 'hex8')
    const field = (s: number) => nodalStressField(mesh, nodalStress(mesh, () => [0, 0, s, 0, 0, 0]))
    const env = sectionEnvelope(mesh, [{ name: 'a', field: field(1) }, { name: 'b', field: field(-3) }],
      [{ name: 'k1', factors: { a: 1.5, b: 1 } }, { name: 'k2', factors: { a: 1 } }], makePlane([0.5, 0.5, 1], [0, 0, 1]), { combinationsOnly: true })
    expect(env.cases.length).toBe(4)
    expect(env.envelope!.axial).toEqual({ max: expect.closeTo(1, 12), maxCase: 'k2', min: expect.closeTo(-1.5, 12), minCase: 'k1' })
    const none = sectionEnvelope(mesh, [{ name: 'a', field: field(1) }], [], makePlane([0.5, 0.5, 1], [0, 0, 1]), { combinationsOnly: true })
    expect(none.envelope).toBeNull()
  })
})
