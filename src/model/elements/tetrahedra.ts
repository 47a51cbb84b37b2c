/**
 * Tetrahedra: tet4 (linear) and tet10 (quadratic Lagrange), on the reference tetrahedron
 * 0 ≤ ξ, η, ζ, ξ + η + ζ ≤ 1 with volume coordinates L0 = 1 - ξ - η - ζ, L1 = ξ, L2 = η, L3 = ζ
 * (common practice; e.g. Zienkiewicz & Taylor, The Finite Element Method, vol. 1).
 *
 * Corners: positive volume when (x1-x0)×(x2-x0)·(x3-x0) > 0. tet10 lists its mid-edge nodes after
 * the corners on edges (0,1) (1,2) (2,0) (0,3) (1,3) (2,3). Mirror: swap corners 1 and 2 (with
 * their mid-edge nodes). A cube cell holds six tetrahedra around its diagonal 0-6 (Kuhn's
 * triangulation, conforming across neighbouring cells).
 */
import type { ElementType, ReferenceDomain } from './elementRecord.ts'
import { linearElement, quadraticElement } from './elementRecord.ts'
import { tetRule } from './quadratureRules.ts'

const TET10_EDGES = [0, 1, 1, 2, 2, 0, 0, 3, 1, 3, 2, 3]

/** Reference tetrahedron 0 ≤ ξ, η, ζ, ξ + η + ζ ≤ 1 (volume 1/6). */
export const TETRAHEDRON: ReferenceDomain = {
  name: 'tetrahedron', volume: 1 / 6, centroid: [0.25, 0.25, 0.25],
  clamp(p) {
    p[0] = Math.max(0, p[0]); p[1] = Math.max(0, p[1]); p[2] = Math.max(0, p[2])
    const s = p[0] + p[1] + p[2]
    if (s > 1) { p[0] /= s; p[1] /= s; p[2] /= s }
  },
  fromUnitCube(out, u, v, w) {
    out[0] = u; out[1] = (1 - u) * v; out[2] = (1 - u) * (1 - v) * w
  },
}

export const TET4 = linearElement({
  name: 'tet4', code: 1, domain: TETRAHEDRON,
  refCoords: [[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]],
  faces: [[0, 2, 1], [0, 1, 3], [1, 2, 3], [0, 3, 2]],
  edges: [[0, 1], [1, 2], [2, 0], [0, 3], [1, 3], [2, 3]],
  mirror: [0, 2, 1, 3],
  // Kuhn's six tetrahedra on the diagonal 0-6, each ordered for positive volume.
  cubeCells: [[0, 1, 2, 6], [0, 1, 6, 5], [0, 3, 6, 2], [0, 3, 7, 6], [0, 4, 5, 6], [0, 4, 6, 7]],
  // det J is constant: the centroid rule is exact for the volume and the centroid.
  volumeRule: tetRule(1),
  shapeValues(xi, eta, zeta, out) {
    out[0] = 1 - xi - eta - zeta; out[1] = xi; out[2] = eta; out[3] = zeta
    return out
  },
  shapeDerivatives(_xi, _eta, _zeta, out) {
    out[0] = -1; out[1] = -1; out[2] = -1
    out[3] = 1; out[4] = 0; out[5] = 0
    out[6] = 0; out[7] = 1; out[8] = 0
    out[9] = 0; out[10] = 0; out[11] = 1
    return out
  },
})

export const TET10: ElementType<'tet10'> = quadraticElement({
  name: 'tet10', code: 2, linear: TET4,
  // Degree 3: det J of a curved tet10 is cubic.
  volumeRule: tetRule(3),
  shapeValues(xi, eta, zeta, out) {
    const l0 = 1 - xi - eta - zeta, l1 = xi, l2 = eta, l3 = zeta
    out[0] = l0 * (2 * l0 - 1); out[1] = l1 * (2 * l1 - 1); out[2] = l2 * (2 * l2 - 1); out[3] = l3 * (2 * l3 - 1)
    out[4] = 4 * l0 * l1; out[5] = 4 * l1 * l2; out[6] = 4 * l2 * l0
    out[7] = 4 * l0 * l3; out[8] = 4 * l1 * l3; out[9] = 4 * l2 * l3
    return out
  },
  shapeDerivatives(xi, eta, zeta, out) {
    const l0 = 1 - xi - eta - zeta
    // dL/dξ_k for L0..L3: L0 → (-1,-1,-1), L1 → e1, L2 → e2, L3 → e3.
    const c0 = 4 * l0 - 1
    out[0] = -c0; out[1] = -c0; out[2] = -c0
    out[3] = 4 * xi - 1; out[4] = 0; out[5] = 0
    out[6] = 0; out[7] = 4 * eta - 1; out[8] = 0
    out[9] = 0; out[10] = 0; out[11] = 4 * zeta - 1
    const L0 = l0, L1 = xi, L2 = eta, L3 = zeta
    for (let m = 0; m < 6; m++) {
      const a = TET10_EDGES[2 * m], b = TET10_EDGES[2 * m + 1]
      const la = a === 0 ? L0 : a === 1 ? L1 : a === 2 ? L2 : L3
      const lb = b === 0 ? L0 : b === 1 ? L1 : b === 2 ? L2 : L3
      const o = 3 * (4 + m)
      for (let k = 0; k < 3; k++) {
        const da = a === 0 ? -1 : a - 1 === k ? 1 : 0
        const db = b === 0 ? -1 : b - 1 === k ? 1 : 0
        out[o + k] = 4 * (da * lb + la * db)
      }
    }
    return out
  },
})
