/**
 * Rigid rotations for objectivity checks: x' = Qx, σ' = QσQᵀ, vectors v' = Qv.
 * Random rotations from a unit quaternion built of three uniforms (Shoemake, "Uniform random
 * rotations", Graphics Gems III, 1992).
 */
import type { Mesh } from '../../src/model/model.ts'
import { mulberry32 } from '../../src/mechanics/seededRandom.ts'
export { mulberry32 }

export type Mat3 = [number, number, number, number, number, number, number, number, number]

/** Rotation matrix (row-major) from three numbers in [0, 1). */
export function rotationFromUniforms(u1: number, u2: number, u3: number): Mat3 {
  const w = Math.sqrt(1 - u1) * Math.sin(2 * Math.PI * u2), x = Math.sqrt(1 - u1) * Math.cos(2 * Math.PI * u2)
  const y = Math.sqrt(u1) * Math.sin(2 * Math.PI * u3), z = Math.sqrt(u1) * Math.cos(2 * Math.PI * u3)
  return [
    1 - 2 * (y * y + z * z), 2 * (x * y - z * w), 2 * (x * z + y * w),
    2 * (x * y + z * w), 1 - 2 * (x * x + z * z), 2 * (y * z - x * w),
    2 * (x * z - y * w), 2 * (y * z + x * w), 1 - 2 * (x * x + y * y),
  ]
}


export function rotateVec(Q: Mat3, v: ArrayLike<number>, o = 0): [number, number, number] {
  const x = v[o], y = v[o + 1], z = v[o + 2]
  return [Q[0] * x + Q[1] * y + Q[2] * z, Q[3] * x + Q[4] * y + Q[5] * z, Q[6] * x + Q[7] * y + Q[8] * z]
}

/** σ' = QσQᵀ for a 6-vector (xx, yy, zz, xy, yz, xz). */
export function rotateStress(Q: Mat3, s: ArrayLike<number>, o = 0): number[] {
  const S = [s[o], s[o + 3], s[o + 5], s[o + 3], s[o + 1], s[o + 4], s[o + 5], s[o + 4], s[o + 2]]
  const R = new Array<number>(9).fill(0)
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
    let v = 0
    for (let k = 0; k < 3; k++) for (let l = 0; l < 3; l++) v += Q[3 * i + k] * S[3 * k + l] * Q[3 * j + l]
    R[3 * i + j] = v
  }
  return [R[0], R[4], R[8], R[1], R[5], R[2]]
}

/** The mesh with every node rotated about the origin (topology shared). */
export function rotateMesh(mesh: Mesh, Q: Mat3): Mesh {
  const c = new Float64Array(mesh.coords.length)
  for (let i = 0; i < mesh.nodeCount; i++) c.set(rotateVec(Q, mesh.coords, 3 * i), 3 * i)
  return { ...mesh, coords: c }
}

export function rotateStressField(Q: Mat3, stress: Float64Array): Float64Array {
  const out = new Float64Array(stress.length)
  for (let i = 0; i < stress.length / 6; i++) out.set(rotateStress(Q, stress, 6 * i), 6 * i)
  return out
}
