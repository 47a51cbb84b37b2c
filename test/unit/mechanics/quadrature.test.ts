import { describe, expect, it } from 'vitest'
import { faceRule, gaussJacobi, gaussLegendre, pyramidRule, tensorRule, tetRule, triangleRule, volumeRule, wedgeRule } from '../../../src/mechanics/quadrature.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES, FACE_KINDS } from '../../../src/model/elementTypes.ts'
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
    // Reference volumes (elementary geometry): tetrahedron 1/6, cube 8, wedge 1/2 × 2, pyramid
    // base 4 × height 1 / 3; triangle 1/2, square 4.
    const volume: Record<string, number> = { tetrahedron: 1 / 6, cube: 8, wedge: 1, pyramid: 4 / 3 }
    for (const t of ELEMENT_TYPE_NAMES) {
      expect(sum(volumeRule(t)), t).toBeCloseTo(volume[ELEMENT_TYPES[t].domain.name], 14)
      expect(ELEMENT_TYPES[t].domain.volume, t).toBe(volume[ELEMENT_TYPES[t].domain.name])
    }
    for (const k of FACE_KINDS) expect(sum(faceRule(k.name)), k.name).toBeCloseTo(k.cornerCount === 3 ? 0.5 : 4, 14)
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

describe('Gauss–Jacobi rules (weight (1 - w)^α on [0, 1]; Abramowitz & Stegun 25.4.33)', () => {
  /** ∫₀¹ w^k (1 - w)^α dw = k! α! / (k + α + 1)! (the Beta function; elementary calculus). */
  const jacobiMoment = (k: number, alpha: number): number => (fact(k) * fact(alpha)) / fact(k + alpha + 1)
  it('integrate w^k exactly up to k = 2n - 1 and not at k = 2n (the degree is sharp)', () => {
    for (const alpha of [0, 1, 2]) for (let n = 1; n <= 8; n++) {
      const r = gaussJacobi(n, alpha)
      const moment = (k: number): number => r.weights.reduce((s, w, i) => s + w * r.points[i] ** k, 0)
      for (let k = 0; k <= 2 * n - 1; k++) expect(Math.abs(moment(k) - jacobiMoment(k, alpha))).toBeLessThan(1e-15)
      expect(Math.abs(moment(2 * n) - jacobiMoment(2 * n, alpha))).toBeGreaterThan(1e-12)
      for (const w of r.points) expect(w > 0 && w < 1).toBe(true)
      for (const w of r.weights) expect(w).toBeGreaterThan(0)
    }
  })
  it('α = 0 is Gauss–Legendre moved to [0, 1]; α = 2 with two points has nodes (5 ∓ √10)/15', () => {
    const g = gaussLegendre(4), j = gaussJacobi(4, 0)
    for (let i = 0; i < 4; i++) {
      expect(j.points[i]).toBeCloseTo((g.points[i] + 1) / 2, 15)
      expect(j.weights[i]).toBeCloseTo(g.weights[i] / 2, 15)
    }
    // The orthogonal quadratic for (1 - w)² on [0, 1] is w² - 2w/3 + 1/15 (derived from the
    // moments 1/3, 1/12, 1/30, 1/60): its roots are the nodes.
    const r = gaussJacobi(2, 2)
    expect(r.points[0]).toBeCloseTo((5 - Math.sqrt(10)) / 15, 15)
    expect(r.points[1]).toBeCloseTo((5 + Math.sqrt(10)) / 15, 15)
    expect(gaussJacobi(1, 2).points[0]).toBe(0.25)
  })
  it('rejects what it does not offer', () => {
    expect(() => gaussJacobi(9, 2)).toThrow(RangeError)
    expect(() => gaussJacobi(2, 0.5)).toThrow(RangeError)
  })
})

describe('pyramid rules (collapsed cube, Gauss–Legendre × Gauss–Jacobi α = 2)', () => {
  /**
   * Exact moments over the pyramid |ξ|, |η| ≤ s = 1 - ζ, 0 ≤ ζ ≤ 1 (elementary calculus: the
   * cross-section at height ζ is the square of side 2s, then the Beta function):
   * ∫ ξ^a η^b ζ^c s^(-m) dV = [a, b even] 4/((a+1)(b+1)) · c! (a+b+2-m)! / (a+b+c+3-m)!.
   */
  const pyramidMoment = (a: number, b: number, c: number, m = 0): number =>
    a % 2 === 1 || b % 2 === 1 ? 0 : (4 / ((a + 1) * (b + 1))) * (fact(c) * fact(a + b + 2 - m)) / fact(a + b + c + 3 - m)
  const integrate = (r: QuadratureRule, f: (x: number, y: number, z: number) => number): number =>
    r.weights.reduce((s, w, q) => s + w * f(r.points[3 * q], r.points[3 * q + 1], r.points[3 * q + 2]), 0)

  it('measure the reference pyramid, 4/3', () => {
    for (const [nuv, nw] of [[1, 1], [2, 2], [3, 3], [2, 4]]) expect(sum(pyramidRule(nuv, nw))).toBeCloseTo(4 / 3, 15)
  })
  it('n × n × n points integrate every monomial of total degree 2n - 1 exactly', () => {
    for (let n = 1; n <= 4; n++) {
      const r = pyramidRule(n, n)
      const d = 2 * n - 1
      for (let a = 0; a <= d; a++) for (let b = 0; a + b <= d; b++) for (let c = 0; a + b + c <= d; c++) {
        expect(Math.abs(integrate(r, (x, y, z) => x ** a * y ** b * z ** c) - pyramidMoment(a, b, c)), `${n}: ${a}${b}${c}`).toBeLessThan(4e-15)
      }
    }
  })
  it('integrate the rational terms of the pyramid functions exactly (polynomials in the collapsed coordinates)', () => {
    const r = pyramidRule(3, 3)
    // ξ²η²/s, ξ²η²ζ/s², ξ²/s, ξ²η²/s² and ξ⁴η²/s³: the products the pyramid13 functions form.
    for (const [a, b, c, m] of [[2, 2, 0, 1], [2, 2, 1, 2], [2, 0, 0, 1], [2, 2, 0, 2], [4, 2, 0, 3]]) {
      const exact = pyramidMoment(a, b, c, m)
      expect(Math.abs(integrate(r, (x, y, z) => (x ** a * y ** b * z ** c) / (1 - z) ** m) - exact) / exact).toBeLessThan(1e-14)
    }
  })
  it('the registry rules integrate every pyramid and wedge15 shape function exactly (∫ N_a dV, against a finer rule)', () => {
    // In the collapsed coordinates a pyramid13 function has degree ≤ 2 per direction (wedge15:
    // degree 2 on the triangle and in ζ), so both the registry's rule and the 5-point rules are
    // exact for ∫ N_a dV and must agree to round-off.
    for (const [type, fine] of [['pyramid5', pyramidRule(5, 5)], ['pyramid13', pyramidRule(5, 5)], ['wedge15', wedgeRule(5, 5)]] as const) {
      const t = ELEMENT_TYPES[type]
      const N = new Float64Array(t.nodeCount)
      const moments = (r: QuadratureRule): number[] => {
        const out = new Array(t.nodeCount).fill(0)
        for (let q = 0; q < r.weights.length; q++) {
          t.shapeValues(r.points[3 * q], r.points[3 * q + 1], r.points[3 * q + 2], N)
          for (let a = 0; a < t.nodeCount; a++) out[a] += r.weights[q] * N[a]
        }
        return out
      }
      const own = moments(t.volumeRule), ref = moments(fine)
      for (let a = 0; a < t.nodeCount; a++) expect(Math.abs(own[a] - ref[a]), `${type} node ${a}`).toBeLessThan(1e-15)
    }
  })
})

describe('wedge15 rule (triangle degree 4 × 3-point Gauss–Legendre)', () => {
  it('integrates ξ^a η^b ζ^c with a + b ≤ 4 and c ≤ 5 exactly (det J of any wedge15)', () => {
    const r = volumeRule('wedge15')
    for (let a = 0; a <= 4; a++) for (let b = 0; a + b <= 4; b++) for (let c = 0; c <= 5; c++) {
      let s = 0
      for (let i = 0; i < r.weights.length; i++) s += r.weights[i] * r.points[3 * i] ** a * r.points[3 * i + 1] ** b * r.points[3 * i + 2] ** c
      expect(Math.abs(s - triMoment(a, b) * lineMoment(c))).toBeLessThan(1e-14)
    }
  })
})
