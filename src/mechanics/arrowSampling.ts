/**
 * Traction arrows decimated by area to a bounded count, so the scene draws a few thousand
 * instances at most whatever the mesh size.
 *
 * Every item (a boundary face, or a section polygon) is an area A_i with a mean traction
 * t̄_i = ∫ t dA / A_i at its centroid. When the items with positive area fit the budget, each gets
 * one arrow with weight A_i. Otherwise the total area A is cut into K = budget equal strata laid
 * along the cumulative area (items in their given order, which follows the mesh so neighbours
 * stay together); one seeded uniform point per stratum picks the item it falls in, and samples
 * falling in the same item merge into one arrow whose weight is the area of the strata it took.
 * The weights sum to A, and Σ t̄_i w_i is an unbiased estimate of ∫ t dA (exact when all items are
 * kept, and for uniform traction), so what the arrows show adds up to the resultant.
 *
 * Record (A arrows):
 * - `origins`: Float32Array(3·A), point of application (item centroid), model length units;
 * - `vectors`: Float32Array(3·A), stress units: t̄ ('full'), its normal part (t̄·n)n ('normal')
 *   or its shear part t̄ - (t̄·n)n ('shear'), with n the outward face normal or the section normal m;
 * - `normals`: Float32Array(3·A), that unit n, so the scene can draw pushing arrows ending at
 *   the surface instead of hidden inside the body;
 * - `magnitudes`: Float32Array(A) = |vectors|; `maxMagnitude` their largest (0 when none);
 * - `normalTraction`: Float32Array(A), the signed normal traction t̄·n of the arrow's mean
 *   traction (stress units, tension positive) whatever the mode, so arrows can be coloured by it;
 * - `weights`: Float32Array(A), area each arrow stands for, length units²;
 * - `item`: Int32Array(A), the face or polygon index.
 */
import type { Vec3 } from '../model/model.ts'
import type { BoundaryFaces, SectionPolygons, SurfaceTractions } from './types.ts'
import { mulberry32 } from './seededRandom.ts'
import { unitNormal } from './plane.ts'

export type ArrowMode = 'full' | 'normal' | 'shear'

export interface ArrowSamples {
  readonly mode: ArrowMode
  readonly count: number
  readonly origins: Float32Array
  readonly vectors: Float32Array
  readonly normals: Float32Array
  readonly magnitudes: Float32Array
  readonly maxMagnitude: number
  readonly normalTraction: Float32Array
  readonly weights: Float32Array
  readonly item: Int32Array
}

export interface ArrowOptions {
  /** Largest number of arrows (count); default 2000. */
  readonly budget?: number
  readonly mode?: ArrowMode
  /** Seed of the stratum jitter; the same seed gives the same arrows. Default 1. */
  readonly seed?: number
}

export const DEFAULT_ARROW_BUDGET = 2000


/**
 * Stratified choice of items by area. Writes the chosen item indices (ascending) into `outItem`
 * and the area each stands for into `outWeight` (both at least min(budget, items) long) and
 * returns how many were written. Items with zero, negative or non-finite area are never chosen.
 */
export function stratifiedByArea(outItem: Int32Array, outWeight: Float64Array, areas: ArrayLike<number>, budget: number, seed = 1): number {
  const n = areas.length
  let total = 0, positive = 0
  for (let i = 0; i < n; i++) {
    const a = areas[i]
    if (a > 0 && a < Infinity) { total += a; positive++ }
  }
  const K = Math.max(0, Math.floor(budget))
  if (positive === 0 || K === 0) return 0
  let count = 0
  if (positive <= K) {
    for (let i = 0; i < n; i++) {
      const a = areas[i]
      if (a > 0 && a < Infinity) { outItem[count] = i; outWeight[count] = a; count++ }
    }
    return count
  }
  const step = total / K
  const random = mulberry32(seed)
  let i = -1, last = -1, cumEnd = 0 // `last`: the latest item with positive area, ending at cumEnd
  for (let k = 0; k < K; k++) {
    const s = (k + random()) * step
    // Advance until the stratum point lies before the end of the latest valid item; at the very
    // end round-off may leave s ≥ total, and the last valid item takes it.
    while (cumEnd <= s && i < n - 1) {
      i++
      const a = areas[i]
      if (a > 0 && a < Infinity) { cumEnd += a; last = i }
    }
    if (count > 0 && outItem[count - 1] === last) outWeight[count - 1] += step
    else { outItem[count] = last; outWeight[count] = step; count++ }
  }
  return count
}

function emptySamples(mode: ArrowMode): ArrowSamples {
  return {
    mode, count: 0, origins: new Float32Array(0), vectors: new Float32Array(0), normals: new Float32Array(0),
    magnitudes: new Float32Array(0), maxMagnitude: 0, normalTraction: new Float32Array(0), weights: new Float32Array(0), item: new Int32Array(0),
  }
}

/**
 * Fills the arrow record from per-item centroid (3·n), mean traction (3·n) and unit normal (3·n,
 * or a single shared normal when `sharedNormal` is given).
 */
function fillArrows(
  mode: ArrowMode, chosen: Int32Array, weight: Float64Array, count: number,
  centroid: ArrayLike<number>, traction: ArrayLike<number>, normal: ArrayLike<number> | null, sharedNormal: Vec3 | null,
): ArrowSamples {
  const origins = new Float32Array(3 * count)
  const vectors = new Float32Array(3 * count)
  const normals = new Float32Array(3 * count)
  const magnitudes = new Float32Array(count)
  const normalTraction = new Float32Array(count)
  const weights = new Float32Array(count)
  const item = new Int32Array(count)
  let maxMagnitude = 0
  for (let j = 0; j < count; j++) {
    const i = chosen[j]
    let nx: number, ny: number, nz: number
    if (sharedNormal) { nx = sharedNormal[0]; ny = sharedNormal[1]; nz = sharedNormal[2] }
    else { nx = normal![3 * i]; ny = normal![3 * i + 1]; nz = normal![3 * i + 2] }
    let tx = traction[3 * i], ty = traction[3 * i + 1], tz = traction[3 * i + 2]
    const tn = tx * nx + ty * ny + tz * nz
    normalTraction[j] = tn
    if (mode === 'normal') { tx = tn * nx; ty = tn * ny; tz = tn * nz }
    else if (mode === 'shear') { tx -= tn * nx; ty -= tn * ny; tz -= tn * nz }
    origins[3 * j] = centroid[3 * i]; origins[3 * j + 1] = centroid[3 * i + 1]; origins[3 * j + 2] = centroid[3 * i + 2]
    vectors[3 * j] = tx; vectors[3 * j + 1] = ty; vectors[3 * j + 2] = tz
    normals[3 * j] = nx; normals[3 * j + 1] = ny; normals[3 * j + 2] = nz
    magnitudes[j] = Math.hypot(tx, ty, tz)
    // Compare the stored (float32) value so maxMagnitude equals the largest entry exactly.
    if (magnitudes[j] > maxMagnitude) maxMagnitude = magnitudes[j]
    weights[j] = weight[j]
    item[j] = i
  }
  return { mode, count, origins, vectors, normals, magnitudes, maxMagnitude, normalTraction, weights, item }
}

/** Surface arrows: one item per boundary face, mean traction = face force / face area. */
export function sampleSurfaceArrows(faces: BoundaryFaces, tractions: SurfaceTractions, options: ArrowOptions = {}): ArrowSamples {
  const mode = options.mode ?? 'full'
  const budget = options.budget ?? DEFAULT_ARROW_BUDGET
  const F = faces.count
  if (F === 0) return emptySamples(mode)
  const cap = Math.min(F, Math.max(0, Math.floor(budget)))
  const chosen = new Int32Array(cap)
  const weight = new Float64Array(cap)
  const count = stratifiedByArea(chosen, weight, faces.area.subarray(0, F), budget, options.seed ?? 1)
  // Mean traction of the chosen faces only: the force array holds ∫ t dA per face.
  const mean = new Float64Array(3 * F)
  const area = faces.area, force = tractions.force
  for (let j = 0; j < count; j++) {
    const f = chosen[j]
    const a = area[f]
    mean[3 * f] = force[3 * f] / a; mean[3 * f + 1] = force[3 * f + 1] / a; mean[3 * f + 2] = force[3 * f + 2] / a
  }
  return fillArrows(mode, chosen, weight, count, faces.centroid, mean, faces.normal, null)
}

/**
 * Section arrows: one item per cut polygon, its area, centroid and mean traction σm = ∫ σm dA / A
 * from the cut's own quadrature by the element's shape functions (SectionPolygons), so the arrows
 * add up to the section's resultant. `normal` is the section normal m, any length (normalised by
 * unitNormal: a zero or non-finite normal is an InputError).
 */
export function sampleSectionArrows(polygons: SectionPolygons, normal: Vec3, options: ArrowOptions = {}): ArrowSamples {
  const mode = options.mode ?? 'full'
  const budget = options.budget ?? DEFAULT_ARROW_BUDGET
  const m = unitNormal(normal)
  const P = polygons.count
  if (P === 0) return emptySamples(mode)
  const cap = Math.min(P, Math.max(0, Math.floor(budget)))
  const chosen = new Int32Array(cap)
  const weight = new Float64Array(cap)
  const count = stratifiedByArea(chosen, weight, polygons.area, budget, options.seed ?? 1)
  const mean = new Float64Array(3 * P)
  const area = polygons.area, force = polygons.force
  for (let j = 0; j < count; j++) {
    const p = chosen[j], a = area[p]
    mean[3 * p] = force[3 * p] / a; mean[3 * p + 1] = force[3 * p + 1] / a; mean[3 * p + 2] = force[3 * p + 2] / a
  }
  return fillArrows(mode, chosen, weight, count, polygons.centroid, mean, null, m)
}
