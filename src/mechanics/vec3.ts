/**
 * Small 3-vector helpers, out first (`fn(out, ...inputs) -> out`, as gl-matrix writes them), on
 * plain arrays (`Vec3`, number[]) and on packed typed arrays at an offset (the `*At` forms: vector i
 * of a Float64Array(3·n) starts at 3i). Units are the caller's.
 *
 * Where they are not used: the innermost per-element and per-quadrature-point loops (the tet4 and
 * hex8 closed forms of the element balance, the face quadrature point, the principal directions)
 * keep their vectors in scalar locals. There a vector lives in registers; routing it through an
 * array costs a store and a load per component, on the loops the benchmarks time.
 */

/** A writable 3-vector: a Vec3, a number[] or a Float64Array. */
export type Vec3Out = number[] | Float64Array
export type Vec3In = ArrayLike<number>

/** out = a × b (out may alias a or b). */
export function cross<T extends Vec3Out>(out: T, a: Vec3In, b: Vec3In): T {
  const ax = a[0], ay = a[1], az = a[2], bx = b[0], by = b[1], bz = b[2]
  out[0] = ay * bz - az * by
  out[1] = az * bx - ax * bz
  out[2] = ax * by - ay * bx
  return out
}

/** a · b. */
export function dot(a: Vec3In, b: Vec3In): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/** out[o..o+2] = a[ao..] × b[bo..] on packed arrays (out may alias a or b). */
export function crossAt(out: Float64Array | number[], o: number, a: Vec3In, ao: number, b: Vec3In, bo: number): Float64Array | number[] {
  const ax = a[ao], ay = a[ao + 1], az = a[ao + 2], bx = b[bo], by = b[bo + 1], bz = b[bo + 2]
  out[o] = ay * bz - az * by
  out[o + 1] = az * bx - ax * bz
  out[o + 2] = ax * by - ay * bx
  return out
}

/** a[ao..] · b[bo..] on packed arrays. */
export function dotAt(a: Vec3In, ao: number, b: Vec3In, bo: number): number {
  return a[ao] * b[bo] + a[ao + 1] * b[bo + 1] + a[ao + 2] * b[bo + 2]
}

/** out = M₀ - p × F: a moment about the origin moved to the point p, for the force F (out may alias any input). */
export function momentAbout<T extends Vec3Out>(out: T, moment0: Vec3In, point: Vec3In, force: Vec3In): T {
  const m0 = moment0[0], m1 = moment0[1], m2 = moment0[2]
  cross(out, point, force)
  out[0] = m0 - out[0]; out[1] = m1 - out[1]; out[2] = m2 - out[2]
  return out
}
