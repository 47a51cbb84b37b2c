/**
 * Cauchy's formula on random uniform stress states (Malvern 1969, ch. 3): t = σn at every
 * boundary face node of any element type and any box; every element and the whole body
 * balance to round-off; the face force equals σ·(A n) on flat faces.
 */
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import { maxAbs, runCore } from '../helpers/pipeline.ts'

const SEED = Number(process.env.TRACTUS_SEED ?? 20261201)
const comp = fc.double({ min: -1e4, max: 1e4, noNaN: true })
const len = fc.double({ min: 0.01, max: 100, noNaN: true })

describe(`random uniform stress (fast-check seed ${SEED})`, () => {
  it('t = σn at every face node; element and body balance to round-off', () => {
    console.log(`uniformStress property fast-check seed ${SEED} (set TRACTUS_SEED to replay)`)
    fc.assert(fc.property(
      fc.constantFrom(...ELEMENT_TYPE_NAMES), fc.array(comp, { minLength: 6, maxLength: 6 }), len, len, len,
      fc.integer({ min: 1, max: 2 }), fc.integer({ min: 1, max: 2 }),
      (type, s, lx, ly, lz, nx, nz) => {
        const mesh = boxMesh({ nx, ny: 1, nz, lx, ly, lz, x0: -lx / 3 }, type)
        const stress = new Float64Array(6 * mesh.nodeCount)
        for (let i = 0; i < mesh.nodeCount; i++) stress.set(s, 6 * i)
        const { faces, tractions, elements, body } = runCore(mesh, stress)
        const scale = 1 + maxAbs(s)
        for (let f = 0; f < faces.count; f++) {
          const A = faces.area[f]
          const n = [faces.normal[3 * f], faces.normal[3 * f + 1], faces.normal[3 * f + 2]]
          const t = [s[0] * n[0] + s[3] * n[1] + s[5] * n[2], s[3] * n[0] + s[1] * n[1] + s[4] * n[2], s[5] * n[0] + s[4] * n[1] + s[2] * n[2]]
          for (let k = 0; k < 3; k++) if (Math.abs(tractions.force[3 * f + k] - t[k] * A) > 1e-10 * scale * A) return false
          for (let a = 0; a < faces.slots; a++) {
            const i = faces.slots * f + a
            if (Number.isNaN(tractions.nodeMagnitude[i])) continue
            for (let k = 0; k < 3; k++) if (Math.abs(tractions.nodeTraction[3 * i + k] - t[k]) > 1e-10 * scale) return false
          }
        }
        if (maxAbs(elements.indicator) > 1e-10) return false
        return body.relative < 1e-10 || body.gross === 0
      }), { seed: SEED, numRuns: 60 })
    expect(true).toBe(true)
  })
})
