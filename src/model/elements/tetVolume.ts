/**
 * Six times the signed volume of a tetrahedron, (x1 - x0) × (x2 - x0) · (x3 - x0): positive when
 * the corners follow the tet4 numbering of the registry. One formula for the readers' orientation
 * test, the element volumes of the kernels and the demo meshes. Coordinates in model length
 * units, result in length³; `x` holds x, y, z per node and p0..p3 are offsets into it (3 × node).
 */
export function sixTetVolume(x: ArrayLike<number>, p0: number, p1: number, p2: number, p3: number): number {
  const x0 = x[p0], y0 = x[p0 + 1], z0 = x[p0 + 2]
  return tripleProduct(
    x[p1] - x0, x[p1 + 1] - y0, x[p1 + 2] - z0,
    x[p2] - x0, x[p2 + 1] - y0, x[p2 + 2] - z0,
    x[p3] - x0, x[p3 + 1] - y0, x[p3 + 2] - z0,
  )
}

/** (u × v) · w for edge vectors u, v, w from corner 0: six times the signed volume. */
export function tripleProduct(ux: number, uy: number, uz: number, vx: number, vy: number, vz: number, wx: number, wy: number, wz: number): number {
  return (uy * vz - uz * vy) * wx + (uz * vx - ux * vz) * wy + (ux * vy - uy * vx) * wz
}
