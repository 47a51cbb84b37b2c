import { describe, expect, it } from 'vitest'
import { barycentric, MAX_SECTION_RULE_DEGREE, sectionRule, shapeDegree } from '../../../src/mechanics/sectionRule.ts'
import { referenceDomain } from '../../../src/mechanics/inverseMap.ts'
import { shapeValues } from '../../../src/mechanics/shapeFunctions.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'

const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1))

describe('section rule', () => {
  // Total degrees of the standard shape functions (Zienkiewicz & Taylor, The Finite Element
  // Method, vol. 1, ch. 6): tet4 linear, tet10 quadratic, hex8 trilinear (ξηζ), hex20
  // serendipity (ξ²ηζ), wedge6 triangle × line (ξζ).
  it.each([['tet4', 1], ['tet10', 2], ['hex8', 3], ['hex20', 4], ['wedge6', 2]] as const)('%s shape functions have degree %i', (type, p) => {
    expect(shapeDegree(type)).toBe(p)
    expect(sectionRule(type).degree).toBe(Math.min(p + 1, MAX_SECTION_RULE_DEGREE))
  })

  // For every registered type: a finite degree p means the functions on any other line are
  // reproduced by the polynomial of degree p through p + 1 of their values (Lagrange).
  it.each([...ELEMENT_TYPE_NAMES])('%s: the degree found holds on another line through the element', (type) => {
    const p = shapeDegree(type), nn = ELEMENT_TYPES[type].nodeCount, dom = referenceDomain(type)
    if (!Number.isFinite(p)) { expect(sectionRule(type).degree).toBe(MAX_SECTION_RULE_DEGREE); return }
    const d = [-0.41, 0.67, 0.23], h = 0.05 * dom.size
    const at = (s: number) => shapeValues(type, dom.centre[0] + s * d[0], dom.centre[1] + s * d[1], dom.centre[2] + s * d[2], new Float64Array(nn))
    const nodes = Array.from({ length: p + 1 }, (_, i) => (i - p / 2) * h)
    const vals = nodes.map(at)
    const s = 0.37 * h, want = at(s)
    for (let a = 0; a < nn; a++) {
      let v = 0
      nodes.forEach((si, i) => {
        let l = 1
        nodes.forEach((sj, j) => { if (j !== i) l *= (s - sj) / (si - sj) })
        v += l * vals[i][a]
      })
      expect(Math.abs(v - want[a])).toBeLessThan(1e-10)
    }
  })

  // ∫_T λ0^a λ1^b λ2^c dA = 2A a! b! c! / (a + b + c + 2)! (the area-coordinate integral,
  // Zienkiewicz & Taylor vol. 1, ch. 6): exact for every monomial up to the rule's degree.
  it.each([1, 2, 3, 4, 5])('barycentric Dunavant rule of degree %i integrates area-coordinate monomials exactly', (deg) => {
    const r = barycentric(deg)
    expect(r.degree).toBe(deg)
    for (let a = 0; a <= deg; a++) for (let b = 0; a + b <= deg; b++) for (let c = 0; a + b + c <= deg; c++) {
      let q = 0
      for (let i = 0; i < r.count; i++) q += r.w[i] * r.l0[i] ** a * r.l1[i] ** b * r.l2[i] ** c
      // weights sum to 1: the rule gives ∫ / A
      const exact = (2 * factorial(a) * factorial(b) * factorial(c)) / factorial(a + b + c + 2)
      expect(Math.abs(q - exact)).toBeLessThan(1e-14)
    }
  })
})
