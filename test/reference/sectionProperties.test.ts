import { describe, expect, it } from 'vitest'
import type { Vec3 } from '../../src/model/model.ts'
import {
  anyBox, cutNodal, cylinderMesh, rotateModel, rotateVec, rotationFromQuaternion, uniformStress,
} from '../helpers/sectionMeshes.ts'
import type { BoxKind } from '../helpers/sectionMeshes.ts'

const ZERO: Vec3 = [0, 0, 0]

describe('section properties of a rectangle', () => {
  // Roark's Formulas for Stress and Strain, appendix (properties of sections): a rectangle of
  // width b and depth h has I = b h³/12 about the centroidal axis parallel to b and h b³/12
  // about the one parallel to h.
  const b = 0.6, h = 1.5, L = 2
  const Ib = (b * h ** 3) / 12, Ih = (h * b ** 3) / 12
  it.each(['hex8', 'tet4', 'wedge6', 'hex20', 'tet10', 'mixed'] as BoxKind[])('%s: I1 = b h³/12 about x, I2 = h b³/12 about y', (kind) => {
    // section normal z through a box b (x) × h (y) × L (z); the mixed box is built along x, so
    // there the section is normal x through L (x) × b (y) × h (z), b along y and h along z
    const mixed = kind === 'mixed'
    const mesh = mixed ? anyBox('mixed', 6, 3, 4, L, b, h) : anyBox(kind, 3, 4, 5, b, h, L)
    const stress = uniformStress(mesh, [0, 0, 0, 0, 0, 0])
    const point: Vec3 = mixed ? [0.613 * L, b / 2, h / 2] : [b / 2, h / 2, 0.613 * L]
    const { result: r } = cutNodal(mesh, stress, ZERO, { point, normal: mixed ? [1, 0, 0] : [0, 0, 1] })
    const bAxis = mixed ? 1 : 0, hAxis = mixed ? 2 : 1
    expect(r.area).toBeCloseTo(b * h, 12)
    expect(r.centroid[bAxis]).toBeCloseTo(b / 2, 12)
    expect(r.centroid[hAxis]).toBeCloseTo(h / 2, 12)
    expect(Math.abs(r.secondMoments.I1 - Ib)).toBeLessThan(1e-12 * Ib)
    expect(Math.abs(r.secondMoments.I2 - Ih)).toBeLessThan(1e-12 * Ib)
    expect(Math.abs(r.secondMoments.J - (Ib + Ih))).toBeLessThan(1e-12 * Ib)
    // e1 along the side b (I1 = b h³/12 is about that axis), e2 along h, e1 × e2 = e3 = m
    expect(Math.abs(Math.abs(r.axes.e1[bAxis]) - 1)).toBeLessThan(1e-12)
    expect(Math.abs(Math.abs(r.axes.e2[hAxis]) - 1)).toBeLessThan(1e-12)
    const { e1, e2, e3 } = r.axes
    const c = [e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2], e1[0] * e2[1] - e1[1] * e2[0]]
    for (let k = 0; k < 3; k++) expect(c[k]).toBeCloseTo(e3[k], 12)
  })

  it('turned rectangle: the same I1, I2, axes turned with the body (objectivity)', () => {
    const mesh = anyBox('hex8', 3, 4, 5, b, h, L)
    const Q = rotationFromQuaternion(0.9, 0.2, -0.3, 0.25)
    const rot = rotateModel(mesh, uniformStress(mesh, [0, 0, 0, 0, 0, 0]), Q)
    const { result: r } = cutNodal(rot.mesh, rot.stress, ZERO, { point: rotateVec(Q, [b / 2, h / 2, 0.4 * L]), normal: rotateVec(Q, [0, 0, 1]) })
    expect(Math.abs(r.secondMoments.I1 - Ib)).toBeLessThan(1e-12 * Ib)
    expect(Math.abs(r.secondMoments.I2 - Ih)).toBeLessThan(1e-12 * Ib)
    const x = rotateVec(Q, [1, 0, 0])
    expect(Math.abs(Math.abs(r.axes.e1[0] * x[0] + r.axes.e1[1] * x[1] + r.axes.e1[2] * x[2]) - 1)).toBeLessThan(1e-12)
  })
})

describe('annular section of a cylinder mesh', () => {
  // Roark appendix: annulus of outer diameter D and inner d: A = π(D² - d²)/4,
  // I = π(D⁴ - d⁴)/64 about any diameter. The mesh section is the ring between two regular
  // n-gons inscribed in the circles; its exact values follow from triangles (O, P1, P2) with
  // |P1| = |P2| = R at angle α = 2π/n (elementary integration): area R² sin α / 2 and polar moment
  // about O, J = A/6 (|P1|² + |P2|² + P1·P2) = R⁴ sin α (2 + cos α)/12; a regular n-gon's
  // centroidal I about any axis is half its J.
  const a = 0.3, b = 0.5, D = 2 * b, d = 2 * a
  const Iexact = (Math.PI * (D ** 4 - d ** 4)) / 64
  const ngon = (R: number, n: number) => {
    const al = (2 * Math.PI) / n
    return { A: (n * R * R * Math.sin(al)) / 2, I: (n * R ** 4 * Math.sin(al) * (2 + Math.cos(al))) / 24 }
  }
  it.each(['hex8', 'tet4'] as const)('%s: equals the polygon ring exactly and converges to π(D⁴-d⁴)/64', (type) => {
    const errors: number[] = []
    for (const n of [16, 32, 64, 128]) {
      const mesh = cylinderMesh(a, b, 0.4, 2, n, 2, type)
      const { result: r } = cutNodal(mesh, uniformStress(mesh, [0, 0, 0, 0, 0, 0]), ZERO, { point: [0, 0, 0.137], normal: [0, 0, 1] })
      const ring = { A: ngon(b, n).A - ngon(a, n).A, I: ngon(b, n).I - ngon(a, n).I }
      expect(Math.abs(r.area - ring.A)).toBeLessThan(1e-12 * ring.A)
      expect(Math.abs(r.secondMoments.I1 - ring.I)).toBeLessThan(1e-11 * ring.I)
      expect(Math.abs(r.secondMoments.I2 - ring.I)).toBeLessThan(1e-11 * ring.I)
      expect(Math.hypot(r.centroid[0], r.centroid[1])).toBeLessThan(1e-12)
      errors.push(Math.abs(r.secondMoments.I1 - Iexact) / Iexact)
    }
    // inscribed polygons: error ~ (2π/n)²/... halves the spacing, quarters the error
    expect(errors[1]).toBeLessThan(errors[0] / 3.5)
    expect(errors[2]).toBeLessThan(errors[1] / 3.5)
    expect(errors[3]).toBeLessThan(errors[2] / 3.5)
    expect(errors[3]).toBeLessThan(1e-3)
  })
})
