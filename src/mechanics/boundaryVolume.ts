/**
 * The body's volume V (length³) and volume centroid c (length) from its boundary faces alone, by
 * the divergence theorem (common practice): with coordinates y = x − r relative to a reference
 * point r on the body (no digits lost far from the origin),
 *   V = ⅓ ∮ y·n dA,   ∫ y_i dV = ½ ∮ y_i² n_i dA,   c = r + ∫ y dV / V.
 * The identity holds face by face of every element, so it holds for any face set that is every
 * element face minus pairs that cancel: the output of boundaryFaces.ts (faces used by one
 * element; a matched pair has the same corners in opposite senses). Faces of parts meshed apart
 * that only coincide stay in the set and cancel in the sums; a face against a neighbour of
 * another kind (a quad against two triangles) stays too and closes its own element. So the
 * result is Σ over elements of their volumes and first moments, as elementVolume.ts sums them,
 * at a cost that grows with the faces, not the elements (10^6 tet4 in a block: 36 000 faces).
 *
 * Per face kind, exact:
 * - tri3 (flat, corners p0, p1, p2, N = (p1 − p0) × (p2 − p0) twice the area vector): ∮ y·n dA
 *   = p0·N/2 (the signed tetrahedron (r, p0, p1, p2) times 3), and y_i² is integrated over the
 *   triangle as a linear function's square, A/6 (Σ p_i² + Σ p_i p_j) (common practice), so
 *   ½∮ y_i² n_i dA = N_i ((Σ p_i)² + Σ p_i²) / 48. (The tetrahedron's first moment V_t (Σ p)/4
 *   would be ¼∮ y_i (y·n) dA, another field whose sum is the same only over faces all treated
 *   alike: the quads here take y_i² e_i / 2.)
 * - quad4 (bilinear, corners at (u, v) = (∓1, ∓1) counter-clockwise seen from outside):
 *   y = A + B u + C v + D uv, y_u × y_v = B×C + u B×D + v D×C; integrating the even terms over
 *   [−1, 1]² (∫1 = 4, ∫u² = 4/3, ∫u²v² = 4/9) gives, with a, b, c, d = 4A, 4B, 4C, 4D (sums and
 *   differences of the corners),
 *     ∮ y·n dA = a·(b×c)/16,
 *     ∮ y_i² n_i dA = [(b×c)_i (9a_i² + 3b_i² + 3c_i² + d_i²) + 2 (b×d)_i (3a_i b_i + c_i d_i)
 *                     + 2 (d×c)_i (3a_i c_i + b_i d_i)] / 576
 *   (the 2×2 Gauss rule gives the same: the integrands have degree ≤ 3 in u and in v).
 * - tri6, quad8 whose mid-edge nodes sit at their edges' midpoints (within 1e-12 of the face's
 *   size, as straightTet10.ts tests a tet10): their map is that of their corners, so as tri3, quad4.
 * - a curved tri6 or quad8: null, and the caller sums the elements (bodyVolume). Why not a face rule
 *   exact for them (degree 6 on a triangle, 4×4 Gauss on a quad8): the element rules of tet10
 *   (degree 3) and hex20 (3×3×3) integrate a curved element's volume exactly but not its first
 *   moment (degree 5, and 7 per direction), so an exact face sum would move the centroid, and the
 *   body's moment about it, by that quadrature error rather than by round-off.
 * Where the boundary is straight but elements inside are curved, the sums here are exact and the
 * element rules' first moment is not: the two differ by that quadrature error in the centroid.
 * Faces are matched by their corners, so the pairs dropped cancel unless the mesh itself is
 * broken: a curved quadratic face against a neighbour whose face has the same corners but other
 * mid-edge nodes, or an inverted element (the readers reorient those).
 * Far from the origin (coordinates above ≈ 10^4 face sizes) a straight quadratic face's mid-edge
 * nodes can round off their midpoints by more than the test allows: the element sums then, as
 * for a curved face.
 *
 * Inputs: `coords` (3 per node), the faces (BoundaryFaces: `kind`, `nodes` with `slots` per face,
 * corners first, outward). Output: { volume, centroid } (the origin for a zero volume, as
 * bodyVolume), or null as above and when there are no faces (nothing to integrate).
 */
import { FACE_KIND_CODE } from '../model/elementTypes.ts'
import type { Vec3 } from '../model/model.ts'
import type { BoundaryFaces } from './types.ts'

const TRI3 = FACE_KIND_CODE.tri3, TRI6 = FACE_KIND_CODE.tri6, QUAD4 = FACE_KIND_CODE.quad4, QUAD8 = FACE_KIND_CODE.quad8

export function boundaryVolume(coords: Float64Array, faces: BoundaryFaces): { readonly volume: number; readonly centroid: Vec3 } | null {
  if (faces.count === 0) return null
  const sums = volumeSums(1)
  return addBoundaryVolumes(sums, coords, faces, null) ? volumeOfSums(sums, 0) : null
}

/** Numbers per group in a volumeSums array: the reference point (3), then the 8 running sums. */
export const VOLUME_SUMS = 11

/** Sums for `groups` groups of faces (addBoundaryVolumes), each group's reference point not yet set. */
export function volumeSums(groups: number): Float64Array {
  const s = new Float64Array(VOLUME_SUMS * groups)
  for (let g = 0; g < groups; g++) s[VOLUME_SUMS * g] = NaN
  return s
}

/**
 * Adds the faces' integrals to their groups' sums (`group[f]` face f's group, all in group 0 when
 * null): several face sets may add to one array, each group's faces in its boundary's order, so
 * that the faces of several bodies (the parts of an assembly: their outer faces, then the sides
 * between them) are integrated in one pass each. A group's reference point is the first node of
 * its first face. Returns false at the first curved quadratic face (see boundaryVolume): the sums
 * are then incomplete and the caller sums the elements.
 */
export function addBoundaryVolumes(sums: Float64Array, coords: Float64Array, faces: BoundaryFaces, group: Int32Array | null): boolean {
  const F = faces.count, S = faces.slots, kind = faces.kind, nodes = faces.nodes, x = coords
  // 6 × (⅓ ∮ y·n) over triangles, 48 × that over quads; 48 × (½ ∮ y_i² n_i) over triangles,
  // 1152 × that over quads: scaled once at the end (volumeOfSums)
  const straight = straightFace
  for (let f = 0; f < F; f++) {
    const k = kind[f], o = S * f, g = VOLUME_SUMS * (group ? group[f] : 0)
    if (Number.isNaN(sums[g])) { const r0 = 3 * nodes[o]; sums[g] = x[r0]; sums[g + 1] = x[r0 + 1]; sums[g + 2] = x[r0 + 2] }
    const rx = sums[g], ry = sums[g + 1], rz = sums[g + 2]
    if (k === TRI3 || k === TRI6) {
      if (k === TRI6 && !straight(x, nodes, o, 3)) return false
      const p0 = 3 * nodes[o], p1 = 3 * nodes[o + 1], p2 = 3 * nodes[o + 2]
      const ax = x[p0] - rx, ay = x[p0 + 1] - ry, az = x[p0 + 2] - rz
      const bx = x[p1] - rx, by = x[p1 + 1] - ry, bz = x[p1 + 2] - rz
      const cx = x[p2] - rx, cy = x[p2 + 1] - ry, cz = x[p2 + 2] - rz
      // N = (b − a) × (c − a), the doubled area vector
      const ux = bx - ax, uy = by - ay, uz = bz - az, vx = cx - ax, vy = cy - ay, vz = cz - az
      const nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx
      sums[g + 3] += nx * ax + ny * ay + nz * az
      const sx = ax + bx + cx, sy = ay + by + cy, sz = az + bz + cz
      sums[g + 5] += nx * (sx * sx + ax * ax + bx * bx + cx * cx)
      sums[g + 6] += ny * (sy * sy + ay * ay + by * by + cy * cy)
      sums[g + 7] += nz * (sz * sz + az * az + bz * bz + cz * cz)
      continue
    }
    if (k !== QUAD4 && k !== QUAD8) throw new RangeError(`face ${f} has an unknown kind code ${k}`)
    if (k === QUAD8 && !straight(x, nodes, o, 4)) return false
    const p0 = 3 * nodes[o], p1 = 3 * nodes[o + 1], p2 = 3 * nodes[o + 2], p3 = 3 * nodes[o + 3]
    // one coordinate at a time: a = Σp, b = (p1 + p2) − (p0 + p3), c = (p2 + p3) − (p0 + p1),
    // d = (p0 + p2) − (p1 + p3); the cross products need all three, so keep them in locals
    const x0 = x[p0] - rx, x1 = x[p1] - rx, x2 = x[p2] - rx, x3 = x[p3] - rx
    const y0 = x[p0 + 1] - ry, y1 = x[p1 + 1] - ry, y2 = x[p2 + 1] - ry, y3 = x[p3 + 1] - ry
    const z0 = x[p0 + 2] - rz, z1 = x[p1 + 2] - rz, z2 = x[p2 + 2] - rz, z3 = x[p3 + 2] - rz
    const ax = x0 + x1 + x2 + x3, bx = x1 + x2 - x0 - x3, cx = x2 + x3 - x0 - x1, dx = x0 + x2 - x1 - x3
    const ay = y0 + y1 + y2 + y3, by = y1 + y2 - y0 - y3, cy = y2 + y3 - y0 - y1, dy = y0 + y2 - y1 - y3
    const az = z0 + z1 + z2 + z3, bz = z1 + z2 - z0 - z3, cz = z2 + z3 - z0 - z1, dz = z0 + z2 - z1 - z3
    // b×c, b×d, d×c
    const nx = by * cz - bz * cy, ny = bz * cx - bx * cz, nz = bx * cy - by * cx
    const ux = by * dz - bz * dy, uy = bz * dx - bx * dz, uz = bx * dy - by * dx
    const wx = dy * cz - dz * cy, wy = dz * cx - dx * cz, wz = dx * cy - dy * cx
    sums[g + 4] += ax * nx + ay * ny + az * nz
    sums[g + 8] += nx * (9 * ax * ax + 3 * (bx * bx + cx * cx) + dx * dx) + 2 * (ux * (3 * ax * bx + cx * dx) + wx * (3 * ax * cx + bx * dx))
    sums[g + 9] += ny * (9 * ay * ay + 3 * (by * by + cy * cy) + dy * dy) + 2 * (uy * (3 * ay * by + cy * dy) + wy * (3 * ay * cy + by * dy))
    sums[g + 10] += nz * (9 * az * az + 3 * (bz * bz + cz * cz) + dz * dz) + 2 * (uz * (3 * az * bz + cz * dz) + wz * (3 * az * cz + bz * dz))
  }
  return true
}

/** Group `k`'s volume and centroid from its sums (a group without faces or volume: 0 at the origin). */
export function volumeOfSums(sums: Float64Array, k: number): { readonly volume: number; readonly centroid: Vec3 } {
  const g = VOLUME_SUMS * k
  const V = sums[g + 3] / 6 + sums[g + 4] / 48
  if (V === 0 || Number.isNaN(sums[g])) return { volume: 0, centroid: [0, 0, 0] }
  const mx = sums[g + 5] / 48 + sums[g + 8] / 1152, my = sums[g + 6] / 48 + sums[g + 9] / 1152, mz = sums[g + 7] / 48 + sums[g + 10] / 1152
  return { volume: V, centroid: [sums[g] + mx / V, sums[g + 1] + my / V, sums[g + 2] + mz / V] }
}

/**
 * Whether a quadratic face (nc corners at nodes[o ..], then its mid-edge nodes on (c0, c1),
 * (c1, c2), …, (c_last, c0)) has every mid-edge node at its edge's midpoint within 1e-12 of the
 * face's size (the largest coordinate extent of its corners from corner 0; the test of
 * straightTet10.ts).
 */
function straightFace(x: Float64Array, nodes: Int32Array, o: number, nc: number): boolean {
  const q = 3 * nodes[o]
  const x0 = x[q], y0 = x[q + 1], z0 = x[q + 2]
  let size = 0
  for (let a = 1; a < nc; a++) {
    const p = 3 * nodes[o + a]
    size = Math.max(size, Math.abs(x[p] - x0), Math.abs(x[p + 1] - y0), Math.abs(x[p + 2] - z0))
  }
  // doubled: 2 x_m − (x_a + x_b) is twice the offset from the midpoint
  const tol = 2e-12 * size
  for (let a = 0; a < nc; a++) {
    const pa = 3 * nodes[o + a], pb = 3 * nodes[o + (a + 1) % nc], m = 3 * nodes[o + nc + a]
    if (Math.abs(2 * (x[m] - x0) - (x[pa] - x0) - (x[pb] - x0)) > tol) return false
    if (Math.abs(2 * (x[m + 1] - y0) - (x[pa + 1] - y0) - (x[pb + 1] - y0)) > tol) return false
    if (Math.abs(2 * (x[m + 2] - z0) - (x[pa + 2] - z0) - (x[pb + 2] - z0)) > tol) return false
  }
  return true
}
