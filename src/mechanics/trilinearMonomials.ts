/**
 * A trilinear (hex8) interpolant in monomial form: from the values v_a of a 3-vector at the eight
 * corners (3 per corner, corners in the registry's order, elements/hexahedra.ts: 0-3 the bottom
 * counter-clockwise from (−1, −1, −1), 4-7 above them), the coefficients of
 *   f(ξ, η, ζ) = c_0 + c_1 ξ + c_2 η + c_3 ζ + c_4 ξη + c_5 ηζ + c_6 ξζ + c_7 ξηζ,
 * c_k = Σ_a P_k(ξ_a) v_a / 8 (N_a = (1 + ξ ξ_a)(1 + η η_a)(1 + ζ ζ_a) / 8 expanded; common
 * practice), 3 per coefficient. A butterfly: sums and differences of the ξ pairs, then along η,
 * then along ζ, 23 additions a component instead of 64 multiply-adds. Units are the values'.
 */
export function trilinearMonomials(c: Float64Array, v: Float64Array): Float64Array {
  for (let k = 0; k < 3; k++) {
    const t0 = v[k], t1 = v[3 + k], t2 = v[6 + k], t3 = v[9 + k], t4 = v[12 + k], t5 = v[15 + k], t6 = v[18 + k], t7 = v[21 + k]
    // ξ pairs at (η, ζ) = (−, −), (+, −), (−, +), (+, +)
    const s01 = t0 + t1, d01 = t1 - t0, s32 = t3 + t2, d32 = t2 - t3, s45 = t4 + t5, d45 = t5 - t4, s76 = t7 + t6, d76 = t6 - t7
    // along η at ζ = −1 (p) and ζ = +1 (q), then along ζ
    const p0 = s01 + s32, p2 = s32 - s01, p1 = d01 + d32, p4 = d32 - d01
    const q0 = s45 + s76, q2 = s76 - s45, q1 = d45 + d76, q4 = d76 - d45
    c[k] = 0.125 * (p0 + q0); c[3 + k] = 0.125 * (p1 + q1); c[6 + k] = 0.125 * (p2 + q2); c[9 + k] = 0.125 * (q0 - p0)
    c[12 + k] = 0.125 * (p4 + q4); c[15 + k] = 0.125 * (q2 - p2); c[18 + k] = 0.125 * (q1 - p1); c[21 + k] = 0.125 * (q4 - p4)
  }
  return c
}

/** Reference corners in the order trilinearMonomials is written for (3 per corner). */
export const TRILINEAR_CORNERS: readonly number[] = [-1, -1, -1, 1, -1, -1, 1, 1, -1, -1, 1, -1, -1, -1, 1, 1, -1, 1, 1, 1, 1, -1, 1, 1]
