/**
 * Through-thickness linearisation (src/mechanics/linearisation.ts), the method of the ASME Boiler
 * and Pressure Vessel Code, Section VIII, Division 2, Part 5, Annex 5-A (EN 13445-3 Annex C is
 * alike): membrane σ_m = (1/t)∫σ dx, bending at the start σ_b = (6/t²)∫σ(t/2 − x) dx, peak =
 * total − membrane ∓ bending.
 *
 * 1. A field linear through the thickness, σ(x) = σ(0) + (σ(t) − σ(0)) x/t, is reproduced
 *    exactly by any element (isoparametric elements interpolate a linear field exactly; common
 *    practice): σ_m = the mean (σ(0) + σ(t))/2, σ_b = the half difference (σ(0) − σ(t))/2 for the
 *    two in-plane normal components the annex bends, zero bending for the others, and zero peak
 *    for the bent components. Also rotated (seeded), and whatever the number of sample points.
 * 2. The Lamé thick cylinder under internal pressure p (Timoshenko & Goodier, Theory of
 *    Elasticity, 3rd ed. 1970, §28), a ≤ r ≤ b, p_o = 0: σθ = A + B/r², σr = A − B/r² with
 *    A = p a²/(b² − a²), B = p a² b²/(b² − a²). Along a radial line (x = r − a, t = b − a):
 *      membrane hoop = (1/t)∫ₐᵇ (A + B/r²) dr = A + B (1/a − 1/b)/(b − a) = A + B/(ab)
 *                    = p a² (1 + b/a)/(b² − a²) = p a (a + b)/((b − a)(b + a)) = p a/(b − a),
 *      membrane radial = A − B/(ab) = −p a/(a + b),
 *      bending hoop at r = a: (6/t²)∫ₐᵇ (A + B/r²)((a + b)/2 − r) dr; the A term integrates to
 *        zero (the lever is odd about mid-wall), and ∫ (c − r)/r² dr = c(1/a − 1/b) − ln(b/a)
 *        with c = (a + b)/2, so σ_b,θ = (6B/t²)[(a + b)(b − a)/(2ab) − ln(b/a)].
 *    On curved quadratic meshes (mid-edge nodes on the arcs) both match to 1e-3; on linear
 *    meshes they converge. Measured (θ = 0.3 rad, quarter cylinder a = 1, b = 2):
 *      hex20 nr 8: membrane 4.4e-6, bending 5.0e-5; tet10 and wedge15 1.7e-5, 2.4e-6;
 *      hex8 nr 8 → 16 → 32: membrane 2.4e-3 → 4.4e-4 → 5.1e-5, bending 7.4e-3 → 1.7e-3 → 3.3e-4
 *      (about second order; tet4 and wedge6 alike).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { buildElementGrid } from '../../src/mechanics/elementGrid.ts'
import { analyseLine } from '../../src/mechanics/lineAnalysis.ts'
import { equivalentStress } from '../../src/mechanics/linearisation.ts'
import type { Linearisation } from '../../src/mechanics/linearisation.ts'
import { rotateStressInto } from '../../src/mechanics/componentAxes.ts'
import { principalStresses } from '../../src/mechanics/invariants.ts'
import { polarToCartesian, quarterCylinder, stressField } from '../helpers/mappedMeshes.ts'
import { mulberry32, rotateMesh, rotateStress, rotateStressField, rotateVec, rotationFromUniforms } from '../helpers/rotation.ts'
import type { Mat3 } from '../helpers/rotation.ts'

/** A general linear field: every component has its own constant and gradient. */
const linear = (x: number, y: number, z: number): number[] =>
  [0, 1, 2, 3, 4, 5].map((k) => 40 + 7 * k + (k - 2.5) * 3 * x + (5 - k) * 11 * y - (1 + k) * 2 * z)

/** The wall: a box 2 × 1 × 1.5 (thickness 1 along y), a 2 × 3 × 2 grid of cells. */
function wall(type: ElementTypeName): Mesh {
  return boxMesh({ nx: 2, ny: 3, nz: 2, lx: 2, ly: 1, lz: 1.5 }, type)
}

const FROM: Vec3 = [0.73, 0, 0.61], TO: Vec3 = [0.73, 1, 0.61]

function linearise(mesh: Mesh, stress: Float64Array, from: Vec3, to: Vec3, points = 11, axes?: Parameters<typeof analyseLine>[4]['axes']): Linearisation {
  const r = analyseLine(mesh, buildElementGrid(mesh), nodalStressField(mesh, stress), null, { from, to, points, axes })
  expect(r.refused).toBeNull()
  return r.linearisation!
}

function local(l: Linearisation, s: ArrayLike<number>): number[] {
  const R = [...l.frame.e1, ...l.frame.e2, ...l.frame.e3]
  return Array.from(rotateStressInto([0, 0, 0, 0, 0, 0], 0, s, 0, R))
}

const maxAbs = (a: ArrayLike<number>, b: ArrayLike<number>): number => Math.max(...Array.from(a, (v, k) => Math.abs(v - b[k])))

describe('linearisation of a field linear through the wall (exact)', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type}: membrane = mean, bending = half difference of the in-plane normals, peak of those = 0`, () => {
      const mesh = wall(type)
      const stress = stressField(mesh, linear)
      const l = linearise(mesh, stress, FROM, TO)
      const s0 = linear(...FROM), s1 = linear(...TO)
      const mean = s0.map((v, k) => (v + s1[k]) / 2), half = s0.map((v, k) => (v - s1[k]) / 2)
      expect(l.thickness).toBeCloseTo(1, 10)
      expect(maxAbs(l.membrane, mean)).toBeLessThan(1e-10)
      const halfLocal = local(l, half)
      // Frame order 11, 22, 33, 12, 23, 13: bending for 22 and 33 only (Annex 5-A).
      expect(maxAbs(l.bendingLocal, [0, halfLocal[1], halfLocal[2], 0, 0, 0])).toBeLessThan(1e-10)
      const peakStart = local(l, l.peakStart), peakEnd = local(l, l.peakEnd)
      for (const k of [1, 2]) { expect(Math.abs(peakStart[k])).toBeLessThan(1e-10); expect(Math.abs(peakEnd[k])).toBeLessThan(1e-10) }
      // The components the method does not bend keep their linear part in the peak.
      for (const k of [0, 3, 5]) expect(Math.abs(peakStart[k] - halfLocal[k])).toBeLessThan(1e-10)
      // Totals at the ends are the field there.
      expect(maxAbs(l.totalStart, s0)).toBeLessThan(1e-10)
      expect(maxAbs(l.totalEnd, s1)).toBeLessThan(1e-10)
    })
  }

  it('a plate-bending field (only the in-plane normals vary) leaves no peak at all', () => {
    // σ22 = σ33 = m + k (x − t/2) across the wall (y here), the rest uniform.
    const f = (_x: number, y: number): number[] => [30 + 80 * (y - 0.5), 5, 12 - 40 * (y - 0.5), 3, 1, -2]
    for (const type of ['hex8', 'tet10', 'wedge6'] as const) {
      const mesh = wall(type)
      const l = linearise(mesh, stressField(mesh, f), FROM, TO)
      expect(Math.max(...l.peakStart.map(Math.abs), ...l.peakEnd.map(Math.abs))).toBeLessThan(1e-10)
      expect(l.peakEquivalent.from).toBeLessThan(1e-8)
      // Bending at the start (y = 0): σ(0) − mean = −40 and +20 for xx and zz.
      expect(maxAbs(l.bending, [-40, 0, 20, 0, 0, 0])).toBeLessThan(1e-10)
      expect(maxAbs(l.membrane, [30, 5, 12, 3, 1, -2])).toBeLessThan(1e-10)
    }
  })

  it('does not depend on the number of sample points', () => {
    const mesh = wall('hex20')
    const stress = stressField(mesh, (x, y, z) => linear(x, y, z).map((v, k) => v + 9 * Math.sin(2 * y + k) * y))
    const a = linearise(mesh, stress, FROM, TO, 2), b = linearise(mesh, stress, FROM, TO, 257)
    expect(b.membrane).toEqual(a.membrane)
    expect(b.bending).toEqual(a.bending)
    expect(b.peakEquivalent).toEqual(a.peakEquivalent)
  })

  it('with an axis the frame is hoop/meridional and the in-plane shear is not bent', () => {
    const mesh = wall('hex8')
    const l = linearise(mesh, stressField(mesh, linear), FROM, TO, 11, { kind: 'cylindrical', origin: [0.73, -3, 0.61], axis: [0, 0, 1] })
    expect(l.frame.rule).toBe('axis')
    // Radial line along +y about an axis along z through (0.73, −3): hoop = −x, meridional = z.
    expect(maxAbs(l.frame.e1, [0, 1, 0])).toBeLessThan(1e-12)
    expect(maxAbs(l.frame.e2, [-1, 0, 0])).toBeLessThan(1e-12)
    expect(maxAbs(l.frame.e3, [0, 0, 1])).toBeLessThan(1e-12)
    expect(l.bendingLocal[4]).toBe(0)
    const half = local(l, linear(...FROM).map((v, k) => (v - linear(...TO)[k]) / 2))
    expect(Math.abs(local(l, l.peakStart)[4] - half[4])).toBeLessThan(1e-10)
  })

  it('is objective: under a random rotation the tensors rotate and the equivalents stay (seeded)', () => {
    const seed = 16016
    console.log(`linearisation objectivity seed ${seed}`)
    const rnd = mulberry32(seed)
    const mesh = wall('tet10')
    const stress = stressField(mesh, (x, y, z) => linear(x, y, z).map((v, k) => v + 20 * Math.cos(3 * y + k)))
    const base = linearise(mesh, stress, FROM, TO)
    for (let r = 0; r < 3; r++) {
      const Q: Mat3 = rotationFromUniforms(rnd(), rnd(), rnd())
      const l = linearise(rotateMesh(mesh, Q), rotateStressField(Q, stress), rotateVec(Q, FROM), rotateVec(Q, TO))
      const scale = Math.max(...base.membrane.map(Math.abs))
      expect(maxAbs(l.membrane, rotateStress(Q, base.membrane))).toBeLessThan(1e-9 * scale)
      expect(maxAbs(l.bending, rotateStress(Q, base.bending))).toBeLessThan(1e-9 * scale)
      expect(Math.abs(l.membraneEquivalent - base.membraneEquivalent)).toBeLessThan(1e-9 * scale)
      expect(Math.abs(l.membranePlusBendingEquivalent.from - base.membranePlusBendingEquivalent.from)).toBeLessThan(1e-9 * scale)
      expect(Math.abs(l.peakEquivalent.to - base.peakEquivalent.to)).toBeLessThan(1e-9 * scale)
    }
  })

  it('Tresca on request: twice the largest shear of each part (von Mises by default)', () => {
    const mesh = wall('hex8')
    const stress = stressField(mesh, linear)
    const grid = buildElementGrid(mesh)
    const vm = analyseLine(mesh, grid, nodalStressField(mesh, stress), null, { from: FROM, to: TO, points: 5 }).linearisation!
    const tr = analyseLine(mesh, grid, nodalStressField(mesh, stress), null, { from: FROM, to: TO, points: 5, criterion: 'tresca' }).linearisation!
    expect(vm.criterion).toBe('vonMises')
    expect(tr.criterion).toBe('tresca')
    const p = principalStresses(tr.membrane, [0, 0, 0])
    expect(tr.membraneEquivalent).toBeCloseTo(p[0] - p[2], 10)
    expect(vm.membraneEquivalent).toBeCloseTo(equivalentStress(vm.membrane, 'vonMises'), 10)
    // Any strength-of-materials text: Tresca ≥ von Mises ≥ (√3/2) Tresca.
    expect(tr.membraneEquivalent).toBeGreaterThanOrEqual(vm.membraneEquivalent - 1e-9)
    expect(vm.membraneEquivalent).toBeGreaterThanOrEqual((Math.sqrt(3) / 2) * tr.membraneEquivalent - 1e-9)
  })
})

describe('Lamé thick cylinder through the wall (Timoshenko & Goodier §28)', () => {
  const a = 1, b = 2, p = 100, L = 0.5
  const A = (p * a * a) / (b * b - a * a), B = (p * a * a * b * b) / (b * b - a * a)
  // σz of a closed cylinder, p a²/(b² − a²) = A (uniform; it only has a membrane part).
  const lame = (x: number, y: number): number[] => {
    const r2 = x * x + y * y
    return polarToCartesian(A - B / r2, A + B / r2, 0, Math.atan2(y, x), A)
  }
  const t = b - a, c = (a + b) / 2
  const membraneHoop = (p * a) / (b - a)
  const membraneRadial = (-p * a) / (a + b)
  const bendingHoop = ((6 * B) / (t * t)) * (c * (1 / a - 1 / b) - Math.log(b / a))
  const theta = 0.3

  function errors(type: ElementTypeName, nr: number) {
    const mesh = quarterCylinder({ a, b, length: L, nr, ntheta: 2 * nr, nz: 1 }, type)
    const r = analyseLine(mesh, buildElementGrid(mesh), nodalStressField(mesh, stressField(mesh, lame)), null, {
      from: [a * Math.cos(theta), a * Math.sin(theta), 0.2], to: [b * Math.cos(theta), b * Math.sin(theta), 0.2], points: 21,
      axes: { kind: 'cylindrical', origin: [0, 0, 0], axis: [0, 0, 1] },
    })
    expect(r.refused).toBeNull()
    const l = r.linearisation!
    expect(l.frame.rule).toBe('axis')
    // Frame: e1 radial, e2 hoop, e3 axial: local 11 = σr, 22 = σθ, 33 = σz.
    return {
      hoop: Math.abs(l.membraneLocal[1] - membraneHoop) / membraneHoop,
      radial: Math.abs(l.membraneLocal[0] - membraneRadial) / Math.abs(membraneRadial),
      bending: Math.abs(l.bendingLocal[1] - bendingHoop) / Math.abs(bendingHoop),
      axial: Math.abs(l.membraneLocal[2] - A) / A,
      axialBending: Math.abs(l.bendingLocal[2]) / A,
    }
  }

  it('the closed forms used below (checked against the direct integral by Simpson, 2000 panels)', () => {
    const n = 2000, h = t / n
    let m = 0, bb = 0
    for (let i = 0; i <= n; i++) {
      const r = a + i * h, w = i === 0 || i === n ? 1 : i % 2 ? 4 : 2
      m += w * (A + B / (r * r)); bb += w * (A + B / (r * r)) * (t / 2 - (r - a))
    }
    expect((m * h) / 3 / t).toBeCloseTo(membraneHoop, 9)
    expect(((6 / (t * t)) * (bb * h)) / 3).toBeCloseTo(bendingHoop, 8)
  })

  for (const type of ELEMENT_TYPE_NAMES.filter((n) => ELEMENT_TYPES[n].quadratic)) {
    it(`${type} (curved, quadratic): membrane and bending hoop stress to 1e-3`, () => {
      const e = errors(type, 8)
      expect(e.hoop).toBeLessThan(1e-3)
      expect(e.bending).toBeLessThan(1e-3)
      expect(e.radial).toBeLessThan(1e-3)
      expect(e.axial).toBeLessThan(1e-9)
      expect(e.axialBending).toBeLessThan(1e-9)
    })
  }

  for (const type of ELEMENT_TYPE_NAMES.filter((n) => !ELEMENT_TYPES[n].quadratic)) {
    it(`${type} (faceted, linear): membrane and bending hoop stress converge`, () => {
      const e = [8, 16, 32].map((n) => errors(type, n))
      expect(e[1].hoop).toBeLessThan(e[0].hoop)
      expect(e[2].hoop).toBeLessThan(e[1].hoop / 3)
      expect(e[1].bending).toBeLessThan(e[0].bending / 2)
      expect(e[2].bending).toBeLessThan(e[1].bending / 2)
      expect(e[2].hoop).toBeLessThan(1e-3)
      expect(e[2].bending).toBeLessThan(1e-3)
    })
  }
})
