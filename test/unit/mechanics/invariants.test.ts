import { describe, expect, it } from 'vitest'
import { EigenvalueDecomposition, Matrix } from 'ml-matrix'
import { allocateNodalInvariants, computeNodalInvariants, principalStresses, vonMises } from '../../../src/mechanics/invariants.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'


const SEED = Number(process.env.TRACTUS_SEED ?? 20261201)

function full(s: ArrayLike<number>): number[][] {
  return [[s[0], s[3], s[5]], [s[3], s[1], s[4]], [s[5], s[4], s[2]]]
}

/** Checks values against ml-matrix and directions by orthonormality and A v = λ v. */
function check(s: number[], label: string): void {
  const vals = [0, 0, 0], dirs = new Array<number>(9).fill(0)
  principalStresses(s, vals, dirs)
  const A = full(s)
  // Reference: ml-matrix EigenvalueDecomposition (general-purpose npm eigen solver).
  const ref = new EigenvalueDecomposition(new Matrix(A), { assumeSymmetric: true }).realEigenvalues.slice().sort((x, y) => y - x)
  const norm = Math.max(...ref.map(Math.abs), 1e-300)
  for (let i = 0; i < 3; i++) {
    if (Math.abs(vals[i] - ref[i]) > 1e-9 * norm) throw new Error(`${label}: σ${i + 1} = ${vals[i]} vs ${ref[i]}`)
  }
  const d = dirs
  const det = d[0] * (d[4] * d[8] - d[5] * d[7]) - d[1] * (d[3] * d[8] - d[5] * d[6]) + d[2] * (d[3] * d[7] - d[4] * d[6])
  if (Math.abs(det - 1) > 1e-12) throw new Error(`${label}: directions not right-handed (det ${det})`)
  for (let i = 0; i < 3; i++) {
    const v = dirs.slice(3 * i, 3 * i + 3)
    for (let j = 0; j < 3; j++) {
      const w = dirs.slice(3 * j, 3 * j + 3)
      const dot = v[0] * w[0] + v[1] * w[1] + v[2] * w[2]
      if (Math.abs(dot - (i === j ? 1 : 0)) > 1e-12) throw new Error(`${label}: directions ${i}, ${j} not orthonormal (${dot})`)
    }
    for (let k = 0; k < 3; k++) {
      const Av = A[k][0] * v[0] + A[k][1] * v[1] + A[k][2] * v[2]
      if (Math.abs(Av - vals[i] * v[k]) > 1e-9 * norm) throw new Error(`${label}: A v ≠ λ v for σ${i + 1} (${Av} vs ${vals[i] * v[k]})`)
    }
  }
}

describe('principal stresses (Smith 1961) against ml-matrix', () => {
  it(`agree on 2000 random symmetric tensors (seed ${SEED})`, () => {
    console.log(`invariants.test seed ${SEED} (set TRACTUS_SEED to replay)`)
    const rnd = mulberry32(SEED)
    for (let i = 0; i < 2000; i++) {
      const scale = 10 ** (6 * rnd() - 3)
      const s = Array.from({ length: 6 }, () => (2 * rnd() - 1) * scale)
      check(s, `seed ${SEED} tensor ${i}`)
    }
  })

  it(`handle repeated and nearly repeated roots (seed ${SEED})`, () => {
    const rnd = mulberry32(SEED + 1)
    for (let i = 0; i < 1000; i++) {
      // Q diag(a, b, c) Qᵀ with two or three roots equal or within 1e-12 of each other.
      const a = 2 * rnd() - 1, eps = [0, 1e-12, 1e-8][i % 3]
      const lam = i % 5 === 0 ? [a, a + eps, a - eps] : i % 2 ? [a, a + eps, 3 * rnd() - 1.5] : [3 * rnd() - 1.5, a, a + eps]
      const Q = randomRotation(rnd)
      const s6 = [0, 0, 0, 0, 0, 0]
      const idx: [number, number][] = [[0, 0], [1, 1], [2, 2], [0, 1], [1, 2], [0, 2]]
      idx.forEach(([r, c], k) => { for (let m = 0; m < 3; m++) s6[k] += Q[r][m] * lam[m] * Q[c][m] })
      check(s6, `seed ${SEED + 1} tensor ${i}`)
    }
  })

  it('diagonal, isotropic, zero and large-magnitude tensors', () => {
    check([3, -1, 2, 0, 0, 0], 'diagonal')
    check([5, 5, 5, 0, 0, 0], 'isotropic')
    check([0, 0, 0, 0, 0, 0], 'zero')
    check([1, 2, -1, 0.5, 0, 0.1], 'moderate twin of the huge case')
    // ml-matrix overflows on 1e300 and underflows on 1e-300 entries; there homogeneity
    // (λ(cA) = cλ(A)) against the moderate twins checked above is the reference.
    const tiny = [0, 0, 0], huge = [0, 0, 0], unit = [0, 0, 0], unit2 = [0, 0, 0]
    principalStresses([1e-300, 2e-300, 0, 0, 1e-300, 0], tiny)
    principalStresses([1, 2, 0, 0, 1, 0], unit)
    principalStresses([1e300, 2e300, -1e300, 5e299, 0, 1e299], huge)
    principalStresses([1, 2, -1, 0.5, 0, 0.1], unit2)
    for (let i = 0; i < 3; i++) {
      expect(tiny[i] / 1e-300).toBeCloseTo(unit[i], 12)
      expect(huge[i] / 1e300).toBeCloseTo(unit2[i], 12)
    }
    check([1, 2, 0, 0, 1, 0], 'moderate twin of the tiny case')
    check([2, 2, 7, 0, 0, 0], 'diagonal double')
    const v = [0, 0, 0]
    principalStresses([1, 2, 3, 0, 0, 0], v)
    expect(v).toEqual([3, 2, 1])
  })
})

function randomRotation(rnd: () => number): number[][] {
  // Unit quaternion from three uniforms (Shoemake 1992, Graphics Gems III).
  const u1 = rnd(), u2 = rnd(), u3 = rnd()
  const w = Math.sqrt(1 - u1) * Math.sin(2 * Math.PI * u2), x = Math.sqrt(1 - u1) * Math.cos(2 * Math.PI * u2)
  const y = Math.sqrt(u1) * Math.sin(2 * Math.PI * u3), z = Math.sqrt(u1) * Math.cos(2 * Math.PI * u3)
  return [
    [1 - 2 * (y * y + z * z), 2 * (x * y - z * w), 2 * (x * z + y * w)],
    [2 * (x * y + z * w), 1 - 2 * (x * x + z * z), 2 * (y * z - x * w)],
    [2 * (x * z - y * w), 2 * (y * z + x * w), 1 - 2 * (x * x + y * y)],
  ]
}

describe('von Mises and Tresca (von Mises 1913; any strength-of-materials text)', () => {
  it('uniaxial σ gives σ_vm = σ; pure shear τ gives √3 τ and Tresca 2τ', () => {
    expect(vonMises([250, 0, 0, 0, 0, 0])).toBeCloseTo(250, 12)
    expect(vonMises([0, 0, -40, 0, 0, 0])).toBeCloseTo(40, 12)
    expect(vonMises([0, 0, 0, 0, 30, 0])).toBeCloseTo(Math.sqrt(3) * 30, 12)
    const inv = computeNodalInvariants(allocateNodalInvariants(3), Float64Array.from([0, 0, 0, 30, 0, 0, 250, 0, 0, 0, 0, 0, 7, 7, 7, 0, 0, 0]))
    expect(inv.tresca[0]).toBeCloseTo(60, 12)
    expect(inv.vonMises[0]).toBeCloseTo(Math.sqrt(3) * 30, 12)
    expect(inv.vonMises[1]).toBeCloseTo(250, 12)
    expect(inv.tresca[1]).toBeCloseTo(250, 12)
    // Hydrostatic: no distortion (common practice).
    expect(inv.vonMises[2]).toBe(0)
    expect(inv.mean[2]).toBeCloseTo(7, 14)
    expect(Array.from(inv.principal.subarray(0, 3))).toEqual([30, 0, -30].map((x) => expect.closeTo(x, 12)))
  })
})
