/**
 * Section regions and bounded sections against statics (Cauchy's formula t = σn and the
 * resultant of a uniform traction, F = t A; Malvern 1969, ch. 3): separate bars through one
 * plane, parts joined by shared or by coincident nodes, the plane exactly on a face between parts.
 */
import { describe, expect, it } from 'vitest'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { assembly } from '../helpers/assemblies.ts'

const ZERO: Vec3 = [0, 0, 0]

/** Nodal σzz per part (nodes of separate parts are separate, so each part's value is uniform). */
function partStress(mesh: Mesh, szz: Record<number, number>): Float64Array {
  const s = new Float64Array(6 * mesh.nodeCount)
  for (const b of mesh.blocks) {
    const nn = b.conn.length / b.ids.length
    for (let e = 0; e < b.ids.length; e++) for (let k = 0; k < nn; k++) s[6 * b.conn[nn * e + k] + 2] = szz[b.part![e]]
  }
  return s
}

const cut = (mesh: Mesh, stress: Float64Array, point: Vec3, normal: Vec3, extra = {}) =>
  cutSection(mesh, nodalStressField(mesh, stress), ZERO, { point, normal }, { regions: true, ...extra }).result

describe.each(['hex8', 'tet4', 'hex20', 'wedge6'] as const)('two separate bars through one plane (%s)', (type) => {
  // bar 1 of 1×1 carries +10 (tension), bar 2 of 2×1 carries -5 (σzz = -2.5): F_z = σzz A
  const mesh = assembly([
    { box: { nx: 2, ny: 2, nz: 3, lx: 1, ly: 1, lz: 3 }, type, part: 1 },
    { box: { nx: 2, ny: 2, nz: 3, lx: 2, ly: 1, lz: 3, x0: 3 }, type, part: 2 },
  ], false)
  const stress = partStress(mesh, { 1: 10, 2: -2.5 })
  const r = cut(mesh, stress, [0, 0, 1.3], [0, 0, 1])

  it('gives two regions with their own forces, largest first, and the whole-plane resultant', () => {
    expect(r.force[2]).toBeCloseTo(5, 10)
    expect(r.regions!.length).toBe(2)
    const [a, b] = r.regions!
    expect(a.force[2]).toBeCloseTo(10, 10)
    expect(a.parts).toEqual([1])
    expect(a.area).toBeCloseTo(1, 12)
    expect(a.centroid[0]).toBeCloseTo(0.5, 12)
    expect(b.force[2]).toBeCloseTo(-5, 10)
    expect(b.parts).toEqual([2])
    expect(b.centroid[0]).toBeCloseTo(4, 12)
    // uniform traction on each region: no moment about its own centroid
    for (const g of r.regions!) for (const k of [0, 1, 2]) expect(Math.abs(g.moment[k])).toBeLessThan(1e-12)
    expect(a.axial).toBeCloseTo(10, 10)
  })

  it('limits to a part (--parts) and to a disc (--within); selects nothing plainly', () => {
    const p2 = cutSection(mesh, nodalStressField(mesh, stress), ZERO, { point: [0, 0, 1.3], normal: [0, 0, 1] }, { limit: { parts: [2] } }).result
    expect(p2.force[2]).toBeCloseTo(-5, 10)
    expect(p2.area).toBeCloseTo(2, 12)
    // whole parts bound a piece (bar 2 below the plane): its free body is defined and balanced
    expect(p2.freeBodyDefined).toBe(true)
    expect(p2.freeBody.relative).toBeLessThan(1e-12)
    const disc = cutSection(mesh, nodalStressField(mesh, stress), ZERO, { point: [0, 0, 1.3], normal: [0, 0, 1] }, { limit: { within: { center: [0.5, 0.5, 99], radius: 1 } } }).result
    expect(disc.force[2]).toBeCloseTo(10, 10)
    expect(disc.centroid[2]).toBeCloseTo(1.3, 12)
    expect(disc.freeBodyDefined).toBe(false)
    const none = cutSection(mesh, nodalStressField(mesh, stress), ZERO, { point: [0, 0, 1.3], normal: [0, 0, 1] }, { limit: { within: { center: [2, 0.5, 0], radius: 0.2 } } }).result
    expect(none.empty).toBe(true)
    expect(none.regions).toEqual([])
  })
})

describe('how regions join', () => {
  it('joins one part meshed in two pieces whose nodes only coincide (geometric match)', () => {
    const mesh = assembly([
      { box: { nx: 2, ny: 2, nz: 2, lx: 0.5, ly: 1, lz: 2 }, type: 'hex8', part: 1 },
      { box: { nx: 2, ny: 2, nz: 2, lx: 0.5, ly: 1, lz: 2, x0: 0.5 }, type: 'hex8', part: 1 },
    ], false)
    const r = cut(mesh, partStress(mesh, { 1: 3 }), [0, 0, 0.7], [0, 0, 1])
    expect(r.regions!.length).toBe(1)
    expect(r.regions![0].force[2]).toBeCloseTo(3, 12)
  })

  it('keeps two parts with shared nodes apart', () => {
    const mesh = assembly([
      { box: { nx: 2, ny: 2, nz: 2, lx: 0.5, ly: 1, lz: 2 }, type: 'tet4', part: 1 },
      { box: { nx: 2, ny: 2, nz: 2, lx: 0.5, ly: 1, lz: 2, x0: 0.5 }, type: 'tet4', part: 2 },
    ], true)
    const r = cut(mesh, partStress(mesh, { 1: 3, 2: 3 }), [0, 0, 0.7], [0.1, 0, 1])
    expect(r.regions!.map((g) => g.parts[0]).sort()).toEqual([1, 2])
  })

  it('takes a plane lying on the face between two parts in the -m side\'s part, and --parts follows', () => {
    // column: part 1 below z = 1, part 2 above, shared nodes on z = 1
    const mesh = assembly([
      { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 },
      { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1, z0: 1 }, type: 'hex8', part: 2 },
    ], true)
    const s = partStress(mesh, { 1: 1, 2: 1 })
    expect(cut(mesh, s, [0, 0, 1], [0, 0, 1]).regions!.map((g) => g.parts)).toEqual([[1]])
    expect(cut(mesh, s, [0, 0, 1], [0, 0, -1]).regions!.map((g) => g.parts)).toEqual([[2]])
    const lim = (parts: number[], normal: Vec3) => cutSection(mesh, nodalStressField(mesh, s), ZERO, { point: [0, 0, 1], normal }, { limit: { parts } }).result
    expect(lim([1], [0, 0, 1]).area).toBeCloseTo(1, 12)
    expect(lim([2], [0, 0, 1]).empty).toBe(true)
    expect(lim([2], [0, 0, -1]).area).toBeCloseTo(1, 12)
  })
})

describe.each(['tet4', 'tet10', 'hex8', 'wedge6', 'pyramid5'] as const)('a plane through a layer of nodes (%s)', (type) => {
  // The plane holds element faces: the polygons are the in-plane faces of the elements below
  // it, and split cells (tetrahedra, wedges, pyramids) put neighbouring in-plane triangles in
  // elements that share only an edge. One connected section is one region all the same, and
  // a uniform σzz = 3 gives F_z = σzz A (Cauchy's formula, Malvern 1969, ch. 3).
  const mesh = assembly([{ box: { nx: 3, ny: 4, nz: 4, lx: 3, ly: 4, lz: 4 }, type, part: 1 }], true)
  const stress = partStress(mesh, { 1: 3 })
  for (const [point, normal, area] of [[[0, 0, 2], [0, 0, 1], 12], [[0, 2, 0], [0, 1, 0], 12], [[1, 0, 0], [-1, 0, 0], 16]] as [Vec3, Vec3, number][]) {
    it(`is one region on the plane through ${point.join(', ')}`, () => {
      const r = cut(mesh, stress, point, normal)
      expect(r.area).toBeCloseTo(area, 10)
      expect(r.regions!.length).toBe(1)
      expect(r.regions![0].area).toBeCloseTo(area, 10)
    })
  }
})
