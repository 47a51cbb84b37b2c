/**
 * Wedges (triangular prisms): wedge6 (linear) and wedge15 (serendipity), on the reference wedge
 * triangle 0 ≤ ξ, η, ξ + η ≤ 1 times ζ ∈ [-1, 1], with L0 = 1 - ξ - η, L1 = ξ, L2 = η.
 *
 * Corners: triangle 0-1-2 counter-clockwise seen from above at ζ = -1, 3-5 above it at ζ = +1.
 * wedge15 lists its mid-edge nodes on (0,1) (1,2) (2,0), (3,4) (4,5) (5,3), (0,3) (1,4) (2,5).
 * Mirror: swap the two triangles. A cube cell holds two wedges split on its bottom-face
 * diagonal 0-2 (top 4-6).
 *
 * wedge15 is the standard serendipity prism (common practice; e.g. Zienkiewicz & Taylor, The
 * Finite Element Method, vol. 1): with g = 1 + ζ_a ζ (ζ_a = ∓1 the level of node a),
 * - corner with volume coordinate L:      N = ½ L ((2L - 1) g - (1 - ζ²)),
 * - mid-edge of triangle edge (p, q):     N = 2 L_p L_q g,
 * - mid-edge of vertical edge at L:       N = L (1 - ζ²).
 * On a quadrilateral face these reduce to the quad8 functions (with (1 - ζ²) = (1 - ζ_a ζ) g),
 * on a triangular face to tri6, so wedge15 conforms to hex20 and tet10. Its space holds every
 * quadratic polynomial in ξ, η, ζ.
 */
import type { ElementType, ReferenceDomain } from './elementRecord.ts'
import { linearElement, quadraticElement } from './elementRecord.ts'
import { wedgeRule } from './quadratureRules.ts'

/** Reference wedge: triangle 0 ≤ ξ, η, ξ + η ≤ 1 times ζ ∈ [-1, 1] (volume 1). */
export const WEDGE: ReferenceDomain = {
  name: 'wedge', volume: 1, centroid: [1 / 3, 1 / 3, 0],
  clamp(p) {
    // Triangle: negatives to 0, then scaled back onto ξ + η = 1; ζ into [-1, 1].
    p[0] = Math.max(0, p[0]); p[1] = Math.max(0, p[1])
    const s = p[0] + p[1]
    if (s > 1) { p[0] /= s; p[1] /= s }
    p[2] = Math.min(1, Math.max(-1, p[2]))
  },
  fromUnitCube(out, u, v, w) {
    out[0] = u; out[1] = (1 - u) * v; out[2] = 2 * w - 1
  },
}

export const WEDGE6 = linearElement({
  name: 'wedge6', code: 5, domain: WEDGE,
  refCoords: [[0, 0, -1], [1, 0, -1], [0, 1, -1], [0, 0, 1], [1, 0, 1], [0, 1, 1]],
  faces: [[0, 2, 1], [3, 4, 5], [0, 1, 4, 3], [1, 2, 5, 4], [2, 0, 3, 5]],
  edges: [[0, 1], [1, 2], [2, 0], [3, 4], [4, 5], [5, 3], [0, 3], [1, 4], [2, 5]],
  mirror: [3, 4, 5, 0, 1, 2],
  cubeCells: [[0, 1, 2, 4, 5, 6], [0, 2, 3, 4, 6, 7]],
  // det J has degree 1 in (ξ, η) and 2 in ζ: triangle degree 2 × 2-point Gauss–Legendre.
  volumeRule: wedgeRule(2, 2),
  shapeValues(xi, eta, zeta, out) {
    const l0 = 1 - xi - eta, zm = 0.5 * (1 - zeta), zp = 0.5 * (1 + zeta)
    out[0] = l0 * zm; out[1] = xi * zm; out[2] = eta * zm
    out[3] = l0 * zp; out[4] = xi * zp; out[5] = eta * zp
    return out
  },
  shapeDerivatives(xi, eta, zeta, out) {
    const l0 = 1 - xi - eta, zm = 0.5 * (1 - zeta), zp = 0.5 * (1 + zeta)
    out[0] = -zm; out[1] = -zm; out[2] = -0.5 * l0
    out[3] = zm; out[4] = 0; out[5] = -0.5 * xi
    out[6] = 0; out[7] = zm; out[8] = -0.5 * eta
    out[9] = -zp; out[10] = -zp; out[11] = 0.5 * l0
    out[12] = zp; out[13] = 0; out[14] = 0.5 * xi
    out[15] = 0; out[16] = zp; out[17] = 0.5 * eta
    return out
  },
})

/** dL_k/dξ and dL_k/dη of the volume coordinates L0, L1, L2. */
const DLX = [-1, 1, 0], DLY = [-1, 0, 1]
/** The triangle edges (p, q) of mid-edge nodes 6-8 and 9-11, as volume-coordinate indices. */
const TRI_EDGES = [0, 1, 1, 2, 2, 0]

export const WEDGE15: ElementType<'wedge15'> = quadraticElement({
  name: 'wedge15', code: 8, linear: WEDGE6,
  // det J of a curved wedge15 has degree ≤ 4 in (ξ, η) and ≤ 5 in ζ: triangle degree 4 ×
  // 3-point Gauss–Legendre (exact to degree 5) integrates it exactly.
  volumeRule: wedgeRule(4, 3),
  shapeValues(xi, eta, zeta, out) {
    const l0 = 1 - xi - eta, h = 1 - zeta * zeta
    for (let a = 0; a < 6; a++) {
      const k = a % 3, L = k === 0 ? l0 : k === 1 ? xi : eta
      const g = a < 3 ? 1 - zeta : 1 + zeta
      out[a] = 0.5 * L * ((2 * L - 1) * g - h)
    }
    for (let m = 0; m < 6; m++) {
      const p = TRI_EDGES[2 * (m % 3)], q = TRI_EDGES[2 * (m % 3) + 1]
      const Lp = p === 0 ? l0 : p === 1 ? xi : eta, Lq = q === 0 ? l0 : q === 1 ? xi : eta
      out[6 + m] = 2 * Lp * Lq * (m < 3 ? 1 - zeta : 1 + zeta)
    }
    out[12] = l0 * h; out[13] = xi * h; out[14] = eta * h
    return out
  },
  shapeDerivatives(xi, eta, zeta, out) {
    const l0 = 1 - xi - eta, h = 1 - zeta * zeta
    for (let a = 0; a < 6; a++) {
      const k = a % 3, L = k === 0 ? l0 : k === 1 ? xi : eta
      const za = a < 3 ? -1 : 1, g = 1 + za * zeta
      const c = 0.5 * ((4 * L - 1) * g - h)
      out[3 * a] = c * DLX[k]; out[3 * a + 1] = c * DLY[k]
      out[3 * a + 2] = 0.5 * L * ((2 * L - 1) * za + 2 * zeta)
    }
    for (let m = 0; m < 6; m++) {
      const p = TRI_EDGES[2 * (m % 3)], q = TRI_EDGES[2 * (m % 3) + 1]
      const Lp = p === 0 ? l0 : p === 1 ? xi : eta, Lq = q === 0 ? l0 : q === 1 ? xi : eta
      const za = m < 3 ? -1 : 1, g = 1 + za * zeta
      const o = 3 * (6 + m)
      out[o] = 2 * (DLX[p] * Lq + Lp * DLX[q]) * g
      out[o + 1] = 2 * (DLY[p] * Lq + Lp * DLY[q]) * g
      out[o + 2] = 2 * Lp * Lq * za
    }
    for (let k = 0; k < 3; k++) {
      const L = k === 0 ? l0 : k === 1 ? xi : eta, o = 3 * (12 + k)
      out[o] = DLX[k] * h; out[o + 1] = DLY[k] * h; out[o + 2] = -2 * zeta * L
    }
    return out
  },
})
