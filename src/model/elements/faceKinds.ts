/**
 * The face kinds of the element registry: flat-reference triangles and quadrilaterals, linear
 * or quadratic. Each record holds everything a kernel needs to integrate over a face of that kind.
 *
 * Reference domains: triangle 0 ≤ u, v, u + v ≤ 1 with L0 = 1 - u - v (tri3, tri6); square
 * [-1, 1]² (quad4, quad8). Node order: corners counter-clockwise, then for quadratic kinds the
 * mid-edge nodes of edges (c0,c1) (c1,c2) (c2,c0) or (c0,c1) (c1,c2) (c2,c3) (c3,c0). tri6 is
 * the Lagrange triangle, quad8 the serendipity quadrilateral (common practice; e.g. Zienkiewicz &
 * Taylor, The Finite Element Method, vol. 1, standard elements).
 *
 * `out` layouts: values `out[a]`; derivatives `out[2a + k] = dN_a/du_k`. Nothing allocates.
 */
import type { QuadratureRule } from './quadratureRules.ts'
import { tensorRule, triangleRule } from './quadratureRules.ts'

export type FaceKind = 'tri3' | 'tri6' | 'quad4' | 'quad8'

export interface FaceKindType {
  readonly name: FaceKind
  /** Small integer used in typed arrays (BoundaryFaces.kind); the index into FACE_KINDS. */
  readonly code: number
  readonly nodeCount: number
  readonly cornerCount: number
  readonly quadratic: boolean
  /** Reference (u, v) of the face nodes, 2 per node. */
  readonly refCoords: Float64Array
  /**
   * The face split into flat triangles through its nodes for drawing, as face-local node
   * numbers, 3 per triangle, counter-clockwise like the face: tri3 → 1, quad4 → 2 (on the 0–2
   * diagonal), tri6 → 4 (three corner triangles and the mid-node triangle), quad8 → 6 (four
   * corner triangles and the mid-node quadrilateral as two).
   */
  readonly triangles: readonly number[]
  /**
   * Face rule, enough for ∫ σ dA and ∫ x × σn dA with σ interpolated by the face's own shape
   * functions: tri3 degree 2, tri6 degree 4, quad4 2×2, quad8 3×3 Gauss–Legendre.
   */
  readonly rule: QuadratureRule
  shapeValues(u: number, v: number, out: Float64Array): Float64Array
  shapeDerivatives(u: number, v: number, out: Float64Array): Float64Array
}

const QUAD_REF = Float64Array.from([-1, -1, 1, -1, 1, 1, -1, 1, 0, -1, 1, 0, 0, 1, -1, 0])

const TRI3: FaceKindType = {
  name: 'tri3', code: 0, nodeCount: 3, cornerCount: 3, quadratic: false,
  refCoords: Float64Array.from([0, 0, 1, 0, 0, 1]),
  triangles: [0, 1, 2],
  rule: triangleRule(2),
  shapeValues(u, v, out) {
    out[0] = 1 - u - v; out[1] = u; out[2] = v
    return out
  },
  shapeDerivatives(_u, _v, out) {
    out[0] = -1; out[1] = -1; out[2] = 1; out[3] = 0; out[4] = 0; out[5] = 1
    return out
  },
}

const TRI6: FaceKindType = {
  name: 'tri6', code: 1, nodeCount: 6, cornerCount: 3, quadratic: true,
  refCoords: Float64Array.from([0, 0, 1, 0, 0, 1, 0.5, 0, 0.5, 0.5, 0, 0.5]),
  // mid nodes 3 (0-1), 4 (1-2), 5 (2-0)
  triangles: [0, 3, 5, 3, 1, 4, 5, 4, 2, 3, 4, 5],
  rule: triangleRule(4),
  shapeValues(u, v, out) {
    const l0 = 1 - u - v
    out[0] = l0 * (2 * l0 - 1); out[1] = u * (2 * u - 1); out[2] = v * (2 * v - 1)
    out[3] = 4 * l0 * u; out[4] = 4 * u * v; out[5] = 4 * v * l0
    return out
  },
  shapeDerivatives(u, v, out) {
    const l0 = 1 - u - v, c0 = 4 * l0 - 1
    out[0] = -c0; out[1] = -c0
    out[2] = 4 * u - 1; out[3] = 0
    out[4] = 0; out[5] = 4 * v - 1
    out[6] = 4 * (l0 - u); out[7] = -4 * u
    out[8] = 4 * v; out[9] = 4 * u
    out[10] = -4 * v; out[11] = 4 * (l0 - v)
    return out
  },
}

const QUAD4: FaceKindType = {
  name: 'quad4', code: 2, nodeCount: 4, cornerCount: 4, quadratic: false,
  refCoords: QUAD_REF.slice(0, 8),
  triangles: [0, 1, 2, 0, 2, 3],
  rule: tensorRule(2, 2),
  shapeValues(u, v, out) {
    out[0] = 0.25 * (1 - u) * (1 - v); out[1] = 0.25 * (1 + u) * (1 - v)
    out[2] = 0.25 * (1 + u) * (1 + v); out[3] = 0.25 * (1 - u) * (1 + v)
    return out
  },
  shapeDerivatives(u, v, out) {
    out[0] = -0.25 * (1 - v); out[1] = -0.25 * (1 - u)
    out[2] = 0.25 * (1 - v); out[3] = -0.25 * (1 + u)
    out[4] = 0.25 * (1 + v); out[5] = 0.25 * (1 + u)
    out[6] = -0.25 * (1 + v); out[7] = 0.25 * (1 - u)
    return out
  },
}

const QUAD8: FaceKindType = {
  name: 'quad8', code: 3, nodeCount: 8, cornerCount: 4, quadratic: true,
  refCoords: QUAD_REF.slice(),
  // mid nodes 4 (0-1), 5 (1-2), 6 (2-3), 7 (3-0)
  triangles: [0, 4, 7, 1, 5, 4, 2, 6, 5, 3, 7, 6, 4, 5, 6, 4, 6, 7],
  rule: tensorRule(3, 2),
  shapeValues(u, v, out) {
    for (let a = 0; a < 8; a++) {
      const ua = QUAD_REF[2 * a], va = QUAD_REF[2 * a + 1]
      const fu = 1 + u * ua, fv = 1 + v * va
      if (a < 4) out[a] = 0.25 * fu * fv * (u * ua + v * va - 1)
      else if (ua === 0) out[a] = 0.5 * (1 - u * u) * fv
      else out[a] = 0.5 * fu * (1 - v * v)
    }
    return out
  },
  shapeDerivatives(u, v, out) {
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
  },
}

/** Every face kind, indexed by its code. */
export const FACE_KINDS: readonly FaceKindType[] = [TRI3, TRI6, QUAD4, QUAD8]

/** The face kind called `name`; an unknown name is an error. */
export function faceKind(name: FaceKind): FaceKindType {
  const k = FACE_KINDS.find((f) => f.name === name)
  if (!k) throw new Error(`unknown face kind ${JSON.stringify(name)}; known: ${FACE_KINDS.map((f) => f.name).join(', ')}`)
  return k
}

/** The face kind with typed-array code `code` (BoundaryFaces.kind); an unknown code is an error. */
export function faceKindOf(code: number): FaceKindType {
  const k = FACE_KINDS[code]
  if (!k) throw new Error(`unknown face kind code ${code}; known: 0..${FACE_KINDS.length - 1}`)
  return k
}
