/**
 * Single elements of every registered type for the section tests, the fields each represents
 * exactly, and an independent exact integrator of a polynomial over the section of a convex
 * element (the reference the section kernels are checked against).
 *
 * - `singleElement(type, scale, shift)`: the type's reference element mapped by x = scale ⊙ ξ +
 *   shift (a diagonal affine map, positive scales keep the orientation), nodes in local order.
 *   A diagonal map keeps each type's polynomial space: Lagrange P1/P2 (tetrahedra) are invariant
 *   under any affine map, the tensor and serendipity spaces (hexahedra, wedges) under per-axis ones.
 * - `EXACT_FIELDS[type]`: scalar polynomials (in physical x, y, z) in the type's space, so nodal
 *   values interpolate them exactly on such an element. A type of the registry without an entry
 *   makes the section tests fail with a message naming this table.
 * - `exactSection(...)`: plane ∩ element computed on its own (corner-edge crossings and on-plane
 *   corners, ordered by angle), integrated by a collapsed (Duffy) Gauss–Legendre product rule of
 *   6 × 6 points per triangle, exact for polynomials up to degree 10 (Stroud, Approximate
 *   Calculation of Multiple Integrals, 1971, the conical product rule); the Gauss–Legendre nodes
 *   are found here by Newton on P_6 (Abramowitz & Stegun 25.4.29 for the weights).
 */
import { createMesh } from '../../src/model/createMesh.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import { ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'

export type Field = (x: number, y: number, z: number) => number

/** An exactly represented scalar field with its name (for messages). */
export interface NamedField { readonly name: string; readonly f: Field }

const F = (name: string, f: Field): NamedField => ({ name, f })
const P1 = [F('1', () => 1), F('x', (x) => x), F('y', (_, y) => y), F('z', (_, __, z) => z)]
const P2 = [...P1, F('x²', (x) => x * x), F('y²', (_, y) => y * y), F('z²', (_, __, z) => z * z),
  F('xy', (x, y) => x * y), F('yz', (_, y, z) => y * z), F('xz', (x, _, z) => x * z)]
const Q1 = [...P1, F('xy', (x, y) => x * y), F('yz', (_, y, z) => y * z), F('xz', (x, _, z) => x * z), F('xyz', (x, y, z) => x * y * z)]

/**
 * Fields each type's shape functions reproduce on a diagonally mapped element (from each
 * family's polynomial space; every one of them contains the complete linear polynomials):
 * - tet4 P1; tet10 P2 (Lagrange);
 * - hex8 Q1 (trilinear); hex20 the serendipity space: Q1 plus x², y², z² times a linear
 *   function of the other two coordinates and x²yz, xy²z, xyz² (superlinear degree ≤ 2);
 * - wedge6 P1(x, y) ⊗ P1(z); wedge15: P2 plus x²z, xyz, y²z, xz², yz²;
 * - pyramid5 P1 and pyramid13 P2: the polynomial part of their rational spaces (Bedrosian,
 *   IJNME 35 (1992); that pyramid13 holds all of P2 is from memory); the rational functions
 *   themselves are integrated only approximately by any polynomial rule and are not used here.
 */
export const EXACT_FIELDS: Readonly<Record<string, readonly NamedField[]>> = {
  tet4: P1,
  tet10: P2,
  hex8: Q1,
  hex20: [...Q1, F('x²', (x) => x * x), F('y²', (_, y) => y * y), F('z²', (_, __, z) => z * z),
    F('x²y', (x, y) => x * x * y), F('x²z', (x, _, z) => x * x * z), F('y²x', (x, y) => y * y * x),
    F('y²z', (_, y, z) => y * y * z), F('z²x', (x, _, z) => z * z * x), F('z²y', (_, y, z) => z * z * y),
    F('x²yz', (x, y, z) => x * x * y * z), F('xy²z', (x, y, z) => x * y * y * z), F('xyz²', (x, y, z) => x * y * z * z)],
  wedge6: [...P1, F('xz', (x, _, z) => x * z), F('yz', (_, y, z) => y * z)],
  wedge15: [...P2, F('x²z', (x, _, z) => x * x * z), F('xyz', (x, y, z) => x * y * z), F('y²z', (_, y, z) => y * y * z),
    F('xz²', (x, _, z) => x * z * z), F('yz²', (_, y, z) => y * z * z)],
  pyramid5: P1,
  pyramid13: P2,
}

/** The fields of `type`, or an error that says what to add. */
export function exactFields(type: string): readonly NamedField[] {
  const f = EXACT_FIELDS[type]
  if (!f) throw new Error(`no exactly represented test fields for element type '${type}': add an entry to EXACT_FIELDS in test/helpers/sectionElements.ts`)
  return f
}

/** The reference element of `type` mapped by x = scale ⊙ ξ + shift. */
export function singleElement(type: ElementTypeName, scale: Vec3, shift: Vec3): Mesh {
  const topo = ELEMENT_TYPES[type]
  const coords = new Float64Array(3 * topo.nodeCount)
  topo.refCoords.forEach((r, a) => { for (let k = 0; k < 3; k++) coords[3 * a + k] = scale[k] * r[k] + shift[k] })
  return createMesh(coords, [{ type, conn: Int32Array.from({ length: topo.nodeCount }, (_, i) => i) }])
}

/** A stress field σ_k(x) = Σ_j c[k][j] f_j(x) from scalar fields and a 6 × n coefficient table. */
export function stressOf(fields: readonly NamedField[], c: readonly (readonly number[])[]): (x: number, y: number, z: number) => number[] {
  return (x, y, z) => {
    const v = fields.map((g) => g.f(x, y, z))
    return c.map((row) => row.reduce((s, ck, j) => s + ck * v[j], 0))
  }
}

// ---------------------------------------------------------------- independent exact integration

const GL = gaussLegendre01(6)

/** n-point Gauss–Legendre nodes and weights on [0, 1] (Newton on P_n from the A&S first guess). */
function gaussLegendre01(n: number): { x: number[]; w: number[] } {
  const x: number[] = [], w: number[] = []
  for (let i = 1; i <= n; i++) {
    let t = Math.cos((Math.PI * (i - 0.25)) / (n + 0.5)), dp = 0
    for (let it = 0; it < 100; it++) {
      let p0 = 1, p1 = t
      for (let k = 2; k <= n; k++) { const p2 = ((2 * k - 1) * t * p1 - (k - 1) * p0) / k; p0 = p1; p1 = p2 }
      dp = (n * (t * p1 - p0)) / (t * t - 1)
      const dt = p1 / dp
      t -= dt
      if (Math.abs(dt) < 1e-16) break
    }
    x.push((1 - t) / 2); w.push(1 / ((1 - t * t) * dp * dp)) // 2/((1-t²)P'²) on [-1, 1], halved
  }
  return { x, w }
}

/**
 * The polygon where the plane (p, unit m) cuts the convex element `mesh` (one element; corners
 * first in its node list), counter-clockwise about m; empty when the plane misses it or only
 * touches it. `tol`: distance within which a corner counts as lying on the plane.
 */
export function exactPolygon(mesh: Mesh, p: Vec3, m: Vec3, tol = 1e-12): Vec3[] {
  const topo = ELEMENT_TYPES[mesh.blocks[0].type], x = mesh.coords, conn = mesh.blocks[0].conn
  const X = (a: number): Vec3 => [x[3 * conn[a]], x[3 * conn[a] + 1], x[3 * conn[a] + 2]]
  const d = (a: number) => { const q = X(a); return (q[0] - p[0]) * m[0] + (q[1] - p[1]) * m[1] + (q[2] - p[2]) * m[2] }
  const pts: Vec3[] = []
  for (let c = 0; c < topo.cornerCount; c++) if (Math.abs(d(c)) <= tol) pts.push(X(c))
  for (const [a, b] of topo.edges) {
    const da = d(a), db = d(b)
    if (Math.abs(da) <= tol || Math.abs(db) <= tol || (da < 0) === (db < 0)) continue
    const t = da / (da - db), A = X(a), B = X(b)
    pts.push([A[0] + t * (B[0] - A[0]), A[1] + t * (B[1] - A[1]), A[2] + t * (B[2] - A[2])])
  }
  if (pts.length < 3) return []
  // order by angle about the mean in a basis of the plane
  const c = [0, 1, 2].map((k) => pts.reduce((s, q) => s + q[k], 0) / pts.length)
  const u = Math.abs(m[0]) < 0.9 ? cross(m, [1, 0, 0]) : cross(m, [0, 1, 0])
  const ul = Math.hypot(...u), un = u.map((v) => v / ul) as Vec3
  const vn = cross(m, un)
  pts.sort((P, Q) => angle(P, c, un, vn) - angle(Q, c, un, vn))
  return pts
}

function angle(P: Vec3, c: number[], u: Vec3, v: Vec3): number {
  const r = [P[0] - c[0], P[1] - c[1], P[2] - c[2]]
  return Math.atan2(r[0] * v[0] + r[1] * v[1] + r[2] * v[2], r[0] * u[0] + r[1] * u[1] + r[2] * u[2])
}

export function cross(a: readonly number[], b: readonly number[]): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}

/** Area, centroid, ∫ σm dA and ∫ (x - centroid) × σm dA over a flat polygon (counter-clockwise about m). */
export function integratePolygonExact(poly: readonly Vec3[], m: Vec3, sigma: (x: number, y: number, z: number) => number[]) {
  let area = 0
  const first = [0, 0, 0], F = [0, 0, 0], Mo = [0, 0, 0]
  const o = poly[0]
  for (let i = 1; i + 1 < poly.length; i++) {
    const A = poly[0], B = poly[i], C = poly[i + 1]
    const n = cross([B[0] - A[0], B[1] - A[1], B[2] - A[2]], [C[0] - A[0], C[1] - A[1], C[2] - A[2]])
    const twoA = n[0] * m[0] + n[1] * m[1] + n[2] * m[2] // signed, positive counter-clockwise about m
    for (let a = 0; a < GL.x.length; a++) for (let b = 0; b < GL.x.length; b++) {
      // Duffy: x = A + u (B - A) + u v (C - B), dA = 2·area·u du dv
      const u = GL.x[a], v = GL.x[b], w = GL.w[a] * GL.w[b] * twoA * u
      const X = [0, 1, 2].map((k) => A[k] + u * (B[k] - A[k]) + u * v * (C[k] - B[k]))
      const s = sigma(X[0], X[1], X[2])
      const t = [s[0] * m[0] + s[3] * m[1] + s[5] * m[2], s[3] * m[0] + s[1] * m[1] + s[4] * m[2], s[5] * m[0] + s[4] * m[1] + s[2] * m[2]]
      const r = [X[0] - o[0], X[1] - o[1], X[2] - o[2]]
      area += w
      for (let k = 0; k < 3; k++) { first[k] += w * r[k]; F[k] += w * t[k] }
      const rt = cross(r, t)
      for (let k = 0; k < 3; k++) Mo[k] += w * rt[k]
    }
  }
  const c: Vec3 = [o[0] + first[0] / area, o[1] + first[1] / area, o[2] + first[2] / area]
  // about the centroid: M_c = M_o - (c - o) × F
  const co = [c[0] - o[0], c[1] - o[1], c[2] - o[2]]
  const cf = cross(co, F)
  return { area, centroid: c, force: F as Vec3, moment: [Mo[0] - cf[0], Mo[1] - cf[1], Mo[2] - cf[2]] as Vec3 }
}
