import { describe, expect, it } from 'vitest'
import { faceRule, gaussLegendre, tensorRule, tetRule, triangleRule, volumeRule, wedgeRule } from '../../../src/mechanics/quadrature.ts'
import type { QuadratureRule } from '../../../src/mechanics/quadrature.ts'

const fact = (n: number): number => (n <= 1 ? 1 : n * fact(n - 1))
const sum = (r: QuadratureRule): number => r.weights.reduce((s, w) => s + w, 0)

/** ∫_{-1}^{1} x^k dx = 2/(k+1) for even k, 0 for odd k (elementary calculus). */
const lineMoment = (k: number): number => (k % 2 === 1 ? 0 : 2 / (k + 1))

describe('Gauss–Legendre', () => {
  it('weights sum to 2 and monomials up to degree 2n-1 integrate exactly', () => {
    for (let n = 1; n <= 5; n++) {
      const r = gaussLegendre(n)
      expect(sum(r)).toBeCloseTo(2, 14)
      for (let k = 0; k <= 2 * n - 1; k++) {
        let s = 0
        for (let q = 0; q < n; q++) s += r.weights[q] * r.points[q] ** k
        expect(Math.abs(s - lineMoment(k))).toBeLessThan(1e-14)
      }
    }
  })
  it('matches Abramowitz & Stegun (1964) Table 25.4 (15 digits, from memory)', () => {
    const g4 = gaussLegendre(4), g5 = gaussLegendre(5)
    // A&S Table 25.4, n = 4: ±0.339981043584856 (0.652145154862546), ±0.861136311594053 (0.347854845137454)
    expect(g4.points[2]).toBeCloseTo(0.339981043584856, 14)
    expect(g4.weights[2]).toBeCloseTo(0.652145154862546, 14)
    expect(g4.points[3]).toBeCloseTo(0.861136311594053, 14)
    expect(g4.weights[3]).toBeCloseTo(0.347854845137454, 14)
    // n = 5: 0 (0.568888888888889), ±0.538469310105683 (0.478628670499366), ±0.906179845938664 (0.236926885056189)
    expect(g5.weights[2]).toBeCloseTo(0.568888888888889, 14)
    expect(g5.points[3]).toBeCloseTo(0.538469310105683, 14)
    expect(g5.weights[3]).toBeCloseTo(0.478628670499366, 14)
    expect(g5.points[4]).toBeCloseTo(0.906179845938664, 14)
    expect(g5.weights[4]).toBeCloseTo(0.236926885056189, 14)
  })
  it('rejects unsupported point counts', () => {
    expect(() => gaussLegendre(6)).toThrow(RangeError)
  })
})

/** Exact simplex moments: ∫_T ξ^a η^b dA = a! b! / (a+b+2)!; ∫_K ξ^a η^b ζ^c dV = a! b! c! / (a+b+c+3)!
 * (the Dirichlet integral; e.g. Zienkiewicz & Taylor, The Finite Element Method, vol. 1, natural coordinates). */
const triMoment = (a: number, b: number): number => (fact(a) * fact(b)) / fact(a + b + 2)
const tetMoment = (a: number, b: number, c: number): number => (fact(a) * fact(b) * fact(c)) / fact(a + b + c + 3)

function checkTriangle(r: QuadratureRule, degree: number): void {
  expect(sum(r)).toBeCloseTo(0.5, 14)
  for (let a = 0; a <= degree; a++) for (let b = 0; a + b <= degree; b++) {
    let s = 0
    for (let q = 0; q < r.weights.length; q++) s += r.weights[q] * r.points[2 * q] ** a * r.points[2 * q + 1] ** b
    // Dunavant's degree-4 table has 15 digits, hence 1e-14 rather than round-off.
    expect(Math.abs(s - triMoment(a, b))).toBeLessThan(1e-14)
  }
}

function checkTet(r: QuadratureRule, degree: number): void {
  expect(sum(r)).toBeCloseTo(1 / 6, 14)
  for (let a = 0; a <= degree; a++) for (let b = 0; a + b <= degree; b++) for (let c = 0; a + b + c <= degree; c++) {
    let s = 0
    for (let q = 0; q < r.weights.length; q++) s += r.weights[q] * r.points[3 * q] ** a * r.points[3 * q + 1] ** b * r.points[3 * q + 2] ** c
    expect(Math.abs(s - tetMoment(a, b, c))).toBeLessThan(1e-15)
  }
}

describe('triangle rules (Dunavant 1985)', () => {
  it('integrate monomials up to their degree exactly', () => {
    for (let d = 1; d <= 5; d++) checkTriangle(triangleRule(d), d)
  })
  it('are not exact one degree higher (the degree is sharp)', () => {
    for (let d = 1; d <= 5; d++) {
      const r = triangleRule(d)
      let worst = 0
      for (let a = 0; a <= d + 1; a++) {
        const b = d + 1 - a
        let s = 0
        for (let q = 0; q < r.weights.length; q++) s += r.weights[q] * r.points[2 * q] ** a * r.points[2 * q + 1] ** b
        worst = Math.max(worst, Math.abs(s - triMoment(a, b)))
      }
      expect(worst).toBeGreaterThan(1e-10)
    }
  })
  it('has the published point counts and a few tabulated values (Dunavant 1985, from memory)', () => {
    expect([1, 2, 3, 4, 5].map((d) => triangleRule(d).weights.length)).toEqual([1, 3, 4, 6, 7])
    // Degree 5: weights 0.225, 0.132394152788506, 0.125939180544827 (of a unit-sum table);
    // points 0.059715871789770 / 0.470142064105115 and 0.797426985353087 / 0.101286507323456.
    const r = triangleRule(5)
    const w = Array.from(r.weights, (x) => 2 * x).sort((p, q) => p - q)
    expect(w[6]).toBeCloseTo(0.225, 14)
    expect(w[0]).toBeCloseTo(0.125939180544827, 14)
    expect(w[5]).toBeCloseTo(0.132394152788506, 14)
    const coords = Array.from(r.points)
    expect(coords.some((x) => Math.abs(x - 0.470142064105115) < 1e-14)).toBe(true)
    expect(coords.some((x) => Math.abs(x - 0.797426985353087) < 1e-14)).toBe(true)
    expect(coords.some((x) => Math.abs(x - 0.059715871789770) < 1e-14)).toBe(true)
    expect(coords.some((x) => Math.abs(x - 0.101286507323456) < 1e-14)).toBe(true)
  })
})

describe('tetrahedron rules (1-, 4-, 5-point; Keast 1986 11-point; collapsed product)', () => {
  it('integrate monomials up to their degree exactly', () => {
    for (let d = 1; d <= 7; d++) checkTet(tetRule(d), d)
  })
  it('has the published point counts and values (from memory)', () => {
    expect([1, 2, 3, 4].map((d) => tetRule(d).weights.length)).toEqual([1, 4, 5, 11])
    // 4-point rule: a = 0.1381966011250105, b = 0.5854101966249685, weight 1/24.
    const r2 = tetRule(2)
    expect(Math.min(...r2.points)).toBeCloseTo(0.1381966011250105, 15)
    expect(Math.max(...r2.points)).toBeCloseTo(0.5854101966249685, 15)
    // Keast 11-point: centroid weight -0.01315555555555556 = -74/5625; a = 0.3994035761667992.
    const r4 = tetRule(4)
    expect(Math.min(...r4.weights)).toBeCloseTo(-0.01315555555555556, 15)
    expect(Array.from(r4.points).some((x) => Math.abs(x - 0.3994035761667992) < 1e-15)).toBe(true)
  })
})

describe('tensor, wedge, volume and face rules', () => {
  it('measure the reference domains', () => {
    expect(sum(tensorRule(3, 2))).toBeCloseTo(4, 14)
    expect(sum(tensorRule(2, 3))).toBeCloseTo(8, 14)
    expect(sum(wedgeRule(2, 2))).toBeCloseTo(1, 14)
    expect(sum(volumeRule('tet4'))).toBeCloseTo(1 / 6, 15)
    expect(sum(volumeRule('tet10'))).toBeCloseTo(1 / 6, 15)
    expect(sum(volumeRule('hex8'))).toBeCloseTo(8, 14)
    expect(sum(volumeRule('hex20'))).toBeCloseTo(8, 14)
    expect(sum(volumeRule('wedge6'))).toBeCloseTo(1, 14)
    expect(sum(faceRule('tri3'))).toBeCloseTo(0.5, 15)
    expect(sum(faceRule('tri6'))).toBeCloseTo(0.5, 15)
    expect(sum(faceRule('quad4'))).toBeCloseTo(4, 14)
    expect(sum(faceRule('quad8'))).toBeCloseTo(4, 14)
  })
  it('face rules integrate the degree they promise (tri6: 4, quad8: 5 per direction)', () => {
    checkTriangle(faceRule('tri6'), 4)
    checkTriangle(faceRule('tri3'), 2)
    const q = faceRule('quad8')
    for (let a = 0; a <= 5; a++) for (let b = 0; b <= 5; b++) {
      let s = 0
      for (let i = 0; i < q.weights.length; i++) s += q.weights[i] * q.points[2 * i] ** a * q.points[2 * i + 1] ** b
      expect(Math.abs(s - lineMoment(a) * lineMoment(b))).toBeLessThan(1e-14)
    }
  })
  it('wedge rule integrates ξ^a η^b ζ^c (a+b ≤ 2, c ≤ 3) exactly', () => {
    const r = wedgeRule(2, 2)
    for (let a = 0; a <= 2; a++) for (let b = 0; a + b <= 2; b++) for (let c = 0; c <= 3; c++) {
      let s = 0
      for (let i = 0; i < r.weights.length; i++) s += r.weights[i] * r.points[3 * i] ** a * r.points[3 * i + 1] ** b * r.points[3 * i + 2] ** c
      expect(Math.abs(s - triMoment(a, b) * lineMoment(c))).toBeLessThan(1e-14)
    }
  })
})
