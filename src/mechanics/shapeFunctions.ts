/**
 * Shape functions of the element and face types, in the local node order of
 * src/model/elementTypes.ts.
 *
 * Reference domains: tet/tri in natural coordinates 0..1 with L0 = 1 - ξ - η (- ζ); hex/quad
 * [-1, 1]; wedge = triangle (ξ, η) × ζ in [-1, 1]. Quadratic types are the standard Lagrange
 * (tet10, tri6) and serendipity (hex20, quad8) families.
 *
 * `out` layouts: values `out[a]`; element derivatives `out[3a + k] = dN_a/dξ_k`; face derivatives
 * `out[2a + k] = dN_a/du_k`. The functions write into `out` and return it; nothing allocates.
 */
import type { ElementTypeName, FaceKind } from '../model/elementTypes.ts'
import { ELEMENT_TYPES, FACE_NODE_COUNT } from '../model/elementTypes.ts'
import type { QuadratureRule } from './quadrature.ts'

// Reference corner signs of hex20 / quad8 nodes, read once from the topology tables.
const HEX20_REF = Float64Array.from(ELEMENT_TYPES.hex20.refCoords.flat())
const QUAD_REF = Float64Array.from([-1, -1, 1, -1, 1, 1, -1, 1, 0, -1, 1, 0, 0, 1, -1, 0])
const TET10_EDGES = [0, 1, 1, 2, 2, 0, 0, 3, 1, 3, 2, 3]

/** Values of the shape functions of `type` at (ξ, η, ζ). */
export function shapeValues(type: ElementTypeName, xi: number, eta: number, zeta: number, out: Float64Array): Float64Array {
  switch (type) {
    case 'tet4':
      out[0] = 1 - xi - eta - zeta; out[1] = xi; out[2] = eta; out[3] = zeta
      return out
    case 'tet10': {
      const l0 = 1 - xi - eta - zeta, l1 = xi, l2 = eta, l3 = zeta
      out[0] = l0 * (2 * l0 - 1); out[1] = l1 * (2 * l1 - 1); out[2] = l2 * (2 * l2 - 1); out[3] = l3 * (2 * l3 - 1)
      out[4] = 4 * l0 * l1; out[5] = 4 * l1 * l2; out[6] = 4 * l2 * l0
      out[7] = 4 * l0 * l3; out[8] = 4 * l1 * l3; out[9] = 4 * l2 * l3
      return out
    }
    case 'hex8': {
      const xm = 1 - xi, xp = 1 + xi, ym = 1 - eta, yp = 1 + eta, zm = 1 - zeta, zp = 1 + zeta
      out[0] = 0.125 * xm * ym * zm; out[1] = 0.125 * xp * ym * zm
      out[2] = 0.125 * xp * yp * zm; out[3] = 0.125 * xm * yp * zm
      out[4] = 0.125 * xm * ym * zp; out[5] = 0.125 * xp * ym * zp
      out[6] = 0.125 * xp * yp * zp; out[7] = 0.125 * xm * yp * zp
      return out
    }
    case 'hex20': {
      for (let a = 0; a < 20; a++) {
        const xa = HEX20_REF[3 * a], ya = HEX20_REF[3 * a + 1], za = HEX20_REF[3 * a + 2]
        const fx = 1 + xi * xa, fy = 1 + eta * ya, fz = 1 + zeta * za
        if (a < 8) out[a] = 0.125 * fx * fy * fz * (xi * xa + eta * ya + zeta * za - 2)
        // Mid-edge nodes: the coordinate that is 0 at the node enters as (1 - s²).
        else if (xa === 0) out[a] = 0.25 * (1 - xi * xi) * fy * fz
        else if (ya === 0) out[a] = 0.25 * fx * (1 - eta * eta) * fz
        else out[a] = 0.25 * fx * fy * (1 - zeta * zeta)
      }
      return out
    }
    case 'wedge6': {
      const l0 = 1 - xi - eta, zm = 0.5 * (1 - zeta), zp = 0.5 * (1 + zeta)
      out[0] = l0 * zm; out[1] = xi * zm; out[2] = eta * zm
      out[3] = l0 * zp; out[4] = xi * zp; out[5] = eta * zp
      return out
    }
  }
}

/** Derivatives dN_a/dξ_k of the shape functions of `type` at (ξ, η, ζ): out[3a + k]. */
export function shapeDerivatives(type: ElementTypeName, xi: number, eta: number, zeta: number, out: Float64Array): Float64Array {
  switch (type) {
    case 'tet4':
      out[0] = -1; out[1] = -1; out[2] = -1
      out[3] = 1; out[4] = 0; out[5] = 0
      out[6] = 0; out[7] = 1; out[8] = 0
      out[9] = 0; out[10] = 0; out[11] = 1
      return out
    case 'tet10': {
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
    }
    case 'hex8': {
      for (let a = 0; a < 8; a++) {
        const xa = HEX20_REF[3 * a], ya = HEX20_REF[3 * a + 1], za = HEX20_REF[3 * a + 2]
        const fx = 1 + xi * xa, fy = 1 + eta * ya, fz = 1 + zeta * za
        out[3 * a] = 0.125 * xa * fy * fz
        out[3 * a + 1] = 0.125 * fx * ya * fz
        out[3 * a + 2] = 0.125 * fx * fy * za
      }
      return out
    }
    case 'hex20': {
      for (let a = 0; a < 20; a++) {
        const xa = HEX20_REF[3 * a], ya = HEX20_REF[3 * a + 1], za = HEX20_REF[3 * a + 2]
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
    }
    case 'wedge6': {
      const l0 = 1 - xi - eta, zm = 0.5 * (1 - zeta), zp = 0.5 * (1 + zeta)
      out[0] = -zm; out[1] = -zm; out[2] = -0.5 * l0
      out[3] = zm; out[4] = 0; out[5] = -0.5 * xi
      out[6] = 0; out[7] = zm; out[8] = -0.5 * eta
      out[9] = -zp; out[10] = -zp; out[11] = 0.5 * l0
      out[12] = zp; out[13] = 0; out[14] = 0.5 * xi
      out[15] = 0; out[16] = zp; out[17] = 0.5 * eta
      return out
    }
  }
}

/** Values of the face shape functions of `kind` at (u, v). */
export function faceShapeValues(kind: FaceKind, u: number, v: number, out: Float64Array): Float64Array {
  switch (kind) {
    case 'tri3':
      out[0] = 1 - u - v; out[1] = u; out[2] = v
      return out
    case 'tri6': {
      const l0 = 1 - u - v
      out[0] = l0 * (2 * l0 - 1); out[1] = u * (2 * u - 1); out[2] = v * (2 * v - 1)
      out[3] = 4 * l0 * u; out[4] = 4 * u * v; out[5] = 4 * v * l0
      return out
    }
    case 'quad4':
      out[0] = 0.25 * (1 - u) * (1 - v); out[1] = 0.25 * (1 + u) * (1 - v)
      out[2] = 0.25 * (1 + u) * (1 + v); out[3] = 0.25 * (1 - u) * (1 + v)
      return out
    case 'quad8': {
      for (let a = 0; a < 8; a++) {
        const ua = QUAD_REF[2 * a], va = QUAD_REF[2 * a + 1]
        const fu = 1 + u * ua, fv = 1 + v * va
        if (a < 4) out[a] = 0.25 * fu * fv * (u * ua + v * va - 1)
        else if (ua === 0) out[a] = 0.5 * (1 - u * u) * fv
        else out[a] = 0.5 * fu * (1 - v * v)
      }
      return out
    }
  }
}

/** Derivatives of the face shape functions of `kind` at (u, v): out[2a + k] = dN_a/du_k. */
export function faceShapeDerivatives(kind: FaceKind, u: number, v: number, out: Float64Array): Float64Array {
  switch (kind) {
    case 'tri3':
      out[0] = -1; out[1] = -1; out[2] = 1; out[3] = 0; out[4] = 0; out[5] = 1
      return out
    case 'tri6': {
      const l0 = 1 - u - v, c0 = 4 * l0 - 1
      out[0] = -c0; out[1] = -c0
      out[2] = 4 * u - 1; out[3] = 0
      out[4] = 0; out[5] = 4 * v - 1
      out[6] = 4 * (l0 - u); out[7] = -4 * u
      out[8] = 4 * v; out[9] = 4 * u
      out[10] = -4 * v; out[11] = 4 * (l0 - v)
      return out
    }
    case 'quad4':
      out[0] = -0.25 * (1 - v); out[1] = -0.25 * (1 - u)
      out[2] = 0.25 * (1 - v); out[3] = -0.25 * (1 + u)
      out[4] = 0.25 * (1 + v); out[5] = 0.25 * (1 + u)
      out[6] = -0.25 * (1 + v); out[7] = 0.25 * (1 - u)
      return out
    case 'quad8': {
      for (let a = 0; a < 8; a++) {
        const ua = QUAD_REF[2 * a], va = QUAD_REF[2 * a + 1]
        const fu = 1 + u * ua, fv = 1 + v * va
        if (a < 4) {
          const s = u * ua + v * va - 1
          out[2 * a] = 0.25 * ua * fv * (s + fu)
          out[2 * a + 1] = 0.25 * va * fu * (s + fv)
        } else if (ua === 0) {
          out[2 * a] = -u * fv; out[2 * a + 1] = 0.5 * (1 - u * u) * va
        } else {
          out[2 * a] = 0.5 * ua * (1 - v * v); out[2 * a + 1] = -v * fu
        }
      }
      return out
    }
  }
}

/** Reference (u, v) of the face nodes of `kind`, in face node order. */
export function faceRefCoords(kind: FaceKind): Float64Array {
  switch (kind) {
    case 'tri3': return Float64Array.from([0, 0, 1, 0, 0, 1])
    case 'tri6': return Float64Array.from([0, 0, 1, 0, 0, 1, 0.5, 0, 0.5, 0.5, 0, 0.5])
    case 'quad4': return QUAD_REF.slice(0, 8)
    case 'quad8': return QUAD_REF.slice()
  }
}

/**
 * Face shape values and derivatives tabulated at a list of (u, v) points, for hot loops:
 * `values[q·nn + a]`, `derivs[(q·nn + a)·2 + k]`.
 */
export interface FaceTable {
  readonly nodeCount: number
  readonly pointCount: number
  readonly values: Float64Array
  readonly derivs: Float64Array
  readonly weights: Float64Array
}

/** Tabulates `kind` at the points of `rule` (weights copied) — or at its own nodes when rule is null (weights 0). */
export function tabulateFace(kind: FaceKind, rule: QuadratureRule | null): FaceTable {
  const nn = FACE_NODE_COUNT[kind]
  const pts = rule ? rule.points : faceRefCoords(kind)
  const nq = pts.length / 2
  const values = new Float64Array(nq * nn), derivs = new Float64Array(nq * nn * 2)
  const v = new Float64Array(nn), d = new Float64Array(2 * nn)
  for (let q = 0; q < nq; q++) {
    faceShapeValues(kind, pts[2 * q], pts[2 * q + 1], v)
    faceShapeDerivatives(kind, pts[2 * q], pts[2 * q + 1], d)
    values.set(v, q * nn)
    derivs.set(d, q * nn * 2)
  }
  return { nodeCount: nn, pointCount: nq, values, derivs, weights: rule ? Float64Array.from(rule.weights) : new Float64Array(nq) }
}

/** Element shape values and derivatives tabulated at the points of `rule` (3 coordinates per point). */
export interface ElementTable {
  readonly nodeCount: number
  readonly pointCount: number
  readonly values: Float64Array
  readonly derivs: Float64Array
  readonly weights: Float64Array
}

export function tabulateElement(type: ElementTypeName, rule: QuadratureRule): ElementTable {
  const nn = ELEMENT_TYPES[type].nodeCount
  const nq = rule.weights.length
  const values = new Float64Array(nq * nn), derivs = new Float64Array(nq * nn * 3)
  const v = new Float64Array(nn), d = new Float64Array(3 * nn)
  for (let q = 0; q < nq; q++) {
    const p = rule.points
    shapeValues(type, p[3 * q], p[3 * q + 1], p[3 * q + 2], v)
    shapeDerivatives(type, p[3 * q], p[3 * q + 1], p[3 * q + 2], d)
    values.set(v, q * nn)
    derivs.set(d, q * nn * 3)
  }
  return { nodeCount: nn, pointCount: nq, values, derivs, weights: Float64Array.from(rule.weights) }
}
