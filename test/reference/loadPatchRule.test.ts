/**
 * The load-entry patch rule (src/mechanics/loadPatches.ts) on the cases the rule was written for:
 * a smooth end load whose low edges fall under the threshold (grown back by the lower level), a
 * loaded surface that folds (split at the feature angle) and one that crosses from one part into
 * another (split between the parts).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { Mesh } from '../../src/model/model.ts'
import { findLoadPatches, LOAD_PATCH_DEFAULTS } from '../../src/mechanics/loadPatches.ts'
import { syntheticModel } from '../../workers/syntheticModel.ts'
import { stressField } from '../helpers/mappedMeshes.ts'
import { runCore } from '../helpers/pipeline.ts'

describe('growth down to the lower threshold (hysteresis)', () => {
  // Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (1970), §21: the end-loaded cantilever
  // carries the load P at x = 0 as the parabolic shear τxy = -(P/2I)(c² - y²), which falls to zero
  // at y = ±c. The generated block (workers/syntheticModel.ts) carries P = 200 kN that way.
  const P = 2e5
  it('the loaded end of the generated block is one patch carrying the end shear within 1 %', () => {
    const model = syntheticModel({ kind: 'block', elements: 60000 })
    const { faces, tractions, invariants, loadPatches } = runCore(model.mesh, model.stress)
    // The end face x = 0: every boundary face whose centroid lies there, and the force the mesh
    // carries over it (tet4 interpolates the parabola linearly between nodes).
    let endArea = 0, endForce = 0
    for (let f = 0; f < faces.count; f++) {
      if (Math.abs(faces.centroid[3 * f]) < 1e-12) { endArea += faces.area[f]; endForce += tractions.force[3 * f + 1] }
    }
    const end = loadPatches.patches.find((p) => Math.abs(p.centroid[0]) < 1e-9)!
    expect(end.area).toBeCloseTo(endArea, 12)
    expect(end.force[1]).toBeCloseTo(endForce, 6)
    expect(Math.abs(end.force[1] - P) / P).toBeLessThan(0.01)
    // Without the lower level (the threshold alone) the low edges drop out and the patch falls short.
    const single = findLoadPatches(model.mesh, faces, tractions, invariants.vonMises, { lowerThreshold: LOAD_PATCH_DEFAULTS.threshold })
    const short = single.patches.find((p) => Math.abs(p.centroid[0]) < 1e-9)!
    expect(short.force[1] / P).toBeLessThan(0.9)
  })

  it('a weakly loaded area touching no strongly loaded face stays free surface', () => {
    // σzz = 0.03·s on the top (z = 1) only through a field linear in z, σxx = s on the ends: the
    // top carries 3 % (between the levels) and folds away from the ends, so it starts nothing.
    const mesh = boxMesh({ nx: 4, ny: 2, nz: 2, lx: 4, ly: 1, lz: 1 }, 'hex8')
    const s = 100
    const stress = stressField(mesh, (_x, _y, z) => [s, 0, 0.03 * s * z, 0, 0, 0])
    const lp = runCore(mesh, stress).loadPatches
    expect(lp.patches.length).toBe(2)
    for (const p of lp.patches) expect(Math.abs(Math.abs(p.normal[0]) - 1)).toBeLessThan(1e-12)
  })
})

describe('splitting', () => {
  it('at the feature angle: a bent strip of faces splits where it folds by more than the angle', () => {
    // A box whose faces y = 0 and z = 0 meet at 90°, both loaded: one patch at 100°, two at 40°.
    const mesh = boxMesh({ nx: 3, ny: 2, nz: 2, lx: 3, ly: 1, lz: 1 }, 'hex8')
    const stress = stressField(mesh, () => [0, 10, 10, 0, 0, 0])
    const { faces, tractions, invariants } = runCore(mesh, stress)
    // σyy and σzz load the four faces normal to y and z; x faces are free.
    expect(findLoadPatches(mesh, faces, tractions, invariants.vonMises).patches.length).toBe(4)
    expect(findLoadPatches(mesh, faces, tractions, invariants.vonMises, { featureAngle: 100 }).patches.length).toBe(1)
    expect(findLoadPatches(mesh, faces, tractions, invariants.vonMises, { featureAngle: 89 }).patches.length).toBe(4)
  })

  it('between parts: a loaded face crossing from part 1 into part 2 makes one patch per part', () => {
    const box = boxMesh({ nx: 4, ny: 2, nz: 2, lx: 4, ly: 1, lz: 1 }, 'hex8')
    // Part 1 for x < 2, part 2 beyond, from each element's first corner.
    const b = box.blocks[0]
    const nn = b.conn.length / b.ids.length
    const part = new Int32Array(b.ids.length)
    let minX = 0
    for (let e = 0; e < part.length; e++) {
      minX = Infinity
      for (let a = 0; a < nn; a++) minX = Math.min(minX, box.coords[3 * b.conn[nn * e + a]])
      part[e] = minX < 2 - 1e-9 ? 1 : 2
    }
    const mesh: Mesh = { ...box, blocks: [{ ...b, part }] }
    const stress = stressField(mesh, () => [0, 0, 10, 0, 0, 0]) // loads top and bottom only
    const lp = runCore(mesh, stress).loadPatches
    expect(lp.patches.length).toBe(4)
    expect(lp.patches.map((p) => p.part).sort()).toEqual([1, 1, 2, 2])
    // Each half of the top carries σzz times its area (Cauchy: t = σn).
    for (const p of lp.patches) {
      expect(p.area).toBeCloseTo(2, 12)
      expect(Math.abs(p.force[2])).toBeCloseTo(20, 10)
      expect(p.centroid[0]).toBeCloseTo(p.part === 1 ? 1 : 3, 12)
    }
  })
})
