/**
 * The inverse of an element's map x(ξ) = Σ N_a(ξ) x_a: the reference coordinates ξ of a physical
 * point x, for every type of the registry, written over the type's shape functions, node reference
 * coordinates and faces alone (src/model/elementTypes.ts, shapeFunctions.ts), so a type added to
 * the registry is inverted here without a line of its own.
 *
 * Units: x in model length, ξ in the type's reference coordinates. Layouts: `ElementMap.x` holds
 * the element's node coordinates relative to its first spanning corner, 3 per local node, so the
 * residual x(ξ) - x is formed in element-sized numbers (a model far from the origin loses no
 * digits); points are passed relative to the same origin.
 *
 * Two cases (decided once per element by `loadElementMap`):
 * - Affine elements: every node sits where an affine image of the reference element puts it
 *   (straight-sided tetrahedra of any order; parallelepiped hexahedra and wedges; checked to
 *   1e-12 of the element size). The map is then x = x_0 + A (ξ - ξ_0) exactly (every type
 *   reproduces linear functions), so ξ follows from any point by a linear map, and a point
 *   interpolated linearly between points of known ξ has the interpolated ξ: callers skip the
 *   inversion (`affine`).
 * - Otherwise, Newton's method on r(ξ) = x(ξ) - x from a start estimate (the linear estimate the
 *   caller has), guarded as follows:
 *   - converged when |r|∞ ≤ 1e-13 · element size (round-off of the residual is about
 *     nodeCount · ε · size, twenty times smaller), or right after a step shorter than 1e-7 of the
 *     reference element's size (Newton's convergence is quadratic, so the error left is of the
 *     order of that step squared, 1e-14, and one evaluation is saved);
 *   - at most NEWTON_ITERATIONS steps; a step longer than a third of the reference element's
 *     size is shortened to that length (damping far from the solution);
 *   - after each step the iterate is pulled back toward the reference centre into the reference
 *     element grown by NEWTON_MARGIN (half) of its size on every face: points on a chord of a
 *     curved element lie outside it (0.12 of a tetrahedron's reference size on a ring of five
 *     elements per quarter, whose diagonal edges are spirals), and their ξ is an extrapolation
 *     of the element's own polynomial that is kept;
 *   - a singular or non-finite Jacobian, non-finite shape values (a rational pyramid function
 *     evaluated beyond its apex) or the iteration cap end the iteration: the point then gets
 *     its start estimate pulled back into the reference element itself, `failures` is counted up
 *     and the function returns false, so the caller can report how many points were not mapped
 *     rather than hand back silent garbage.
 * A distorted hex8 is inverted in monomial form (`ElementMap.trilinear`): its map written once per
 * element as eight coefficient vectors, so each Newton step costs a few dozen multiplications
 * instead of eight shape functions and their 24 derivatives (the same polynomial: tests compare).
 * The apex of a pyramid, where the rational shape functions are 0/0, is the shape-function
 * module's business (it returns their limits); a section vertex lying on the apex node gets
 * that node's reference coordinates directly and is never inverted.
 */
import type { ElementTypeName } from '../model/elementTypes.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../model/elementTypes.ts'
import { TRILINEAR_CORNERS, trilinearMonomials } from './trilinearMonomials.ts'

/** The largest node count of any registered type (scratch sizes). */
export const MAX_ELEMENT_NODES = Math.max(...ELEMENT_TYPE_NAMES.map((t) => ELEMENT_TYPES[t].nodeCount))

/** Newton steps at most (a smooth element converges in 2-4 from the linear estimate). */
export const NEWTON_ITERATIONS = 12
/**
 * A Newton step shorter than this fraction of the reference element's size ends the iteration:
 * the error it leaves is of the order of its square (1e-14), below what the residual test can see.
 */
export const NEWTON_STEP_DONE = 1e-7
/** Growth of the reference element, as a fraction of its size, within which iterates may move (header). */
export const NEWTON_MARGIN = 0.5

/**
 * The reference element of a type as the map inversion needs it:
 * - `ref`: ξ of every local node, 3 per node;
 * - `planes`: the faces as half-spaces n·ξ ≤ c, 4 numbers per face (unit outward n, then c);
 * - `centre`: mean of the corners (inside); `size`: largest corner distance from it;
 * - `span`: four corners whose reference edges from span[0] are independent, and
 *   `spanInverse` (row-major 3×3) the inverse of the matrix with those edges as columns.
 */
export interface ReferenceDomain {
  readonly type: ElementTypeName
  readonly nodeCount: number
  readonly cornerCount: number
  readonly ref: Float64Array
  readonly planes: Float64Array
  readonly centre: Float64Array
  readonly size: number
  readonly span: Int32Array
  readonly spanInverse: Float64Array
  /** The type's shape functions and their derivatives (the registry record's own, called directly in the Newton loop). */
  readonly values: (xi: number, eta: number, zeta: number, out: Float64Array) => Float64Array
  readonly derivatives: (xi: number, eta: number, zeta: number, out: Float64Array) => Float64Array
}

const DOMAINS = new Map<ElementTypeName, ReferenceDomain>()

export function referenceDomain(type: ElementTypeName): ReferenceDomain {
  const known = DOMAINS.get(type)
  if (known) return known
  const topo = ELEMENT_TYPES[type]
  if (!topo) throw new Error(`unknown element type '${type}'`)
  const nn = topo.nodeCount, cc = topo.cornerCount
  const ref = Float64Array.from(topo.refCoords.flat())
  const centre = new Float64Array(3)
  for (let c = 0; c < cc; c++) for (let k = 0; k < 3; k++) centre[k] += ref[3 * c + k] / cc
  let size = 0
  for (let c = 0; c < cc; c++) size = Math.max(size, Math.hypot(ref[3 * c] - centre[0], ref[3 * c + 1] - centre[1], ref[3 * c + 2] - centre[2]))
  const planes = new Float64Array(4 * topo.faces.length)
  topo.faces.forEach((f, i) => {
    // reference faces are flat: three corners fix the plane; orient it away from the centre
    const p = [0, 1, 2].map((k) => [ref[3 * f[k]], ref[3 * f[k] + 1], ref[3 * f[k] + 2]])
    const e1 = p[1].map((v, k) => v - p[0][k]), e2 = p[2].map((v, k) => v - p[0][k])
    let n = [e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2], e1[0] * e2[1] - e1[1] * e2[0]]
    const l = Math.hypot(n[0], n[1], n[2])
    n = n.map((v) => v / l)
    let c = n[0] * p[0][0] + n[1] * p[0][1] + n[2] * p[0][2]
    if (n[0] * centre[0] + n[1] * centre[1] + n[2] * centre[2] > c) { n = n.map((v) => -v); c = -c }
    planes.set([n[0], n[1], n[2], c], 4 * i)
  })
  // the best-conditioned corner frame (the largest |det| over corner triples from corner 0)
  let best = 0, span = [0, 1, 2, 3]
  for (let i = 1; i < cc; i++) for (let j = i + 1; j < cc; j++) for (let k = j + 1; k < cc; k++) {
    const d = det3(edgeMatrix(ref, 0, i, j, k))
    if (Math.abs(d) > best * (1 + 1e-12)) { best = Math.abs(d); span = [0, i, j, k] }
  }
  const spanInverse = invert3(edgeMatrix(ref, span[0], span[1], span[2], span[3]))
  const domain: ReferenceDomain = {
    type, nodeCount: nn, cornerCount: cc, ref, planes, centre, size, span: Int32Array.from(span), spanInverse,
    values: topo.shapeValues, derivatives: topo.shapeDerivatives,
  }
  DOMAINS.set(type, domain)
  return domain
}

/** Row-major 3×3 matrix whose columns are the edges from point o to points i, j, k of `p`. */
function edgeMatrix(p: ArrayLike<number>, o: number, i: number, j: number, k: number): Float64Array {
  const m = new Float64Array(9)
  for (let r = 0; r < 3; r++) {
    m[3 * r] = p[3 * i + r] - p[3 * o + r]
    m[3 * r + 1] = p[3 * j + r] - p[3 * o + r]
    m[3 * r + 2] = p[3 * k + r] - p[3 * o + r]
  }
  return m
}

function det3(m: ArrayLike<number>): number {
  return m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6])
}

function invert3(m: ArrayLike<number>): Float64Array {
  const d = det3(m)
  return Float64Array.from([
    (m[4] * m[8] - m[5] * m[7]) / d, (m[2] * m[7] - m[1] * m[8]) / d, (m[1] * m[5] - m[2] * m[4]) / d,
    (m[5] * m[6] - m[3] * m[8]) / d, (m[0] * m[8] - m[2] * m[6]) / d, (m[2] * m[3] - m[0] * m[5]) / d,
    (m[3] * m[7] - m[4] * m[6]) / d, (m[1] * m[6] - m[0] * m[7]) / d, (m[0] * m[4] - m[1] * m[3]) / d,
  ])
}

/**
 * One loaded element (scratch: create once, load per element). `x` holds node coordinates
 * relative to `origin` (the node of corner span[0]), `size` the element's size (largest
 * coordinate extent of its span edges), `affine` whether the map is affine (see the file header);
 * `failures` counts inversions that did not converge since the caller last set it to 0.
 */
export interface ElementMap {
  domain: ReferenceDomain
  readonly x: Float64Array
  readonly origin: Float64Array
  affine: boolean
  size: number
  failures: number
  readonly N: Float64Array
  readonly dN: Float64Array
  /**
   * A non-affine hex8 in monomial form: x(ξ) = c0 + c1 ξ + c2 η + c3 ζ + c4 ξη + c5 ηζ + c6 ξζ
   * + c7 ξηζ, the vectors c_k in `poly` (3 each, relative to the origin). The Newton loop then
   * forms the residual and the Jacobian from these eight vectors instead of the eight shape
   * functions and their 24 derivatives (the same polynomial, fewer operations).
   */
  trilinear: boolean
  readonly poly: Float64Array
}

export function createElementMap(): ElementMap {
  return {
    domain: referenceDomain(ELEMENT_TYPE_NAMES[0]), x: new Float64Array(3 * MAX_ELEMENT_NODES), origin: new Float64Array(3),
    affine: true, size: 0, failures: 0, N: new Float64Array(MAX_ELEMENT_NODES), dN: new Float64Array(3 * MAX_ELEMENT_NODES),
    trilinear: false, poly: new Float64Array(24),
  }
}

/** Loads the element whose nodes are conn[base .. base + nodeCount) and decides whether it is affine. */
export function loadElementMap(em: ElementMap, domain: ReferenceDomain, coords: Float64Array, conn: Int32Array, base: number): ElementMap {
  em.domain = domain
  const nn = domain.nodeCount, x = em.x, ref = domain.ref, span = domain.span
  const o = 3 * conn[base + span[0]]
  const ox = coords[o], oy = coords[o + 1], oz = coords[o + 2]
  em.origin[0] = ox; em.origin[1] = oy; em.origin[2] = oz
  for (let a = 0; a < nn; a++) {
    const p = 3 * conn[base + a]
    x[3 * a] = coords[p] - ox; x[3 * a + 1] = coords[p + 1] - oy; x[3 * a + 2] = coords[p + 2] - oz
  }
  if (domain.type === 'tet10') {
    // Straight-sided test on the loaded coordinates: each mid-edge node at its edge's midpoint
    // within 1e-12 of the size (the general test below, with A's columns the corner edges, reduces
    // to this; straightTet10.ts is the same test on the mesh arrays), without forming A.
    let size = 0
    for (let k = 3; k < 12; k++) size = Math.max(size, Math.abs(x[k]))
    em.size = size
    em.affine = midpointsOnEdges(x, size)
    em.trilinear = false
    return em
  }
  em.size = spanSize(x, domain)
  if (domain.type === 'hex8') {
    // The monomial form first: a non-linear coefficient far above the affine test's tolerance
    // settles it without the fit (every node of an affine element lies within 1e-12 · size of
    // the fitted map, and each c_4..c_7 is a mix of those deviations with weights of total 1, so
    // |c_k| ≤ 1e-12 · size up to round-off); near-affine elements take the general test as before.
    trilinearForm(em.poly, x, ref)
    em.affine = !clearlyTrilinear(em.poly, em.size) && affineFit(em, domain)
    em.trilinear = !em.affine
    return em
  }
  em.affine = affineFit(em, domain)
  em.trilinear = false
  return em
}

/** Largest coordinate extent of the span edges of the loaded element (ElementMap.size). */
function spanSize(x: Float64Array, domain: ReferenceDomain): number {
  const span = domain.span
  let size = 0
  for (let k = 1; k < 4; k++) {
    const s = 3 * span[k]
    size = Math.max(size, Math.abs(x[s]), Math.abs(x[s + 1]), Math.abs(x[s + 2]))
  }
  return size
}

/** Whether a hex8's monomial coefficients c_4..c_7 (poly[12 ..]) hold a component above 1e-9 · size: then it is not affine (loadElementMap). */
function clearlyTrilinear(poly: Float64Array, size: number): boolean {
  const big = 1e-9 * size
  for (let k = 12; k < 24; k++) if (Math.abs(poly[k]) > big) return true
  return false
}

/** tet10 edges as (corner, corner, mid-edge node), 3 per edge (ELEMENT_TYPES.tet10.edges). */
const TET10_EDGES = Int32Array.from(ELEMENT_TYPES.tet10.edges.flat())

/** Whether every tet10 mid-edge node of the loaded x (relative to corner 0) is at its edge's midpoint, 2x_m - x_a - x_b within 2e-12 · size. */
function midpointsOnEdges(x: Float64Array, size: number): boolean {
  const tol = 2e-12 * size, E = TET10_EDGES
  for (let k = 0; k < 18; k += 3) {
    const a = 3 * E[k], b = 3 * E[k + 1], m = 3 * E[k + 2]
    if (Math.abs(2 * x[m] - x[a] - x[b]) > tol || Math.abs(2 * x[m + 1] - x[a + 1] - x[b + 1]) > tol || Math.abs(2 * x[m + 2] - x[a + 2] - x[b + 2]) > tol) return false
  }
  return true
}

/**
 * The general affine test of a loaded element (file header): the affine map A fitted to the span
 * corners reproduces every node within 1e-12 of the element's size. Exported for the tests that
 * compare the tet10 shortcut of loadElementMap with it.
 */
export function affineFit(em: ElementMap, domain: ReferenceDomain): boolean {
  const nn = domain.nodeCount, x = em.x, ref = domain.ref, span = domain.span
  // A = X Ξ⁻¹ with X the physical and Ξ the reference span edges as columns
  const s1 = 3 * span[1], s2 = 3 * span[2], s3 = 3 * span[3], S = domain.spanInverse
  const A = AFFINE
  for (let r = 0; r < 3; r++) {
    const e1 = x[s1 + r], e2 = x[s2 + r], e3 = x[s3 + r]
    A[3 * r] = e1 * S[0] + e2 * S[3] + e3 * S[6]
    A[3 * r + 1] = e1 * S[1] + e2 * S[4] + e3 * S[7]
    A[3 * r + 2] = e1 * S[2] + e2 * S[5] + e3 * S[8]
  }
  const tol = 1e-12 * em.size, r0 = 3 * span[0]
  let affine = true
  for (let a = 0; a < nn && affine; a++) {
    const d0 = ref[3 * a] - ref[r0], d1 = ref[3 * a + 1] - ref[r0 + 1], d2 = ref[3 * a + 2] - ref[r0 + 2]
    if (Math.abs(x[3 * a] - (A[0] * d0 + A[1] * d1 + A[2] * d2)) > tol) affine = false
    else if (Math.abs(x[3 * a + 1] - (A[3] * d0 + A[4] * d1 + A[5] * d2)) > tol) affine = false
    else if (Math.abs(x[3 * a + 2] - (A[6] * d0 + A[7] * d1 + A[8] * d2)) > tol) affine = false
  }
  return affine
}

/**
 * The monomial coefficients of a hex8's map (ElementMap.poly) from its node coordinates x, the
 * corners in the registry's order (elements/hexahedra.ts: 0-3 the bottom counter-clockwise from
 * (−1, −1, −1), 4-7 above them): c_k = Σ_a P_k(ξ_a) x_a / 8 with P = 1, ξ, η, ζ, ξη, ηζ, ξζ, ξηζ
 * (N_a = (1 + ξ ξ_a)(1 + η η_a)(1 + ζ ζ_a) / 8 expanded), by the butterfly of trilinearMonomials.ts
 * (about 75 operations instead of 400 for the sum over the eight corners; the tests compare with
 * the shape functions). `ref` is checked once to be that corner order.
 */
function trilinearForm(c: Float64Array, x: Float64Array, ref: Float64Array): void {
  if (ref !== HEX8_REF_CHECKED) checkHexCorners(ref)
  monomials(c, x)
}

/** The reference corners trilinearForm was last checked against (checked once per array). */
let HEX8_REF_CHECKED: Float64Array | null = null
function checkHexCorners(ref: Float64Array): void {
  for (let i = 0; i < 24; i++) if (ref[i] !== TRILINEAR_CORNERS[i]) throw new Error('trilinearForm: the hex8 corners are not in the order trilinearMonomials is written for')
  HEX8_REF_CHECKED = ref
}

const monomials = trilinearMonomials

const AFFINE = new Float64Array(9)

/**
 * Reference coordinates of the point at (x0, x1, x2) relative to `em.origin`, by guarded Newton
 * (file header) from the estimate xi[o .. o+3), written back there. Returns true when converged;
 * on failure xi holds the estimate pulled into the reference element and em.failures is one up.
 */
export function invertElementMap(em: ElementMap, x0: number, x1: number, x2: number, xi: Float64Array, o: number): boolean {
  if (em.trilinear) {
    const X = ONE_POINT
    X[0] = x0; X[1] = x1; X[2] = x2
    return invertTrilinearPoints(em, X, xi, o, 1) === 0
  }
  return invertGeneral(em, x0, x1, x2, xi, o)
}
const ONE_POINT = new Float64Array(3)

/**
 * The guarded Newton iteration of invertGeneral for a distorted hex8 in monomial form, for
 * `count` points of the element at once (a section polygon's quadrature points; invertElementMap
 * passes one): point k lies at X[3k ..] (relative to em.origin, as invertElementMap's x0, x1, x2)
 * and starts from the estimate xi[o + 3k ..], where its ξ is written. Residual and Jacobian share
 * their products, and the grown reference cube is tested as max(|ξ|, |η|, |ζ|) > 1 + margin (its
 * face planes are ±ξ ≤ 1 exactly, so this is the general test's arithmetic). Same steps and
 * stopping rules as invertGeneral; the tests compare its ξ with the shape-function iteration's.
 * The map's 24 coefficients are read into locals once for all the points instead of from the
 * array at every step (about a quarter of the inversion's time on the section points of a
 * distorted block). Returns the number of points not mapped (also added to em.failures).
 */
export function invertTrilinearPoints(em: ElementMap, X: Float64Array, xi: Float64Array, o0: number, count: number): number {
  const domain = em.domain, P = em.poly
  const tol = 1e-13 * em.size, maxStep = domain.size / 3, done = NEWTON_STEP_DONE * domain.size, margin = NEWTON_MARGIN * domain.size
  const lim = 1 + margin, cap = NEWTON_ITERATIONS
  const P0 = P[0], P1 = P[1], P2 = P[2], P3 = P[3], P4 = P[4], P5 = P[5], P6 = P[6], P7 = P[7], P8 = P[8], P9 = P[9], P10 = P[10], P11 = P[11]
  const P12 = P[12], P13 = P[13], P14 = P[14], P15 = P[15], P16 = P[16], P17 = P[17], P18 = P[18], P19 = P[19], P20 = P[20]
  const P21 = P[21], P22 = P[22], P23 = P[23]
  let failed = 0
  for (let k = 0; k < count; k++) {
    const o = o0 + 3 * k, x = 3 * k
    const s0 = xi[o], s1 = xi[o + 1], s2 = xi[o + 2]
    let a = s0, b = s1, c = s2, ok = false
    const q0 = P0 - X[x], q1 = P1 - X[x + 1], q2 = P2 - X[x + 2]
    for (let it = 0; ; it++) {
      // x(ξ) = A(η, ζ) + ξ x_ξ(η, ζ), with x_ξ = c1 + c4 η + c6 ζ + c7 ηζ the Jacobian's first
      // column and A = c0 + c2 η + c3 ζ + c5 ηζ: the residual reuses that column (19 operations
      // fewer than the eight monomials; the same polynomial)
      const bc = b * c
      const j00 = P3 + P12 * b + P18 * c + P21 * bc
      const j10 = P4 + P13 * b + P19 * c + P22 * bc
      const j20 = P5 + P14 * b + P20 * c + P23 * bc
      const r0 = q0 + P6 * b + P9 * c + P15 * bc + a * j00
      const r1 = q1 + P7 * b + P10 * c + P16 * bc + a * j10
      const r2 = q2 + P8 * b + P11 * c + P17 * bc + a * j20
      const rm = Math.max(Math.abs(r0), Math.abs(r1), Math.abs(r2))
      if (rm <= tol) { ok = true; break }
      if (!(rm < Infinity) || it === cap) break // NaN or the cap: give up
      const ab = a * b, ac = a * c
      const j01 = P6 + P12 * a + P15 * c + P21 * ac, j02 = P9 + P15 * b + P18 * a + P21 * ab
      const j11 = P7 + P13 * a + P16 * c + P22 * ac, j12 = P10 + P16 * b + P19 * a + P22 * ab
      const j21 = P8 + P14 * a + P17 * c + P23 * ac, j22 = P11 + P17 * b + P20 * a + P23 * ab
      const c00 = j11 * j22 - j12 * j21, c01 = j02 * j21 - j01 * j22, c02 = j01 * j12 - j02 * j11
      const det = j00 * c00 + j10 * c01 + j20 * c02
      if (!(Math.abs(det) > 0 && Math.abs(det) < Infinity)) break // singular map here
      const c10 = j12 * j20 - j10 * j22, c11 = j00 * j22 - j02 * j20, c12 = j02 * j10 - j00 * j12
      const c20 = j10 * j21 - j11 * j20, c21 = j01 * j20 - j00 * j21, c22 = j00 * j11 - j01 * j10
      let da = (c00 * r0 + c01 * r1 + c02 * r2) / det
      let db = (c10 * r0 + c11 * r1 + c12 * r2) / det
      let dc = (c20 * r0 + c21 * r1 + c22 * r2) / det
      const step = Math.max(Math.abs(da), Math.abs(db), Math.abs(dc))
      if (step > maxStep) { const f = maxStep / step; da *= f; db *= f; dc *= f } // damping
      a -= da; b -= db; c -= dc
      if (step <= done) { ok = true; break }
      if (Math.abs(a) > lim || Math.abs(b) > lim || Math.abs(c) > lim) {
        pullInside(domain, margin, a, b, c, PULLED)
        a = PULLED[0]; b = PULLED[1]; c = PULLED[2]
      }
    }
    if (ok) { xi[o] = a; xi[o + 1] = b; xi[o + 2] = c; continue }
    pullInside(domain, 0, s0, s1, s2, PULLED)
    xi[o] = PULLED[0]; xi[o + 1] = PULLED[1]; xi[o + 2] = PULLED[2]
    failed++
  }
  em.failures += failed
  return failed
}

/**
 * The guarded Newton iteration over the type's shape functions (every type; the plain path the
 * hex8 monomial form is tested against). Its step and damping lines are repeated in
 * invertTrilinearPoints on purpose: shared through a function, the hex8 cut measured about 20 % slower.
 */
function invertGeneral(em: ElementMap, x0: number, x1: number, x2: number, xi: Float64Array, o: number): boolean {
  const domain = em.domain, values = domain.values, derivatives = domain.derivatives, nn = domain.nodeCount
  const X = em.x, N = em.N, dN = em.dN
  const s0 = xi[o], s1 = xi[o + 1], s2 = xi[o + 2]
  let a = s0, b = s1, c = s2
  const tol = 1e-13 * em.size, maxStep = domain.size / 3, done = NEWTON_STEP_DONE * domain.size, margin = NEWTON_MARGIN * domain.size
  for (let it = 0; ; it++) {
    let r0 = -x0, r1 = -x1, r2 = -x2
    values(a, b, c, N)
    for (let k = 0; k < nn; k++) {
      const n = N[k]
      r0 += n * X[3 * k]; r1 += n * X[3 * k + 1]; r2 += n * X[3 * k + 2]
    }
    const rm = Math.max(Math.abs(r0), Math.abs(r1), Math.abs(r2))
    if (rm <= tol) { xi[o] = a; xi[o + 1] = b; xi[o + 2] = c; return true }
    if (!(rm < Infinity) || it === NEWTON_ITERATIONS) break // NaN or the cap: give up
    let j00 = 0, j01 = 0, j02 = 0, j10 = 0, j11 = 0, j12 = 0, j20 = 0, j21 = 0, j22 = 0
    derivatives(a, b, c, dN)
    for (let k = 0; k < nn; k++) {
      const X0 = X[3 * k], X1 = X[3 * k + 1], X2 = X[3 * k + 2]
      const d0 = dN[3 * k], d1 = dN[3 * k + 1], d2 = dN[3 * k + 2]
      j00 += X0 * d0; j01 += X0 * d1; j02 += X0 * d2
      j10 += X1 * d0; j11 += X1 * d1; j12 += X1 * d2
      j20 += X2 * d0; j21 += X2 * d1; j22 += X2 * d2
    }
    const c00 = j11 * j22 - j12 * j21, c01 = j02 * j21 - j01 * j22, c02 = j01 * j12 - j02 * j11
    const det = j00 * c00 + j10 * c01 + j20 * c02
    if (!(Math.abs(det) > 0 && Math.abs(det) < Infinity)) break // singular map here
    const c10 = j12 * j20 - j10 * j22, c11 = j00 * j22 - j02 * j20, c12 = j02 * j10 - j00 * j12
    const c20 = j10 * j21 - j11 * j20, c21 = j01 * j20 - j00 * j21, c22 = j00 * j11 - j01 * j10
    let da = (c00 * r0 + c01 * r1 + c02 * r2) / det
    let db = (c10 * r0 + c11 * r1 + c12 * r2) / det
    let dc = (c20 * r0 + c21 * r1 + c22 * r2) / det
    const step = Math.max(Math.abs(da), Math.abs(db), Math.abs(dc))
    if (step > maxStep) { const f = maxStep / step; da *= f; db *= f; dc *= f } // damping
    a -= da; b -= db; c -= dc
    if (step <= done) {
      // quadratic convergence: the error left after a step this short is of order its square
      // (a step this short cannot carry an iterate from inside the grown element far outside)
      xi[o] = a; xi[o + 1] = b; xi[o + 2] = c
      return true
    }
    if (outside(domain, margin, a, b, c)) {
      pullInside(domain, margin, a, b, c, PULLED)
      a = PULLED[0]; b = PULLED[1]; c = PULLED[2]
    }
  }
  pullInside(domain, 0, s0, s1, s2, PULLED)
  xi[o] = PULLED[0]; xi[o + 1] = PULLED[1]; xi[o + 2] = PULLED[2]
  em.failures++
  return false
}

const PULLED = new Float64Array(3)

/** True when ξ lies outside the reference element grown by `margin`. */
function outside(domain: ReferenceDomain, margin: number, a: number, b: number, c: number): boolean {
  const P = domain.planes
  for (let f = 0; f < P.length; f += 4) if (P[f] * a + P[f + 1] * b + P[f + 2] * c > P[f + 3] + margin) return true
  return false
}

/**
 * The point ξ moved toward the reference centre just far enough to satisfy every face half-space
 * grown by `margin` (n·ξ ≤ c + margin), into out; unchanged when already inside. The reference
 * element is convex and contains its centre, so the segment from the centre meets each face once.
 */
export function pullInside(domain: ReferenceDomain, margin: number, a: number, b: number, c: number, out: Float64Array): Float64Array {
  const P = domain.planes, ce = domain.centre
  const qa = ce[0], qb = ce[1], qc = ce[2]
  let s = 1
  for (let f = 0; f < P.length; f += 4) {
    const n0 = P[f], n1 = P[f + 1], n2 = P[f + 2], lim = P[f + 3] + margin
    const v = n0 * a + n1 * b + n2 * c
    if (v > lim) {
      const vc = n0 * qa + n1 * qb + n2 * qc // < lim: the centre is inside
      const t = (lim - vc) / (v - vc)
      if (t < s) s = t
    }
  }
  if (s < 1) { out[0] = qa + s * (a - qa); out[1] = qb + s * (b - qb); out[2] = qc + s * (c - qc) } else { out[0] = a; out[1] = b; out[2] = c }
  return out
}
