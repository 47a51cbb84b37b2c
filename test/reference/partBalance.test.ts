/**
 * Parts of an assembly against statics: a two-part column under its own weight (shared nodes at
 * the joint) passes the weight of the upper part through the interface (σzz = w(z − L) solves
 * dσzz/dz + b_z = 0 with a free top; Timoshenko & Goodier, Theory of Elasticity, §97: a bar
 * under its own weight); Newton's third law on the interface; per-part residuals sum to the
 * whole-body residual (moments about one common point).
 */
import { describe, expect, it } from 'vitest'
import { assemblyBalance } from '../../src/mechanics/partBalance.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { computeBodyBalance } from '../../src/mechanics/balanceAudit.ts'
import { findLoadPatches } from '../../src/mechanics/loadPatches.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../src/mechanics/invariants.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { Vec3 } from '../../src/model/model.ts'
import { assembly } from '../helpers/assemblies.ts'
import { nodalStress } from '../helpers/sectionMeshes.ts'

const W = 7.7e-5 // ρg, stress/length (steel in N/mm³)
const cross = (a: readonly number[], b: readonly number[]): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]

describe.each([true, false])('two-part column under its own weight (shared nodes: %s)', (merge) => {
  // 1 × 1 × 2 column, part 1 below z = 1, part 2 above; σzz = W (z - 2)
  const mesh = assembly([
    { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 },
    { box: { nx: 2, ny: 2, nz: 3, lx: 1, ly: 1, lz: 1, z0: 1 }, type: merge ? 'hex8' : 'hex20', part: 2 },
  ], merge)
  const stress = nodalStress(mesh, (_x, _y, z) => [0, 0, W * (z - 2), 0, 0, 0])
  const b: Vec3 = [0, 0, -W]
  const field = nodalStressField(mesh, stress)
  const asm = assemblyBalance(mesh, field, () => b, new Map([[1, 'base'], [2, 'top']]))

  it('finds one interface that carries the weight of the upper part, equal and opposite', () => {
    expect(asm.parts.map((p) => [p.part, p.name])).toEqual([[1, 'base'], [2, 'top']])
    expect(asm.parts[1].volume).toBeCloseTo(1, 12)
    // apart (hex8 against hex20 on the same 2 × 2 grid): the interface is found geometrically
    expect(asm.interfaces.length).toBe(1)
    const i = asm.interfaces[0]
    expect(i.parts).toEqual([1, 2])
    expect(i.area).toBeCloseTo(1, 12)
    expect(i.force[2]).toBeCloseTo(W * 1, 15)
    expect(Math.abs(i.force[0]) + Math.abs(i.force[1])).toBeLessThan(1e-18)
    expect(i.mismatch).toBeLessThan(1e-12)
    for (const p of asm.parts) expect(p.balance.relative).toBeLessThan(1e-10)
  })

  it('keeps the interface out of the load-entry patches and the free surface', () => {
    const faces = extractBoundaryFaces(mesh)
    const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
    const vm = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), stress).vonMises
    const p = findLoadPatches(mesh, faces, tractions, vm)
    // the held base (|t| = 2W) is the one patch; the joint (|t| = W, above the 5 % level) is an
    // interface, not a load, whether its nodes are shared (interior) or only coincide (labelled -2)
    expect(p.patches.length).toBe(1)
    expect(p.patches[0].force[2]).toBeCloseTo(2 * W, 15)
    // free surface: the four sides (area 8) and the top (1)
    expect(p.freeSurface.area).toBeCloseTo(9, 12)
    let against = 0
    for (let f = 0; f < faces.count; f++) if (p.faceLabel[f] === -2) against += faces.area[f]
    expect(against).toBeCloseTo(merge ? 0 : 2, 12)
  })

  it('sums the per-part residuals to the whole-body residual (moments about one point)', () => {
    const faces = extractBoundaryFaces(mesh)
    const whole = computeBodyBalance(mesh, faces, computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces), b)
    const P: Vec3 = [0.3, -0.2, 5]
    const F: Vec3 = [0, 0, 0], M: Vec3 = [0, 0, 0]
    for (const p of asm.parts) {
      const arm = cross([p.balance.about[0] - P[0], p.balance.about[1] - P[1], p.balance.about[2] - P[2]], p.balance.force)
      for (let k = 0; k < 3; k++) { F[k] += p.balance.force[k]; M[k] += p.balance.moment[k] + arm[k] }
    }
    const armW = cross([whole.about[0] - P[0], whole.about[1] - P[1], whole.about[2] - P[2]], whole.force)
    const mis = asm.interfaces.reduce((s, i) => [s[0] + i.force[0] + i.reverseForce[0], s[1] + i.force[1] + i.reverseForce[1], s[2] + i.force[2] + i.reverseForce[2]], [0, 0, 0])
    for (let k = 0; k < 3; k++) {
      expect(Math.abs(F[k] - (whole.force[k] + mis[k]))).toBeLessThan(1e-15)
      expect(Math.abs(M[k] - (whole.moment[k] + armW[k]))).toBeLessThan(1e-14)
    }
  })
})
