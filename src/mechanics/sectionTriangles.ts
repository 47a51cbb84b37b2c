/**
 * Render buffers of the section face: the cut polygons fan-triangulated.
 *
 * Record (V vertices = polygon vertices, T triangles):
 * - `positions`: Float32Array(3·V), model length units; polygon p keeps its own vertices
 *   `polygonStart[p]..polygonStart[p+1]-1` (not shared: σm jumps between elements);
 * - `index`: Uint32Array(3·T), fans (v0, vi, vi+1), n - 2 triangles per n-gon; cut polygons of
 *   straight-sided elements are convex, so a fan covers them without overlap;
 * - `triangleElement`: Int32Array(T), global element index of each triangle (probe, highlight);
 * - `normalTraction`: Float32Array(V) = m·(σm), stress units, tension positive;
 * - `shearTraction`: Float32Array(V) = |σm - (m·σm)m|, stress units;
 * - `ranges`: [min, max] of each over the finite values ([0, 0] when none);
 * - `normal`: the unit section normal m used.
 */
import type { Vec3 } from '../model/model.ts'
import type { SectionPolygons } from './types.ts'
import { finiteRange } from './surfaceTriangles.ts'
import { unitNormal } from './plane.ts'

export interface SectionTriangles {
  readonly positions: Float32Array
  readonly index: Uint32Array
  readonly triangleElement: Int32Array
  readonly normalTraction: Float32Array
  readonly shearTraction: Float32Array
  readonly ranges: { readonly normalTraction: readonly [number, number]; readonly shearTraction: readonly [number, number] }
  readonly normal: Vec3
}

/**
 * Triangulates the section polygons; `normal` is the section normal m, any length (normalised by
 * unitNormal: a zero or non-finite normal is an InputError, as everywhere).
 */
export function buildSectionTriangles(polygons: SectionPolygons, normal: Vec3): SectionTriangles {
  const { count: P, start, positions: x, traction: t, elem } = polygons
  const [mx, my, mz] = unitNormal(normal)
  const V = P > 0 ? start[P] - start[0] : 0
  let T = 0
  for (let p = 0; p < P; p++) T += Math.max(0, start[p + 1] - start[p] - 2)
  const base = P > 0 ? start[0] : 0

  const positions = new Float32Array(3 * V)
  const normalTraction = new Float32Array(V)
  const shearTraction = new Float32Array(V)
  const index = new Uint32Array(3 * T)
  const triangleElement = new Int32Array(T)

  for (let i = 0; i < V; i++) {
    const j = base + i
    positions[3 * i] = x[3 * j]; positions[3 * i + 1] = x[3 * j + 1]; positions[3 * i + 2] = x[3 * j + 2]
    const tx = t[3 * j], ty = t[3 * j + 1], tz = t[3 * j + 2]
    const tn = tx * mx + ty * my + tz * mz
    normalTraction[i] = tn
    shearTraction[i] = Math.hypot(tx - tn * mx, ty - tn * my, tz - tn * mz)
  }
  let k = 0
  for (let p = 0; p < P; p++) {
    const s = start[p] - base, e = start[p + 1] - base
    for (let i = s + 1; i + 1 < e; i++) {
      index[3 * k] = s; index[3 * k + 1] = i; index[3 * k + 2] = i + 1
      triangleElement[k] = elem[p]
      k++
    }
  }
  return {
    positions, index, triangleElement, normalTraction, shearTraction,
    ranges: { normalTraction: finiteRange(normalTraction), shearTraction: finiteRange(shearTraction) },
    normal: [mx, my, mz],
  }
}
