/**
 * Render buffers of the boundary surface, built in the worker and moved to the scene by transfer.
 *
 * Record (V vertices, T triangles, F boundary faces):
 * - vertices are per face node and never shared between faces: the traction t = σn depends on
 *   the face normal, so it jumps across the edges between faces; a face with k nodes owns k
 *   consecutive vertices starting at `faceVertexStart[f]` (tri3 3, tri6 6, quad4 4, quad8 8);
 * - `positions`: Float32Array(3·V), model length units;
 * - `normals`: Float32Array(3·V), unit outward normal of the face at that node (curved faces differ
 *   per node);
 * - `index`: Uint32Array(3·T), counter-clockwise seen from outside. tri3 → 1 triangle, quad4 → 2
 *   (split on the 0–2 diagonal), tri6 → 4 (three corner triangles and the mid-node triangle),
 *   quad8 → 6 (four corner triangles and the mid-node quad as two);
 * - `triangleFace`: Uint32Array(T), boundary-face index of each triangle;
 * - `faceVertexStart`: Int32Array(F + 1), first vertex of each face (and V at the end);
 * - `scalars[q]`: Float32Array(V) for each SurfaceQuantity, model stress units, except
 *   `balanceIndicator` (dimensionless, the element's |residual| / gross on all its face vertices,
 *   0 when no balance was given) and `stressJump` (dimensionless, src/mechanics/stressJump.ts, at
 *   the face's node; 0 when none was given: nodal stress). NaN stays NaN (the shader paints it neutral);
 * - `ranges[q]`: [min, max] over the finite values of `scalars[q]` ([0, 0] when none);
 * - `patch`: Float32Array(V), load-patch id of the vertex's face, -1 on the nominally free surface
 *   (or everywhere when no labels were given); a float because it is a vertex attribute;
 * - `bounds`: axis-aligned box of the vertices, model length units.
 *
 * Linear in the number of faces; the only allocations are the output arrays. A load case switch
 * keeps the geometry and builds only the scalars and labels again (buildSurfaceScalars).
 */
import { FACE_KINDS } from '../model/elementTypes.ts'
import type { Vec3 } from '../model/model.ts'
import type { BoundaryFaces, NodalInvariants, SurfaceTractions } from './types.ts'

/** Scalars the surface can be coloured by (names shared with the app store's QuantityName). */
export type SurfaceQuantity =
  | 'normalTraction' | 'shearTraction' | 'tractionMagnitude'
  | 'vonMises' | 'principal1' | 'principal3' | 'balanceIndicator' | 'stressJump'

export const SURFACE_QUANTITIES: readonly SurfaceQuantity[] = [
  'normalTraction', 'shearTraction', 'tractionMagnitude', 'vonMises', 'principal1', 'principal3', 'balanceIndicator', 'stressJump',
]

export interface SurfaceTriangles {
  readonly positions: Float32Array
  readonly normals: Float32Array
  readonly index: Uint32Array
  readonly triangleFace: Uint32Array
  readonly faceVertexStart: Int32Array
  readonly scalars: Readonly<Record<SurfaceQuantity, Float32Array>>
  readonly ranges: Readonly<Record<SurfaceQuantity, readonly [number, number]>>
  readonly patch: Float32Array
  readonly bounds: { readonly min: Vec3; readonly max: Vec3 }
}

/** Vertices, sub-triangles and their face-local vertex lists per face kind code (the registry's drawing split). */
const NODES_OF_KIND = FACE_KINDS.map((k) => k.nodeCount)
const TRIS_OF_KIND = FACE_KINDS.map((k) => k.triangles.length / 3)
const LOCAL_TRIS: readonly (readonly number[])[] = FACE_KINDS.map((k) => k.triangles)

/** The case-dependent part of the surface buffers: the scalars, their ranges and the patch labels (layout above). */
export interface SurfaceScalars {
  readonly scalars: Readonly<Record<SurfaceQuantity, Float32Array>>
  readonly ranges: Readonly<Record<SurfaceQuantity, readonly [number, number]>>
  readonly patch: Float32Array
}

/** What the surface scalars read of the invariants: von Mises and the principal values at the surface's nodes. */
export type SurfaceInvariants = Pick<NodalInvariants, 'vonMises' | 'principal'>

/** First vertex of each face and V at the end (Int32Array(F + 1)), and the triangle count T. */
export function surfaceVertexRuns(faces: BoundaryFaces): { faceVertexStart: Int32Array; triangles: number } {
  const F = faces.count, kind = faces.kind
  const faceVertexStart = new Int32Array(F + 1)
  let V = 0, T = 0
  for (let f = 0; f < F; f++) {
    faceVertexStart[f] = V
    V += NODES_OF_KIND[kind[f]]
    T += TRIS_OF_KIND[kind[f]]
  }
  faceVertexStart[F] = V
  return { faceVertexStart, triangles: T }
}

/**
 * Builds the surface render buffers. `indicator` is the ElementBalance indicator per element
 * (dimensionless) or null; `faceLabel` the LoadPatches label per boundary face or null; `jump`
 * the stress jump per node (element-nodal stress) or null. The geometry (positions, normals,
 * index, triangle faces, vertex runs, bounds) does not depend on the stress; the scalars and
 * labels are those of buildSurfaceScalars.
 */
export function buildSurfaceTriangles(
  coords: Float64Array,
  faces: BoundaryFaces,
  tractions: SurfaceTractions,
  invariants: SurfaceInvariants,
  indicator: ArrayLike<number> | null = null,
  faceLabel: Int32Array | null = null,
  jump: ArrayLike<number> | null = null,
): SurfaceTriangles {
  const F = faces.count
  const kind = faces.kind
  const { faceVertexStart, triangles: T } = surfaceVertexRuns(faces)
  const V = faceVertexStart[F]

  const positions = new Float32Array(3 * V)
  const normals = new Float32Array(3 * V)
  const index = new Uint32Array(3 * T)
  const triangleFace = new Uint32Array(T)

  const nodes = faces.nodes, S = faces.slots
  const nodeNormal = tractions.nodeNormal
  let minX = Infinity, minY = Infinity, minZ = Infinity, maxX = -Infinity, maxY = -Infinity, maxZ = -Infinity

  let t = 0
  for (let f = 0; f < F; f++) {
    const k = kind[f]
    const nv = NODES_OF_KIND[k]
    const v0 = faceVertexStart[f]
    for (let a = 0; a < nv; a++) {
      const slot = f * S + a
      const node = nodes[slot]
      const v = v0 + a
      const x = coords[3 * node], y = coords[3 * node + 1], z = coords[3 * node + 2]
      positions[3 * v] = x; positions[3 * v + 1] = y; positions[3 * v + 2] = z
      if (x < minX) minX = x
      if (x > maxX) maxX = x
      if (y < minY) minY = y
      if (y > maxY) maxY = y
      if (z < minZ) minZ = z
      if (z > maxZ) maxZ = z
      normals[3 * v] = nodeNormal[3 * slot]
      normals[3 * v + 1] = nodeNormal[3 * slot + 1]
      normals[3 * v + 2] = nodeNormal[3 * slot + 2]
    }
    const local = LOCAL_TRIS[k]
    for (let i = 0; i < local.length; i += 3) {
      index[3 * t] = v0 + local[i]
      index[3 * t + 1] = v0 + local[i + 1]
      index[3 * t + 2] = v0 + local[i + 2]
      triangleFace[t] = f
      t++
    }
  }

  const { scalars, ranges, patch } = buildSurfaceScalars(faces, faceVertexStart, tractions, invariants, indicator, faceLabel, jump)
  // An empty surface gets a unit box at the origin so camera fitting stays finite.
  const bounds = V > 0
    ? { min: [minX, minY, minZ] as Vec3, max: [maxX, maxY, maxZ] as Vec3 }
    : { min: [0, 0, 0] as Vec3, max: [1, 1, 1] as Vec3 }
  return { positions, normals, index, triangleFace, faceVertexStart, scalars, ranges, patch, bounds }
}

/**
 * The scalars, ranges and patch labels of the surface whose vertex runs are `faceVertexStart`
 * (surfaceVertexRuns): what another load case changes, on the same geometry. Arguments as
 * buildSurfaceTriangles; `invariants` is read at the surface's nodes only.
 */
export function buildSurfaceScalars(
  faces: BoundaryFaces,
  faceVertexStart: Int32Array,
  tractions: SurfaceTractions,
  invariants: SurfaceInvariants,
  indicator: ArrayLike<number> | null = null,
  faceLabel: Int32Array | null = null,
  jump: ArrayLike<number> | null = null,
): SurfaceScalars {
  const F = faces.count
  const V = faceVertexStart[F]
  const normalTraction = new Float32Array(V)
  const shearTraction = new Float32Array(V)
  const tractionMagnitude = new Float32Array(V)
  const vonMises = new Float32Array(V)
  const principal1 = new Float32Array(V)
  const principal3 = new Float32Array(V)
  const balanceIndicator = new Float32Array(V)
  const stressJump = new Float32Array(V)
  const patch = new Float32Array(V)

  const nodes = faces.nodes, elem = faces.elem, S = faces.slots
  const nn = tractions.nodeNormalTraction, ns = tractions.nodeShear, nm = tractions.nodeMagnitude
  const vm = invariants.vonMises, pr = invariants.principal
  for (let f = 0; f < F; f++) {
    const v0 = faceVertexStart[f], nv = faceVertexStart[f + 1] - v0
    const ind = indicator ? indicator[elem[f]] : 0
    const label = faceLabel ? faceLabel[f] : -1
    for (let a = 0; a < nv; a++) {
      const slot = f * S + a
      const node = nodes[slot]
      const v = v0 + a
      normalTraction[v] = nn[slot]
      shearTraction[v] = ns[slot]
      tractionMagnitude[v] = nm[slot]
      vonMises[v] = vm[node]
      principal1[v] = pr[3 * node]
      principal3[v] = pr[3 * node + 2]
      balanceIndicator[v] = ind
      if (jump) stressJump[v] = jump[node]
      patch[v] = label
    }
  }

  const scalars: Record<SurfaceQuantity, Float32Array> = {
    normalTraction, shearTraction, tractionMagnitude, vonMises, principal1, principal3, balanceIndicator, stressJump,
  }
  const ranges = {} as Record<SurfaceQuantity, readonly [number, number]>
  for (const q of SURFACE_QUANTITIES) ranges[q] = finiteRange(scalars[q])
  return { scalars, ranges, patch }
}

/**
 * Writes the load-patch label of each vertex's face into `out` (Float32Array(V)), for when the
 * patches are found again with another threshold and only the labels change.
 */
export function fillVertexPatch(out: Float32Array, faceVertexStart: Int32Array, faceLabel: Int32Array | null): Float32Array {
  const F = faceVertexStart.length - 1
  for (let f = 0; f < F; f++) {
    const label = faceLabel ? faceLabel[f] : -1
    for (let v = faceVertexStart[f], end = faceVertexStart[f + 1]; v < end; v++) out[v] = label
  }
  return out
}

/** [min, max] over the finite entries; [0, 0] when there are none. */
export function finiteRange(values: ArrayLike<number>): [number, number] {
  let lo = Infinity, hi = -Infinity
  for (let i = 0; i < values.length; i++) {
    const v = values[i]
    // NaN fails both comparisons, so it never widens the range; ±Infinity is skipped explicitly.
    if (v < lo && v !== -Infinity) lo = v
    if (v > hi && v !== Infinity) hi = v
  }
  return lo <= hi ? [lo, hi] : [0, 0]
}
