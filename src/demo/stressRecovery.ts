import { HEX8_CENTROID_SPREAD, HEX8_EXTRAPOLATION, HEX8_EXTRAPOLATION_PLANAR, hex8GaussStress } from './hex8.ts'

/** How element values reach the corners before nodal averaging (see hex8.ts). */
export type RecoveryMode = 'extrapolate' | 'planar' | 'centroid'

/**
 * Nodal stress (xx, yy, zz, xy, yz, xz per node) from a hex8 displacement field: each element's
 * Gauss-point stresses are extrapolated to its corners (HEX8_EXTRAPOLATION), then every node takes
 * the plain mean over the elements that hold it (nodal averaging, common practice). Writes
 * `out` (6·N) and returns it.
 */
export function recoverNodalStress(out: Float64Array, coords: Float64Array, conn: Int32Array, u: Float64Array, lambda: number, mu: number, mode: RecoveryMode = 'extrapolate'): Float64Array {
  const X = mode === 'planar' ? HEX8_EXTRAPOLATION_PLANAR : mode === 'centroid' ? HEX8_CENTROID_SPREAD : HEX8_EXTRAPOLATION
  const nodeCount = coords.length / 3
  const count = new Float64Array(nodeCount)
  const xyz = new Float64Array(24), ue = new Float64Array(24), grad = new Float64Array(24), sg = new Float64Array(48)
  out.fill(0)
  const elements = conn.length / 8
  for (let e = 0; e < elements; e++) {
    for (let a = 0; a < 8; a++) {
      const n = 3 * conn[8 * e + a]
      for (let k = 0; k < 3; k++) { xyz[3 * a + k] = coords[n + k]; ue[3 * a + k] = u[n + k] }
    }
    hex8GaussStress(sg, xyz, ue, lambda, mu, grad)
    for (let a = 0; a < 8; a++) {
      const n = conn[8 * e + a], o = 6 * n
      for (let g = 0; g < 8; g++) {
        const w = X[8 * a + g]
        for (let c = 0; c < 6; c++) out[o + c] += w * sg[6 * g + c]
      }
      count[n]++
    }
  }
  for (let n = 0; n < nodeCount; n++) {
    // A node no element holds keeps zero stress.
    if (count[n] === 0) continue
    const s = 1 / count[n]
    for (let c = 0; c < 6; c++) out[6 * n + c] *= s
  }
  return out
}
