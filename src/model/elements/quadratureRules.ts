/**
 * Quadrature rules on the reference domains of the element registry (src/model/elementTypes.ts).
 * Pure math: which rule an element type or face kind uses is written in its registry record.
 *
 * Reference domains and their measures:
 * - line [-1, 1] (length 2): Gauss–Legendre, Abramowitz & Stegun (1964) Table 25.4, written in
 *   closed form (the roots of P_n are algebraic up to n = 5);
 * - line [0, 1] with weight (1 - w)^α: Gauss–Jacobi, Abramowitz & Stegun (1964) 25.4.33, nodes
 *   found as the roots of the Jacobi polynomial P_n^(α,0) (no closed form needed);
 * - triangle 0 ≤ ξ, η, ξ + η ≤ 1 (area 1/2): Dunavant, IJNME 21 (1985), degrees 1–5; Dunavant's
 *   weights sum to 1 and are halved here;
 * - tetrahedron 0 ≤ ξ, η, ζ, ξ + η + ζ ≤ 1 (volume 1/6): the centroid rule (degree 1), the 4-point
 *   degree-2 rule, the 5-point degree-3 rule and Keast's 11-point degree-4 rule (Keast, CMAME 55,
 *   1986); degree ≥ 5 uses a collapsed (Duffy) Gauss–Legendre product rule, exact for any
 *   polynomial of that degree;
 * - square [-1, 1]² and cube [-1, 1]³: tensor Gauss–Legendre;
 * - wedge: triangle × [-1, 1];
 * - pyramid |ξ|, |η| ≤ 1 - ζ, 0 ≤ ζ ≤ 1 (volume 4/3): the cube collapsed onto the apex with
 *   Gauss–Legendre across and Gauss–Jacobi (α = 2) along the axis (a conical product rule in the
 *   sense of Stroud, Approximate Calculation of Multiple Integrals, 1971).
 *
 * A rule is `{points, weights}`; `points` holds `dim` reference coordinates per point. Rules are
 * built once and cached: callers must treat them as read-only.
 */

export interface QuadratureRule {
  /** Reference coordinates, `dim` per point (2 for faces, 3 for volumes, 1 for lines). */
  readonly points: Float64Array
  readonly weights: Float64Array
}

const lineCache: QuadratureRule[] = []

/** Gauss–Legendre rule with n = 1..5 points on [-1, 1], exact for degree 2n - 1. */
export function gaussLegendre(n: number): QuadratureRule {
  if (!Number.isInteger(n) || n < 1 || n > 5) throw new RangeError(`Gauss–Legendre rule with ${n} points is not available (1..5)`)
  const cached = lineCache[n]
  if (cached) return cached
  let x: number[], w: number[]
  switch (n) {
    case 1: x = [0]; w = [2]; break
    case 2: { const a = 1 / Math.sqrt(3); x = [-a, a]; w = [1, 1]; break }
    case 3: { const a = Math.sqrt(3 / 5); x = [-a, 0, a]; w = [5 / 9, 8 / 9, 5 / 9]; break }
    case 4: {
      const a = Math.sqrt(3 / 7 - (2 / 7) * Math.sqrt(6 / 5)), b = Math.sqrt(3 / 7 + (2 / 7) * Math.sqrt(6 / 5))
      const wa = (18 + Math.sqrt(30)) / 36, wb = (18 - Math.sqrt(30)) / 36
      x = [-b, -a, a, b]; w = [wb, wa, wa, wb]; break
    }
    default: {
      const a = Math.sqrt(5 - 2 * Math.sqrt(10 / 7)) / 3, b = Math.sqrt(5 + 2 * Math.sqrt(10 / 7)) / 3
      const wa = (322 + 13 * Math.sqrt(70)) / 900, wb = (322 - 13 * Math.sqrt(70)) / 900
      x = [-b, -a, 0, a, b]; w = [wb, wa, 128 / 225, wa, wb]; break
    }
  }
  const rule = { points: Float64Array.from(x), weights: Float64Array.from(w) }
  lineCache[n] = rule
  return rule
}

/** Builds a rule from barycentric orbits [weight (summing to 1 over the orbit set), l0, l1, l2]. */
function fromTriangleOrbits(orbits: readonly (readonly [number, number, number, number])[], measure: number): QuadratureRule {
  const pts: number[] = [], ws: number[] = []
  for (const [w, a, b, c] of orbits) {
    // Distinct permutations of the barycentric triple (a, b, c); (ξ, η) = (l1, l2).
    const perms: [number, number, number][] = [[a, b, c], [b, c, a], [c, a, b], [a, c, b], [c, b, a], [b, a, c]]
    const seen: string[] = []
    for (const p of perms) {
      const key = p.join(',')
      if (seen.includes(key)) continue
      seen.push(key)
      pts.push(p[1], p[2]); ws.push(w * measure)
    }
  }
  return { points: Float64Array.from(pts), weights: Float64Array.from(ws) }
}

const triCache: QuadratureRule[] = []

/**
 * Dunavant (1985) rule on the reference triangle (area 1/2) exact for polynomials of `degree`
 * (1..5). Degree 3 is Dunavant's 4-point rule, which has one negative weight.
 */
export function triangleRule(degree: number): QuadratureRule {
  if (!Number.isInteger(degree) || degree < 1 || degree > 5) throw new RangeError(`triangle rule of degree ${degree} is not available (1..5)`)
  const cached = triCache[degree]
  if (cached) return cached
  let rule: QuadratureRule
  switch (degree) {
    case 1: rule = fromTriangleOrbits([[1, 1 / 3, 1 / 3, 1 / 3]], 0.5); break
    case 2: rule = fromTriangleOrbits([[1 / 3, 2 / 3, 1 / 6, 1 / 6]], 0.5); break
    case 3: rule = fromTriangleOrbits([[-27 / 48, 1 / 3, 1 / 3, 1 / 3], [25 / 48, 0.6, 0.2, 0.2]], 0.5); break
    case 4: rule = fromTriangleOrbits([
      // Dunavant (1985) Table, degree 4, 6 points (values to 15 digits as published).
      [0.223381589678011, 0.108103018168070, 0.445948490915965, 0.445948490915965],
      [0.109951743655322, 0.816847572980459, 0.091576213509771, 0.091576213509771],
    ], 0.5); break
    default: {
      // Degree 5, 7 points; the closed forms reproduce Dunavant's tabulated digits.
      const s = Math.sqrt(15)
      const a1 = (6 - s) / 21, a2 = (6 + s) / 21
      rule = fromTriangleOrbits([
        [9 / 40, 1 / 3, 1 / 3, 1 / 3],
        [(155 - s) / 1200, 1 - 2 * a1, a1, a1],
        [(155 + s) / 1200, 1 - 2 * a2, a2, a2],
      ], 0.5)
    }
  }
  triCache[degree] = rule
  return rule
}

/** Builds a tetrahedron rule from orbits [weight (absolute), l0, l1, l2, l3] of barycentric quadruples. */
function fromTetOrbits(orbits: readonly (readonly [number, number, number, number, number])[]): QuadratureRule {
  const pts: number[] = [], ws: number[] = []
  for (const [w, a, b, c, d] of orbits) {
    const base = [a, b, c, d]
    const seen: string[] = []
    // All 24 permutations, deduplicated: the orbits are small, this runs once per rule.
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) for (let k = 0; k < 4; k++) for (let l = 0; l < 4; l++) {
      if (i === j || i === k || i === l || j === k || j === l || k === l) continue
      const p = [base[i], base[j], base[k], base[l]]
      const key = p.join(',')
      if (seen.includes(key)) continue
      seen.push(key)
      pts.push(p[1], p[2], p[3]); ws.push(w)
    }
  }
  return { points: Float64Array.from(pts), weights: Float64Array.from(ws) }
}

const tetCache: QuadratureRule[] = []

/**
 * Rule on the reference tetrahedron (volume 1/6) exact for polynomials of `degree`:
 * 1 → 1 point (centroid); 2 → 4 points (a = (5 - √5)/20); 3 → 5 points (centroid weight -4/5 of
 * the volume, one negative weight); 4 → Keast's 11-point rule (one negative weight);
 * 5..7 → collapsed Gauss–Legendre product rule (positive weights, n³ points with n = ⌈(degree+3)/2⌉).
 */
export function tetRule(degree: number): QuadratureRule {
  if (!Number.isInteger(degree) || degree < 1 || degree > 7) throw new RangeError(`tetrahedron rule of degree ${degree} is not available (1..7)`)
  const cached = tetCache[degree]
  if (cached) return cached
  let rule: QuadratureRule
  switch (degree) {
    case 1: rule = fromTetOrbits([[1 / 6, 0.25, 0.25, 0.25, 0.25]]); break
    case 2: {
      const a = (5 - Math.sqrt(5)) / 20
      rule = fromTetOrbits([[1 / 24, 1 - 3 * a, a, a, a]]); break
    }
    case 3: rule = fromTetOrbits([[-2 / 15, 0.25, 0.25, 0.25, 0.25], [3 / 40, 0.5, 1 / 6, 1 / 6, 1 / 6]]); break
    case 4: {
      // Keast (1986) 11-point rule: weights -74/5625, 343/45000, 56/2250 on volume 1/6.
      const r = Math.sqrt(5 / 14)
      const a = (1 + r) / 4, b = (1 - r) / 4
      rule = fromTetOrbits([
        [-74 / 5625, 0.25, 0.25, 0.25, 0.25],
        [343 / 45000, 11 / 14, 1 / 14, 1 / 14, 1 / 14],
        [56 / 2250, a, a, b, b],
      ]); break
    }
    default: rule = collapsedTetRule(Math.min(5, Math.ceil((degree + 3) / 2)))
  }
  tetCache[degree] = rule
  return rule
}

/**
 * Collapsed product rule: x = u, y = (1-u)v, z = (1-u)(1-v)w with u, v, w in [0, 1] and Jacobian
 * (1-u)²(1-v). A degree-p polynomial becomes degree p+2 in u, so n points per direction suffice
 * when 2n - 1 ≥ p + 2.
 */
function collapsedTetRule(n: number): QuadratureRule {
  const g = gaussLegendre(n)
  const pts = new Float64Array(3 * n * n * n), ws = new Float64Array(n * n * n)
  let q = 0
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
    const u = (g.points[i] + 1) / 2, v = (g.points[j] + 1) / 2, w = (g.points[k] + 1) / 2
    pts[3 * q] = u; pts[3 * q + 1] = (1 - u) * v; pts[3 * q + 2] = (1 - u) * (1 - v) * w
    ws[q] = (g.weights[i] * g.weights[j] * g.weights[k] / 8) * (1 - u) * (1 - u) * (1 - v)
    q++
  }
  return { points: pts, weights: ws }
}

/** Tensor Gauss–Legendre on [-1, 1]^dim, n points per direction; first coordinate varies fastest. */
export function tensorRule(n: number, dim: 2 | 3): QuadratureRule {
  const g = gaussLegendre(n)
  const count = dim === 2 ? n * n : n * n * n
  const pts = new Float64Array(dim * count), ws = new Float64Array(count)
  let q = 0
  const nk = dim === 3 ? n : 1
  for (let k = 0; k < nk; k++) for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) {
    pts[dim * q] = g.points[i]; pts[dim * q + 1] = g.points[j]
    if (dim === 3) pts[dim * q + 2] = g.points[k]
    ws[q] = g.weights[i] * g.weights[j] * (dim === 3 ? g.weights[k] : 1)
    q++
  }
  return { points: pts, weights: ws }
}

/** Wedge rule: triangle rule of `triDegree` × Gauss–Legendre with `n` points in ζ. */
export function wedgeRule(triDegree: number, n: number): QuadratureRule {
  const t = triangleRule(triDegree), g = gaussLegendre(n)
  const nt = t.weights.length
  const pts = new Float64Array(3 * nt * n), ws = new Float64Array(nt * n)
  let q = 0
  for (let k = 0; k < n; k++) for (let i = 0; i < nt; i++) {
    pts[3 * q] = t.points[2 * i]; pts[3 * q + 1] = t.points[2 * i + 1]; pts[3 * q + 2] = g.points[k]
    ws[q] = t.weights[i] * g.weights[k]
    q++
  }
  return { points: pts, weights: ws }
}

const jacobiCache = new Map<number, QuadratureRule>()

/**
 * Gauss–Jacobi rule with n = 1..8 points on [0, 1] for the weight (1 - w)^α (α = 0, 1, 2, ...):
 * Σ W_i g(w_i) = ∫₀¹ g(w) (1 - w)^α dw exactly for every polynomial g of degree ≤ 2n - 1.
 *
 * On [-1, 1] the nodes x_i are the roots of the Jacobi polynomial P_n^(α,0) and the weights
 * (Abramowitz & Stegun 25.4.33 with β = 0, where the Gamma-function factor is 1) are
 * 2^(α+1) / ((1 - x_i²) P_n'(x_i)²); with w = (1 + x)/2 the measure (1 - x)^α dx becomes
 * 2^(α+1) (1 - w)^α dw, so on [0, 1]: w_i = (1 + x_i)/2, W_i = 1 / ((1 - x_i²) P_n'(x_i)²).
 * The n roots are separated by scanning P_n on a fine grid and refined by bisection (they are
 * simple and lie strictly inside (-1, 1)), so no initial guesses from tables are needed.
 */
export function gaussJacobi(n: number, alpha: number): QuadratureRule {
  if (!Number.isInteger(n) || n < 1 || n > 8) throw new RangeError(`Gauss–Jacobi rule with ${n} points is not available (1..8)`)
  if (!Number.isInteger(alpha) || alpha < 0 || alpha > 4) throw new RangeError(`Gauss–Jacobi weight exponent ${alpha} is not available (0..4)`)
  const key = 16 * n + alpha
  const cached = jacobiCache.get(key)
  if (cached) return cached
  const roots: number[] = []
  const grid = 4000
  let xa = -1, pa = jacobi(n, alpha, xa)[0]
  for (let g = 1; g <= grid; g++) {
    const xb = -1 + (2 * g) / grid, pb = jacobi(n, alpha, xb)[0]
    if (pa === 0) roots.push(xa)
    else if (pa * pb < 0) {
      let lo = xa, hi = xb, plo = pa
      // Bisection to the last bit: 60 halvings of an interval of 1/2000.
      for (let it = 0; it < 60 && hi - lo > 0; it++) {
        const mid = 0.5 * (lo + hi), pm = jacobi(n, alpha, mid)[0]
        if (pm === 0) { lo = hi = mid; break }
        if (pm * plo < 0) hi = mid
        else { lo = mid; plo = pm }
      }
      roots.push(0.5 * (lo + hi))
    }
    xa = xb; pa = pb
  }
  if (roots.length !== n) throw new Error(`Gauss–Jacobi: found ${roots.length} roots of P_${n}^(${alpha},0), expected ${n}`)
  const pts = new Float64Array(n), ws = new Float64Array(n)
  roots.forEach((x, i) => {
    const d = jacobi(n, alpha, x)[1]
    pts[i] = 0.5 * (1 + x)
    ws[i] = 1 / ((1 - x * x) * d * d)
  })
  const rule = { points: pts, weights: ws }
  jacobiCache.set(key, rule)
  return rule
}

/**
 * [P_n^(α,0)(x), its derivative], by the three-term recurrence (Abramowitz & Stegun 22.7.1 with
 * β = 0) and the derivative identity (2n + α)(1 - x²) P_n' = n(α - (2n + α)x) P_n + 2(n + α) n P_{n-1}
 * (A&S 22.8.1 with β = 0). Only for |x| < 1 in the derivative.
 */
function jacobi(n: number, a: number, x: number): [number, number] {
  let p0 = 1, p1 = 0.5 * (a + (a + 2) * x)
  if (n === 0) return [1, 0]
  for (let k = 2; k <= n; k++) {
    const c = 2 * k + a
    const p2 = ((c - 1) * (c * (c - 2) * x + a * a) * p1 - 2 * (k + a - 1) * (k - 1) * c * p0) / (2 * k * (k + a) * (c - 2))
    p0 = p1; p1 = p2
  }
  const c = 2 * n + a
  const d = (n * (a - c * x) * p1 + 2 * (n + a) * n * p0) / (c * (1 - x * x))
  return [p1, d]
}

const pyramidCache = new Map<number, QuadratureRule>()

/**
 * Collapsed-cube rule on the reference pyramid |ξ|, |η| ≤ 1 - ζ, 0 ≤ ζ ≤ 1 (volume 4/3): with
 * ξ = u(1 - w), η = v(1 - w), ζ = w for (u, v, w) ∈ [-1, 1]² × [0, 1] the Jacobian is (1 - w)²,
 * which the Gauss–Jacobi rule (α = 2) carries in its weight. `nuv` Gauss–Legendre points in u and
 * v, `nw` Gauss–Jacobi points in w.
 *
 * Exactness: a monomial ξ^a η^b ζ^c becomes u^a v^b (1 - w)^(a+b) w^c, so the rule is exact when
 * a, b ≤ 2·nuv - 1 and a + b + c ≤ 2·nw - 1; with nuv = nw = n it is exact for every polynomial
 * of total degree 2n - 1. It is exact as well for the pyramid's rational shape functions, which
 * are polynomials in (u, v, w): ξη/(1 - ζ) = uv(1 - w).
 */
export function pyramidRule(nuv: number, nw: number): QuadratureRule {
  const key = 16 * nuv + nw
  const cached = pyramidCache.get(key)
  if (cached) return cached
  const g = gaussLegendre(nuv), j = gaussJacobi(nw, 2)
  const count = nuv * nuv * nw
  const pts = new Float64Array(3 * count), ws = new Float64Array(count)
  let q = 0
  for (let k = 0; k < nw; k++) for (let jj = 0; jj < nuv; jj++) for (let i = 0; i < nuv; i++) {
    const w = j.points[k], s = 1 - w
    pts[3 * q] = g.points[i] * s; pts[3 * q + 1] = g.points[jj] * s; pts[3 * q + 2] = w
    ws[q] = g.weights[i] * g.weights[jj] * j.weights[k]
    q++
  }
  const rule = { points: pts, weights: ws }
  pyramidCache.set(key, rule)
  return rule
}
