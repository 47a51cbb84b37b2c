/**
 * Values along a straight line, sampled at `count` evenly spaced points from `from` to `to`
 * (both included): each point is located in the mesh (pointLocation.ts) and read with the
 * elements' own shape functions (fieldAtPoint.ts). A point that no element holds is a gap: NaN in
 * every array of that point, never a zero. A point held by several elements (on a shared face,
 * edge or node) gets the mean of their stresses (the same value for nodal stress).
 *
 * Record (P points):
 * - `points`: Float64Array(3P), model length units; `distance`: Float64Array(P) from `from`;
 * - `stress`: Float64Array(6P) xx, yy, zz, xy, yz, xz (global axes, model stress units);
 * - `vonMises`: Float64Array(P); `principal`: Float64Array(3P), σ1 ≥ σ2 ≥ σ3 (stress units);
 * - `displacement`: Float64Array(3P) (length units) when the model has it, else null;
 * - `held`: Uint8Array(P), how many elements hold the point (0 = gap);
 * - `length`: |to − from|.
 * Field-agnostic: the stress comes as a StressField and the displacement as a nodal array, so a
 * load case is sampled the same way.
 */
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { ElementGrid } from './elementGrid.ts'
import { allocatePointHits, locatePoint } from './pointLocation.ts'
import { meanStressAt, vectorAt } from './fieldAtPoint.ts'
import { principalStressesAt, vonMisesAt } from './invariants.ts'

export interface LineSamples {
  readonly count: number
  readonly length: number
  readonly points: Float64Array
  readonly distance: Float64Array
  readonly stress: Float64Array
  readonly vonMises: Float64Array
  readonly principal: Float64Array
  readonly displacement: Float64Array | null
  readonly held: Uint8Array
}

/** Samples the line (see the file comment); `count` ≥ 2, `tol` the location tolerance (length units). */
export function sampleLine(
  mesh: Mesh, grid: ElementGrid, field: StressField, displacement: Float64Array | null,
  from: Vec3, to: Vec3, count: number, tol: number,
): LineSamples {
  const P = Math.max(2, Math.floor(count))
  const points = new Float64Array(3 * P), distance = new Float64Array(P)
  const stress = new Float64Array(6 * P), vonMises = new Float64Array(P), principal = new Float64Array(3 * P)
  const disp = displacement ? new Float64Array(3 * P) : null
  const held = new Uint8Array(P)
  const dx = to[0] - from[0], dy = to[1] - from[1], dz = to[2] - from[2]
  const length = Math.hypot(dx, dy, dz)
  const hits = allocatePointHits()
  for (let i = 0; i < P; i++) {
    const t = i / (P - 1)
    // The last point is `to` itself, not from + 1·d with its round-off.
    const x = i === P - 1 ? to[0] : from[0] + t * dx, y = i === P - 1 ? to[1] : from[1] + t * dy, z = i === P - 1 ? to[2] : from[2] + t * dz
    points[3 * i] = x; points[3 * i + 1] = y; points[3 * i + 2] = z
    distance[i] = t * length
    locatePoint(hits, mesh, grid, x, y, z, tol)
    held[i] = Math.min(255, hits.count)
    meanStressAt(stress, 6 * i, mesh, field, hits)
    if (hits.count === 0) {
      vonMises[i] = NaN
      principal[3 * i] = NaN; principal[3 * i + 1] = NaN; principal[3 * i + 2] = NaN
    } else {
      vonMises[i] = vonMisesAt(stress, 6 * i)
      principalStressesAt(stress, 6 * i, principal, 3 * i, undefined, 0)
    }
    if (disp && displacement) vectorAt(disp, 3 * i, mesh, displacement, hits)
  }
  return { count: P, length, points, distance, stress, vonMises, principal, displacement: disp, held }
}
