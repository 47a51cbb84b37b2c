import { describe, expect, it } from 'vitest'
import { isInputError } from '../../src/model/errors.ts'
import type { Vec3 } from '../../src/model/model.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import { shapeValues } from '../../src/mechanics/shapeFunctions.ts'
import type { SectionResult } from '../../src/mechanics/types.ts'
import {
  anyBox, cutNodal, nodalStress, norm, rotateModel, rotateVec, rotationFromQuaternion, scaleMesh, sweepNodal, tractionOf, uniformStress,
} from '../helpers/sectionMeshes.ts'
import type { BoxKind } from '../helpers/sectionMeshes.ts'

// Unit cells: a 3 × 3 × 3 box of 3 cells per side, so nodes sit at integer coordinates.
const KINDS: BoxKind[] = [...ELEMENT_TYPE_NAMES, 'mixed']
const S6 = [3, -2, 5, 1.5, -0.5, 0.7]
const ZERO: Vec3 = [0, 0, 0]

function allFinite(r: SectionResult): boolean {
  const walk = (v: unknown): boolean =>
    typeof v === 'number' ? Number.isFinite(v) : Array.isArray(v) ? v.every(walk)
      : typeof v === 'object' && v !== null ? Object.values(v).every(walk) : true
  return walk(r)
}

/** Uniform stress (Cauchy's formula, Malvern ch. 3): F = σm·A exactly, free body balanced. */
function expectUniform(r: SectionResult, area: number): void {
  expect(allFinite(r)).toBe(true)
  expect(Math.abs(r.area - area)).toBeLessThan(1e-12 * area)
  const t = tractionOf(S6, r.plane.normal)
  for (let k = 0; k < 3; k++) expect(Math.abs(r.force[k] - t[k] * area)).toBeLessThan(1e-12 * 10 * area)
  expect(r.freeBody.relative).toBeLessThan(1e-12)
}

describe.each(KINDS)('edge cases, %s box', (kind) => {
  const mesh = anyBox(kind, 3, 3, 3, 3, 3, 3)
  const stress = uniformStress(mesh, S6)

  // d == 0 counts as the + side: a plane along a layer of element faces is taken once, from the
  // elements below it, so the area is the box's cross-section and not twice it.
  it('plane along element faces (through a node layer): counted once', () => {
    expectUniform(cutNodal(mesh, stress, ZERO, { point: [0.3, 0.4, 1], normal: [0, 0, 1] }).result, 9)
    expectUniform(cutNodal(mesh, stress, ZERO, { point: [2, 0.4, 0.2], normal: [-1, 0, 0] }).result, 9)
  })

  // Plane x + y + z = 2 through the nodes (2,0,0), (1,1,0), (0,1,1)...: it cuts the box in the
  // equilateral triangle with vertices (2,0,0), (0,2,0), (0,0,2), side 2√2, area (√3/4)(2√2)² = 2√3.
  it('oblique plane through many nodes: the exact triangle 2√3', () => {
    expectUniform(cutNodal(mesh, stress, ZERO, { point: [1, 1, 0], normal: [1, 1, 1] }).result, 2 * Math.sqrt(3))
  })

  it('plane tangent to the body: top face taken once, bottom face, edge and corner give an empty section', () => {
    // top face z = 3: the elements below it touch the plane, the section is that face
    expectUniform(cutNodal(mesh, stress, ZERO, { point: [0, 0, 3], normal: [0, 0, 1] }).result, 9)
    for (const plane of [
      { point: [0, 0, 0], normal: [0, 0, 1] }, // bottom face: nothing on the - side
      { point: [3, 0, 3], normal: [1, 0, 1] }, // touches the edge x = 3, z = 3 only
      { point: [3, 3, 3], normal: [1, 1, 1] }, // touches the corner (3, 3, 3) only
      { point: [0, 0, 0], normal: [1, 1, 1] }, // touches the corner (0, 0, 0) only
    ] as { point: Vec3; normal: Vec3 }[]) {
      const r = cutNodal(mesh, stress, ZERO, plane).result
      expect(allFinite(r)).toBe(true)
      expect(r.empty).toBe(true)
      expect(r.area).toBe(0)
    }
  })

  it('plane missing the body: empty, zeros, no NaN', () => {
    for (const z of [10, -5]) {
      const { result: r, polygons } = cutNodal(mesh, stress, [0, 0, -9.81], { point: [1, 1, z], normal: [0, 0.2, 1] }, { polygons: true })
      expect(r.empty).toBe(true)
      expect(allFinite(r)).toBe(true)
      expect([r.area, r.axial, r.torque, norm(r.force), norm(r.moment), r.freeBody.relative, r.cutElements]).toEqual([0, 0, 0, 0, 0, 0, 0])
      expect(polygons!.count).toBe(0)
    }
  })
})

describe('edge cases of the input', () => {
  const mesh = anyBox('hex8', 2, 2, 2, 1, 1, 1)
  const stress = uniformStress(mesh, S6)

  it('zero or non-finite normal: InputError bad-argument', () => {
    for (const normal of [[0, 0, 0], [Number.NaN, 0, 1], [Infinity, 0, 0]] as Vec3[]) {
      let caught: unknown = null
      try { cutNodal(mesh, stress, ZERO, { point: [0.5, 0.5, 0.5], normal }) } catch (e) { caught = e }
      expect(isInputError(caught) && caught.kind === 'bad-argument').toBe(true)
      expect((caught as Error).message).toMatch(/normal/)
    }
    expect(() => sweepNodal(mesh, stress, ZERO, [0, 0, 0], 0, 1, 5)).toThrow(/direction/)
    expect(() => sweepNodal(mesh, stress, ZERO, [0, 0, 1], 0, 1, 0)).toThrow(/count/)
  })

  it('the normal need not be unit: it is normalised', () => {
    const a = cutNodal(mesh, stress, ZERO, { point: [0.5, 0.5, 0.3], normal: [0, 0, 7] }).result
    expect(a.plane.normal).toEqual([0, 0, 1])
    expectUniform(a, 1)
  })

  // Statics: moving the moment point by Δ changes the moment by (c - p) × F.
  it('moment about a given point = moment about the centroid + (c - p) × F', () => {
    const field = (x: number, y: number, z: number) => [1 + x, 2 - y, 3 * z, x * y, z, -x]
    const s = nodalStress(mesh, field)
    const plane = { point: [0.4, 0.5, 0.6] as Vec3, normal: [0.3, -0.4, 1] as Vec3 }
    const c = cutNodal(mesh, s, ZERO, plane).result
    const p: Vec3 = [2, -1, 0.5]
    const q = cutNodal(mesh, s, ZERO, plane, { about: p }).result
    const d = [c.centroid[0] - p[0], c.centroid[1] - p[1], c.centroid[2] - p[2]]
    const F = c.force
    const expectM = [c.moment[0] + d[1] * F[2] - d[2] * F[1], c.moment[1] + d[2] * F[0] - d[0] * F[2], c.moment[2] + d[0] * F[1] - d[1] * F[0]]
    for (let k = 0; k < 3; k++) expect(q.moment[k]).toBeCloseTo(expectM[k], 12)
    expect(q.about).toEqual(p)
  })

  it.each([...ELEMENT_TYPE_NAMES])('%s polygons for drawing: one per cut element, areas, forces and tractions add up, ξ maps to the vertex', (type) => {
    const big = anyBox(type, 3, 3, 3, 1, 1, 1)
    const s = uniformStress(big, S6)
    const { result: r, polygons } = cutNodal(big, s, ZERO, { point: [0.5, 0.5, 0.5], normal: [0.2, 0.3, 1] }, { polygons: true })
    const P = polygons!
    expect(P.count).toBe(r.cutElements)
    expect(P.start[P.count]).toBe(P.positions.length / 3)
    let area = 0, polyArea = 0
    const force = [0, 0, 0]
    const m = r.plane.normal, t = tractionOf(S6, m)
    for (let p = 0; p < P.count; p++) {
      const v = (i: number) => [P.positions[3 * i], P.positions[3 * i + 1], P.positions[3 * i + 2]]
      const a0 = v(P.start[p])
      for (let i = P.start[p] + 1; i < P.start[p + 1] - 1; i++) {
        const e1 = v(i).map((x, k) => x - a0[k]), e2 = v(i + 1).map((x, k) => x - a0[k])
        const n = [e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2], e1[0] * e2[1] - e1[1] * e2[0]]
        area += 0.5 * (n[0] * m[0] + n[1] * m[1] + n[2] * m[2]) // positive: polygons face +m
      }
      for (let i = P.start[p]; i < P.start[p + 1]; i++) for (let k = 0; k < 3; k++) expect(P.traction[3 * i + k]).toBeCloseTo(t[k], 12)
      expect(P.elem[p]).toBeGreaterThanOrEqual(0)
      expect(P.elem[p]).toBeLessThan(big.elementCount)
      // each vertex's reference coordinates map to the vertex through its element's shape functions
      const blk = big.blocks[0], nn = ELEMENT_TYPES[type].nodeCount, e = P.elem[p] - blk.offset
      for (let i = P.start[p]; i < P.start[p + 1]; i++) {
        const N = shapeValues(type, P.reference[3 * i], P.reference[3 * i + 1], P.reference[3 * i + 2], new Float64Array(nn))
        for (let k = 0; k < 3; k++) {
          let x = 0
          for (let a = 0; a < nn; a++) x += N[a] * big.coords[3 * blk.conn[e * nn + a] + k]
          expect(Math.abs(x - P.positions[3 * i + k])).toBeLessThan(1e-14)
        }
      }
      for (let k = 0; k < 3; k++) force[k] += P.force[3 * p + k]
      polyArea += P.area[p]
    }
    expect(area).toBeCloseTo(r.area, 12)
    expect(polyArea).toBeCloseTo(r.area, 12)
    for (let k = 0; k < 3; k++) expect(force[k]).toBeCloseTo(r.force[k], 12)
  })

  // A node layer that lies in the plane only up to round-off (the box turned by Q) must still be
  // taken once: the snap band treats those nodes as lying on the plane.
  it.each([...ELEMENT_TYPE_NAMES])('%s turned: a plane on a node layer is still counted once', (type) => {
    const box = anyBox(type, 3, 3, 3, 3, 3, 3)
    const Q = rotationFromQuaternion(0.7, -0.3, 0.5, 0.4)
    const rot = rotateModel(box, uniformStress(box, S6), Q)
    for (const z of [1, 2, 3]) {
      const { result: r } = cutNodal(rot.mesh, rot.stress, ZERO, { point: rotateVec(Q, [0.5, 0.5, z]), normal: rotateVec(Q, [0, 0, 1]) })
      expect(Math.abs(r.area - 9)).toBeLessThan(1e-12 * 9)
      expect(r.freeBody.relative).toBeLessThan(1e-12)
    }
  })

  // Scale invariance (dimensional analysis): lengths × k give area × k², force × k² (same stress),
  // moment × k³, second moments × k⁴, with the same relative accuracy at 1e-9 and 1e9.
  it.each([1e-9, 1e9])('coordinates scaled by %s keep relative accuracy', (k) => {
    const field = (x: number, y: number, z: number) => [10 + 3 * x, -4 + 2 * y - z, 1 + x, 2 * z, -1 + y, x - z]
    const box = anyBox('tet4', 3, 2, 2, 2, 1.5, 1)
    const ref = cutNodal(box, nodalStress(box, field), ZERO, { point: [0.9, 0.7, 0.45], normal: [0.3, 1, -0.2] }).result
    const scaled = scaleMesh(box, k)
    // the same stress at the same material points
    const s = nodalStress(scaled, (x, y, z) => field(x / k, y / k, z / k))
    const r = cutNodal(scaled, s, ZERO, { point: [0.9 * k, 0.7 * k, 0.45 * k], normal: [0.3, 1, -0.2] }).result
    expect(r.area / k ** 2).toBeCloseTo(ref.area, 12)
    for (let i = 0; i < 3; i++) {
      expect(Math.abs(r.force[i] / k ** 2 - ref.force[i])).toBeLessThan(1e-12 * norm(ref.force))
      expect(Math.abs(r.moment[i] / k ** 3 - ref.moment[i])).toBeLessThan(1e-12 * (norm(ref.moment) + norm(ref.force)))
      expect(Math.abs(r.centroid[i] / k - ref.centroid[i])).toBeLessThan(1e-12)
    }
    expect(Math.abs(r.secondMoments.I1 / k ** 4 - ref.secondMoments.I1)).toBeLessThan(1e-12 * ref.secondMoments.I1)
    expect(Math.abs(r.secondMoments.I2 / k ** 4 - ref.secondMoments.I2)).toBeLessThan(1e-12 * ref.secondMoments.I1)
    expect(Math.abs(r.freeBody.relative - ref.freeBody.relative)).toBeLessThan(1e-12)
  })
})
