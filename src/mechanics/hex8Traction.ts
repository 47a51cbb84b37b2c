/**
 * The traction integrals over one hex8 element's section points in monomial form: the hex8 case
 * of accumulateTraction (elementSection.ts), the same sums over the same points.
 *
 * t(ξ) = Σ_a N_a(ξ) t_a is trilinear, so it is written once per element as
 * t = T_0 + T_1 ξ + T_2 η + T_3 ζ + T_4 ξη + T_5 ηζ + T_6 ξζ + T_7 ξηζ with T_k = Σ_a P_k(ξ_a) t_a / 8
 * (trilinearMonomials.ts); each point then costs four products and
 * 21 multiply-adds instead of the eight shape functions and a sum over eight nodes (about half
 * the operations). The same polynomial: the tests compare with the shape-function path.
 *
 * Layouts as in accumulateTraction: tn the nodal tractions (3 per node), ref ξ per point (3 each),
 * w the area weights, a and b the plane coordinates; acc[off + slot] the section sums (ACC_*).
 */
import { ACC_AT, ACC_BT, ACC_FORCE, ACC_GROSS } from './sectionPolygon.ts'
import { trilinearMonomials } from './trilinearMonomials.ts'

// module constants: imported bindings are getters under tsx's CommonJS transform
const FORCE = ACC_FORCE, AT = ACC_AT, BT = ACC_BT, GROSS = ACC_GROSS, monomials = trilinearMonomials

/** T_0..T_7 of the element (3 each). */
const T = new Float64Array(24)

/** accumulateTraction for a hex8 (see elementSection.ts for the arguments and what is added). */
export function accumulateTractionHex8(
  acc: Float64Array, off: number, tn: Float64Array,
  ref: Float64Array, w: Float64Array, a: Float64Array, b: Float64Array, from: number, to: number,
  force: Float64Array, fo: number,
): void {
  const c = monomials(T, tn)
  let Fx = 0, Fy = 0, Fz = 0, Ax = 0, Ay = 0, Az = 0, Bx = 0, By = 0, Bz = 0
  for (let q = from; q < to; q++) {
    const u = ref[3 * q], v = ref[3 * q + 1], s = ref[3 * q + 2]
    const uv = u * v, vs = v * s, us = u * s, uvs = uv * s
    const tx = c[0] + c[3] * u + c[6] * v + c[9] * s + c[12] * uv + c[15] * vs + c[18] * us + c[21] * uvs
    const ty = c[1] + c[4] * u + c[7] * v + c[10] * s + c[13] * uv + c[16] * vs + c[19] * us + c[22] * uvs
    const tz = c[2] + c[5] * u + c[8] * v + c[11] * s + c[14] * uv + c[17] * vs + c[20] * us + c[23] * uvs
    const wq = w[q], wa = wq * a[q], wb = wq * b[q]
    Fx += wq * tx; Fy += wq * ty; Fz += wq * tz
    Ax += wa * tx; Ay += wa * ty; Az += wa * tz
    Bx += wb * tx; By += wb * ty; Bz += wb * tz
  }
  acc[off + FORCE] += Fx; acc[off + FORCE + 1] += Fy; acc[off + FORCE + 2] += Fz
  acc[off + AT] += Ax; acc[off + AT + 1] += Ay; acc[off + AT + 2] += Az
  acc[off + BT] += Bx; acc[off + BT + 1] += By; acc[off + BT + 2] += Bz
  acc[off + GROSS] += Math.sqrt(Fx * Fx + Fy * Fy + Fz * Fz)
  force[fo] = Fx; force[fo + 1] = Fy; force[fo + 2] = Fz
}
