import { describe, expect, it } from 'vitest'
import { nodalStressField } from '../../src/model/stressField.ts'
import fc from 'fast-check'
import type { Vec3 } from '../../src/model/model.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { Mesh } from '../../src/model/model.ts'
import type { StressField } from '../../src/model/stressField.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { freeBodyTractions } from '../../src/mechanics/freeBody.ts'
import { sweepSections } from '../../src/mechanics/sectionSweep.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { quarterCylinder } from '../helpers/mappedMeshes.ts'
import {
  anyBox, cutNodal, nodalStress, norm, rotateModel, rotateVec, rotationFromQuaternion, sweepNodal, tractionOf, uniformStress,
} from '../helpers/sectionMeshes.ts'
import type { BoxKind } from '../helpers/sectionMeshes.ts'

const KINDS: BoxKind[] = [...ELEMENT_TYPE_NAMES, 'mixed']
const LX = 2, LY = 1.5, LZ = 1
const SEED = 20261201
const ZERO: Vec3 = [0, 0, 0]

// values below 1e-6 in size are taken as 0: subnormal numbers carry no relative precision
const stressArb = fc.array(fc.double({ min: -100, max: 100, noNaN: true }).map((v) => (Math.abs(v) < 1e-6 ? 0 : v)), { minLength: 6, maxLength: 6 })
const unitArb = fc.double({ min: 0.05, max: 0.95, noNaN: true })
const dirArb = fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 3, maxLength: 3 }).filter((v) => norm(v) > 0.1)

describe.each(KINDS)('uniform stress, random planes through a %s box', (kind) => {
  const mesh = anyBox(kind, 3, 2, 2, LX, LY, LZ)

  // Cauchy's formula on a uniform stress state (Malvern 1969, ch. 3): any section carries
  // F = σm·A and, about its centroid, M = 0; the cut-off piece is in equilibrium.
  it('F = σm·A, M about the centroid = 0, free body balanced', () => {
    fc.assert(fc.property(stressArb, unitArb, unitArb, unitArb, dirArb, (s6, px, py, pz, n) => {
      const stress = uniformStress(mesh, s6)
      const { result: r } = cutNodal(mesh, stress, ZERO, { point: [px * LX, py * LY, pz * LZ], normal: n as Vec3 })
      expect(r.empty).toBe(false)
      const m = r.plane.normal
      const t = tractionOf(s6, m)
      const scale = Math.max(1e-300, norm(s6.slice(0, 3)) + norm(s6.slice(3))) * r.area
      for (let k = 0; k < 3; k++) expect(Math.abs(r.force[k] - t[k] * r.area)).toBeLessThan(1e-12 * scale)
      expect(norm(r.moment)).toBeLessThan(1e-12 * scale * LX)
      expect(r.freeBody.relative).toBeLessThan(1e-10)
      expect(r.freeBody.momentRelative).toBeLessThan(1e-10)
    }), { seed: SEED, numRuns: 40 })
  })

  // Geometry of a box (elementary): a plane normal to an axis cuts the box in a rectangle whose
  // area is the product of the other two sides.
  it('axis-aligned planes: area = exact cross-section of the box', () => {
    fc.assert(fc.property(unitArb, fc.integer({ min: 0, max: 2 }), (u, axis) => {
      const stress = uniformStress(mesh, [1, 2, 3, 0, 0, 0])
      const L = [LX, LY, LZ]
      const point: Vec3 = [LX / 2, LY / 2, LZ / 2]
      point[axis] = u * L[axis]
      const normal: Vec3 = [0, 0, 0]
      normal[axis] = 1
      const { result: r } = cutNodal(mesh, stress, ZERO, { point, normal })
      const exact = (LX * LY * LZ) / L[axis]
      expect(Math.abs(r.area - exact)).toBeLessThan(1e-12 * exact)
      expect(Math.abs(r.axial - (1 + axis) * exact)).toBeLessThan(1e-12 * exact * 3)
    }), { seed: SEED + 1, numRuns: 20 })
  })

  // Objectivity (any continuum-mechanics text, e.g. Malvern 1969): turning the whole model by Q (x' = Qx, σ' = QσQᵀ) turns every
  // resultant with it, F' = QF, M' = QM. A linear stress field so the moment is not trivially 0.
  it('rotated model: F\' = QF, M\' = QM (linear stress field)', () => {
    const field = (x: number, y: number, z: number) => [10 + 3 * x, -4 + 2 * y - z, 1 + x * 0.5, 2 * z, -1 + y, 0.5 * x - z]
    const stress = nodalStress(mesh, field)
    fc.assert(fc.property(
      fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 4, maxLength: 4 }).filter((q) => Math.hypot(...q) > 0.1),
      unitArb, unitArb, unitArb, dirArb,
      (q, px, py, pz, n) => {
        const Q = rotationFromQuaternion(q[0], q[1], q[2], q[3])
        const point: Vec3 = [px * LX, py * LY, pz * LZ]
        const rot = rotateModel(mesh, stress, Q)
        const a = cutNodal(mesh, stress, ZERO, { point, normal: n as Vec3 }).result
        const b = cutNodal(rot.mesh, rot.stress, ZERO, { point: rotateVec(Q, point), normal: rotateVec(Q, n) }).result
        const QF = rotateVec(Q, a.force), QM = rotateVec(Q, a.moment), Qc = rotateVec(Q, a.centroid)
        const fs = norm(a.force) + 1e-3 * a.area, ms = norm(a.moment) + fs * LX
        expect(Math.abs(b.area - a.area)).toBeLessThan(1e-12 * a.area)
        for (let k = 0; k < 3; k++) {
          expect(Math.abs(b.force[k] - QF[k])).toBeLessThan(1e-10 * fs)
          expect(Math.abs(b.moment[k] - QM[k])).toBeLessThan(1e-10 * ms)
          expect(Math.abs(b.centroid[k] - Qc[k])).toBeLessThan(1e-12 * LX)
        }
        expect(Math.abs(b.secondMoments.I1 - a.secondMoments.I1)).toBeLessThan(1e-9 * a.secondMoments.I1)
        expect(Math.abs(b.secondMoments.I2 - a.secondMoments.I2)).toBeLessThan(1e-9 * a.secondMoments.I1)
      }), { seed: SEED + 2, numRuns: 15 })
  })
})

/**
 * Element-nodal stress through the StressField's row index: every element-node its own row.
 * `value(e, node)` gives the row of element e's node (global element index, mesh node index).
 */
function elementNodalField(mesh: Mesh, value: (e: number, node: number) => ArrayLike<number>): StressField {
  const rows: Int32Array[] = []
  let R = 0
  for (const b of mesh.blocks) R += b.conn.length
  const values = new Float64Array(6 * R)
  let r = 0
  for (const b of mesh.blocks) {
    const nn = ELEMENT_TYPES[b.type].nodeCount
    const idx = new Int32Array(b.conn.length)
    for (let i = 0; i < b.conn.length; i++, r++) {
      idx[i] = r
      values.set(value(b.offset + Math.floor(i / nn), b.conn[i]), 6 * r)
    }
    rows.push(idx)
  }
  return { values, rows, layout: 'element-nodal' }
}

describe.each(KINDS)('element-nodal stress, %s box', (kind) => {
  const mesh = anyBox(kind, 3, 2, 2, LX, LY, LZ)
  const field = (x: number, y: number, z: number) => [10 + 3 * x, -4 + 2 * y - z, 1 + x * 0.5, 2 * z, -1 + y, 0.5 * x - z]
  const plane = { point: [0.9, 0.7, 0.45] as Vec3, normal: [0.3, 1, -0.2] as Vec3 }

  // The same values read through the row index give bit-for-bit the nodal cut: one code path.
  it('rows holding the nodal values give the nodal cut exactly', () => {
    const nodal = nodalStress(mesh, field)
    const a = cutNodal(mesh, nodal, ZERO, plane).result
    const en = elementNodalField(mesh, (_, node) => nodal.subarray(6 * node, 6 * node + 6))
    const allFaces = extractBoundaryFaces(mesh)
    const tractions = computeSurfaceTractions(allocateSurfaceTractions(allFaces), mesh, nodalStressField(mesh, nodal), allFaces)
    const b = cutSection(mesh, en, ZERO, plane, { tractions }).result
    expect(b.force).toEqual(a.force)
    expect(b.moment).toEqual(a.moment)
    expect(b.freeBody.force).toEqual(a.freeBody.force)
    const sw = sweepSections(mesh, en, ZERO, plane.normal, 0.2, 1.4, 4, { tractions }).results
    const sn = sweepNodal(mesh, nodal, ZERO, plane.normal, 0.2, 1.4, 4).results
    sw.forEach((r, k) => expect(r.force).toEqual(sn[k].force))
  })

  // A stress constant in each element but jumping between elements (what element-nodal data
  // hold): the section force is Σ over the cut elements of σ_e m times their polygon's area
  // (Cauchy's formula on each piece).
  it('a stress constant per element, jumping between elements: F = Σ σ_e m A_e', () => {
    const s6 = (e: number) => [1 + (e % 5), -2 + (e % 3), 0.5 * (e % 7), 0.1 * e, -0.3, (e % 2) - 0.5]
    const en = elementNodalField(mesh, (e) => s6(e))
    const { result: r, polygons } = cutSection(mesh, en, ZERO, plane, { polygons: true, tractions: freeBodyTractions(mesh, nodalStressField(mesh, new Float64Array(6 * mesh.nodeCount)), extractBoundaryFaces(mesh)) })
    const m = r.plane.normal
    const F = [0, 0, 0]
    for (let p = 0; p < polygons!.count; p++) {
      const t = tractionOf(s6(polygons!.elem[p]), m)
      for (let k = 0; k < 3; k++) F[k] += t[k] * polygons!.area[p]
    }
    for (let k = 0; k < 3; k++) expect(Math.abs(r.force[k] - F[k])).toBeLessThan(1e-12 * 100 * r.area)
  })
})

describe.each(['tet10', 'hex20'] as const)('coarse curved %s rings, random planes', (type) => {
  // Five elements per quarter of a ring whose diagonal edges are spirals: chord points lie well
  // outside the curved elements, and every one must still be mapped (inverseMap.ts); uniform
  // stress gives F = σm·A over the chord polygons (Cauchy's formula, Malvern ch. 3).
  const mesh = quarterCylinder({ a: 1, b: 2, length: 0.5, nr: 2, ntheta: 5, nz: 2 }, type)
  it('every section point is mapped; F = σm·A', () => {
    fc.assert(fc.property(stressArb, fc.double({ min: 0.9, max: 1.7, noNaN: true }), dirArb, (s6, r, n) => {
      const stress = uniformStress(mesh, s6)
      const { result: res } = cutNodal(mesh, stress, ZERO, { point: [r * Math.SQRT1_2, r * Math.SQRT1_2, 0.25], normal: n as Vec3 }, { polygons: true })
      expect(res.empty).toBe(false)
      expect(res.unmappedPoints).toBe(0)
      const t = tractionOf(s6, res.plane.normal)
      const scale = Math.max(1e-300, norm(s6.slice(0, 3)) + norm(s6.slice(3))) * res.area
      for (let k = 0; k < 3; k++) expect(Math.abs(res.force[k] - t[k] * res.area)).toBeLessThan(1e-12 * scale)
    }), { seed: SEED + 5, numRuns: 60 })
  })
})
