/**
 * The triangle rule that integrates traction over the section polygons of an element type, found
 * from the type's own shape functions so a type added to the registry gets its rule here without
 * a table entry.
 *
 * On an element with an affine map, the stress interpolated by shape functions of total degree p
 * is a polynomial of degree ≤ p on any plane, the traction σm too, and the first moments
 * ∫ (x - o) × σm dA have degree p + 1. So the rule has degree p + 1 (Dunavant, IJNME 21 (1985),
 * `triangleRule` in quadrature.ts, which holds degrees 1-5), capped at 5:
 *   tet4 (p = 1) -> 2 (the linear path of sectionPolygon.ts integrates it in closed form),
 *   tet10 (2) -> 3, wedge6 (2: ξζ) -> 3, hex8 (3: ξηζ) -> 4, wedge15 (3) -> 4,
 *   hex20 (4: ξ²ηζ) -> 5, and rational shape functions (pyramids) -> 5, which integrates the
 *   polynomial part of their space (degree ≤ 4) exactly and the rest approximately.
 * On curved (non-affine) elements the integrand is not a polynomial; the same rule is used, its
 * error falls faster than the chord error of the polygon edges (see elementSection.ts).
 *
 * p is the degree of the shape functions along a generic line through the reference element: the
 * (p+1)-th finite differences of every N_a at equally spaced points vanish there (to round-off),
 * the p-th do not; a function whose differences never vanish up to order 7 (a rational one) is
 * reported as Infinity.
 */
import type { ElementTypeName } from '../model/elementTypes.ts'
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import { triangleRule } from './quadrature.ts'
import { referenceDomain } from './inverseMap.ts'
import { shapeValues } from './shapeFunctions.ts'

/** Highest triangle rule degree available (quadrature.ts). */
export const MAX_SECTION_RULE_DEGREE = 5

/**
 * A triangle rule in barycentric form for hot loops: point q at λ = (l0[q], l1[q], l2[q]) of the
 * triangle's vertices with weight w[q] (Σ w = 1: multiply by the triangle's area).
 */
export interface BarycentricRule {
  readonly degree: number
  readonly count: number
  readonly l0: Float64Array
  readonly l1: Float64Array
  readonly l2: Float64Array
  readonly w: Float64Array
}

const DEGREES = new Map<ElementTypeName, number>()

/** Total polynomial degree of the shape functions of `type` (Infinity when not polynomial). */
export function shapeDegree(type: ElementTypeName): number {
  const known = DEGREES.get(type)
  if (known !== undefined) return known
  const nn = ELEMENT_TYPES[type].nodeCount
  const dom = referenceDomain(type)
  // a line through the centre in a direction no face or symmetry plane of a reference element holds
  const d = [0.5390, 0.3107, 0.7829], h = 0.02 * dom.size, K = 8
  const samples: Float64Array[] = []
  for (let k = 0; k <= K; k++) {
    const s = (k - K / 2) * h
    samples.push(shapeValues(type, dom.centre[0] + s * d[0], dom.centre[1] + s * d[1], dom.centre[2] + s * d[2], new Float64Array(nn)))
  }
  let degree = Infinity
  for (let p = 0; p < K; p++) {
    // (p+1)-th forward differences of every function: zero for all iff degree ≤ p
    let big = 0
    for (let a = 0; a < nn; a++) {
      let row = samples.map((v) => v[a])
      for (let m = 0; m <= p; m++) row = row.slice(1).map((v, i) => v - row[i])
      for (const v of row) big = Math.max(big, Math.abs(v))
    }
    if (big <= 1e-11) { degree = p; break }
  }
  DEGREES.set(type, degree)
  return degree
}

const RULES = new Map<ElementTypeName, BarycentricRule>()

/** The rule for section polygons of `type` (degree min(p + 1, 5), header). */
export function sectionRule(type: ElementTypeName): BarycentricRule {
  const known = RULES.get(type)
  if (known) return known
  const degree = Math.min(shapeDegree(type) + 1, MAX_SECTION_RULE_DEGREE)
  const r = barycentric(degree)
  RULES.set(type, r)
  return r
}

/** Dunavant's rule of `degree` with its reference points (ξ, η) turned into λ = (1-ξ-η, ξ, η). */
export function barycentric(degree: number): BarycentricRule {
  const t = triangleRule(degree)
  const n = t.weights.length
  const l0 = new Float64Array(n), l1 = new Float64Array(n), l2 = new Float64Array(n), w = new Float64Array(n)
  for (let q = 0; q < n; q++) {
    const xi = t.points[2 * q], eta = t.points[2 * q + 1]
    l0[q] = 1 - xi - eta; l1[q] = xi; l2[q] = eta
    w[q] = 2 * t.weights[q] // the reference triangle has area 1/2
  }
  return { degree, count: n, l0, l1, l2, w }
}
