/**
 * Load-entry patches of a bar pulled at both ends (statics, common practice): uniform σxx = P/A
 * in a bar along x; the two end faces carry the load and form two patches, each with a resultant
 * of magnitude P (+P x̂ at x = L, -P x̂ at x = 0) and no moment about its own centroid; the
 * lateral surface is traction-free.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import { findLoadPatches } from '../../src/mechanics/loadPatches.ts'
import { stressField } from '../helpers/mappedMeshes.ts'
import { runCore } from '../helpers/pipeline.ts'

const L = 4, W = 0.5, D = 0.8, P = 1200
const area = W * D

describe('bar pulled at both ends: two load-entry patches', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    it(type, () => {
      const mesh = boxMesh({ nx: 6, ny: 2, nz: 2, lx: L, ly: W, lz: D }, type)
      const stress = stressField(mesh, () => [P / area, 0, 0, 0, 0, 0])
      const lp = runCore(mesh, stress).loadPatches
      expect(lp.referenceStress).toBeCloseTo(P / area, 9)
      expect(lp.threshold).toBeCloseTo(0.05 * P / area, 9)
      expect(lp.patches.length).toBe(2)
      for (const p of lp.patches) {
        expect(Math.hypot(...p.force) / P).toBeCloseTo(1, 12)
        expect(Math.hypot(...p.moment)).toBeLessThan(1e-9 * P * L)
        expect(p.area).toBeCloseTo(area, 12)
        expect(p.mean).toBeCloseTo(P / area, 9)
        expect(p.peak).toBeCloseTo(P / area, 9)
        // The +x end pulls +x, the -x end pulls -x.
        expect(Math.sign(p.force[0])).toBe(p.centroid[0] > L / 2 ? 1 : -1)
        expect(p.centroid[1]).toBeCloseTo(W / 2, 12)
        expect(p.centroid[2]).toBeCloseTo(D / 2, 12)
        // The end faces are flat, so their mean outward normal is the unit normal ±x (geometry).
        expect(p.normal[0]).toBeCloseTo(p.centroid[0] > L / 2 ? 1 : -1, 12)
        expect(Math.hypot(p.normal[1], p.normal[2])).toBeLessThan(1e-12)
      }
      expect(lp.patches.map((p) => p.id)).toEqual([0, 1])
      expect(lp.freeSurface.area).toBeCloseTo(2 * L * (W + D), 12)
      expect(lp.freeSurface.mean).toBeLessThan(1e-12 * P)
      expect(lp.freeSurface.relative).toBeLessThan(1e-12)
      expect(lp.freeSurface.peak).toBeLessThan(1e-12 * P)
      const labelled = Array.from(lp.faceLabel).filter((l) => l >= 0).length
      expect(labelled).toBe(lp.patches[0].faceCount + lp.patches[1].faceCount)
    })
  }

  it('a higher threshold option drops weakly loaded faces; patches sort by |force|; folds split them', () => {
    const mesh = boxMesh({ nx: 4, ny: 2, nz: 2, lx: L, ly: W, lz: D }, 'hex8')
    // σxx = P/A plus a small σzz = 0.1 P/A: the top and bottom faces carry 10 % of the end traction.
    const stress = stressField(mesh, () => [P / area, 0, 0.1 * P / area, 0, 0, 0])
    const { faces, tractions, invariants, loadPatches: all } = runCore(mesh, stress)
    // Ends (2), top and bottom: loaded, and split where the surface folds by 90°.
    expect(all.patches.length).toBe(4)
    expect(all.featureAngle).toBe(40)
    // With no fold splitting (180°) they join along shared edges into one loaded band.
    const band = findLoadPatches(mesh, faces, tractions, invariants.vonMises, { featureAngle: 180 })
    expect(band.patches.length).toBe(1)
    const strict = findLoadPatches(mesh, faces, tractions, invariants.vonMises, { threshold: 0.2, lowerThreshold: 0.2 })
    expect(strict.patches.length).toBe(2)
    expect(strict.freeSurface.relative).toBeGreaterThan(0.01)
    // Hysteresis: top and bottom (10 %) start no patch of their own at 20 %, but they join the
    // ends they touch when the lower level lets them and no fold separates them.
    const grown = findLoadPatches(mesh, faces, tractions, invariants.vonMises, { threshold: 0.2, lowerThreshold: 0.05, featureAngle: 180 })
    expect(grown.patches.length).toBe(1)
    expect(grown.patches[0].area).toBeCloseTo(2 * area + 2 * L * W, 12)
    const split = findLoadPatches(mesh, faces, tractions, invariants.vonMises, { threshold: 0.2, lowerThreshold: 0.05 })
    expect(split.patches.length).toBe(2)
  })
})
