import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { findLoadPatches } from '../../../src/mechanics/loadPatches.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'
import { runCore } from '../../helpers/pipeline.ts'

describe('findLoadPatches (rule documented in src/mechanics/loadPatches.ts)', () => {
  it('an unstressed body has no patches and a zero reference stress', () => {
    const mesh = boxMesh({ nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, 'tet4')
    const stress = new Float64Array(6 * mesh.nodeCount)
    const lp = runCore(mesh, stress).loadPatches
    expect(lp.patches).toEqual([])
    expect(lp.referenceStress).toBe(0)
    expect(lp.freeSurface.area).toBeCloseTo(6, 12)
    expect(lp.freeSurface.relative).toBe(0)
    expect(Array.from(lp.faceLabel).every((l) => l === -1)).toBe(true)
  })

  it('patches are edge-connected: two loaded faces touching only at a corner stay separate', () => {
    // Top of a 2×2×1 hex8 box: σzz = 100 at the top corner nodes (0,0,1) and (2,2,1) only, so the
    // top faces of cells (0,0) and (1,1) carry a mean |t| of 25 and share just the centre node.
    // σxx = 1 everywhere keeps every other face weakly loaded (|t| ≤ 1).
    const mesh = boxMesh({ nx: 2, ny: 2, nz: 1, lx: 2, ly: 2, lz: 1 }, 'hex8')
    const stress = stressField(mesh, (x, y, z) => [1, 0, z === 1 && ((x === 0 && y === 0) || (x === 2 && y === 2)) ? 100 : 0, 0, 0, 0])
    const lp = runCore(mesh, stress, [0, 0, 0], { loadPatches: { threshold: 0.1 } }).loadPatches
    // Reference: 95th percentile of 18 nodal von Mises values, two of which are ≈ 99.5.
    expect(lp.referenceStress).toBeCloseTo(Math.sqrt(1 - 100 + 10000), 9)
    expect(lp.patches.length).toBe(2)
    for (const p of lp.patches) {
      expect(p.faceCount).toBe(1)
      expect(p.centroid[2]).toBeCloseTo(1, 12)
      expect(p.force[2]).toBeCloseTo(25, 12) // ∫ σzz dA over a unit face with one corner at 100
      expect(p.peak).toBeCloseTo(100, 12) // t = σẑ = (0, 0, 100) at the loaded corner
    }
    lp.patches.forEach((p, i) => expect(p.id).toBe(i))
    // Joining them by edges: load the top edge y = 0 too, and the patches merge.
    const s2 = stressField(mesh, (x, y, z) => [1, 0, z === 1 && (y === 0 || (x === 2 && y === 2)) ? 100 : 0, 0, 0, 0])
    const r2 = runCore(mesh, s2)
    const lp2 = findLoadPatches(mesh, r2.faces, r2.tractions, r2.invariants.vonMises, { threshold: 0.1 })
    // Top faces of cells (0,0), (1,0) and (1,1) are now loaded and chained by shared edges.
    expect(lp2.patches.length).toBe(1)
    expect(lp2.patches[0].faceCount).toBe(3)
  })
})
