/**
 * The stress jump at nodes (src/mechanics/stressJump.ts). References: a uniform field has no jump
 * (every element holds the same tensor: exact zero); a field that is one element's own constant
 * inside an otherwise uniform mesh gives the closed-form value at that element's nodes, which is
 * worked out below by hand from the definition; von Mises is invariant under a rotation of axes
 * (σ' = QσQᵀ), so the jump of a rotated field is the same (property, seeded).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { allocateStressJump, computeStressJump } from '../../../src/mechanics/stressJump.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'
import { elementNodalCopy } from '../../helpers/elementNodal.ts'
import { rotateStress, rotationFromUniforms } from '../../helpers/rotation.ts'

const mesh = boxMesh({ nx: 3, ny: 3, nz: 3, lx: 3, ly: 3, lz: 3 }, 'hex8')
const uniform = (s: number[]) => {
  const v = new Float64Array(6 * mesh.nodeCount)
  for (let n = 0; n < mesh.nodeCount; n++) v.set(s, 6 * n)
  return v
}
const S = [100, -20, 30, 15, -5, 8]

describe('stress jump', () => {
  it('is zero for a uniform field, nodal or element-nodal', () => {
    const j = computeStressJump(allocateStressJump(mesh.nodeCount), mesh, elementNodalCopy(mesh, uniform(S)), 100)
    expect(Math.max(...j)).toBe(0)
    expect(Math.max(...computeStressJump(allocateStressJump(mesh.nodeCount), mesh, nodalStressField(mesh, uniform(S)), 100))).toBe(0)
  })

  it('is largest at the nodes of the element that differs, with the value of the definition', () => {
    // Uniaxial σxx = 100 everywhere; the centre element (index 13 of 27) holds σxx = 200.
    const field = elementNodalCopy(mesh, uniform([100, 0, 0, 0, 0, 0]))
    const centre = 13, nn = 8
    for (let a = 0; a < nn; a++) field.values[6 * field.rows[0][centre * nn + a]] = 200
    const j = computeStressJump(allocateStressJump(mesh.nodeCount), mesh, field, 100)
    // Each corner of the centre element is an interior node shared by 8 elements: the mean is
    // σxx = (200 + 7·100)/8 = 112.5; the largest deviation is the centre element's, 87.5 in σxx
    // alone (von Mises of a uniaxial tensor is its magnitude); scaled by vM(mean) = 112.5.
    const corners: number[] = []
    for (let a = 0; a < nn; a++) corners.push(mesh.blocks[0].conn[centre * nn + a])
    for (const n of corners) expect(j[n]).toBeCloseTo(87.5 / 112.5, 6)
    let elsewhere = 0
    for (let n = 0; n < mesh.nodeCount; n++) if (!corners.includes(n)) elsewhere = Math.max(elsewhere, j[n])
    expect(elsewhere).toBe(0)
  })

  it('is scaled by 1 % of the reference stress where the node\'s own stress is smaller', () => {
    const field = elementNodalCopy(mesh, uniform([0, 0, 0, 0, 0, 0]))
    field.values[6 * field.rows[0][13 * 8]] = 1 // one element-node: σxx = 1 at a node shared by 8
    const j = computeStressJump(allocateStressJump(mesh.nodeCount), mesh, field, 1000)
    // mean 1/8, deviation 7/8, scale max(1/8, 0.01·1000 = 10) = 10.
    expect(Math.max(...j)).toBeCloseTo(0.875 / 10, 6)
  })

  it('leaves out the jump across parts', () => {
    const parted = { ...mesh, blocks: mesh.blocks.map((b) => ({ ...b, part: Int32Array.from(b.ids, (_, e) => (e === 13 ? 2 : 1)) })) }
    const field = elementNodalCopy(mesh, uniform([100, 0, 0, 0, 0, 0]))
    for (let a = 0; a < 8; a++) field.values[6 * field.rows[0][13 * 8 + a]] = 200
    expect(Math.max(...computeStressJump(allocateStressJump(mesh.nodeCount), parted, field, 100))).toBe(0)
  })

  it('is the same for the field in rotated axes (von Mises is objective)', () => {
    const seed = 20261202
    console.log(`stress jump rotation seed ${seed}`)
    const rand = mulberry32(seed)
    const field = elementNodalCopy(mesh, uniform(S))
    for (let i = 0; i < field.values.length; i++) field.values[i] += 20 * (rand() - 0.5)
    const j0 = computeStressJump(allocateStressJump(mesh.nodeCount), mesh, field, 100)
    for (let t = 0; t < 3; t++) {
      const Q = rotationFromUniforms(rand(), rand(), rand())
      const rotated = { ...field, values: new Float64Array(field.values.length) }
      for (let r = 0; r < field.values.length / 6; r++) rotated.values.set(rotateStress(Q, field.values, 6 * r), 6 * r)
      const j1 = computeStressJump(allocateStressJump(mesh.nodeCount), mesh, rotated, 100)
      for (let n = 0; n < mesh.nodeCount; n++) expect(j1[n]).toBeCloseTo(j0[n], 5)
    }
  })
})
