import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'
import { allocateElementBalance, computeElementBalance, computeElementBalanceGeneral, percentiles } from '../../../src/mechanics/balanceAudit.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { elementVolumes } from '../../../src/mechanics/elementVolume.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'
import type { Mesh } from '../../../src/model/model.ts'
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
      const r = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, nodalStressField(mesh, stress), b)
      const r2 = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, nodalStressField(mesh, stress2), [0, 0, 0])
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

  /**
   * A hex8 box with every interior node moved by up to ±15 % of the cell size per axis (seeded):
   * warped, non-parallel faces, every element still positively oriented (checked by the caller).
   */
  function distortedHexBox(nx: number, ny: number, nz: number, seed: number, origin = 0): Mesh {
    const mesh = boxMesh({ nx, ny, nz, lx: 1, ly: 0.8, lz: 1.2, x0: origin, y0: origin, z0: origin }, 'hex8')
    const h = [1 / nx, 0.8 / ny, 1.2 / nz]
    const rand = mulberry32(seed)
    const c = mesh.coords.slice()
    let i = 0
    for (let k = 0; k <= nz; k++) for (let j = 0; j <= ny; j++) for (let l = 0; l <= nx; l++, i++) {
      if (l === 0 || l === nx || j === 0 || j === ny || k === 0 || k === nz) continue
      for (let d = 0; d < 3; d++) c[3 * i + d] += 0.15 * h[d] * (2 * rand() - 1)
    }
    return { ...mesh, coords: c }
  }

  // The hex8 closed form integrates the same bilinear faces and σ as the general 2×2 face
  // quadrature (both exact for that integrand), so the two agree to rounding.
  for (const [nx, ny, nz, seed] of [[3, 3, 3, 7], [4, 2, 5, 20261201]]) {
    it(`hex8 closed form = general face quadrature on a distorted ${nx}×${ny}×${nz} box`, () => {
      const mesh = distortedHexBox(nx, ny, nz, seed)
      // Boxes are numbered node-fastest in x, then y, then z (boxMesh): distortedHexBox relies on it to find the interior nodes.
      expect(mesh.nodeCount).toBe((nx + 1) * (ny + 1) * (nz + 1))
      const V = elementVolumes(mesh)
      for (let e = 0; e < mesh.elementCount; e++) expect(V[e]).toBeGreaterThan(0)
      // A quadratic field (σ quadratic in x, y, z with cross terms) with a body force: neither
      // interpolated exactly nor in equilibrium, so every element has a sizeable residual.
      const stress = stressField(mesh, (x, y, z) => [1 + x * x + 2 * x * y, 2 + y * y - x * z, -1 + z * z + x * y, 0.5 + x * z + y * y, y * z - x * x, 3 * x * y + z])
      const b: [number, number, number] = [0.5, 2, -3]
      const fast = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, nodalStressField(mesh, stress), b)
      const ref = computeElementBalanceGeneral(allocateElementBalance(mesh.elementCount), mesh, nodalStressField(mesh, stress), b)
      for (let e = 0; e < mesh.elementCount; e++) {
        const r = [ref.residual[3 * e], ref.residual[3 * e + 1], ref.residual[3 * e + 2]]
        const d = [fast.residual[3 * e] - r[0], fast.residual[3 * e + 1] - r[1], fast.residual[3 * e + 2] - r[2]]
        expect(Math.hypot(...r)).toBeGreaterThan(1e-3 * ref.gross[e])
        expect(Math.hypot(...d)).toBeLessThanOrEqual(1e-12 * Math.hypot(...r))
        expect(Math.abs(fast.gross[e] - ref.gross[e])).toBeLessThanOrEqual(1e-12 * ref.gross[e])
        expect(Math.abs(fast.indicator[e] - ref.indicator[e])).toBeLessThanOrEqual(1e-12 * ref.indicator[e])
      }
    })
  }

  // Divergence theorem with div x = 3: V = ⅓ ∮ x·n dA, exact on a trilinear hexahedron; compared
  // with the volume quadrature of elementVolumes (∫ det J dξ). With zero stress the residual is
  // ρb·V and the gross load ½|ρb|V. The second box sits far from the origin.
  for (const origin of [0, 1000]) {
    it(`hex8 closed form: residual of zero stress = ρb · V on a distorted box at origin ${origin}`, () => {
      const mesh = distortedHexBox(4, 3, 3, 99, origin)
      const b: [number, number, number] = [0.3, -9.81, 1.7]
      const bMag = Math.hypot(...b)
      const r = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, nodalStressField(mesh, new Float64Array(6 * mesh.nodeCount)), b)
      const V = elementVolumes(mesh)
      for (let e = 0; e < mesh.elementCount; e++) {
        for (let k = 0; k < 3; k++) expect(Math.abs(r.residual[3 * e + k] - b[k] * V[e])).toBeLessThanOrEqual(1e-12 * Math.abs(b[k] * V[e]))
        expect(Math.abs(r.gross[e] - 0.5 * bMag * V[e])).toBeLessThanOrEqual(1e-12 * 0.5 * bMag * V[e])
      }
    })
  }

  it('an unstressed element without body force has indicator 0', () => {
    const mesh = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, 'hex8')
    const r = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, nodalStressField(mesh, new Float64Array(6 * mesh.nodeCount)), [0, 0, 0])
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
