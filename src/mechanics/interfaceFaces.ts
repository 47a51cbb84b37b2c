/**
 * Interface faces on the body's boundary: faces of two parts meshed apart whose corners coincide
 * (their nodes are distinct, so each appears as a boundary face of the whole body). They are not
 * outer surface: they leave the load-entry patches and the nominally free surface (loadPatches.ts
 * labels them -2); their forces stay in the whole-body balance, where the two sides cancel but for
 * the interface mismatch. Faces shared through nodes are interior and never reach the boundary.
 * The same pairing gives partBalance.ts the interfaces between parts meshed apart.
 *
 * Matching: candidates whose centroids lie within twice the largest tolerance along one direction
 * (coincidentSweep.ts), then the centroids within INTERFACE_TOL times the smaller face's size,
 * then every corner. Never by floating-point equality. Each face pairs with at most one other,
 * the first such candidate in the sweep's order.
 *
 * Layout: `part` Int32Array(F) the part of each boundary face (a part number or index: only
 * equality is used).
 */
import type { BoundaryFaces } from './types.ts'
import { faceCornerCount } from './freeBody.ts'
import { cornersCoincide } from './sectionRegions.ts'
import { nearPoints } from './coincidentSweep.ts'

/** Relative tolerance for corners of two parts' faces to coincide (fraction of the face size). */
export const INTERFACE_TOL = 1e-6

/** Uint8Array(F), 1 on an interface face, or null when the faces belong to one part. */
export function coincidentInterfaceFaces(coords: Float64Array, faces: BoundaryFaces, part: Int32Array): Uint8Array | null {
  const twin = coincidentFacePairs(coords, faces, part)
  if (!twin) return null
  const out = new Uint8Array(faces.count)
  for (let f = 0; f < faces.count; f++) out[f] = twin[f] >= 0 ? 1 : 0
  return out
}

/**
 * Each face's twin across the interface (Int32Array(F), -1 for none), or null when the faces belong
 * to one part. `only` (F, nonzero to keep), when given, limits the search to those faces: the
 * interface faces a load already found (coincidentInterfaceFaces), so the pairing runs over a few
 * faces instead of the whole surface.
 */
export function coincidentFacePairs(coords: Float64Array, faces: BoundaryFaces, part: Int32Array, only: ArrayLike<number> | null = null): Int32Array | null {
  const F = faces.count
  let mixed = false
  for (let f = 1; f < F && !mixed; f++) mixed = part[f] !== part[0]
  if (!mixed) return null
  // the faces searched: all, or those of `only`
  let ids: Int32Array | null = null
  if (only) {
    let n = 0
    for (let f = 0; f < F; f++) if (only[f]) n++
    ids = new Int32Array(n)
    for (let f = 0, k = 0; f < F; f++) if (only[f]) ids[k++] = f
  }
  const P = ids ? ids.length : F
  const id = (i: number): number => (ids ? ids[i] : i)
  const twin = new Int32Array(F).fill(-1)
  let cell = 0
  for (let i = 0; i < P; i++) cell = Math.max(cell, INTERFACE_TOL * Math.sqrt(faces.area[id(i)]))
  if (!(cell > 0)) return twin
  let c = faces.centroid
  if (ids) {
    c = new Float64Array(3 * P)
    for (let i = 0; i < P; i++) for (let k = 0; k < 3; k++) c[3 * i + k] = faces.centroid[3 * ids[i] + k]
  }
  // candidates: centroids within twice the largest tolerance along one direction (coincidentSweep.ts)
  const near = nearPoints(c, P, 2 * cell)
  const corners = (f: number): number[] => Array.from(faces.nodes.subarray(faces.slots * f, faces.slots * f + faceCornerCount(faces.kind[f])))
  for (let i = 0; i < P; i++) {
    const f = id(i)
    if (twin[f] >= 0) continue
    for (let k = near.start[i]; k < near.start[i + 1]; k++) {
      const j = near.list[k], g = id(j)
      if (twin[g] >= 0 || part[g] === part[f]) continue
      const tol = INTERFACE_TOL * Math.sqrt(Math.min(faces.area[f], faces.area[g]))
      if (Math.hypot(c[3 * i] - c[3 * j], c[3 * i + 1] - c[3 * j + 1], c[3 * i + 2] - c[3 * j + 2]) > tol) continue
      const a = corners(f), b = corners(g)
      if (a.length === b.length && cornersCoincide(coords, a, b, tol)) { twin[f] = g; twin[g] = f; break }
    }
  }
  return twin
}
