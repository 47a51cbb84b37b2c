/**
 * Whether a tet10 is straight-sided: each mid-edge node at the midpoint of its edge within
 * 1e-12 of the element's size (the largest coordinate extent of its corner edges from corner 0,
 * the size and tolerance of the affine test in inverseMap.ts). Its map is then affine (the
 * quadratic terms of x(ξ) vanish), so the closed forms of a linear tetrahedron hold for its
 * geometry: flat faces, constant det J, volume and centroid those of its corners.
 *
 * Input: coords Float64Array(3·N) (model length), conn the block's connectivity, base the
 * element's first entry (10 local nodes: corners, then mid-edge nodes on (0,1) (1,2) (2,0)
 * (0,3) (1,3) (2,3), ELEMENT_TYPES.tet10.edges).
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'

/** Edges of the tet10 as (corner, corner, mid-edge node), 3 per edge. */
const EDGES = Int32Array.from(ELEMENT_TYPES.tet10.edges.flat())

export function isStraightTet10(x: Float64Array, conn: Int32Array, base: number): boolean {
  const o = 3 * conn[base]
  const x0 = x[o], y0 = x[o + 1], z0 = x[o + 2]
  let size = 0
  for (let c = 1; c < 4; c++) {
    const p = 3 * conn[base + c]
    size = Math.max(size, Math.abs(x[p] - x0), Math.abs(x[p + 1] - y0), Math.abs(x[p + 2] - z0))
  }
  // Doubled: 2 x_m - (x_a + x_b) is twice the offset from the midpoint, formed without a halving.
  const tol = 2e-12 * size
  for (let k = 0; k < 18; k += 3) {
    const a = 3 * conn[base + EDGES[k]], b = 3 * conn[base + EDGES[k + 1]], m = 3 * conn[base + EDGES[k + 2]]
    // coordinates relative to corner 0, as the affine test forms them (no digits lost far from the origin)
    if (Math.abs(2 * (x[m] - x0) - (x[a] - x0) - (x[b] - x0)) > tol) return false
    if (Math.abs(2 * (x[m + 1] - y0) - (x[a + 1] - y0) - (x[b + 1] - y0)) > tol) return false
    if (Math.abs(2 * (x[m + 2] - z0) - (x[a + 2] - z0) - (x[b + 2] - z0)) > tol) return false
  }
  return true
}
