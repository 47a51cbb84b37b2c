/**
 * Traction integrals over the section polygon of one element of any type, by the element's own
 * shape functions: the stress at a point of the polygon is Σ N_a(ξ) σ_a over all of the
 * element's nodes at the point's reference coordinates ξ (the conventions of DEVELOPERS.md).
 *
 * Geometry first, stress second:
 * - `polygonPoints`: the polygon left by `elementPolygonRef` (sectionPolygon.ts, vertices with
 *   exact ξ) is split into a fan of triangles from its first vertex; on each, the points of the
 *   type's Dunavant rule (sectionRule.ts) get their plane coordinates, area weight and ξ (for a
 *   degree-4 rule two neighbouring fan triangles form a quadrilateral, integrated as exactly by
 *   9 Gauss points instead of 12: `quadPoints`). On an
 *   affine element ξ is linear in x, so the barycentric mix of the vertex ξ is exact; otherwise it
 *   is the start of the guarded Newton inversion of inverseMap.ts.
 * - the stress: the element's nodal tractions σ_a m (`nodalTraction`) and per point their mix by
 *   N(ξ) (`accumulateTraction`). A cut (sectionCut.ts) and a sweep run the two halves element by
 *   element, while the element's points are in cache; the case stencil (sectionStencil.ts)
 *   integrates the points' shape functions into node weights once instead, for many fields.
 *
 * Curved (non-affine) quadratic elements, the approximation: the polygon's vertices lie exactly on
 * the element's curved edges, but its sides are straight chords between them, while the element's
 * true section is bounded by the curves where the plane meets its curved faces. The region between
 * a chord and its curve is a sliver of width O(h²/R) (h element size, R radius of curvature), so
 * the section's area and resultant carry an error of order h² relative (less where the plane
 * meets the faces along straight lines, such as an axial plane through a ring); inside the polygon
 * the stress is the element's own interpolation at the inverted ξ. The rule is the affine case's;
 * its error on the non-polynomial integrand falls faster than the chord error. The reference test
 * (test/reference/sectionLame.test.ts, curved tet10 and hex20 rings) measures the rate.
 *
 * Units: plane coordinates a, b in model length (about the section's local origin, see
 * sectionPolygon.ts), weights in length², tractions in stress units, integrals as in ACC_*.
 */
import type { ElementTypeName } from '../model/elementTypes.ts'
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { ElementMap } from './inverseMap.ts'
import { invertElementMap, invertTrilinearPoints } from './inverseMap.ts'
import { ACC_AT, ACC_BT, ACC_FORCE, ACC_GROSS, MAX_POLYGON_POINTS } from './sectionPolygon.ts'
import type { PolygonScratch } from './sectionPolygon.ts'
import type { BarycentricRule } from './sectionRule.ts'
import { barycentric, MAX_SECTION_RULE_DEGREE } from './sectionRule.ts'
import { trilinearMonomials } from './trilinearMonomials.ts'

// The accumulator slots as module constants: an imported binding read in a per-element function
// is a getter call where tsx compiles the modules to CommonJS (a script run from outside the project).
const FORCE = ACC_FORCE, AT = ACC_AT, BT = ACC_BT, GROSS = ACC_GROSS
const monomials = trilinearMonomials, invert = invertElementMap, invertHex = invertTrilinearPoints
/** The hex8 traction's monomial coefficients T_0..T_7 of the element in hand (3 each). */
const TRACTION_MONOMIALS = new Float64Array(24)

/** Most quadrature points one polygon can have: its fan triangles times the largest rule. */
export const MAX_POLYGON_QUADRATURE = (MAX_POLYGON_POINTS - 2) * barycentric(MAX_SECTION_RULE_DEGREE).count

/** Quadrature points of one polygon (scratch, create once; `polygonPoints` says how many). */
export interface SectionPoints {
  /** ξ per point (3 each). */
  readonly ref: Float64Array
  /** Area weight per point (rule weight × triangle area). */
  readonly w: Float64Array
  /** Plane coordinates about the section's local origin. */
  readonly a: Float64Array
  readonly b: Float64Array
}

export function createSectionPoints(): SectionPoints {
  const n = MAX_POLYGON_QUADRATURE
  return { ref: new Float64Array(3 * n), w: new Float64Array(n), a: new Float64Array(n), b: new Float64Array(n) }
}

/**
 * Quadrature points of the polygon left in `sc` by elementPolygonRef, for the element loaded in
 * `em` (loadElementMap), written from index o on: ξ to ref (3 each), area weight to w, plane
 * coordinates to a and b (room for MAX_POLYGON_QUADRATURE points is the caller's). Points whose
 * Newton inversion fails keep their clamped linear estimate and are counted in em.failures
 * (inverseMap.ts). Returns the point count.
 */
export function polygonPoints(
  ref: Float64Array, w: Float64Array, pa: Float64Array, pb: Float64Array, o: number,
  sc: PolygonScratch, rule: BarycentricRule, em: ElementMap,
): number {
  const n = sc.count, order = sc.order, a = sc.a, b = sc.b, vref = sc.ref, pos = sc.pos
  const nq = rule.count, L0 = rule.l0, L1 = rule.l1, L2 = rule.l2, W = rule.w
  const affine = em.affine
  const ox = em.origin[0], oy = em.origin[1], oz = em.origin[2]
  // a distorted hex8: the points' positions go to POINT_X and are inverted together at the end
  // (invertTrilinearPoints: the same Newton, the map's coefficients read once)
  const hex = em.trilinear, X = POINT_X
  // Degree 4: two fan triangles side by side make a quadrilateral, 9 points instead of 12.
  const quads = rule.degree === 4
  const k0 = order[0]
  const a0 = a[k0], b0 = b[k0], r0 = 3 * k0
  let q = o
  for (let i = 1; i < n - 1;) {
    if (quads && i + 2 < n) {
      q = quadPoints(ref, w, pa, pb, q, o, sc, k0, order[i], order[i + 1], order[i + 2], em)
      i += 2
      continue
    }
    const ki = order[i], kj = order[i + 1], ri = 3 * ki, rj = 3 * kj
    const ai = a[ki], bi = b[ki], aj = a[kj], bj = b[kj]
    const At = 0.5 * ((ai - a0) * (bj - b0) - (aj - a0) * (bi - b0))
    // the vertices' ξ and positions once into locals (see quadPoints)
    const u0 = vref[r0], ui = vref[ri], uj = vref[rj], v0 = vref[r0 + 1], vi = vref[ri + 1], vj = vref[rj + 1]
    const s0 = vref[r0 + 2], si = vref[ri + 2], sj = vref[rj + 2]
    const x00 = pos[r0], xi0 = pos[ri], xj0 = pos[rj], x01 = pos[r0 + 1], xi1 = pos[ri + 1], xj1 = pos[rj + 1]
    const x02 = pos[r0 + 2], xi2 = pos[ri + 2], xj2 = pos[rj + 2]
    for (let r = 0; r < nq; r++, q++) {
      const l0 = L0[r], l1 = L1[r], l2 = L2[r]
      w[q] = W[r] * At
      pa[q] = l0 * a0 + l1 * ai + l2 * aj
      pb[q] = l0 * b0 + l1 * bi + l2 * bj
      ref[3 * q] = l0 * u0 + l1 * ui + l2 * uj
      ref[3 * q + 1] = l0 * v0 + l1 * vi + l2 * vj
      ref[3 * q + 2] = l0 * s0 + l1 * si + l2 * sj
      if (!affine) {
        // the point on the flat polygon, relative to the element's origin node
        const x0 = l0 * x00 + l1 * xi0 + l2 * xj0 - ox
        const x1 = l0 * x01 + l1 * xi1 + l2 * xj1 - oy
        const x2 = l0 * x02 + l1 * xi2 + l2 * xj2 - oz
        if (hex) { const x = 3 * (q - o); X[x] = x0; X[x + 1] = x1; X[x + 2] = x2 } else invert(em, x0, x1, x2, ref, 3 * q)
      }
    }
    i++
  }
  if (hex) invertHex(em, X, ref, 3 * o, q - o)
  return q - o
}

/** Positions of one polygon's points relative to the element's origin (3 each, from its first point on): the hex8 batch inversion's input. */
const POINT_X = new Float64Array(3 * MAX_POLYGON_QUADRATURE)

/**
 * The 3×3 Gauss–Legendre rule on the unit square (abscissae (1 ∓ √(3/5))/2 and ½, weights 5/18,
 * 8/18, 5/18 per direction; any numerical-analysis text): per point the bilinear weights of the
 * corners 0..3 (N0 = (1−u)(1−v), N1 = u(1−v), N2 = uv, N3 = (1−u)v), u, v and the weight.
 */
const QUAD_GAUSS = (() => {
  const g = [(1 - Math.sqrt(0.6)) / 2, 0.5, (1 + Math.sqrt(0.6)) / 2], gw = [5 / 18, 8 / 18, 5 / 18]
  const t = new Float64Array(9 * 7)
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
    const u = g[i], v = g[j], k = 7 * (3 * i + j)
    t.set([(1 - u) * (1 - v), u * (1 - v), u * v, (1 - u) * v, u, v, gw[i] * gw[j]], k)
  }
  return t
})()

/**
 * Quadrature points of the quadrilateral of polygon vertices k0, k1, k2, k3 (in order) for a
 * degree-4 section rule (sectionRule.ts: hex8, wedge15), from index q on; returns the next index.
 * The bilinear map of the unit square onto the quadrilateral, X(u, v) = Σ N_k P_k, turns a
 * polynomial of total degree 4 in the plane coordinates into one of degree ≤ 4 in u and in v, and
 * its Jacobian determinant is of degree 1 in each: degree ≤ 5 per variable, which the 3×3 Gauss
 * rule integrates exactly, as the two fan triangles' degree-4 rules do (12 points). A signed
 * Jacobian integrates the same over a non-convex quadrilateral (the map's degree is 1 inside, 0
 * outside, as for fan triangles of negative area). ξ is mixed bilinearly like the plane
 * coordinates: exact on an affine element (ξ linear in x), the Newton start otherwise.
 */
function quadPoints(
  ref: Float64Array, w: Float64Array, pa: Float64Array, pb: Float64Array, q: number, o: number,
  sc: PolygonScratch, k0: number, k1: number, k2: number, k3: number, em: ElementMap,
): number {
  const a = sc.a, b = sc.b, vref = sc.ref, pos = sc.pos, G = QUAD_GAUSS
  const a0 = a[k0], a1 = a[k1], a2 = a[k2], a3 = a[k3], b0 = b[k0], b1 = b[k1], b2 = b[k2], b3 = b[k3]
  const r0 = 3 * k0, r1 = 3 * k1, r2 = 3 * k2, r3 = 3 * k3
  const affine = em.affine, hex = em.trilinear, X = POINT_X
  const ox = em.origin[0], oy = em.origin[1], oz = em.origin[2]
  // the corners' ξ and positions once into locals: the stores below go to Float64Arrays too, so
  // the compiler would read them again at every point (the same values, the same arithmetic)
  const u0 = vref[r0], u1 = vref[r1], u2 = vref[r2], u3 = vref[r3], v0 = vref[r0 + 1], v1 = vref[r1 + 1], v2 = vref[r2 + 1], v3 = vref[r3 + 1]
  const s0 = vref[r0 + 2], s1 = vref[r1 + 2], s2 = vref[r2 + 2], s3 = vref[r3 + 2]
  const x00 = pos[r0], x10 = pos[r1], x20 = pos[r2], x30 = pos[r3], x01 = pos[r0 + 1], x11 = pos[r1 + 1], x21 = pos[r2 + 1], x31 = pos[r3 + 1]
  const x02 = pos[r0 + 2], x12 = pos[r1 + 2], x22 = pos[r2 + 2], x32 = pos[r3 + 2]
  for (let g = 0; g < 63; g += 7, q++) {
    const n0 = G[g], n1 = G[g + 1], n2 = G[g + 2], n3 = G[g + 3], u = G[g + 4], v = G[g + 5]
    // ∂X/∂u = (1−v)(P1−P0) + v(P2−P3), ∂X/∂v = (1−u)(P3−P0) + u(P2−P1)
    const au = (1 - v) * (a1 - a0) + v * (a2 - a3), bu = (1 - v) * (b1 - b0) + v * (b2 - b3)
    const av = (1 - u) * (a3 - a0) + u * (a2 - a1), bv = (1 - u) * (b3 - b0) + u * (b2 - b1)
    w[q] = G[g + 6] * (au * bv - av * bu)
    pa[q] = n0 * a0 + n1 * a1 + n2 * a2 + n3 * a3
    pb[q] = n0 * b0 + n1 * b1 + n2 * b2 + n3 * b3
    ref[3 * q] = n0 * u0 + n1 * u1 + n2 * u2 + n3 * u3
    ref[3 * q + 1] = n0 * v0 + n1 * v1 + n2 * v2 + n3 * v3
    ref[3 * q + 2] = n0 * s0 + n1 * s1 + n2 * s2 + n3 * s3
    if (!affine) {
      const x0 = n0 * x00 + n1 * x10 + n2 * x20 + n3 * x30 - ox
      const x1 = n0 * x01 + n1 * x11 + n2 * x21 + n3 * x31 - oy
      const x2 = n0 * x02 + n1 * x12 + n2 * x22 + n3 * x32 - oz
      // a distorted hex8's points are inverted by polygonPoints once the polygon's are all placed
      if (hex) { const x = 3 * (q - o); X[x] = x0; X[x + 1] = x1; X[x + 2] = x2 } else invert(em, x0, x1, x2, ref, 3 * q)
    }
  }
  return q
}

/**
 * Traction σm of the element's nodes into tn (3 per local node) from the stress rows
 * values[6·rows[base + a] ..] (the StressField index).
 */
export function nodalTraction(tn: Float64Array, values: Float64Array, rows: Int32Array, base: number, nn: number, mx: number, my: number, mz: number): Float64Array {
  for (let k = 0; k < nn; k++) {
    const s = 6 * rows[base + k]
    const sxx = values[s], syy = values[s + 1], szz = values[s + 2], sxy = values[s + 3], syz = values[s + 4], sxz = values[s + 5]
    tn[3 * k] = sxx * mx + sxy * my + sxz * mz
    tn[3 * k + 1] = sxy * mx + syy * my + syz * mz
    tn[3 * k + 2] = sxz * mx + syz * my + szz * mz
  }
  return tn
}

/**
 * Adds ∫ t dA, ∫ a t dA, ∫ b t dA over points [from, to) with t = Σ N_a(ξ) tn_a to acc[off ..],
 * and |∫ t dA| of these points (one polygon) to its gross slot; the polygon's ∫ t dA goes to
 * force[fo .. fo+3). `N` is scratch of at least nodeCount.
 */
export function accumulateTraction(
  acc: Float64Array, off: number, type: ElementTypeName, nn: number, tn: Float64Array,
  ref: Float64Array, w: Float64Array, a: Float64Array, b: Float64Array, from: number, to: number,
  N: Float64Array, force: Float64Array, fo: number,
): void {
  let Fx = 0, Fy = 0, Fz = 0, Ax = 0, Ay = 0, Az = 0, Bx = 0, By = 0, Bz = 0
  const values = ELEMENT_TYPES[type].shapeValues // the record's own function: no lookup per point
  // hex8: t is trilinear, written once per element in monomial form t = Σ_k T_k P_k(ξ)
  // (trilinearMonomials.ts), so a point costs four products and 21 multiply-adds instead of the
  // eight shape functions and an eight-node sum (the same polynomial; tested against them)
  const hex = type === 'hex8', c = hex ? monomials(TRACTION_MONOMIALS, tn) : TRACTION_MONOMIALS
  for (let q = from; q < to; q++) {
    const u = ref[3 * q], v = ref[3 * q + 1], s = ref[3 * q + 2]
    let tx = 0, ty = 0, tz = 0
    if (hex) {
      const uv = u * v, vs = v * s, us = u * s, uvs = uv * s
      tx = c[0] + c[3] * u + c[6] * v + c[9] * s + c[12] * uv + c[15] * vs + c[18] * us + c[21] * uvs
      ty = c[1] + c[4] * u + c[7] * v + c[10] * s + c[13] * uv + c[16] * vs + c[19] * us + c[22] * uvs
      tz = c[2] + c[5] * u + c[8] * v + c[11] * s + c[14] * uv + c[17] * vs + c[20] * us + c[23] * uvs
    } else {
      values(u, v, s, N)
      for (let k = 0; k < nn; k++) {
        const nk = N[k]
        tx += nk * tn[3 * k]; ty += nk * tn[3 * k + 1]; tz += nk * tn[3 * k + 2]
      }
    }
    const wq = w[q], wa = wq * a[q], wb = wq * b[q]
    Fx += wq * tx; Fy += wq * ty; Fz += wq * tz
    Ax += wa * tx; Ay += wa * ty; Az += wa * tz
    Bx += wb * tx; By += wb * ty; Bz += wb * tz
  }
  acc[off + FORCE] += Fx; acc[off + FORCE + 1] += Fy; acc[off + FORCE + 2] += Fz
  acc[off + AT] += Ax; acc[off + AT + 1] += Ay; acc[off + AT + 2] += Az
  acc[off + BT] += Bx; acc[off + BT + 1] += By; acc[off + BT + 2] += Bz
  acc[off + GROSS] += Math.sqrt(Fx * Fx + Fy * Fy + Fz * Fz)
  force[fo] = Fx; force[fo + 1] = Fy; force[fo + 2] = Fz
}

/** acc[off ..] += src[so ..] over the slots the traction integrals write (force, its first moments, gross). */
export function addTractionSlots(acc: Float64Array, off: number, src: Float64Array, so: number): void {
  for (let k = FORCE; k < BT + 3; k++) acc[off + k] += src[so + k]
  acc[off + GROSS] += src[so + GROSS]
}

/** A copy of `a` in a larger array of length n (grows-only storage). */
export function growInt(a: Int32Array, n: number): Int32Array {
  const b = new Int32Array(n)
  b.set(a)
  return b
}

/** A copy of `a` in a larger array of length n (grows-only storage). */
export function growFloat(a: Float64Array, n: number): Float64Array {
  const b = new Float64Array(n)
  b.set(a)
  return b
}
