/**
 * Interface faces on the body's boundary: faces of two parts meshed apart whose corners coincide
 * (their nodes are distinct, so each appears as a boundary face of the whole body). They are not
 * outer surface: they leave the load-entry patches and the nominally free surface (loadPatches.ts
 * labels them -2); their forces stay in the whole-body balance, where the two sides cancel but for
 * the interface mismatch. Faces shared through nodes are interior and never reach the boundary.
 *
 * Matching as partBalance.ts: candidates whose centroids lie within twice the largest tolerance
 * along one direction (coincidentSweep.ts), then the centroids within INTERFACE_TOL times the
 * smaller face's size, then every corner. Never by floating-point equality.
 *
 * Layout: `part` Int32Array(F) the part of each boundary face; returns Uint8Array(F), 1 on an
 * interface face, or null when the faces belong to one part (nothing to do).
 */
import type { BoundaryFaces } from './types.ts'
import { faceCornerCount } from './freeBody.ts'
import { cornersCoincide } from './sectionRegions.ts'
import { nearPoints } from './coincidentSweep.ts'

/** Relative tolerance for corners to coincide (fraction of the face size), as partBalance.ts. */
const TOL = 1e-6

export function coincidentInterfaceFaces(coords: Float64Array, faces: BoundaryFaces, part: Int32Array): Uint8Array | null {
  const F = faces.count
  let mixed = false
  for (let f = 1; f < F && !mixed; f++) mixed = part[f] !== part[0]
  if (!mixed) return null
  let cell = 0
  for (let f = 0; f < F; f++) cell = Math.max(cell, TOL * Math.sqrt(faces.area[f]))
  if (!(cell > 0)) return null
  const c = faces.centroid
  // candidates: centroids within twice the largest tolerance along one direction (coincidentSweep.ts)
  const near = nearPoints(c, F, 2 * cell)
  const corners = (f: number): number[] => Array.from(faces.nodes.subarray(faces.slots * f, faces.slots * f + faceCornerCount(faces.kind[f])))
  const out = new Uint8Array(F)
  for (let f = 0; f < F; f++) {
    if (out[f]) continue
    for (let k = near.start[f]; k < near.start[f + 1]; k++) {
      const g = near.list[k]
      if (out[g] || part[g] === part[f]) continue
      const tol = TOL * Math.sqrt(Math.min(faces.area[f], faces.area[g]))
      if (Math.hypot(c[3 * f] - c[3 * g], c[3 * f + 1] - c[3 * g + 1], c[3 * f + 2] - c[3 * g + 2]) > tol) continue
      const a = corners(f), b = corners(g)
      if (a.length === b.length && cornersCoincide(coords, a, b, tol)) { out[f] = 1; out[g] = 1 }
    }
  }
  return out
}
