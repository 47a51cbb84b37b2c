import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/demo/boxMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'
import { computeElementBalance, percentiles } from '../../../src/mechanics/balanceAudit.ts'
import { elementVolumes } from '../../../src/mechanics/elementVolume.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'

describe('computeElementBalance', () => {
  // Divergence theorem (any vector-calculus text): ∮ σn dA = ∫ div σ dV, exact for a linear
  // σ, which every element type interpolates exactly.
  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type}: residual of a linear field = V · div σ (+ ρb V)`, () => {
      const mesh = boxMesh({ nx: 2, ny: 1, nz: 2, lx: 1, ly: 0.7, lz: 1.3 }, type)
      // div σ = (∂σxx/∂x + ∂σxy/∂y + ∂σxz/∂z, ...) for σxx = 2x, σxy = 3y, σxz = -z, σyy = 5z, σyz = x, σzz = y.
      const stress = stressField(mesh, (x, y, z) => [2 * x, 0, y, 3 * y, x, -z])
      const div = [2 + 3 - 1, 0 + 0 + 0, 0 + 0 + 0]
      const stress2 = stressField(mesh, (x, y, z) => [2 * x, 5 * z, y, 3 * y, x, -z])
      const b: [number, number, number] = [0.5, -1, 2]
      const r = computeElementBalance(mesh, stress, b)
      const r2 = computeElementBalance(mesh, stress2, [0, 0, 0])
      const V = elementVolumes(mesh)
      for (let e = 0; e < mesh.elementCount; e++) {
        for (let k = 0; k < 3; k++) expect(r.residual[3 * e + k]).toBeCloseTo((div[k] + b[k]) * V[e], 12)
        // σyy = 5z does not enter div σ (∂σyy/∂y = 0): same residual without body force.
        for (let k = 0; k < 3; k++) expect(r2.residual[3 * e + k]).toBeCloseTo(div[k] * V[e], 12)
        expect(r.gross[e]).toBeGreaterThan(0)
        expect(r.indicator[e]).toBeCloseTo(Math.hypot(r.residual[3 * e], r.residual[3 * e + 1], r.residual[3 * e + 2]) / r.gross[e], 12)
      }
    })
  }

  it('an unstressed element without body force has indicator 0', () => {
    const mesh = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, 'hex8')
    const r = computeElementBalance(mesh, new Float64Array(6 * mesh.nodeCount), [0, 0, 0])
    expect(r.indicator[0]).toBe(0)
    expect(r.gross[0]).toBe(0)
  })
})

describe('percentiles', () => {
  // Linear interpolation between order statistics, Hyndman & Fan (1996) type 7.
  it('matches hand-computed type-7 values and ignores NaN', () => {
    expect(percentiles([4, 1, 3, 2], [0, 25, 50, 100])).toEqual([1, 1.75, 2.5, 4])
    expect(percentiles(Float64Array.from([NaN, 10, NaN, 20]), [50, 95])).toEqual([15, 19.5])
    expect(percentiles([], [50]).map(Number.isNaN)).toEqual([true])
    expect(percentiles([7], [0, 50, 100])).toEqual([7, 7, 7])
  })
})
