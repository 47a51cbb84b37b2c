import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { Vec3 } from '../../src/model/model.ts'
import {
  cutNodal, nodalStress, sweepNodal,
} from '../helpers/sectionMeshes.ts'

// Cantilever with an end load, Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (1970), §21:
// beam along x from the loaded end x = 0, depth 2c (y from -c to c), thickness b (z from 0 to b),
// I = b(2c)³/12; σx = -Pxy/I, τxy = -(P/2I)(c² - y²), σy = 0 (the other components 0).
// The section at x with normal +x: the + side (toward the support) acts on the end piece with
// F = ∫ σ e_x dA = (0, -P, 0) and, about the centroid, M = (0, 0, P·x) (statics of the end piece:
// the end face carries +P in y at arm x).
const Lb = 10, c = 1, b = 0.5, P = 1000
const I = (b * (2 * c) ** 3) / 12
const field = (x: number, y: number) => [(-P * x * y) / I, 0, 0, (-P / (2 * I)) * (c * c - y * y), 0, 0]
const ZERO: Vec3 = [0, 0, 0]

function beam(type: 'hex8' | 'tet4' | 'hex20' | 'tet10', ny: number) {
  const mesh = boxMesh({ nx: 5 * ny, ny, nz: 1, lx: Lb, ly: 2 * c, lz: b, y0: -c }, type)
  return { mesh, stress: nodalStress(mesh, (x, y) => field(x, y)) }
}

describe('cantilever with an end load (Timoshenko & Goodier §21)', () => {
  const x0 = 3.7 // between node layers of every level, so stress is interpolated along x-edges too

  // The parabolic shear is linear between vertices on the section, i.e. the trapezoid rule in y:
  // its error is (2c) h²/12 · τ'' · b with τ'' = P/I, h = 2c/ny, which is P/ny² (too small in
  // magnitude). σx is linear in y and x, so axial and bending are exact for hex8.
  it('hex8: shear → P with the trapezoid error P/ny², moment P·x exact, axial 0', () => {
    const errors: number[] = []
    for (const ny of [2, 4, 8]) {
      const { mesh, stress } = beam('hex8', ny)
      const { result: r } = cutNodal(mesh, stress, ZERO, { point: [x0, 0, b / 2], normal: [1, 0, 0] })
      const err = Math.abs(r.force[1] + P) / P
      expect(Math.abs(err - 1 / ny ** 2)).toBeLessThan(1e-9)
      expect(Math.abs(r.axial)).toBeLessThan(1e-9 * P)
      expect(Math.abs(r.moment[2] - P * x0)).toBeLessThan(1e-9 * P * x0)
      expect(Math.abs(r.moment[0]) + Math.abs(r.moment[1])).toBeLessThan(1e-9 * P * x0)
      // section axes: depth 2c = 2 > b = 0.5, so e1 (stiff axis) is z; bending M1 = ±P·x
      expect(Math.abs(Math.abs(r.bending[0]) - P * x0)).toBeLessThan(1e-9 * P * x0)
      expect(Math.abs(Math.abs(r.shear[1]) - P)).toBeLessThan(err * P + 1e-9 * P)
      // free body of the end piece: the end face is integrated with the same trapezoid in y,
      // so forces balance to round-off; the moment residual is that shear error times x
      expect(r.freeBody.relative).toBeLessThan(1e-10)
      expect(Math.abs(r.freeBody.moment[2])).toBeLessThan(1.01 * P * x0 / ny ** 2)
      errors.push(err)
    }
    expect(errors[1]).toBeLessThan(errors[0] / 3.9)
    expect(errors[2]).toBeLessThan(errors[1] / 3.9)
  })

  // tet4: σx = -Pxy/I is bilinear, so interpolation along oblique edges is not exact either; the
  // error still falls like h² (approximation documented in sectionPolygon.ts).
  it('tet4: shear, moment and the free body converge under refinement', () => {
    const fErr: number[] = [], mErr: number[] = [], fb: number[] = [], aErr: number[] = [], fbm: number[] = []
    for (const ny of [2, 4, 8]) {
      const { mesh, stress } = beam('tet4', ny)
      const { result: r } = cutNodal(mesh, stress, ZERO, { point: [x0, 0, b / 2], normal: [1, 0, 0] })
      fErr.push(Math.abs(r.force[1] + P) / P)
      mErr.push(Math.abs(r.moment[2] - P * x0) / (P * x0))
      fb.push(r.freeBody.relative)
      fbm.push(r.freeBody.momentRelative)
      // axial against the tension half of the section, ∫ σx dA over y > 0 = P x b c²/(2I)
      aErr.push(Math.abs(r.axial) / ((P * x0 * b * c * c) / (2 * I)))
    }
    for (let i = 1; i < 3; i++) {
      expect(fErr[i]).toBeLessThan(fErr[i - 1] / 3)
      expect(mErr[i]).toBeLessThanOrEqual(mErr[i - 1] / 3 + 1e-12)
      expect(fb[i]).toBeLessThanOrEqual(fb[i - 1] / 3 + 1e-12)
      // the end piece's moment residual about the section centroid, over gross load × its size
      expect(fbm[i]).toBeLessThanOrEqual(fbm[i - 1] / 3 + 1e-12)
      expect(aErr[i]).toBeLessThanOrEqual(aErr[i - 1] / 3 + 1e-12)
    }
    expect(aErr[2]).toBeLessThan(0.02)
    expect(fErr[2]).toBeLessThan(0.02)
    expect(mErr[2]).toBeLessThan(0.02)
    expect(fb[2]).toBeLessThan(0.02)
  })

  // σx = -Pxy/I (bilinear) and the parabolic τxy lie in the spaces of tet10 (P2) and hex20
  // (serendipity), so with each element's own shape functions every section of the beam is
  // exact, in any position, and the end piece is in equilibrium in force and moment; the plane
  // x = Lb (the support face) carries the full clamping moment P·Lb.
  it.each(['tet10', 'hex20'] as const)('%s: shear P, moment P·x and the free body exact at any section, also at the support face', (type) => {
    for (const ny of [1, 2]) {
      const { mesh, stress } = beam(type, ny)
      for (const [x, n] of [[x0, [1, 0, 0]], [2.25, [1, 0, 0]], [Lb, [1, 0, 0]]] as [number, Vec3][]) {
        const { result: r } = cutNodal(mesh, stress, ZERO, { point: [x, 0, b / 2], normal: n })
        expect(Math.abs(r.force[1] + P)).toBeLessThan(1e-10 * P)
        expect(Math.abs(r.moment[2] - P * x)).toBeLessThan(1e-10 * P * x)
        expect(Math.abs(r.axial)).toBeLessThan(1e-10 * P)
        expect(r.freeBody.relative).toBeLessThan(1e-12)
        expect(r.freeBody.momentRelative).toBeLessThan(1e-12)
      }
    }
  })

  // The gross load of a free body counts the section by its traction distribution (issue 18): at
  // the support face the resultant is only P but the bending stress carries ∫|σx| dA = P Lb b c²/I
  // across it; gross = 1/2 (Σ|face forces| + Σ|polygon forces|) must hold that share.
  it('the free body gross load counts the section polygon by polygon', () => {
    const { mesh, stress } = beam('hex20', 2)
    const { result: r, polygons } = cutNodal(mesh, stress, ZERO, { point: [Lb, 0, b / 2], normal: [1, 0, 0] }, { polygons: true })
    let sectionGross = 0
    for (let p = 0; p < polygons!.count; p++) sectionGross += Math.hypot(polygons!.force[3 * p], polygons!.force[3 * p + 1], polygons!.force[3 * p + 2])
    // the end face x = 0 carries P, the top and bottom faces nothing, the sides nothing
    expect(Math.abs(r.freeBody.gross - 0.5 * (P + sectionGross))).toBeLessThan(1e-9 * P)
    // two elements through the depth, each half carries ∫|σx| over its half ≈ the bending share
    expect(sectionGross).toBeGreaterThan((P * Lb * b * c * c) / (2 * I))
  })

  // Statics of the end piece (T&G §21): shear constant = P, bending moment linear = P·x.
  it('sweep along the beam: shear P and moment P·x within 1% (hex8, 12 elements deep)', () => {
    const { mesh, stress } = beam('hex8', 12)
    const { offsets, results } = sweepNodal(mesh, stress, ZERO, [1, 0, 0], 0.25, 9.75, 39)
    results.forEach((r, k) => {
      const x = offsets[k]
      expect(r.empty).toBe(false)
      expect(Math.abs(-r.force[1] - P)).toBeLessThan(0.01 * P)
      expect(Math.abs(r.moment[2] - P * x)).toBeLessThan(0.01 * P * x)
      expect(Math.abs(r.axial)).toBeLessThan(1e-9 * P)
      expect(r.freeBody.relative).toBeLessThan(1e-9)
    })
  })
})
