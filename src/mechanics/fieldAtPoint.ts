/**
 * Values of the model's fields at a point inside an element, by the element's own shape
 * functions: σ(ξ) = Σₐ Nₐ(ξ) σ_row(e,a) for stress read through the field's element-node rows
 * (src/model/stressField.ts: nodal and element-nodal stress take the same path), and
 * u(ξ) = Σₐ Nₐ(ξ) u_node(e,a) for a nodal vector field (displacement).
 *
 * At a point held by several elements (a shared face, edge or node: pointLocation.ts) the stress
 * is the mean of the elements' values: for nodal stress they agree (the field is continuous), for
 * element-nodal stress this is the average of the elements' own values there.
 *
 * Units: stress in model stress units (6 per point, xx, yy, zz, xy, yz, xz), displacement in
 * model length units (3 per point). Nothing allocates.
 */
import { ELEMENT_TYPE_LIST, elementType } from '../model/elementTypes.ts'
import type { Mesh } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { PointHits } from './pointLocation.ts'

const N = new Float64Array(Math.max(...ELEMENT_TYPE_LIST.map((t) => t.nodeCount)))

/** Stress of element `local` of block `b` at reference point xi[o..o+2] into out[oo..oo+5]. */
export function stressInElement(out: Float64Array, oo: number, mesh: Mesh, field: StressField, b: number, local: number, xi: ArrayLike<number>, o = 0): Float64Array {
  const blk = mesh.blocks[b]
  const topo = elementType(blk.type)
  const nn = topo.nodeCount
  topo.shapeValues(xi[o], xi[o + 1], xi[o + 2], N)
  const rows = field.rows[b], v = field.values, base = local * nn
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, s5 = 0
  for (let a = 0; a < nn; a++) {
    const r = 6 * rows[base + a], w = N[a]
    s0 += w * v[r]; s1 += w * v[r + 1]; s2 += w * v[r + 2]; s3 += w * v[r + 3]; s4 += w * v[r + 4]; s5 += w * v[r + 5]
  }
  out[oo] = s0; out[oo + 1] = s1; out[oo + 2] = s2; out[oo + 3] = s3; out[oo + 4] = s4; out[oo + 5] = s5
  return out
}

/** A nodal 3-vector field (3N) of element `local` of block `b` at xi[o..o+2] into out[oo..oo+2]. */
export function vectorInElement(out: Float64Array, oo: number, mesh: Mesh, values: Float64Array, b: number, local: number, xi: ArrayLike<number>, o = 0): Float64Array {
  const blk = mesh.blocks[b]
  const topo = elementType(blk.type)
  const nn = topo.nodeCount
  topo.shapeValues(xi[o], xi[o + 1], xi[o + 2], N)
  const conn = blk.conn, base = local * nn
  let x = 0, y = 0, z = 0
  for (let a = 0; a < nn; a++) {
    const n = 3 * conn[base + a], w = N[a]
    x += w * values[n]; y += w * values[n + 1]; z += w * values[n + 2]
  }
  out[oo] = x; out[oo + 1] = y; out[oo + 2] = z
  return out
}

const S = new Float64Array(6), U = new Float64Array(3)

/**
 * Mean stress over the elements of `hits` into out[oo..oo+5]; NaN when no element holds the point
 * (a gap, never a zero). Returns the number of elements averaged.
 */
export function meanStressAt(out: Float64Array, oo: number, mesh: Mesh, field: StressField, hits: PointHits): number {
  const n = hits.count
  if (n === 0) { out.fill(NaN, oo, oo + 6); return 0 }
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, s5 = 0
  for (let i = 0; i < n; i++) {
    stressInElement(S, 0, mesh, field, hits.block[i], hits.local[i], hits.xi, 3 * i)
    s0 += S[0]; s1 += S[1]; s2 += S[2]; s3 += S[3]; s4 += S[4]; s5 += S[5]
  }
  out[oo] = s0 / n; out[oo + 1] = s1 / n; out[oo + 2] = s2 / n; out[oo + 3] = s3 / n; out[oo + 4] = s4 / n; out[oo + 5] = s5 / n
  return n
}

/**
 * A nodal vector field at the point of `hits` into out[oo..oo+2] (the first element's value: a
 * nodal field is continuous, so every holding element gives it); NaN in a gap.
 */
export function vectorAt(out: Float64Array, oo: number, mesh: Mesh, values: Float64Array, hits: PointHits): Float64Array {
  if (hits.count === 0) { out[oo] = NaN; out[oo + 1] = NaN; out[oo + 2] = NaN; return out }
  vectorInElement(U, 0, mesh, values, hits.block[0], hits.local[0], hits.xi, 0)
  out[oo] = U[0]; out[oo + 1] = U[1]; out[oo + 2] = U[2]
  return out
}
