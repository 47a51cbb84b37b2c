/** Runs the mechanics core on a mesh and stress field, the way the app and the CLI chain it. */
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { computeBodyBalance, computeElementBalance } from '../../src/mechanics/balanceAudit.ts'

export function runCore(mesh: Mesh, stress: Float64Array, bodyForce: Vec3 = [0, 0, 0]) {
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(mesh, stress, faces)
  const elements = computeElementBalance(mesh, stress, bodyForce)
  const body = computeBodyBalance(mesh, faces, tractions, bodyForce)
  return { faces, tractions, elements, body }
}

export const FACE_NODES_BY_CODE = [3, 6, 4, 8]

export function maxAbs(a: ArrayLike<number>): number {
  let m = 0
  for (let i = 0; i < a.length; i++) { const v = Math.abs(a[i]); if (v > m) m = v }
  return m
}
