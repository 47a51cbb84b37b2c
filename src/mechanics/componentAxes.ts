/**
 * The axes that stress and displacement components are reported in: the global x, y, z, or
 * cylindrical axes r, θ, z about a line (an axis through `origin` along `axis`), as pipes,
 * vessels, shafts and tunnels are read. At a point p, with a the unit axis and
 * d = (p − origin) − ((p − origin)·a) a its distance vector from the axis:
 *   e_r = d / |d|, e_θ = a × e_r, e_z = a   (right-handed: e_r × e_θ = e_z).
 * On the axis itself (|d| at round-off of the model) e_r is undefined; a fixed perpendicular is
 * taken (the global axis least aligned with a, made orthogonal to it), so the values stay finite
 * and, for a field symmetric about the axis (σrr = σθθ there), correct.
 *
 * Components keep the stress order of the house with x → r, y → θ (or x, y, z themselves):
 * [rr, θθ, zz, rθ, θz, rz] like [xx, yy, zz, xy, yz, xz]; displacement [u_r, u_θ, u_z].
 * σ' = R σ Rᵀ and u' = R u, with R the rows (e1, e2, e3). Units are the caller's.
 */
import type { Vec3 } from '../model/model.ts'
import { checkPoint, unitNormal } from './plane.ts'

export type ComponentAxes =
  | { readonly kind: 'global' }
  | { readonly kind: 'cylindrical'; readonly origin: Vec3; readonly axis: Vec3 }

export const GLOBAL_AXES: ComponentAxes = { kind: 'global' }

/** Checks the axes (a zero or non-finite axis is an InputError) and returns them with a unit axis. */
export function checkAxes(axes: ComponentAxes): ComponentAxes {
  if (axes.kind === 'global') return GLOBAL_AXES
  return { kind: 'cylindrical', origin: checkPoint(axes.origin, 'axis point'), axis: unitNormal(axes.axis, 'cylinder axis') }
}

/** A unit vector perpendicular to unit a: the global axis least aligned with a, orthogonalised. */
export function perpendicularTo(out: number[] | Float64Array, ax: number, ay: number, az: number): number[] | Float64Array {
  const x = Math.abs(ax), y = Math.abs(ay), z = Math.abs(az)
  let gx = 0, gy = 0, gz = 0
  if (x <= y && x <= z) gx = 1
  else if (y <= z) gy = 1
  else gz = 1
  const d = gx * ax + gy * ay + gz * az
  let px = gx - d * ax, py = gy - d * ay, pz = gz - d * az
  const l = Math.hypot(px, py, pz)
  px /= l; py /= l; pz /= l
  out[0] = px; out[1] = py; out[2] = pz
  return out
}

/**
 * The basis of `axes` at p as rows e1, e2, e3 into out (9 numbers, row-major). `axes` must have
 * a unit axis (checkAxes). Global axes: the identity.
 */
export function basisAt(out: Float64Array | number[], axes: ComponentAxes, px: number, py: number, pz: number): Float64Array | number[] {
  if (axes.kind === 'global') {
    out[0] = 1; out[1] = 0; out[2] = 0; out[3] = 0; out[4] = 1; out[5] = 0; out[6] = 0; out[7] = 0; out[8] = 1
    return out
  }
  const [ax, ay, az] = axes.axis, o = axes.origin
  const vx = px - o[0], vy = py - o[1], vz = pz - o[2]
  const s = vx * ax + vy * ay + vz * az
  let dx = vx - s * ax, dy = vy - s * ay, dz = vz - s * az
  const l = Math.hypot(dx, dy, dz)
  // On the axis (to round-off of the distance from the origin): a fixed perpendicular.
  if (!(l > 1e-12 * (Math.hypot(vx, vy, vz) + Math.hypot(o[0], o[1], o[2])))) {
    perpendicularTo(out, ax, ay, az)
    dx = out[0]; dy = out[1]; dz = out[2]
  } else { dx /= l; dy /= l; dz /= l }
  out[0] = dx; out[1] = dy; out[2] = dz
  out[3] = ay * dz - az * dy; out[4] = az * dx - ax * dz; out[5] = ax * dy - ay * dx
  out[6] = ax; out[7] = ay; out[8] = az
  return out
}

/** σ' = R σ Rᵀ: stress s[so..so+5] (xx, yy, zz, xy, yz, xz) in the basis rows R (9) into out[oo..oo+5]. */
export function rotateStressInto(out: Float64Array | number[], oo: number, s: ArrayLike<number>, so: number, R: ArrayLike<number>): Float64Array | number[] {
  const xx = s[so], yy = s[so + 1], zz = s[so + 2], xy = s[so + 3], yz = s[so + 4], xz = s[so + 5]
  // Rows of σ Rᵀ's transpose: (R σ) row i = R_i σ.
  const r0 = R[0], r1 = R[1], r2 = R[2], r3 = R[3], r4 = R[4], r5 = R[5], r6 = R[6], r7 = R[7], r8 = R[8]
  const a0 = r0 * xx + r1 * xy + r2 * xz, a1 = r0 * xy + r1 * yy + r2 * yz, a2 = r0 * xz + r1 * yz + r2 * zz
  const b0 = r3 * xx + r4 * xy + r5 * xz, b1 = r3 * xy + r4 * yy + r5 * yz, b2 = r3 * xz + r4 * yz + r5 * zz
  const c0 = r6 * xx + r7 * xy + r8 * xz, c1 = r6 * xy + r7 * yy + r8 * yz, c2 = r6 * xz + r7 * yz + r8 * zz
  out[oo] = a0 * r0 + a1 * r1 + a2 * r2
  out[oo + 1] = b0 * r3 + b1 * r4 + b2 * r5
  out[oo + 2] = c0 * r6 + c1 * r7 + c2 * r8
  out[oo + 3] = a0 * r3 + a1 * r4 + a2 * r5
  out[oo + 4] = b0 * r6 + b1 * r7 + b2 * r8
  out[oo + 5] = a0 * r6 + a1 * r7 + a2 * r8
  return out
}

/** σ = Rᵀ σ' R: the inverse of rotateStressInto (a tensor given in the basis R back to global axes). */
export function unrotateStressInto(out: Float64Array | number[], oo: number, s: ArrayLike<number>, so: number, R: ArrayLike<number>): Float64Array | number[] {
  // Rᵀ has the basis vectors as columns: the rows of Rᵀ are the global axes written in the basis.
  const T = [R[0], R[3], R[6], R[1], R[4], R[7], R[2], R[5], R[8]]
  return rotateStressInto(out, oo, s, so, T)
}

/** u' = R u: vector v[vo..vo+2] in the basis rows R into out[oo..oo+2]. */
export function rotateVectorInto(out: Float64Array | number[], oo: number, v: ArrayLike<number>, vo: number, R: ArrayLike<number>): Float64Array | number[] {
  const x = v[vo], y = v[vo + 1], z = v[vo + 2]
  out[oo] = R[0] * x + R[1] * y + R[2] * z
  out[oo + 1] = R[3] * x + R[4] * y + R[5] * z
  out[oo + 2] = R[6] * x + R[7] * y + R[8] * z
  return out
}
