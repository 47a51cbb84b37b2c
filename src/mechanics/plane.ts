/**
 * The one plane type of Tractus (section cuts, sweeps, the probe's side test) and its one
 * normalisation. A plane passes through `point` (model length) with unit normal `normal`; every
 * caller turns user input into a plane here, so a zero or non-finite normal fails the same way
 * everywhere: an InputError naming what was given and how to fix it.
 */
import { InputError } from '../model/errors.ts'
import type { Vec3 } from '../model/model.ts'

/** A plane through `point` with unit normal `normal` (model length units). */
export interface Plane {
  readonly point: Vec3
  readonly normal: Vec3
}

/**
 * Unit vector along n; a zero, non-finite or short (< 3 numbers) vector is an InputError the
 * caller can show as is. `what` names the vector in the message ("section normal", "sweep
 * direction").
 */
export function unitNormal(n: readonly number[], what = 'section normal'): Vec3 {
  const x = n[0], y = n[1], z = n[2]
  const l = Math.hypot(x, y, z)
  if (!(l > 0) || !Number.isFinite(l)) {
    throw new InputError('bad-argument', `the ${what} (${x}, ${y}, ${z}) has no direction; give three finite numbers, not all zero`, { field: 'normal' })
  }
  return [x / l, y / l, z / l]
}

/** Checks that p is three finite numbers; `field` names it in the message. */
export function checkPoint(p: readonly number[], field: string): Vec3 {
  const x = p[0], y = p[1], z = p[2]
  if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) {
    throw new InputError('bad-argument', `the ${field} (${x}, ${y}, ${z}) must be three finite numbers`, { field })
  }
  return [x, y, z]
}

/** A plane from a point and any non-zero normal: the normal is normalised, both are checked. */
export function makePlane(point: readonly number[], normal: readonly number[], what = 'section normal'): Plane {
  return { point: checkPoint(point, 'section point'), normal: unitNormal(normal, what) }
}

/** Signed distance (x - p)·m of a point from the plane (model length). */
export function planeDistance(plane: Plane, x: number, y: number, z: number): number {
  const p = plane.point, m = plane.normal
  return (x - p[0]) * m[0] + (y - p[1]) * m[1] + (z - p[2]) * m[2]
}
