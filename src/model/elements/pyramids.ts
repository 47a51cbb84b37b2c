/**
 * Pyramids: pyramid5 (linear) and pyramid13 (quadratic), the elements that join hexahedra (on the
 * quadrilateral base) to tetrahedra (on the triangular sides) in mixed meshes.
 *
 * Reference pyramid: base [-1, 1]² at ζ = 0, apex (0, 0, 1), |ξ|, |η| ≤ s with s = 1 - ζ.
 * Corners: base 0-1-2-3 = (-1,-1) (1,-1) (1,1) (-1,1), counter-clockwise seen from the apex 4.
 * pyramid13 lists its mid-edge nodes on (0,1) (1,2) (2,3) (3,0) (0,4) (1,4) (2,4) (3,4).
 * Mirror: swap base corners 1 and 3 (with their mid-edge nodes). A cube cell holds six pyramids,
 * one on each face with the apex at the cell centre.
 *
 * Shape functions: the rational pyramid functions of Bedrosian, "Shape functions and integration
 * formulas for three-dimensional finite element analysis", IJNME 35 (1992), written here from
 * memory in this reference frame and checked by the tests (Kronecker delta at the nodes,
 * partition of unity, reproduction of polynomial fields, face traces equal to the quad and
 * triangle face functions, derivatives against finite differences). With base corner signs
 * (ξ_a, η_a) and P_a = (s + ξ_a ξ)(s + η_a η)/s = s + ξ_a ξ + η_a η + ξ_a η_a ξη/s:
 * - pyramid5: base corner N_a = P_a / 4, apex N = ζ. The space is {1, ξ, η, ζ, ξη/s}: linear
 *   fields are reproduced exactly; the bilinear base trace is what lets it meet a hex8 face.
 * - pyramid13: base corner N_a = P_a (ξ_a ξ + η_a η - 1) / 4; apex N = ζ(2ζ - 1); base mid-edge
 *   node at (0, η_m): N = (s² - ξ²)(s + η_m η) / (2s), at (ξ_m, 0) likewise with ξ, η swapped;
 *   mid-edge node between base corner a and the apex: N = ζ P_a. Every quadratic polynomial in
 *   ξ, η, ζ is reproduced exactly (the tests check all ten monomials); the three rational
 *   functions besides them make the base trace quad8 and the side traces tri6.
 *
 * The apex: the rational terms ξη/s, ξ²η/s and their derivatives are 0/0 there. Inside the
 * pyramid |ξ/s|, |η/s| ≤ 1, so the values tend to 0 (the limit is taken: every function has its
 * Kronecker value at the apex). The derivatives stay bounded but depend on the direction from
 * which the apex is approached; at s = 0 we take the limit along the axis ξ = η = 0, where the
 * rational terms vanish identically, which is also their mean over the cross-sections near the
 * apex. The terms are evaluated through ra = ξ/s and rb = η/s, never ξη/s², so nothing overflows
 * close to the apex.
 *
 * Volume rules: the collapsed-cube Gauss–Jacobi rule (quadratureRules.ts, pyramidRule). In the
 * collapsed coordinates every pyramid function is a polynomial (P_a = s (1 + ξ_a u)(1 + η_a v)),
 * so det J of a pyramid5 has degree ≤ 2 in u and v and 0 in w: 2×2×2 points integrate its volume
 * and centroid exactly (and every polynomial of degree 3). pyramid13's det J has degree ≤ 5 in u,
 * v and ≤ 3 in w: 3×3×3 points integrate its volume exactly (and every polynomial of degree 5).
 */
import type { ElementType, ReferenceDomain } from './elementRecord.ts'
import { linearElement, quadraticElement } from './elementRecord.ts'
import { pyramidRule } from './quadratureRules.ts'

const XA = [-1, 1, 1, -1], YA = [-1, -1, 1, 1]

/** Reference pyramid |ξ|, |η| ≤ 1 - ζ, 0 ≤ ζ ≤ 1 (volume 4/3). */
export const PYRAMID: ReferenceDomain = {
  // Centroid of a cone: a quarter of the height above the base.
  name: 'pyramid', volume: 4 / 3, centroid: [0, 0, 0.25],
  clamp(p) {
    const z = Math.min(1, Math.max(0, p[2])), s = 1 - z
    p[0] = Math.min(s, Math.max(-s, p[0])); p[1] = Math.min(s, Math.max(-s, p[1])); p[2] = z
  },
  fromUnitCube(out, u, v, w) {
    const s = 1 - w
    out[0] = (2 * u - 1) * s; out[1] = (2 * v - 1) * s; out[2] = w
  },
}

export const PYRAMID5 = linearElement({
  name: 'pyramid5', code: 6, domain: PYRAMID,
  refCoords: [[-1, -1, 0], [1, -1, 0], [1, 1, 0], [-1, 1, 0], [0, 0, 1]],
  faces: [[0, 3, 2, 1], [0, 1, 4], [1, 2, 4], [2, 3, 4], [3, 0, 4]],
  edges: [[0, 1], [1, 2], [2, 3], [3, 0], [0, 4], [1, 4], [2, 4], [3, 4]],
  mirror: [0, 3, 2, 1, 4],
  // One pyramid per cell face, base = the face seen from the centre 8 (counter-clockwise).
  cubeCells: [[0, 1, 2, 3, 8], [4, 7, 6, 5, 8], [0, 4, 5, 1, 8], [1, 5, 6, 2, 8], [2, 6, 7, 3, 8], [3, 7, 4, 0, 8]],
  volumeRule: pyramidRule(2, 2),
  shapeValues(xi, eta, zeta, out) {
    const s = 1 - zeta
    // q = ξη/s → 0 at the apex.
    const q = s > 0 ? (xi / s) * eta : 0
    for (let a = 0; a < 4; a++) out[a] = 0.25 * (s + XA[a] * xi + YA[a] * eta + XA[a] * YA[a] * q)
    out[4] = zeta
    return out
  },
  shapeDerivatives(xi, eta, zeta, out) {
    const s = 1 - zeta
    // ra = ξ/s, rb = η/s: bounded by 1 inside; their axis limit 0 at the apex.
    const ra = s > 0 ? xi / s : 0, rb = s > 0 ? eta / s : 0
    for (let a = 0; a < 4; a++) {
      const c = XA[a] * YA[a]
      out[3 * a] = 0.25 * (XA[a] + c * rb)
      out[3 * a + 1] = 0.25 * (YA[a] + c * ra)
      out[3 * a + 2] = 0.25 * (-1 + c * ra * rb)
    }
    out[12] = 0; out[13] = 0; out[14] = 1
    return out
  },
})

/** Base mid-edge nodes 5-8: the fixed coordinate's sign (η_m for edges along ξ, ξ_m along η). */
const MID_SIGN = [-1, 1, 1, -1]

export const PYRAMID13: ElementType<'pyramid13'> = quadraticElement({
  name: 'pyramid13', code: 7, linear: PYRAMID5,
  volumeRule: pyramidRule(3, 3),
  shapeValues(xi, eta, zeta, out) {
    const s = 1 - zeta
    const ra = s > 0 ? xi / s : 0, rb = s > 0 ? eta / s : 0
    const q = ra * eta
    for (let a = 0; a < 4; a++) {
      const P = s + XA[a] * xi + YA[a] * eta + XA[a] * YA[a] * q
      out[a] = 0.25 * P * (XA[a] * xi + YA[a] * eta - 1)
      out[9 + a] = zeta * P
    }
    out[4] = zeta * (2 * zeta - 1)
    // (s² - ξ²)(s + m η)/(2s) = ½ (s² + m η s - ξ² - m ξ² η / s), edges along ξ (nodes 5, 7);
    // the same with ξ and η swapped along η (nodes 6, 8).
    for (let e = 0; e < 4; e++) {
      const m = MID_SIGN[e]
      out[5 + e] = e % 2 === 0
        ? 0.5 * (s * s + m * eta * s - xi * xi - m * xi * ra * eta)
        : 0.5 * (s * s + m * xi * s - eta * eta - m * eta * rb * xi)
    }
    return out
  },
  shapeDerivatives(xi, eta, zeta, out) {
    const s = 1 - zeta
    const ra = s > 0 ? xi / s : 0, rb = s > 0 ? eta / s : 0
    const q = ra * eta
    for (let a = 0; a < 4; a++) {
      const xa = XA[a], ya = YA[a], c = xa * ya
      const P = s + xa * xi + ya * eta + c * q
      const Px = xa + c * rb, Py = ya + c * ra, Pz = -1 + c * ra * rb
      const C = xa * xi + ya * eta - 1
      out[3 * a] = 0.25 * (Px * C + P * xa)
      out[3 * a + 1] = 0.25 * (Py * C + P * ya)
      out[3 * a + 2] = 0.25 * Pz * C
      const o = 3 * (9 + a)
      out[o] = zeta * Px; out[o + 1] = zeta * Py; out[o + 2] = P + zeta * Pz
    }
    out[12] = 0; out[13] = 0; out[14] = 4 * zeta - 1
    for (let e = 0; e < 4; e++) {
      const m = MID_SIGN[e], o = 3 * (5 + e)
      if (e % 2 === 0) {
        out[o] = -xi * (1 + m * rb)
        out[o + 1] = 0.5 * m * (s - xi * ra)
        out[o + 2] = 0.5 * (-2 * s - m * eta - m * ra * ra * eta)
      } else {
        out[o] = 0.5 * m * (s - eta * rb)
        out[o + 1] = -eta * (1 + m * ra)
        out[o + 2] = 0.5 * (-2 * s - m * xi - m * rb * rb * xi)
      }
    }
    return out
  },
})
