import { hex8CentroidStress } from './hex8.ts'
import { hexBoundaryFaces } from './hexFaces.ts'

/**
 * Superconvergent patch recovery of nodal stress on a hex8 mesh (Zienkiewicz & Zhu, "The
 * superconvergent patch recovery and a posteriori error estimates", Part 1, IJNME 33 (1992)
 * 1331–1364). For every interior node, each stress component is fitted by least squares with a
 * linear polynomial a + b·(x - x_node) to the centroid stresses (the trilinear element's
 * superconvergent sampling points) of the elements round the node, and the node takes the
 * polynomial's value. A boundary node takes the mean of the polynomials of the interior patches it
 * belongs to, evaluated at it, as Zienkiewicz & Zhu do. A boundary node that no interior patch
 * reaches keeps `fallback`'s value (for example nodal-averaged extrapolation).
 * Writes `out` (6·N, xx yy zz xy yz xz) and returns it.
 */
export function recoverPatchStress(out: Float64Array, coords: Float64Array, conn: Int32Array, u: Float64Array, lambda: number, mu: number, fallback: Float64Array): Float64Array {
  const N = coords.length / 3, E = conn.length / 8
  const cs = new Float64Array(6 * E), cx = new Float64Array(3 * E)
  const xyz = new Float64Array(24), ue = new Float64Array(24), grad = new Float64Array(24), s6 = new Float64Array(6)
  for (let e = 0; e < E; e++) {
    let x = 0, y = 0, z = 0
    for (let a = 0; a < 8; a++) {
      const n = 3 * conn[8 * e + a]
      for (let k = 0; k < 3; k++) { xyz[3 * a + k] = coords[n + k]; ue[3 * a + k] = u[n + k] }
      x += coords[n]; y += coords[n + 1]; z += coords[n + 2]
    }
    hex8CentroidStress(s6, xyz, ue, lambda, mu, grad)
    cs.set(s6, 6 * e)
    cx[3 * e] = x / 8; cx[3 * e + 1] = y / 8; cx[3 * e + 2] = z / 8
  }
  const boundary = new Uint8Array(N)
  const faces = hexBoundaryFaces(conn, N)
  for (let i = 0; i < faces.nodes.length; i++) boundary[faces.nodes[i]] = 1
  // Node → element incidence.
  const start = new Int32Array(N + 1)
  for (let k = 0; k < conn.length; k++) start[conn[k] + 1]++
  for (let i = 0; i < N; i++) start[i + 1] += start[i]
  const inc = new Int32Array(conn.length)
  const fill = start.slice(0, N)
  for (let e = 0; e < E; e++) for (let a = 0; a < 8; a++) { const n = conn[8 * e + a]; inc[fill[n]++] = e }

  const acc = new Float64Array(6 * N), cnt = new Float64Array(N)
  const stamp = new Int32Array(N).fill(-1)
  const A = new Float64Array(16), B = new Float64Array(24), pv = new Float64Array(4)
  out.fill(0)
  for (let i = 0; i < N; i++) {
    if (boundary[i]) continue
    const xi = coords[3 * i], yi = coords[3 * i + 1], zi = coords[3 * i + 2]
    let h = 0
    for (let q = start[i]; q < start[i + 1]; q++) {
      const e = inc[q]
      h = Math.max(h, Math.abs(cx[3 * e] - xi), Math.abs(cx[3 * e + 1] - yi), Math.abs(cx[3 * e + 2] - zi))
    }
    A.fill(0); B.fill(0)
    for (let q = start[i]; q < start[i + 1]; q++) {
      const e = inc[q]
      // Scaled local coordinates keep the normal equations well conditioned.
      pv[0] = 1; pv[1] = (cx[3 * e] - xi) / h; pv[2] = (cx[3 * e + 1] - yi) / h; pv[3] = (cx[3 * e + 2] - zi) / h
      for (let r = 0; r < 4; r++) {
        for (let c = 0; c < 4; c++) A[4 * r + c] += pv[r] * pv[c]
        for (let k = 0; k < 6; k++) B[6 * r + k] += pv[r] * cs[6 * e + k]
      }
    }
    // A patch too thin to fix a slope (fewer than four non-coplanar centroids) is skipped.
    if (!solve4(A, B)) continue
    out[6 * i] = B[0]; out[6 * i + 1] = B[1]; out[6 * i + 2] = B[2]; out[6 * i + 3] = B[3]; out[6 * i + 4] = B[4]; out[6 * i + 5] = B[5]
    cnt[i] = -1
    for (let q = start[i]; q < start[i + 1]; q++) {
      const e = inc[q]
      for (let a = 0; a < 8; a++) {
        const j = conn[8 * e + a]
        if (!boundary[j] || stamp[j] === i) continue
        stamp[j] = i
        const d1 = (coords[3 * j] - xi) / h, d2 = (coords[3 * j + 1] - yi) / h, d3 = (coords[3 * j + 2] - zi) / h
        for (let k = 0; k < 6; k++) acc[6 * j + k] += B[k] + d1 * B[6 + k] + d2 * B[12 + k] + d3 * B[18 + k]
        cnt[j]++
      }
    }
  }
  for (let i = 0; i < N; i++) {
    if (cnt[i] < 0) continue
    if (cnt[i] > 0) { for (let k = 0; k < 6; k++) out[6 * i + k] = acc[6 * i + k] / cnt[i]; continue }
    // Neither an interior patch centre nor reached by one: keep the fallback.
    for (let k = 0; k < 6; k++) out[6 * i + k] = fallback[6 * i + k]
  }
  return out
}

/**
 * Solves A X = B in place (A 4×4 symmetric positive semi-definite, B 4×6) by Gaussian elimination
 * with partial pivoting; X is left in B. False when A is (nearly) singular.
 */
function solve4(A: Float64Array, B: Float64Array): boolean {
  const scale = A[0] + A[5] + A[10] + A[15]
  for (let c = 0; c < 4; c++) {
    let p = c
    for (let r = c + 1; r < 4; r++) if (Math.abs(A[4 * r + c]) > Math.abs(A[4 * p + c])) p = r
    if (Math.abs(A[4 * p + c]) < 1e-9 * scale) return false
    if (p !== c) {
      for (let k = 0; k < 4; k++) { const t = A[4 * c + k]; A[4 * c + k] = A[4 * p + k]; A[4 * p + k] = t }
      for (let k = 0; k < 6; k++) { const t = B[6 * c + k]; B[6 * c + k] = B[6 * p + k]; B[6 * p + k] = t }
    }
    for (let r = 0; r < 4; r++) {
      if (r === c) continue
      const f = A[4 * r + c] / A[4 * c + c]
      if (f === 0) continue
      for (let k = c; k < 4; k++) A[4 * r + k] -= f * A[4 * c + k]
      for (let k = 0; k < 6; k++) B[6 * r + k] -= f * B[6 * c + k]
    }
  }
  for (let r = 0; r < 4; r++) { const d = A[4 * r + r]; for (let k = 0; k < 6; k++) B[6 * r + k] /= d }
  return true
}
