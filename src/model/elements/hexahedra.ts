/**
 * Hexahedra: hex8 (trilinear) and hex20 (serendipity), on the reference cube [-1, 1]³ (common
 * practice; e.g. Zienkiewicz & Taylor, The Finite Element Method, vol. 1).
 *
 * Corners: bottom face 0-1-2-3 counter-clockwise seen from the top face, 4-7 above 0-3. hex20
 * lists its mid-edge nodes on (0,1) (1,2) (2,3) (3,0), (4,5) (5,6) (6,7) (7,4), (0,4) (1,5) (2,6)
 * (3,7). Mirror: swap the bottom and top faces. A cube cell is one hexahedron.
 */
import type { ElementType, RefPoint, ReferenceDomain } from './elementRecord.ts'
import { linearElement, quadraticElement } from './elementRecord.ts'
import { tensorRule } from './quadratureRules.ts'

const CORNERS: RefPoint[] = [
  [-1, -1, -1], [1, -1, -1], [1, 1, -1], [-1, 1, -1],
  [-1, -1, 1], [1, -1, 1], [1, 1, 1], [-1, 1, 1],
]
const EDGES: [number, number][] = [
  [0, 1], [1, 2], [2, 3], [3, 0], [4, 5], [5, 6], [6, 7], [7, 4], [0, 4], [1, 5], [2, 6], [3, 7],
]
/** Reference coordinates of the 20 hex20 nodes (the first 8 are the hex8 corners), 3 per node. */
const REF = Float64Array.from([
  ...CORNERS.flat(),
  ...EDGES.flatMap(([a, b]) => [0, 1, 2].map((k) => (CORNERS[a][k] + CORNERS[b][k]) / 2)),
])

const clampUnit = (x: number): number => Math.min(1, Math.max(-1, x))

/** Reference cube [-1, 1]³ (volume 8). */
export const CUBE: ReferenceDomain = {
  name: 'cube', volume: 8, centroid: [0, 0, 0],
  clamp(p) {
    p[0] = clampUnit(p[0]); p[1] = clampUnit(p[1]); p[2] = clampUnit(p[2])
  },
  fromUnitCube(out, u, v, w) {
    out[0] = 2 * u - 1; out[1] = 2 * v - 1; out[2] = 2 * w - 1
  },
}

export const HEX8 = linearElement({
  name: 'hex8', code: 3, domain: CUBE,
  refCoords: CORNERS,
  faces: [[0, 3, 2, 1], [4, 5, 6, 7], [0, 1, 5, 4], [1, 2, 6, 5], [2, 3, 7, 6], [3, 0, 4, 7]],
  edges: EDGES,
  mirror: [4, 5, 6, 7, 0, 1, 2, 3],
  cubeCells: [[0, 1, 2, 3, 4, 5, 6, 7]],
  // det J of a trilinear map has degree 2 per direction: 2×2×2 Gauss–Legendre is exact for it.
  volumeRule: tensorRule(2, 3),
  shapeValues(xi, eta, zeta, out) {
    const xm = 1 - xi, xp = 1 + xi, ym = 1 - eta, yp = 1 + eta, zm = 1 - zeta, zp = 1 + zeta
    out[0] = 0.125 * xm * ym * zm; out[1] = 0.125 * xp * ym * zm
    out[2] = 0.125 * xp * yp * zm; out[3] = 0.125 * xm * yp * zm
    out[4] = 0.125 * xm * ym * zp; out[5] = 0.125 * xp * ym * zp
    out[6] = 0.125 * xp * yp * zp; out[7] = 0.125 * xm * yp * zp
    return out
  },
  shapeDerivatives(xi, eta, zeta, out) {
    for (let a = 0; a < 8; a++) {
      const xa = REF[3 * a], ya = REF[3 * a + 1], za = REF[3 * a + 2]
      const fx = 1 + xi * xa, fy = 1 + eta * ya, fz = 1 + zeta * za
      out[3 * a] = 0.125 * xa * fy * fz
      out[3 * a + 1] = 0.125 * fx * ya * fz
      out[3 * a + 2] = 0.125 * fx * fy * za
    }
    return out
  },
})

export const HEX20: ElementType<'hex20'> = quadraticElement({
  name: 'hex20', code: 4, linear: HEX8,
  volumeRule: tensorRule(3, 3),
  shapeValues(xi, eta, zeta, out) {
    for (let a = 0; a < 20; a++) {
      const xa = REF[3 * a], ya = REF[3 * a + 1], za = REF[3 * a + 2]
      const fx = 1 + xi * xa, fy = 1 + eta * ya, fz = 1 + zeta * za
      if (a < 8) out[a] = 0.125 * fx * fy * fz * (xi * xa + eta * ya + zeta * za - 2)
      // Mid-edge nodes: the coordinate that is 0 at the node enters as (1 - s²).
      else if (xa === 0) out[a] = 0.25 * (1 - xi * xi) * fy * fz
      else if (ya === 0) out[a] = 0.25 * fx * (1 - eta * eta) * fz
      else out[a] = 0.25 * fx * fy * (1 - zeta * zeta)
    }
    return out
  },
  shapeDerivatives(xi, eta, zeta, out) {
    for (let a = 0; a < 20; a++) {
      const xa = REF[3 * a], ya = REF[3 * a + 1], za = REF[3 * a + 2]
      const fx = 1 + xi * xa, fy = 1 + eta * ya, fz = 1 + zeta * za
      const o = 3 * a
      if (a < 8) {
        const s = xi * xa + eta * ya + zeta * za - 2
        out[o] = 0.125 * xa * fy * fz * (s + fx)
        out[o + 1] = 0.125 * ya * fx * fz * (s + fy)
        out[o + 2] = 0.125 * za * fx * fy * (s + fz)
      } else if (xa === 0) {
        const gx = 1 - xi * xi
        out[o] = -0.5 * xi * fy * fz; out[o + 1] = 0.25 * gx * ya * fz; out[o + 2] = 0.25 * gx * fy * za
      } else if (ya === 0) {
        const gy = 1 - eta * eta
        out[o] = 0.25 * xa * gy * fz; out[o + 1] = -0.5 * eta * fx * fz; out[o + 2] = 0.25 * fx * gy * za
      } else {
        const gz = 1 - zeta * zeta
        out[o] = 0.25 * xa * fy * gz; out[o + 1] = 0.25 * fx * ya * gz; out[o + 2] = -0.5 * zeta * fx * fy
      }
    }
    return out
  },
})
