/**
 * The fast path of all cases at once (sectionStencil.ts: the tet4 closed forms of
 * tetSectionWeights.ts, merged and sorted rows, two cases per walk) against its reference: one
 * single-case cut (sectionCut.ts) per case and per combination, each combination cut on the
 * factored sum of its cases' stress. Both integrate the same polygons with the element's own
 * interpolation, so they must agree to round-off (1e-9 relative to the largest component) for
 * every case, on warped meshes (affine tet4, non-affine hex8, curved tet10), for nodal and for
 * discontinuous element-nodal stress, for oblique planes and for planes through node layers.
 */
import { describe, expect, it } from 'vitest'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import type { Combination } from '../../../src/model/loadCases.ts'
import type { Mesh } from '../../../src/model/model.ts'
import type { StressField } from '../../../src/model/stressField.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { cutSection } from '../../../src/mechanics/sectionCut.ts'
import { sectionEnvelope } from '../../../src/mechanics/sectionEnvelope.ts'
import { makePlane } from '../../../src/mechanics/plane.ts'
import type { SectionPlane, SectionResult } from '../../../src/mechanics/types.ts'
import { mulberry32 } from '../../helpers/rotation.ts'
import { assembly } from '../../helpers/assemblies.ts'
import { nodalStress } from '../../helpers/sectionMeshes.ts'

/** max |a - b| over max |b| (1 where b is all zero). */
const rel = (a: readonly number[], b: readonly number[]) => {
  let d = 0, s = 0
  for (let i = 0; i < a.length; i++) { d = Math.max(d, Math.abs(a[i] - b[i])); s = Math.max(s, Math.abs(b[i])) }
  return d / (s || 1)
}

/** Two parts meshed apart (two regions), warped by a smooth map so coincident nodes stay coincident. */
function warpedAssembly(type: ElementTypeName, warp: boolean): Mesh {
  const mesh = assembly([
    { box: { nx: 3, ny: 3, nz: 4, lx: 1.5, ly: 1.5, lz: 2 }, type, part: 1 },
    { box: { nx: 2, ny: 1, nz: 4, lx: 1, ly: 0.5, lz: 2, x0: 2 }, type, part: 2 },
  ], false)
  if (warp) {
    const x = mesh.coords
    for (let i = 0; i < x.length; i += 3) {
      const a = x[i], b = x[i + 1], c = x[i + 2]
      x[i] = a + 0.04 * Math.sin(3 * b + 2 * c)
      x[i + 1] = b + 0.04 * Math.sin(2 * a - 3 * c)
      x[i + 2] = c + 0.04 * Math.sin(3 * a + b)
    }
  }
  return mesh
}

/** A smooth nodal field (quadratic in x, y, z, seeded coefficients). */
function nodalCase(mesh: Mesh, seed: number): StressField {
  const r = mulberry32(seed)
  const c = Array.from({ length: 60 }, () => 2 * r() - 1)
  return nodalStressField(mesh, nodalStress(mesh, (x, y, z) => [0, 1, 2, 3, 4, 5].map((k) => {
    const o = 10 * k
    return c[o] + c[o + 1] * x + c[o + 2] * y + c[o + 3] * z + c[o + 4] * x * y + c[o + 5] * y * z + c[o + 6] * x * z + c[o + 7] * x * x + c[o + 8] * y * y + c[o + 9] * z * z
  })))
}

/** A discontinuous element-nodal field: seeded random stress on every element-node, rows in a seeded order shared by every case. */
function elementNodalCases(mesh: Mesh, seed: number, count: number): StressField[] {
  const R = mesh.blocks.reduce((n, b) => n + b.conn.length, 0)
  const r = mulberry32(seed)
  const order = Int32Array.from({ length: R }, (_, i) => i)
  for (let i = R - 1; i > 0; i--) { // Fisher–Yates shuffle (Knuth, TAOCP vol. 2, Algorithm P)
    const j = Math.floor(r() * (i + 1))
    const t = order[i]; order[i] = order[j]; order[j] = t
  }
  let k = 0
  const rows = mesh.blocks.map((b) => Int32Array.from({ length: b.conn.length }, () => order[k++]))
  return Array.from({ length: count }, () => ({ values: Float64Array.from({ length: 6 * R }, () => 2 * r() - 1), rows, layout: 'element-nodal' as const }))
}

function expectSame(e: SectionResult, s: SectionResult, what: string): void {
  expect(rel(e.force, s.force), `${what} force`).toBeLessThan(1e-9)
  expect(rel(e.moment, s.moment), `${what} moment`).toBeLessThan(1e-9)
  const comps = (r: SectionResult) => [r.axial, ...r.shear, r.torque, ...r.bending]
  expect(rel(comps(e), comps(s)), `${what} axes components`).toBeLessThan(1e-9)
  expect(rel([e.area, ...e.centroid], [s.area, ...s.centroid]), `${what} area and centroid`).toBeLessThan(1e-12)
  expect(e.cutElements, `${what} cut elements`).toBe(s.cutElements)
}

describe('section stencil: all cases at once equal one single cut per case', () => {
  const planes: [string, SectionPlane][] = [
    ['oblique', makePlane([0.61, 0.73, 1.03], [0.3, -0.4, 0.866])],
    ['through a node layer', makePlane([0, 0, 1], [0, 0, 1])],
    ['oblique through node lines', makePlane([0.5, 0.5, 1], [1, 1, 0])],
  ]
  const types: ElementTypeName[] = ['tet4', 'tet10', 'hex8']
  for (const type of types) {
    for (const layout of ['nodal', 'element-nodal'] as const) {
      it(`${type}, ${layout}: 5 cases and 2 combinations, three planes, with and without regions, to 1e-9`, () => {
        const seed = 15_200 + 10 * types.indexOf(type) + (layout === 'nodal' ? 0 : 5)
        console.log(`seed ${seed}`)
        for (const [name, plane] of planes) {
          // planes through nodes need the nodes where the grid put them
          const mesh = warpedAssembly(type, name === 'oblique')
          const fields = layout === 'nodal' ? [0, 1, 2, 3, 4].map((k) => nodalCase(mesh, seed + 100 * k)) : elementNodalCases(mesh, seed, 5)
          const cases = fields.map((field, k) => ({ name: `c${k}`, field }))
          const combos: Combination[] = [{ name: 'K1', factors: { c0: 1.35, c3: 1.5 } }, { name: 'K2', factors: { c1: -0.7, c2: 1, c4: 0.25 } }]
          const sum = (f: Record<string, number>): StressField => {
            const v = new Float64Array(fields[0].values.length)
            for (const [c, x] of Object.entries(f)) { const s = fields[Number(c.slice(1))].values; for (let i = 0; i < v.length; i++) v[i] += x * s[i] }
            return { ...fields[0], values: v }
          }
          const all = [...fields, ...combos.map((k) => sum(k.factors))]
          for (const regions of [false, true]) {
            const env = sectionEnvelope(mesh, cases, combos, plane, { regions })
            expect(env.cases.map((c) => c.name)).toEqual(['c0', 'c1', 'c2', 'c3', 'c4', 'K1', 'K2'])
            all.forEach((field, k) => {
              const single = cutSection(mesh, field, [0, 0, 0], plane, { regions }).result
              const what = `${name}, regions ${regions}, ${env.cases[k].name}`
              expect(single.empty, what).toBeFalsy()
              expectSame(env.cases[k].section, single, what)
              if (!regions) return
              expect(env.cases[k].regions.length, what).toBe(single.regions!.length)
              // the single cut orders regions by force, the envelope by area: match by centroid
              for (const g of env.cases[k].regions) {
                const twin = single.regions!.find((x) => Math.hypot(x.centroid[0] - g.centroid[0], x.centroid[1] - g.centroid[1], x.centroid[2] - g.centroid[2]) < 1e-9)
                expect(twin, what).toBeDefined()
                expect(rel(g.force, twin!.force), `${what} region force`).toBeLessThan(1e-9)
                expect(rel(g.moment, twin!.moment), `${what} region moment`).toBeLessThan(1e-9)
              }
            })
          }
        }
      })
    }
  }
})
