/**
 * Render buffers of the section face: the fill triangles of the cut polygons (SectionFill,
 * sectionDrawing.ts), whose points carry the traction σm interpolated by each element's own shape
 * functions (fan triangles, split in four at their edge midpoints for types whose stress is not
 * linear, so the colours follow the element's field between the polygon's vertices).
 *
 * Record (V fill points, T triangles):
 * - `positions`: Float32Array(3·V), model length units; each polygon keeps its own points (not
 *   shared: σm jumps between elements);
 * - `index`: Uint32Array(3·T); cut polygons of straight-sided elements are convex, so a fan
 *   covers them without overlap;
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
 * Colours of the section fill; `normal` is the section normal m, any length (normalised by
 * unitNormal: a zero or non-finite normal is an InputError, as everywhere).
 */
export function buildSectionTriangles(polygons: SectionPolygons, normal: Vec3): SectionTriangles {
  const { positions: x, traction: t, index: fillIndex, element } = polygons.fill
  const [mx, my, mz] = unitNormal(normal)
  const V = x.length / 3

  const positions = new Float32Array(3 * V)
  const normalTraction = new Float32Array(V)
  const shearTraction = new Float32Array(V)
  for (let i = 0; i < V; i++) {
    positions[3 * i] = x[3 * i]; positions[3 * i + 1] = x[3 * i + 1]; positions[3 * i + 2] = x[3 * i + 2]
    const tx = t[3 * i], ty = t[3 * i + 1], tz = t[3 * i + 2]
    const tn = tx * mx + ty * my + tz * mz
    normalTraction[i] = tn
    // the square root of the sum of squares, not Math.hypot: the same value for stresses (no
    // overflow below 1e150), and at 10^7 tet4 Math.hypot took about a fifth of a drag's cut here
    const sx = tx - tn * mx, sy = ty - tn * my, sz = tz - tn * mz
    shearTraction[i] = Math.sqrt(sx * sx + sy * sy + sz * sz)
  }
  return {
    positions, index: fillIndex.slice(), triangleElement: element.slice(), normalTraction, shearTraction,
    ranges: { normalTraction: finiteRange(normalTraction), shearTraction: finiteRange(shearTraction) },
    normal: [mx, my, mz],
  }
}
