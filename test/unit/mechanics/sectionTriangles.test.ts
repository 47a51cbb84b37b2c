import { describe, expect, it } from 'vitest'
import { buildSectionTriangles } from '../../../src/mechanics/sectionTriangles.ts'
import { sectionStressAt } from '../../../src/mechanics/sectionDrawing.ts'
import { shapeDegree } from '../../../src/mechanics/sectionRule.ts'
import { ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { Vec3 } from '../../../src/model/model.ts'
import { exactFields, singleElement, stressOf } from '../../helpers/sectionElements.ts'
import { anyBox, cutNodal, nodalStress, tractionOf } from '../../helpers/sectionMeshes.ts'
import { quarterCylinder } from '../../helpers/mappedMeshes.ts'

const ZERO: Vec3 = [0, 0, 0]

describe('buildSectionTriangles', () => {
  // Box of 2 × 1 × 1 cells, plane x + 2y + 3z = 1.7 cutting both cells.
  it.each([...ELEMENT_TYPE_NAMES])('%s: fill triangles cover each polygon once, n - 2 (linear) or 4(n - 2) (other types) per n-gon', (type) => {
    const mesh = anyBox(type, 2, 1, 1, 2, 1, 1)
    const { polygons } = cutNodal(mesh, nodalStress(mesh, () => [1, 2, 3, 0.5, 0.25, -1]), ZERO, { point: [0.6, 0.3, 0.2], normal: [1, 2, 3] }, { polygons: true })
    const P = polygons!
    const s = buildSectionTriangles(P, [2, 4, 6])
    const split = shapeDegree(type) > 1 ? 4 : 1
    let T = 0
    for (let p = 0; p < P.count; p++) T += split * (P.start[p + 1] - P.start[p] - 2)
    expect(s.index.length).toBe(3 * T)
    expect(s.triangleElement.length).toBe(T)
    const m = [1, 2, 3].map((v) => v / Math.hypot(1, 2, 3))
    // fill triangles face +m and their areas add up to the polygons' areas
    let area = 0, polyArea = 0
    for (let t = 0; t < T; t++) {
      const [a, b, c] = [s.index[3 * t], s.index[3 * t + 1], s.index[3 * t + 2]]
      const u = [0, 1, 2].map((k) => s.positions[3 * b + k] - s.positions[3 * a + k])
      const v = [0, 1, 2].map((k) => s.positions[3 * c + k] - s.positions[3 * a + k])
      const n = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]]
      const at = 0.5 * (n[0] * m[0] + n[1] * m[1] + n[2] * m[2])
      expect(at).toBeGreaterThan(0)
      area += at
    }
    for (let p = 0; p < P.count; p++) polyArea += P.area[p]
    expect(area).toBeCloseTo(polyArea, 5) // float32 positions
    // uniform stress (Cauchy's formula): every fill point carries σm
    const t = tractionOf([1, 2, 3, 0.5, 0.25, -1], m)
    const tn = t[0] * m[0] + t[1] * m[1] + t[2] * m[2]
    for (let i = 0; i < s.normalTraction.length; i++) expect(s.normalTraction[i]).toBeCloseTo(tn, 5)
    expect(s.normal.map((v, k) => v - m[k]).every((d) => Math.abs(d) < 1e-15)).toBe(true)
  })

  // The fill points carry the element's own interpolation: for a field the element represents
  // exactly, the colour value at every point (vertices and edge midpoints) is the field there.
  it.each([...ELEMENT_TYPE_NAMES])('%s: fill values equal an exactly represented field at every fill point', (type) => {
    const fields = exactFields(type)
    const coef = Array.from({ length: 6 }, (_, i) => fields.map((_, j) => Math.sin(1 + 3 * i + 7 * j)))
    const sigma = stressOf(fields, coef)
    const mesh = singleElement(type, [1.3, 0.8, 1.1], [0.2, -0.4, 0.7])
    const centre = [0, 1, 2].map((k) => { let s = 0; for (let a = 0; a < mesh.nodeCount; a++) s += mesh.coords[3 * a + k]; return s / mesh.nodeCount }) as Vec3
    const m: Vec3 = [0.3, -0.5, 0.81]
    const { polygons } = cutNodal(mesh, nodalStress(mesh, sigma), ZERO, { point: centre, normal: m }, { polygons: true })
    const P = polygons!
    expect(P.count).toBe(1)
    const ml = Math.hypot(...m)
    const mu = m.map((v) => v / ml)
    const fill = P.fill
    for (let i = 0; i < fill.positions.length / 3; i++) {
      const s = sigma(fill.positions[3 * i], fill.positions[3 * i + 1], fill.positions[3 * i + 2])
      const t = tractionOf(s, mu)
      for (let k = 0; k < 3; k++) expect(Math.abs(fill.traction[3 * i + k] - t[k])).toBeLessThan(1e-12 * 10)
    }
    // and the probe on the section reads the same field at any point of the polygon
    const out = new Float64Array(6)
    const q: Vec3 = [0, 1, 2].map((k) => (P.positions[k] + P.positions[3 + k] + P.positions[6 + k]) / 3) as Vec3
    expect(sectionStressAt(out, mesh, nodalStressField(mesh, nodalStress(mesh, sigma)), P, 0, q)).toBe(true)
    const s = sigma(q[0], q[1], q[2])
    for (let k = 0; k < 6; k++) expect(Math.abs(out[k] - s[k])).toBeLessThan(1e-12 * 10)
  })

  // On a curved element the fill midpoints and the probe invert the element map (inverseMap.ts):
  // a field linear in x is represented exactly by any isoparametric element, so the values at
  // every fill point of a curved quarter ring must still be the field there.
  it.each(['tet10', 'hex20'] as const)('%s curved ring: fill points and probe follow the inverted map', (type) => {
    const mesh = quarterCylinder({ a: 1, b: 2, length: 0.5, nr: 2, ntheta: 3, nz: 1 }, type)
    const lin = (x: number, y: number, z: number) => [1 + x, 2 - y, z, x + y, 0.5 * z, -x]
    const field = nodalStress(mesh, lin)
    const m: Vec3 = [-Math.sin(0.6), Math.cos(0.6), 0]
    const { result, polygons } = cutNodal(mesh, field, ZERO, { point: [0, 0, 0.2], normal: m }, { polygons: true })
    expect(result.unmappedPoints).toBe(0)
    const fill = polygons!.fill
    for (let i = 0; i < fill.positions.length / 3; i++) {
      const t = tractionOf(lin(fill.positions[3 * i], fill.positions[3 * i + 1], fill.positions[3 * i + 2]), m)
      for (let k = 0; k < 3; k++) expect(Math.abs(fill.traction[3 * i + k] - t[k])).toBeLessThan(1e-11)
    }
  })
})
