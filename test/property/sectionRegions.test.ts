/**
 * Properties of section regions: the regions' forces sum to the whole-plane force, their moments
 * transfer to the whole section's centroid by M_c = M_r + (r − c) × F (rigid-body statics), and
 * everything turns with a rigidly rotated model (objectivity of t = σn; Malvern 1969, ch. 3).
 * Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { Vec3 } from '../../src/model/model.ts'
import { assembly } from '../helpers/assemblies.ts'
import { mulberry32, rotateStressField, rotateVec, rotationFromUniforms, rotateMesh } from '../helpers/rotation.ts'
import { nodalStress } from '../helpers/sectionMeshes.ts'

const SEED = 1414
const cross = (a: readonly number[], b: readonly number[]): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]

describe(`section regions (seed ${SEED})`, () => {
  console.log(`section regions property seed ${SEED}`)
  const rnd = mulberry32(SEED)
  // three parts: two bars side by side (shared nodes where they touch) and a separate third
  const mesh = assembly([
    { box: { nx: 2, ny: 2, nz: 4, lx: 1, ly: 1, lz: 4 }, type: 'hex8', part: 1 },
    { box: { nx: 2, ny: 2, nz: 4, lx: 1, ly: 1, lz: 4, x0: 1 }, type: 'tet10', part: 2 },
    { box: { nx: 2, ny: 2, nz: 4, lx: 1, ly: 1, lz: 4, x0: 3 }, type: 'wedge6', part: 3 },
  ], true)
  const c6 = Array.from({ length: 24 }, () => rnd() * 2 - 1)
  const stress = nodalStress(mesh, (x, y, z) => [0, 1, 2, 3, 4, 5].map((k) => c6[k] + c6[6 + k] * x + c6[12 + k] * y + c6[18 + k] * z))

  for (let trial = 0; trial < 6; trial++) {
    const normal: Vec3 = [0.3 * (rnd() - 0.5), 0.3 * (rnd() - 0.5), 1]
    const point: Vec3 = [2, 0.5, 0.5 + 3 * rnd()]
    it(`trial ${trial}: forces sum, moments transfer, rotation`, () => {
      const r = cutSection(mesh, nodalStressField(mesh, stress), [0, 0, 0], { point, normal }, { regions: true }).result
      const regs = r.regions!
      expect(regs.length).toBe(3)
      const scale = Math.max(...regs.map((g) => Math.hypot(...g.force)))
      const F: Vec3 = [0, 0, 0], M: Vec3 = [0, 0, 0]
      let area = 0
      for (const g of regs) {
        area += g.area
        const arm = cross([g.centroid[0] - r.centroid[0], g.centroid[1] - r.centroid[1], g.centroid[2] - r.centroid[2]], g.force)
        for (let k = 0; k < 3; k++) { F[k] += g.force[k]; M[k] += g.moment[k] + arm[k] }
      }
      expect(area).toBeCloseTo(r.area, 12)
      for (let k = 0; k < 3; k++) {
        expect(Math.abs(F[k] - r.force[k])).toBeLessThan(1e-12 * scale)
        expect(Math.abs(M[k] - r.moment[k])).toBeLessThan(1e-11 * scale * 5)
      }
      // the same cut of the rotated model: each region's force and centroid turn with it
      const Q = rotationFromUniforms(rnd(), rnd(), rnd())
      const rm = rotateMesh(mesh, Q)
      const rr = cutSection(rm, nodalStressField(rm, rotateStressField(Q, stress)), [0, 0, 0], { point: rotateVec(Q, point), normal: rotateVec(Q, normal) }, { regions: true }).result
      for (const g of regs) {
        const h = rr.regions!.find((x) => x.parts[0] === g.parts[0])!
        const f = rotateVec(Q, g.force), c = rotateVec(Q, g.centroid), mm = rotateVec(Q, g.moment)
        for (let k = 0; k < 3; k++) {
          expect(Math.abs(h.force[k] - f[k])).toBeLessThan(1e-10 * scale)
          expect(Math.abs(h.centroid[k] - c[k])).toBeLessThan(1e-10)
          expect(Math.abs(h.moment[k] - mm[k])).toBeLessThan(1e-9 * scale)
        }
      }
    })
  }
})
