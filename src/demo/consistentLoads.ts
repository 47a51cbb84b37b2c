import { HEX8_GAUSS, hex8GradientsAtGauss, hex8ShapeValues } from './hex8.ts'
import type { HexFaces } from './hexFaces.ts'

/**
 * Traction at a face quadrature point, written into out[0..2] (stress units): the point (x, y, z)
 * and the face's outward unit normal (nx, ny, nz) are given.
 */
export type TractionFn = (out: Float64Array, x: number, y: number, z: number, nx: number, ny: number, nz: number) => void

const G = 1 / Math.sqrt(3)
const FACE_GAUSS = [-G, -G, G, -G, G, G, -G, G]
/** Per face Gauss point q: N_c at 4q + c, ∂N_c/∂u and ∂N_c/∂v likewise (bilinear quad, corners (-1,-1) (1,-1) (1,1) (-1,1)). */
const FN = new Float64Array(16), FDU = new Float64Array(16), FDV = new Float64Array(16)
for (let q = 0; q < 4; q++) {
  const u = FACE_GAUSS[2 * q], v = FACE_GAUSS[2 * q + 1]
  const su = [-1, 1, 1, -1], sv = [-1, -1, 1, 1]
  for (let c = 0; c < 4; c++) {
    FN[4 * q + c] = 0.25 * (1 + su[c] * u) * (1 + sv[c] * v)
    FDU[4 * q + c] = 0.25 * su[c] * (1 + sv[c] * v)
    FDV[4 * q + c] = 0.25 * sv[c] * (1 + su[c] * u)
  }
}

/**
 * Adds the consistent nodal loads f_a = ∫ N_a t dA of a distributed traction over bilinear quad
 * faces (2×2 Gauss rule, Abramowitz & Stegun Table 25.4) into `out` (3 per node).
 * Returns the resultant force added.
 */
export function addFaceLoads(out: Float64Array, coords: Float64Array, faces: HexFaces, traction: TractionFn): [number, number, number] {
  const t = new Float64Array(3)
  const total: [number, number, number] = [0, 0, 0]
  for (let f = 0; f < faces.count; f++) {
    for (let q = 0; q < 4; q++) {
      let x = 0, y = 0, z = 0, xu = 0, yu = 0, zu = 0, xv = 0, yv = 0, zv = 0
      for (let c = 0; c < 4; c++) {
        const o = 3 * faces.nodes[4 * f + c], N = FN[4 * q + c], du = FDU[4 * q + c], dv = FDV[4 * q + c]
        x += N * coords[o]; y += N * coords[o + 1]; z += N * coords[o + 2]
        xu += du * coords[o]; yu += du * coords[o + 1]; zu += du * coords[o + 2]
        xv += dv * coords[o]; yv += dv * coords[o + 1]; zv += dv * coords[o + 2]
      }
      // Counter-clockwise corners seen from outside: ∂x/∂u × ∂x/∂v points out, its length is dA/(du dv).
      const ax = yu * zv - zu * yv, ay = zu * xv - xu * zv, az = xu * yv - yu * xv
      const dA = Math.hypot(ax, ay, az)
      traction(t, x, y, z, ax / dA, ay / dA, az / dA)
      for (let c = 0; c < 4; c++) {
        const o = 3 * faces.nodes[4 * f + c], w = FN[4 * q + c] * dA
        out[o] += w * t[0]; out[o + 1] += w * t[1]; out[o + 2] += w * t[2]
      }
      total[0] += dA * t[0]; total[1] += dA * t[1]; total[2] += dA * t[2]
    }
  }
  return total
}

/**
 * Adds the consistent nodal loads f_a = ∫ N_a ρb dV of a uniform body force (force per volume)
 * over hex8 elements (2×2×2 Gauss rule). Returns the total force added.
 */
export function addBodyLoads(out: Float64Array, coords: Float64Array, conn: Int32Array, bodyForce: readonly [number, number, number]): [number, number, number] {
  const xyz = new Float64Array(24), grad = new Float64Array(24), N = new Float64Array(8)
  const [bx, by, bz] = bodyForce
  let volume = 0
  const elements = conn.length / 8
  for (let e = 0; e < elements; e++) {
    for (let a = 0; a < 8; a++) {
      const n = conn[8 * e + a]
      xyz[3 * a] = coords[3 * n]; xyz[3 * a + 1] = coords[3 * n + 1]; xyz[3 * a + 2] = coords[3 * n + 2]
    }
    for (let g = 0; g < 8; g++) {
      const det = hex8GradientsAtGauss(grad, xyz, g)
      hex8ShapeValues(N, HEX8_GAUSS[3 * g], HEX8_GAUSS[3 * g + 1], HEX8_GAUSS[3 * g + 2])
      volume += det
      for (let a = 0; a < 8; a++) {
        const o = 3 * conn[8 * e + a], w = N[a] * det
        out[o] += w * bx; out[o + 1] += w * by; out[o + 2] += w * bz
      }
    }
  }
  return [bx * volume, by * volume, bz * volume]
}
