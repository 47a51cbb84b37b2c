/**
 * Stress invariants: principal stresses and directions, von Mises, Tresca, mean stress.
 *
 * Principal values use the closed-form trigonometric solution of the characteristic cubic
 * (Smith, "Eigenvalues of a symmetric 3×3 matrix", Comm. ACM 4(4), 1961): with q = tr σ / 3,
 * p = √(tr (σ - qI)² / 6), B = (σ - qI)/p and φ = acos(det B / 2) / 3,
 * σ1 = q + 2p cos φ, σ3 = q + 2p cos(φ + 2π/3), σ2 = 3q - σ1 - σ3. The tensor is scaled by its
 * largest entry first (no overflow), det B / 2 is clamped to [-1, 1] (round-off can push it out
 * when two roots coincide), and p = 0 (isotropic or diagonal input) is handled without the cubic.
 *
 * Directions: the eigenvector of the root farthest from the other two is the longest cross
 * product of two rows of σ - λI (well conditioned because that root is isolated); the other two
 * come from an exact 2×2 rotation in the plane orthogonal to it, so they stay orthonormal even
 * when σ2 = σ3 (or σ1 = σ2), where any orthonormal pair in that plane is a valid answer.
 *
 * Component order of stress 6-vectors: xx, yy, zz, xy, yz, xz.
 */
import type { NodalInvariants } from './types.ts'

const TWO_PI_3 = (2 * Math.PI) / 3

/**
 * Principal stresses σ1 ≥ σ2 ≥ σ3 of s (6 components) into outValues3; when outDirs9 is given,
 * unit eigenvectors as rows (row i for σi), orthonormal and right-handed.
 */
export function principalStresses(s: ArrayLike<number>, outValues3: Float64Array | number[], outDirs9?: Float64Array | number[]): Float64Array | number[] {
  return principalStressesAt(s, 0, outValues3, 0, outDirs9, 0)
}

/** Offset form of principalStresses for loops over packed arrays (no allocation). */
export function principalStressesAt(
  s: ArrayLike<number>, so: number,
  outValues: Float64Array | number[], vo: number,
  outDirs: Float64Array | number[] | undefined, dirOffset: number,
): Float64Array | number[] {
  const scale = Math.max(Math.abs(s[so]), Math.abs(s[so + 1]), Math.abs(s[so + 2]), Math.abs(s[so + 3]), Math.abs(s[so + 4]), Math.abs(s[so + 5]))
  if (!(scale > 0) || !Number.isFinite(scale)) {
    // Zero tensor: every direction is principal; NaN/∞ input propagates as NaN.
    const v = scale === 0 ? 0 : NaN
    outValues[vo] = v; outValues[vo + 1] = v; outValues[vo + 2] = v
    if (outDirs) writeIdentity(outDirs, dirOffset, scale === 0 ? 1 : NaN)
    return outValues
  }
  const inv = 1 / scale
  const a11 = s[so] * inv, a22 = s[so + 1] * inv, a33 = s[so + 2] * inv
  const a12 = s[so + 3] * inv, a23 = s[so + 4] * inv, a13 = s[so + 5] * inv

  const p1 = a12 * a12 + a23 * a23 + a13 * a13
  const q = (a11 + a22 + a33) / 3
  const d1 = a11 - q, d2 = a22 - q, d3 = a33 - q
  const p2 = d1 * d1 + d2 * d2 + d3 * d3 + 2 * p1
  let l1: number, l2: number, l3: number
  if (p1 === 0) {
    // Diagonal tensor: the roots are the diagonal entries.
    l1 = a11; l2 = a22; l3 = a33
    let t: number
    if (l1 < l2) { t = l1; l1 = l2; l2 = t }
    if (l2 < l3) { t = l2; l2 = l3; l3 = t }
    if (l1 < l2) { t = l1; l1 = l2; l2 = t }
  } else {
    const p = Math.sqrt(p2 / 6)
    const ip = 1 / p
    const b11 = d1 * ip, b22 = d2 * ip, b33 = d3 * ip, b12 = a12 * ip, b23 = a23 * ip, b13 = a13 * ip
    let r = 0.5 * (b11 * (b22 * b33 - b23 * b23) - b12 * (b12 * b33 - b23 * b13) + b13 * (b12 * b23 - b22 * b13))
    // Round-off near a double root can push r just outside [-1, 1].
    if (r > 1) r = 1
    else if (r < -1) r = -1
    const phi = Math.acos(r) / 3
    l1 = q + 2 * p * Math.cos(phi)
    l3 = q + 2 * p * Math.cos(phi + TWO_PI_3)
    l2 = 3 * q - l1 - l3
    // Clamp the middle root into [l3, l1] against round-off.
    if (l2 > l1) l2 = l1
    if (l2 < l3) l2 = l3
  }
  if (p1 === 0 || l1 - l3 <= 1e-15 * Math.max(Math.abs(l1), Math.abs(l3))) {
    // Diagonal (exact roots) or isotropic to round-off (every direction is principal).
    outValues[vo] = l1 * scale; outValues[vo + 1] = l2 * scale; outValues[vo + 2] = l3 * scale
    if (outDirs) {
      if (p1 === 0 && l1 - l3 > 0) writeDiagonalDirs(outDirs, dirOffset, a11, a22, a33)
      else writeIdentity(outDirs, dirOffset, 1)
    }
    return outValues
  }
  // Isolated root: σ1 when it is farther from σ2 than σ3 is; else σ3.
  const firstIsTop = l1 - l2 >= l2 - l3
  const la = firstIsTop ? l1 : l3
  const r0x = a11 - la, r0y = a12, r0z = a13
  const r1x = a12, r1y = a22 - la, r1z = a23
  const r2x = a13, r2y = a23, r2z = a33 - la
  // Cross products of row pairs; the longest is the best-conditioned null vector. (Here and below
  // in scalar locals, not vec3.cross: this runs once per node.)
  let c0x = r0y * r1z - r0z * r1y, c0y = r0z * r1x - r0x * r1z, c0z = r0x * r1y - r0y * r1x
  const c1x = r0y * r2z - r0z * r2y, c1y = r0z * r2x - r0x * r2z, c1z = r0x * r2y - r0y * r2x
  const c2x = r1y * r2z - r1z * r2y, c2y = r1z * r2x - r1x * r2z, c2z = r1x * r2y - r1y * r2x
  let n0 = c0x * c0x + c0y * c0y + c0z * c0z
  const n1 = c1x * c1x + c1y * c1y + c1z * c1z, n2 = c2x * c2x + c2y * c2y + c2z * c2z
  if (n1 > n0) { c0x = c1x; c0y = c1y; c0z = c1z; n0 = n1 }
  if (n2 > n0) { c0x = c2x; c0y = c2y; c0z = c2z; n0 = n2 }
  let vx: number, vy: number, vz: number
  if (n0 > 0) {
    const il = 1 / Math.sqrt(n0)
    vx = c0x * il; vy = c0y * il; vz = c0z * il
  } else {
    // σ - λI of rank ≤ 1 cannot happen for an isolated root except through underflow: pick the axis.
    vx = 1; vy = 0; vz = 0
  }
  // Orthonormal U, W spanning the plane ⊥ v (Frisvad-style choice avoiding the small component).
  let ux: number, uy: number, uz: number
  if (Math.abs(vx) > Math.abs(vy)) {
    const il = 1 / Math.sqrt(vx * vx + vz * vz); ux = -vz * il; uy = 0; uz = vx * il
  } else {
    const il = 1 / Math.sqrt(vy * vy + vz * vz); ux = 0; uy = vz * il; uz = -vy * il
  }
  const wx = vy * uz - vz * uy, wy = vz * ux - vx * uz, wz = vx * uy - vy * ux
  // 2×2 restriction M = [U W]ᵀ A [U W] and its exact Jacobi rotation.
  const Aux = a11 * ux + a12 * uy + a13 * uz, Auy = a12 * ux + a22 * uy + a23 * uz, Auz = a13 * ux + a23 * uy + a33 * uz
  const Awx = a11 * wx + a12 * wy + a13 * wz, Awy = a12 * wx + a22 * wy + a23 * wz, Awz = a13 * wx + a23 * wy + a33 * wz
  const m00 = ux * Aux + uy * Auy + uz * Auz
  const m11 = wx * Awx + wy * Awy + wz * Awz
  const m01 = ux * Awx + uy * Awy + uz * Awz
  // The pair's roots from the 2×2 in closed form: Smith's formula loses half the digits of the
  // two roots that coincide when det B / 2 → ±1, the deflated 2×2 does not.
  const hm = 0.5 * (m00 + m11), hd = 0.5 * (m00 - m11)
  const rad = Math.sqrt(hd * hd + m01 * m01)
  let mu1 = hm + rad, mu2 = hm - rad
  if (firstIsTop) {
    if (mu1 > la) mu1 = la
    outValues[vo] = la * scale; outValues[vo + 1] = mu1 * scale; outValues[vo + 2] = mu2 * scale
  } else {
    if (mu2 < la) mu2 = la
    outValues[vo] = mu1 * scale; outValues[vo + 1] = mu2 * scale; outValues[vo + 2] = la * scale
  }
  if (!outDirs) return outValues
  const theta = 0.5 * Math.atan2(2 * m01, m00 - m11)
  const c = Math.cos(theta), sn = Math.sin(theta)
  // (c, s) is the eigenvector of the larger 2×2 root, (-s, c) of the smaller.
  const hx = c * ux + sn * wx, hy = c * uy + sn * wy, hz = c * uz + sn * wz
  const gx = -sn * ux + c * wx, gy = -sn * uy + c * wy, gz = -sn * uz + c * wz
  const o = dirOffset
  if (firstIsTop) {
    // Rows: σ1 = v, σ2 = h (larger of the rest), σ3 = v × h.
    outDirs[o] = vx; outDirs[o + 1] = vy; outDirs[o + 2] = vz
    outDirs[o + 3] = hx; outDirs[o + 4] = hy; outDirs[o + 5] = hz
    outDirs[o + 6] = vy * hz - vz * hy; outDirs[o + 7] = vz * hx - vx * hz; outDirs[o + 8] = vx * hy - vy * hx
  } else {
    // Rows: σ1 = h, σ2 = g (smaller of the rest), σ3 = h × g.
    outDirs[o] = hx; outDirs[o + 1] = hy; outDirs[o + 2] = hz
    outDirs[o + 3] = gx; outDirs[o + 4] = gy; outDirs[o + 5] = gz
    outDirs[o + 6] = hy * gz - hz * gy; outDirs[o + 7] = hz * gx - hx * gz; outDirs[o + 8] = hx * gy - hy * gx
  }
  return outValues
}

/** Directions of a diagonal tensor with distinct-enough roots: the axes, ordered by value, right-handed. */
function writeDiagonalDirs(out: Float64Array | number[], o: number, a: number, b: number, c: number): void {
  // Rank of each axis: 0 for the largest (ties broken by axis order, matching the sort above).
  const ra = (b > a ? 1 : 0) + (c > a ? 1 : 0)
  const rb = (a >= b ? 1 : 0) + (c > b ? 1 : 0)
  const rc = (a >= c ? 1 : 0) + (b >= c ? 1 : 0)
  for (let k = 0; k < 9; k++) out[o + k] = 0
  out[o + 3 * ra] = 1; out[o + 3 * rb + 1] = 1; out[o + 3 * rc + 2] = 1
  // Row 3 = row 1 × row 2 (right-handed): this flips the third row when the permutation is odd.
  const x0 = out[o], y0 = out[o + 1], z0 = out[o + 2], x1 = out[o + 3], y1 = out[o + 4], z1 = out[o + 5]
  out[o + 6] = y0 * z1 - z0 * y1; out[o + 7] = z0 * x1 - x0 * z1; out[o + 8] = x0 * y1 - y0 * x1
}

function writeIdentity(out: Float64Array | number[], o: number, one: number): void {
  const z = Number.isNaN(one) ? NaN : 0
  out[o] = one; out[o + 1] = z; out[o + 2] = z
  out[o + 3] = z; out[o + 4] = one; out[o + 5] = z
  out[o + 6] = z; out[o + 7] = z; out[o + 8] = one
}

/** von Mises equivalent stress √(½[(σxx-σyy)² + (σyy-σzz)² + (σzz-σxx)²] + 3(σxy² + σyz² + σxz²)). */
export function vonMises(s6: ArrayLike<number>): number {
  return vonMisesAt(s6, 0)
}

export function vonMisesAt(s: ArrayLike<number>, o: number): number {
  const a = s[o] - s[o + 1], b = s[o + 1] - s[o + 2], c = s[o + 2] - s[o]
  const xy = s[o + 3], yz = s[o + 4], xz = s[o + 5]
  return Math.sqrt(0.5 * (a * a + b * b + c * c) + 3 * (xy * xy + yz * yz + xz * xz))
}

/** Fresh output arrays for N nodes (see NodalInvariants). */
export function allocateNodalInvariants(N: number): NodalInvariants {
  return {
    principal: new Float64Array(3 * N), directions: new Float64Array(9 * N),
    vonMises: new Float64Array(N), tresca: new Float64Array(N), mean: new Float64Array(N),
  }
}

/**
 * Invariants of every row of `stress` (6 per node: the nodal display stress, see
 * nodalDisplayStress in src/model/stressField.ts) into `out` (allocateNodalInvariants) and returns
 * it. Invariants are display values at nodes: for element-nodal stress they are taken of the
 * part-wise nodal average, which the caller forms first. Rows are independent, so a range of nodes
 * is stress.subarray(6·a, 6·b) with subarray views of the output.
 */
export function computeNodalInvariants(out: NodalInvariants, stress: Float64Array): NodalInvariants {
  const N = stress.length / 6
  if (out.vonMises.length < N || out.principal.length < 3 * N || out.directions.length < 9 * N) {
    throw new RangeError(`nodal invariant output holds ${out.vonMises.length} nodes, the stress has ${N}`)
  }
  const { principal, directions, vonMises: vm, tresca, mean } = out
  for (let i = 0; i < N; i++) {
    principalStressesAt(stress, 6 * i, principal, 3 * i, directions, 9 * i)
    vm[i] = vonMisesAt(stress, 6 * i)
    tresca[i] = principal[3 * i] - principal[3 * i + 2]
    mean[i] = (stress[6 * i] + stress[6 * i + 1] + stress[6 * i + 2]) / 3
  }
  return out
}
