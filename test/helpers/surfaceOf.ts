/**
 * The boundary surface's triangles of a small seeded block (test/bench/syntheticModel.ts's
 * jittered boxes): the worker's own builders, for the cluster tests.
 */
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../src/mechanics/invariants.ts'
import { buildSurfaceTriangles } from '../../src/mechanics/surfaceTriangles.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'

export function surfaceOf(type: 'tet4' | 'tet10' | 'hex8', elements: number, seed: number) {
  const model = syntheticModel(type, elements, seed, 0.1)
  const mesh = model.mesh
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, model.stress), faces)
  const invariants = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), model.stress)
  return buildSurfaceTriangles(mesh.coords, faces, tractions, invariants)
}
