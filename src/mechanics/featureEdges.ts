/**
 * Feature edges of the boundary surface for drawing thin lines over it: the edges where the two
 * faces that share them turn by more than a crease angle, plus the edges that only one face
 * uses (an open border) or more than two use (a non-manifold seam). Smoothly curved surfaces
 * keep their outline without the mesh lines.
 *
 * Record: `segments` Float32Array(6·S), the two end points of each line segment, model length
 * units; a quadratic face's edge is drawn as two segments through its mid node. `count` = S.
 * `nodes` Int32Array(2·S): the node of each end point (the deformed shape moves them by their
 * displacement).
 *
 * Edges are matched by their corner nodes in an open-addressing table of typed arrays: linear in
 * the number of faces, no per-face allocation.
 */
import { FACE_KINDS } from '../model/elementTypes.ts'
import type { BoundaryFaces } from './types.ts'

export interface FeatureEdges {
  readonly count: number
  readonly segments: Float32Array
  readonly nodes: Int32Array
}

/** Corners per face kind code, and whether the kind has mid-edge nodes (from the element registry). */
const CORNERS = FACE_KINDS.map((k) => k.cornerCount)
const QUADRATIC = FACE_KINDS.map((k) => k.quadratic)

/** Default crease angle in degrees: a box's 90° edges show, a cylinder faceted at 15° does not. */
export const DEFAULT_CREASE_DEGREES = 30

export function buildFeatureEdges(coords: Float64Array, faces: BoundaryFaces, creaseDegrees = DEFAULT_CREASE_DEGREES): FeatureEdges {
  const F = faces.count
  const kind = faces.kind, nodes = faces.nodes, normal = faces.normal, slots = faces.slots
  let faceEdges = 0
  for (let f = 0; f < F; f++) faceEdges += CORNERS[kind[f]]
  let size = 16
  while (size < 2 * faceEdges) size *= 2
  const mask = size - 1
  const keyA = new Int32Array(size).fill(-1)
  const keyB = new Int32Array(size)
  const firstFace = new Int32Array(size)
  const firstLocal = new Uint8Array(size)
  const uses = new Uint8Array(size)
  const crease = new Uint8Array(size)
  const cosLimit = Math.cos((creaseDegrees * Math.PI) / 180)

  for (let f = 0; f < F; f++) {
    const nc = CORNERS[kind[f]]
    const base = f * slots
    for (let e = 0; e < nc; e++) {
      const p = nodes[base + e], q = nodes[base + ((e + 1) % nc)]
      const a = p < q ? p : q, b = p < q ? q : p
      let h = (Math.imul(a, 0x9e3779b1) ^ Math.imul(b, 0x85ebca6b)) & mask
      while (keyA[h] !== -1 && (keyA[h] !== a || keyB[h] !== b)) h = (h + 1) & mask
      if (keyA[h] === -1) {
        keyA[h] = a; keyB[h] = b; firstFace[h] = f; firstLocal[h] = e; uses[h] = 1
        continue
      }
      // Saturate at 3: more than two faces on an edge is a seam, drawn whatever the angle.
      if (uses[h] < 3) uses[h]++
      const g = firstFace[h]
      const c = normal[3 * f] * normal[3 * g] + normal[3 * f + 1] * normal[3 * g + 1] + normal[3 * f + 2] * normal[3 * g + 2]
      // NaN normals (degenerate faces) fail the comparison and count as creases.
      if (!(c >= cosLimit)) crease[h] = 1
    }
  }

  let count = 0
  for (let h = 0; h < size; h++) {
    if (keyA[h] === -1 || (uses[h] === 2 && !crease[h])) continue
    count += QUADRATIC[kind[firstFace[h]]] ? 2 : 1
  }
  const segments = new Float32Array(6 * count)
  const ends = new Int32Array(2 * count)
  let s = 0
  const put = (i: number, j: number): void => {
    ends[2 * s] = i; ends[2 * s + 1] = j
    segments[6 * s] = coords[3 * i]; segments[6 * s + 1] = coords[3 * i + 1]; segments[6 * s + 2] = coords[3 * i + 2]
    segments[6 * s + 3] = coords[3 * j]; segments[6 * s + 4] = coords[3 * j + 1]; segments[6 * s + 5] = coords[3 * j + 2]
    s++
  }
  for (let h = 0; h < size; h++) {
    if (keyA[h] === -1 || (uses[h] === 2 && !crease[h])) continue
    const f = firstFace[h], e = firstLocal[h], k = kind[f], nc = CORNERS[k], base = f * slots
    const p = nodes[base + e], q = nodes[base + ((e + 1) % nc)]
    if (QUADRATIC[k]) {
      const m = nodes[base + nc + e]
      put(p, m); put(m, q)
    } else put(p, q)
  }
  return { count, segments, nodes: ends }
}
