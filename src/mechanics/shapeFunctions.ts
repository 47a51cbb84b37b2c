/**
 * Shape functions of the element types and face kinds, looked up in the element registry
 * (src/model/elementTypes.ts), whose family files under src/model/elements/ hold the functions,
 * their reference domains and their sources. An unknown type or kind is an error.
 *
 * `out` layouts: values `out[a]`; element derivatives `out[3a + k] = dN_a/dξ_k`; face derivatives
 * `out[2a + k] = dN_a/du_k`. The functions write into `out` and return it; nothing allocates.
 * Hot loops tabulate once per block (tabulateElement, tabulateFace) instead of calling per point.
 */
import type { ElementTypeName, FaceKind } from '../model/elementTypes.ts'
import { elementType, faceKind } from '../model/elementTypes.ts'
import type { QuadratureRule } from './quadrature.ts'

/** Values of the shape functions of `type` at (ξ, η, ζ). */
export function shapeValues(type: ElementTypeName, xi: number, eta: number, zeta: number, out: Float64Array): Float64Array {
  return elementType(type).shapeValues(xi, eta, zeta, out)
}

/** Derivatives dN_a/dξ_k of the shape functions of `type` at (ξ, η, ζ): out[3a + k]. */
export function shapeDerivatives(type: ElementTypeName, xi: number, eta: number, zeta: number, out: Float64Array): Float64Array {
  return elementType(type).shapeDerivatives(xi, eta, zeta, out)
}

/** Values of the face shape functions of `kind` at (u, v). */
export function faceShapeValues(kind: FaceKind, u: number, v: number, out: Float64Array): Float64Array {
  return faceKind(kind).shapeValues(u, v, out)
}

/** Derivatives of the face shape functions of `kind` at (u, v): out[2a + k] = dN_a/du_k. */
export function faceShapeDerivatives(kind: FaceKind, u: number, v: number, out: Float64Array): Float64Array {
  return faceKind(kind).shapeDerivatives(u, v, out)
}

/** Reference (u, v) of the face nodes of `kind`, in face node order (a fresh copy). */
export function faceRefCoords(kind: FaceKind): Float64Array {
  return faceKind(kind).refCoords.slice()
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
  const k = faceKind(kind)
  const nn = k.nodeCount
  const pts = rule ? rule.points : k.refCoords
  const nq = pts.length / 2
  const values = new Float64Array(nq * nn), derivs = new Float64Array(nq * nn * 2)
  const v = new Float64Array(nn), d = new Float64Array(2 * nn)
  for (let q = 0; q < nq; q++) {
    k.shapeValues(pts[2 * q], pts[2 * q + 1], v)
    k.shapeDerivatives(pts[2 * q], pts[2 * q + 1], d)
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
  const t = elementType(type)
  const nn = t.nodeCount
  const nq = rule.weights.length
  const values = new Float64Array(nq * nn), derivs = new Float64Array(nq * nn * 3)
  const v = new Float64Array(nn), d = new Float64Array(3 * nn)
  for (let q = 0; q < nq; q++) {
    const p = rule.points
    t.shapeValues(p[3 * q], p[3 * q + 1], p[3 * q + 2], v)
    t.shapeDerivatives(p[3 * q], p[3 * q + 1], p[3 * q + 2], d)
    values.set(v, q * nn)
    derivs.set(d, q * nn * 3)
  }
  return { nodeCount: nn, pointCount: nq, values, derivs, weights: Float64Array.from(rule.weights) }
}
