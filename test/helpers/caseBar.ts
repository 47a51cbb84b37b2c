/**
 * A bar 4 × 1 × 0.5 along x (hex8, length m, stress Pa) under three load cases with closed forms
 * by elementary beam theory (Timoshenko & Goodier; common practice), A = 0.5, I = 1 · 0.5³ / 12:
 * pull σxx = 10 (N = 5), bend σxx = 6(z − 0.25) (|M| = 6 I, N = 0), press σxx = −4 (N = −2);
 * the model's combination K = 1.5 pull + bend (N = 7.5). `sweepOf` runs the engine worker's sweep
 * of a model along x with every case, as the app asks for it.
 */
import { boxMesh } from '../../src/model/boxMesh.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { Model } from '../../src/model/model.ts'
import type { Combination } from '../../src/model/loadCases.ts'
import { sweepAlong, sweepCasesAlong } from '../../workers/sweep.ts'
import type { SweepReply } from '../../workers/protocol.ts'
import { stressField } from './mappedMeshes.ts'

export const barMesh = boxMesh({ nx: 8, ny: 2, nz: 2, lx: 4, ly: 1, lz: 0.5 }, 'hex8')
const field = (f: (z: number) => number) => stressField(barMesh, (_x, _y, z) => [f(z), 0, 0, 0, 0, 0])
export const barCases = [
  { name: 'pull', description: '', bodyForce: null, stress: field(() => 10), displacement: null },
  { name: 'bend', description: '', bodyForce: null, stress: field((z) => 6 * (z - 0.25)), displacement: null },
  { name: 'press', description: '', bodyForce: null, stress: field(() => -4), displacement: null },
]
export const caseBar: Model = {
  name: 'bar', description: '', units: { length: 'm', stress: 'Pa' }, mesh: barMesh, stress: barCases[0].stress, displacement: null, bodyForce: [0, 0, 0], warnings: [],
  cases: barCases, combinations: [{ name: 'K', factors: { pull: 1.5, bend: 1 } }],
}
export const barFaces = extractBoundaryFaces(barMesh)

/** The worker's sweep of `m` along x (`count` sections, or from..to), with every case and the app's `combinations`. */
export function sweepOf(m: Model, count: number, combinations: readonly Combination[] = [], range?: [number, number]): SweepReply {
  const t = computeSurfaceTractions(allocateSurfaceTractions(barFaces), barMesh, nodalStressField(barMesh, m.stress), barFaces)
  const shown = range ? sweepAlong(m, barFaces, t, [1, 0, 0], count, range[0], range[1]) : sweepAlong(m, barFaces, t, [1, 0, 0], count)
  const cases = sweepCasesAlong(caseBar, shown, { combinations })
  return cases ? { ...shown, cases } : shown
}
