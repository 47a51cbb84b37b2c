/**
 * Section axes (src/mechanics/sectionAxes.ts): the default reference, principal axes that follow
 * the reference where the principal moments are equal, reference axes with the second moments
 * about them, the refusal of a reference parallel to the normal, and the rotation of both kinds
 * with the body.
 */
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { defaultReference, projectReference } from '../../src/mechanics/sectionAxes.ts'
import { isInputError } from '../../src/model/errors.ts'
import type { Vec3 } from '../../src/model/model.ts'
import { anyBox, cutNodal, cylinderMesh, nodalStress, rotateModel, rotateVec, sweepNodal, uniformStress } from '../helpers/sectionMeshes.ts'
import { rotationFromUniforms } from '../helpers/rotation.ts'

const ZERO: Vec3 = [0, 0, 0]
const dot = (a: readonly number[], b: readonly number[]): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
const SEED = Number(process.env.TRACTUS_SEED ?? 20261203)

describe('default reference', () => {
  // Ours (sectionAxes.ts): the first of x, y, z whose projection onto the plane is longest.
  it.each([
    [[1, 0, 0], [0, 1, 0]], [[0, 1, 0], [1, 0, 0]], [[0, 0, 1], [1, 0, 0]], [[0, 0, -1], [1, 0, 0]],
    [[Math.SQRT1_2, Math.SQRT1_2, 0], [0, 0, 1]], [[0, Math.SQRT1_2, Math.SQRT1_2], [1, 0, 0]],
    [[1 / Math.sqrt(3), 1 / Math.sqrt(3), 1 / Math.sqrt(3)], [1, 0, 0]], [[0.2, 0.9, 0.387], [1, 0, 0]],
  ] as [Vec3, Vec3][])('normal %j → %j', (m, want) => {
    expect(defaultReference(m)).toEqual(want)
  })

  it('a reference parallel to the normal is refused with a message that names both', () => {
    let caught: unknown = null
    try { projectReference([0, 0, 1], [0, 0, -3]) } catch (e) { caught = e }
    expect(isInputError(caught)).toBe(true)
    expect((caught as Error).message).toMatch(/reference direction \(0, 0, -3\) is parallel to the section normal \(0, 0, 1\)/)
    const mesh = anyBox('hex8', 2, 2, 2, 1, 1, 1)
    expect(() => cutNodal(mesh, uniformStress(mesh, [1, 0, 0, 0, 0, 0]), ZERO, { point: [0.5, 0.5, 0.5], normal: [1, 0, 0] }, { axes: { kind: 'reference', reference: [2, 0, 0] } }))
      .toThrow(/parallel to the section normal/)
  })
})

describe('square bar: equal principal moments follow the reference', () => {
  // A square b × b (Roark, appendix: I = b⁴/12 about every centroidal axis) bent by σxx = k·(z − cz):
  // with r = x − c and t = σx̂ = (σxx, 0, 0), M = ∫ r × t dA = (0, ∫ r_z σxx dA, −∫ r_y σxx dA),
  // so My = k b⁴/12 and Mz = 0 (statics, common practice).
  const b = 0.15, L = 0.6, k = 2e8
  for (const kind of ['hex8', 'tet4'] as const) {
    it(`${kind}: cut normal to x gives e1 = y, e2 = z, so M1 = My and M2 = Mz`, () => {
      const mesh = anyBox(kind, 6, 3, 3, L, b, b)
      const stress = nodalStress(mesh, (_x, _y, z) => [k * (z - b / 2), 0, 0, 0, 0, 0])
      const { result: r } = cutNodal(mesh, stress, ZERO, { point: [0.075, 0, 0], normal: [1, 0, 0] })
      expect(r.axes.kind).toBe('principal')
      expect(r.axes.followsReference).toBe(true)
      expect(r.axes.reference).toEqual([0, 1, 0])
      for (let i = 0; i < 3; i++) {
        expect(r.axes.e1[i]).toBeCloseTo([0, 1, 0][i], 12)
        expect(r.axes.e2[i]).toBeCloseTo([0, 0, 1][i], 12)
      }
      const I = b ** 4 / 12
      expect(r.secondMoments.I1).toBeCloseTo(I, 15)
      expect(r.secondMoments.I2).toBeCloseTo(I, 15)
      expect(Math.abs(r.secondMoments.I12)).toBeLessThan(1e-12 * I)
      expect(r.moment[1]).toBeCloseTo(k * I, 6)
      expect(r.bending[0]).toBeCloseTo(r.moment[1], 9)
      expect(r.bending[1]).toBeCloseTo(r.moment[2], 9)
    })
  }

  it('an annulus cut normal to z (a tunnel in a block has the same symmetry) takes e1 = x, e2 = y', () => {
    const mesh = cylinderMesh(0.3, 0.5, 0.4, 2, 32, 2, 'hex8')
    const { result: r } = cutNodal(mesh, uniformStress(mesh, [0, 0, 1, 0, 0, 0]), ZERO, { point: [0, 0, 0.13], normal: [0, 0, 1] })
    expect(r.axes.followsReference).toBe(true)
    expect(r.axes.e1[0]).toBeCloseTo(1, 12)
    expect(r.axes.e2[1]).toBeCloseTo(1, 12)
  })

  it('a rectangle 1 % off square still follows the reference; 3 % off takes its principal axes', () => {
    // Section 1 (y) × h (z): I about y = h³/12, about z = h/12, so I1/I2 = h²: h = 1.004 gives
    // 0.8 % (follows the reference y), h = 1.015 gives 3 % (principal; the stiff axis is y).
    for (const [h, follows] of [[1.004, true], [1.015, false]] as const) {
      const mesh = anyBox('hex8', 4, 2, 2, 2, 1, h)
      const { result: r } = cutNodal(mesh, uniformStress(mesh, [1, 0, 0, 0, 0, 0]), ZERO, { point: [1, 0, 0], normal: [1, 0, 0] })
      expect(r.axes.followsReference).toBe(follows)
      // The stiff axis of a section deeper in z than wide in y is y (I = b h³/12 about y).
      expect(r.axes.e1[1]).toBeCloseTo(1, 12)
      expect(r.secondMoments.I1).toBeGreaterThanOrEqual(r.secondMoments.I2)
    }
  })
})

describe('reference axes: second moments about turned axes', () => {
  // Gere, Mechanics of Materials (rotation of axes): for axes x1, y1 turned by θ from x, y,
  // Ix1 = (Ix + Iy)/2 + (Ix − Iy)/2 cos 2θ − Ixy sin 2θ, Ix1y1 = (Ix − Iy)/2 sin 2θ + Ixy cos 2θ.
  const b = 0.6, h = 1.5, L = 2
  const Ix = (b * h ** 3) / 12, Iy = (h * b ** 3) / 12
  it.each([0, 0.3, 1.1, 2.5, -0.7])('θ = %f rad', (theta) => {
    const mesh = anyBox('hex8', 3, 4, 4, b, h, L)
    const ref: Vec3 = [Math.cos(theta), Math.sin(theta), 0.4] // the z part is projected away
    const { result: r } = cutNodal(mesh, uniformStress(mesh, [0, 0, 0, 0, 0, 0]), ZERO, { point: [b / 2, h / 2, 0.7], normal: [0, 0, 1] }, { axes: { kind: 'reference', reference: ref } })
    expect(r.axes.kind).toBe('reference')
    expect(r.axes.e1[0]).toBeCloseTo(Math.cos(theta), 12)
    expect(r.axes.e1[1]).toBeCloseTo(Math.sin(theta), 12)
    expect(r.axes.e2[0]).toBeCloseTo(-Math.sin(theta), 12)
    const c2 = Math.cos(2 * theta), s2 = Math.sin(2 * theta)
    expect(r.secondMoments.I1).toBeCloseTo((Ix + Iy) / 2 + ((Ix - Iy) / 2) * c2, 12)
    expect(r.secondMoments.I2).toBeCloseTo((Ix + Iy) / 2 - ((Ix - Iy) / 2) * c2, 12)
    expect(r.secondMoments.I12).toBeCloseTo(((Ix - Iy) / 2) * s2, 12)
    expect(r.secondMoments.J).toBeCloseTo(Ix + Iy, 12)
  })

  it('a sweep resolves every section in the one reference it is given', () => {
    const mesh = anyBox('tet4', 6, 2, 3, 3, 0.5, 0.8)
    const stress = uniformStress(mesh, [0, 0, 0, 2, 0, 1])
    const ref: Vec3 = [0, 1, 1]
    const { results } = sweepNodal(mesh, stress, ZERO, [1, 0, 0], 0.2, 2.8, 7, { axes: { kind: 'reference', reference: ref } })
    for (const r of results) {
      expect(r.axes.kind).toBe('reference')
      expect(r.axes.e1[1]).toBeCloseTo(Math.SQRT1_2, 12)
      expect(r.axes.e1[2]).toBeCloseTo(Math.SQRT1_2, 12)
      expect(r.shear[0]).toBeCloseTo(dot(r.force, r.axes.e1), 9)
    }
  })
})

describe('both kinds turn with the body (objectivity)', () => {
  it(`random rotations, principal and reference axes (fast-check seed ${SEED})`, () => {
    console.log(`sectionAxes objectivity fast-check seed ${SEED} (set TRACTUS_SEED to replay)`)
    const mesh = anyBox('hex8', 3, 4, 4, 0.6, 1.5, 2)
    const stress = nodalStress(mesh, (x, y) => [0, 0, 3 + x - 2 * y, 0.5, 0.2, 0])
    const point: Vec3 = [0.3, 0.75, 0.9], m: Vec3 = [0, 0, 1], ref: Vec3 = [1, 2, 0]
    const base = {
      principal: cutNodal(mesh, stress, ZERO, { point, normal: m }).result,
      reference: cutNodal(mesh, stress, ZERO, { point, normal: m }, { axes: { kind: 'reference', reference: ref } }).result,
    }
    fc.assert(fc.property(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (u1, u2, u3) => {
      const Q = rotationFromUniforms(u1, u2, u3)
      const rot = rotateModel(mesh, stress, Q)
      const plane = { point: rotateVec(Q, point), normal: rotateVec(Q, m) }
      const got = {
        principal: cutNodal(rot.mesh, rot.stress, ZERO, plane, { axes: { kind: 'principal', reference: rotateVec(Q, [1, 0, 0]) } }).result,
        reference: cutNodal(rot.mesh, rot.stress, ZERO, plane, { axes: { kind: 'reference', reference: rotateVec(Q, ref) } }).result,
      }
      for (const kind of ['principal', 'reference'] as const) {
        const a = base[kind], g = got[kind]
        const e1 = rotateVec(Q, a.axes.e1), e2 = rotateVec(Q, a.axes.e2)
        for (let i = 0; i < 3; i++) {
          expect(g.axes.e1[i]).toBeCloseTo(e1[i], 9)
          expect(g.axes.e2[i]).toBeCloseTo(e2[i], 9)
        }
        expect(g.bending[0]).toBeCloseTo(a.bending[0], 9)
        expect(g.bending[1]).toBeCloseTo(a.bending[1], 9)
        expect(g.shear[0]).toBeCloseTo(a.shear[0], 9)
        expect(g.secondMoments.I12).toBeCloseTo(a.secondMoments.I12, 12)
      }
    }), { seed: SEED, numRuns: 25 })
  })
})
