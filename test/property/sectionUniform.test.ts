import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import type { Vec3 } from '../../src/model/model.ts'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import {
  anyBox, cutNodal, nodalStress, norm, rotateModel, rotateVec, rotationFromQuaternion, tractionOf, uniformStress,
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

  // Objectivity (REFERENCES.md): turning the whole model by Q (x' = Qx, σ' = QσQᵀ) turns every
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
