import { describe, expect, it } from 'vitest'
import type { Vec3 } from '../../src/model/model.ts'
import { cutNodal, cylinderMesh, nodalStress } from '../helpers/sectionMeshes.ts'
import { quarterCylinder } from '../helpers/mappedMeshes.ts'

// Thick-walled cylinder, Lamé solution (Timoshenko & Goodier §28): inner radius a with pressure
// p_i, outer radius b with p_o, open ends (σzz = 0):
//   σr = A - B/r², σθ = A + B/r², A = (p_i a² - p_o b²)/(b² - a²), B = (p_i - p_o) a² b²/(b² - a²).
// Statics of a half cylinder: a diametral section carries 2(p_i a - p_o b) per unit length.
const a = 0.5, b = 1.0, pi = 10e6, po = 2e6, lz = 0.2
const Ac = (pi * a * a - po * b * b) / (b * b - a * a)
const Bc = ((pi - po) * a * a * b * b) / (b * b - a * a)
const lame = (x: number, y: number): number[] => {
  const r2 = x * x + y * y, c = x / Math.sqrt(r2), s = y / Math.sqrt(r2)
  const sr = Ac - Bc / r2, st = Ac + Bc / r2
  return [sr * c * c + st * s * s, sr * s * s + st * c * c, 0, (sr - st) * c * s, 0, 0]
}
const ZERO: Vec3 = [0, 0, 0]
const expected = 2 * (pi * a - po * b) * lz

describe('Lamé thick cylinder (Timoshenko & Goodier §28)', () => {
  it.each(['hex8', 'tet4'] as const)('%s: a diametral section carries 2(p_i a - p_o b) per unit length', (type) => {
    const errors: number[] = []
    for (const nr of [4, 8, 16]) {
      const mesh = cylinderMesh(a, b, lz, nr, 64, 1, type)
      const stress = nodalStress(mesh, (x, y) => lame(x, y))
      // plane y = 0 with normal +y: the + half (y > 0) pulls on the - half across two strips
      const { result: r } = cutNodal(mesh, stress, ZERO, { point: [0, 0, lz / 2], normal: [0, 1, 0] })
      expect(r.area).toBeCloseTo(2 * (b - a) * lz, 12)
      errors.push(Math.abs(r.force[1] - expected) / expected)
      expect(Math.abs(r.force[0]) + Math.abs(r.force[2])).toBeLessThan(1e-9 * expected)
    }
    // σθ is linear between nodes along the section (trapezoid in r): error falls as h²
    expect(errors[1]).toBeLessThan(errors[0] / 3.5)
    expect(errors[2]).toBeLessThan(errors[1] / 3.5)
    expect(errors[2]).toBeLessThan(1.5e-3)
  })

  // Free body of the lower half: the pressures on its faceted inner and outer faces against the
  // section. The mesh's chords are not the circles the nodal stresses belong to, so the residual
  // is a geometry error that falls like (2π/n)² with the number of facets n (32 elements through
  // the wall keep the section's own radial error, ~2.5e-4, below it).
  it.each(['hex8', 'tet4'] as const)('%s: the half cylinder balances as the facets refine', (type) => {
    const rel: number[] = []
    for (const nt of [32, 64, 128]) {
      const mesh = cylinderMesh(a, b, lz, 32, nt, 1, type)
      const { result: r } = cutNodal(mesh, nodalStress(mesh, (x, y) => lame(x, y)), ZERO, { point: [0, 0, lz / 2], normal: [0, 1, 0] })
      rel.push(r.freeBody.relative)
    }
    expect(rel[1]).toBeLessThan(rel[0] / 3)
    expect(rel[2]).toBeLessThan(rel[1] / 3)
    expect(rel[2]).toBeLessThan(1e-3)
  })
})

// Curved quadratic rings (quarterCylinder maps the box's mid-edge nodes onto the true arcs): the
// nodes carry the closed-form Lamé stress, the section is a radial plane at θ0 = π/5 (never a node
// layer of these meshes, so it crosses curved element edges and faces), and the hoop force across
// it is ∫ₐᵇ σθ dr · L = (p_i a - p_o b) L (Timoshenko & Goodier §28, statics of the ring wall).
// The section polygon's sides are chords between points on the curved edges (elementSection.ts),
// and the stress inside is each element's own interpolation: the error must fall at least as h²
// (measured, least-squares slope from 2 × 4 to 32 × 64 elements across wall × quarter: tet10
// h^3.1, 3.7e-3 → 4.8e-7; hex20 h^4.0, 5.1e-3 → 8.5e-8; the radial plane meets the curved faces
// along straight lines, so the chords cost less here than the h² they are bounded by), and the
// cut-off piece's moment residual falls with it.
describe('curved quadratic rings, Lamé stress at the nodes (Timoshenko & Goodier §28)', () => {
  const th = Math.PI / 5
  const n: Vec3 = [-Math.sin(th), Math.cos(th), 0]
  const L = 0.2
  it.each(['tet10', 'hex20'] as const)('%s: the hoop force across a radial section converges at least as h²', (type) => {
    const h: number[] = [], err: number[] = [], mrel: number[] = []
    for (const k of [1, 2, 4, 8]) {
      const mesh = quarterCylinder({ a, b, length: L, nr: 2 * k, ntheta: 4 * k, nz: 1 }, type)
      const { result: r } = cutNodal(mesh, nodalStress(mesh, (x, y) => lame(x, y)), ZERO, { point: [0, 0, L / 2], normal: n })
      const F = r.force[0] * n[0] + r.force[1] * n[1]
      const exact = (pi * a - po * b) * L
      h.push(1 / k)
      err.push(Math.abs(F - exact) / exact)
      mrel.push(r.freeBody.momentRelative)
      expect(r.unmappedPoints).toBe(0)
      expect(Math.abs(r.force[2])).toBeLessThan(1e-9 * exact)
    }
    // least-squares slope of log(error) against log(h)
    const lx = h.map(Math.log), ly = err.map(Math.log)
    const mx = lx.reduce((s, v) => s + v) / lx.length, my = ly.reduce((s, v) => s + v) / ly.length
    const rate = lx.reduce((s, v, i) => s + (v - mx) * (ly[i] - my), 0) / lx.reduce((s, v) => s + (v - mx) ** 2, 0)
    expect(rate).toBeGreaterThan(2)
    expect(err[3]).toBeLessThan(1e-5)
    // the free body of the piece θ < θ0 (pressures on its curved faces, its end face, the section)
    expect(mrel[3]).toBeLessThan(mrel[0] / 100)
    expect(mrel[3]).toBeLessThan(1e-6)
  })
})
