/**
 * Body force balance: the static Cauchy equation div σ + ρb = 0 (Malvern 1969, ch. 3). A column
 * of height H under its own weight, body force ρb = (0, 0, -ρg), carries σzz = -ρg(H - z) (free
 * top, supported base). Element and whole-body residuals vanish only when ρb is included, and the
 * base reaction equals the weight ρgV (statics).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import type { Vec3 } from '../../src/model/model.ts'
import { elementVolumes } from '../../src/mechanics/elementVolume.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance } from '../../src/mechanics/balanceAudit.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { stressField } from '../helpers/mappedMeshes.ts'
import { maxAbs, runCore } from '../helpers/pipeline.ts'
import { mulberry32, rotateMesh, rotateStressField, rotateVec, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = Number(process.env.TRACTUS_SEED ?? 815)
const H = 3, RHO_G = 2300 * 9.81 // N/m³: a rock-like density (invented test value)

describe(`gravity column σzz = -ρg(H - z) (rotation seed ${SEED})`, () => {
  const rnd = mulberry32(SEED)
  for (const type of ELEMENT_TYPE_NAMES) {
    const Q = rotationFromUniforms(rnd(), rnd(), rnd())
    it(type, () => {
      const mesh = boxMesh({ nx: 2, ny: 2, nz: 4, lx: 1, ly: 0.5, lz: H }, type)
      const stress = stressField(mesh, (_x, _y, z) => [0, 0, -RHO_G * (H - z), 0, 0, 0])
      const b: Vec3 = [0, 0, -RHO_G]
      const r = runCore(mesh, stress, b)
      // With ρb: every element balances to round-off.
      expect(maxAbs(r.elements.indicator)).toBeLessThan(1e-11)
      expect(r.body.relative).toBeLessThan(1e-12)
      // Without ρb: every element is out of balance by its weight ρg·V_e (statics), a visible
      // fraction of its gross face load.
      const noBody = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, nodalStressField(mesh, stress), [0, 0, 0])
      const vol = elementVolumes(mesh)
      let minIndicator = Infinity
      for (let e = 0; e < mesh.elementCount; e++) {
        minIndicator = Math.min(minIndicator, noBody.indicator[e])
        expect(Math.abs(noBody.residual[3 * e + 2] / (RHO_G * vol[e]) - 1)).toBeLessThan(1e-9)
      }
      expect(minIndicator).toBeGreaterThan(0.02)
      const bodyNoB = computeBodyBalance(mesh, r.faces, r.tractions, [0, 0, 0])
      expect(bodyNoB.relative).toBeGreaterThan(0.5)
      // Base reaction (faces on z = 0) = weight, pointing up.
      const V = 1 * 0.5 * H
      expect(r.body.volume).toBeCloseTo(V, 12)
      let Rz = 0, Rxy = 0
      for (let f = 0; f < r.faces.count; f++) {
        if (Math.abs(r.faces.centroid[3 * f + 2]) > 1e-12) continue
        Rz += r.tractions.force[3 * f + 2]
        Rxy += Math.hypot(r.tractions.force[3 * f], r.tractions.force[3 * f + 1])
      }
      expect(Rz / (RHO_G * V)).toBeCloseTo(1, 12)
      expect(Rxy).toBeLessThan(1e-9 * RHO_G * V)
      expect(r.body.bodyForceTotal[2]).toBeCloseTo(-RHO_G * V, 6)

      // Rotated: the same balance, and the body force total rotates with the body.
      const bq = rotateVec(Q, b)
      const rq = runCore(rotateMesh(mesh, Q), rotateStressField(Q, stress), bq)
      expect(maxAbs(rq.elements.indicator)).toBeLessThan(1e-11)
      expect(rq.body.relative).toBeLessThan(1e-12)
      const sf = rotateVec(Q, r.body.surfaceForce)
      for (let c = 0; c < 3; c++) expect(rq.body.surfaceForce[c]).toBeCloseTo(sf[c], 6)
    })
  }
})
