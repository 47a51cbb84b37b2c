// Quick timing of the mechanics core on a 10^6-element tet4 box (seeded, checks outside the timed
// part). Run: npx tsx test/bench/mechanicsCoreQuick.ts [cellsPerSide]
import { boxMesh } from '../../src/model/boxMesh.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'

const n = Number(process.argv[2] ?? 55) // 6·55³ ≈ 1.0·10^6 tetrahedra
const mesh = boxMesh({ nx: n, ny: n, nz: n, lx: 1, ly: 1, lz: 1 }, 'tet4')
const stress = new Float64Array(6 * mesh.nodeCount)
for (let i = 0; i < mesh.nodeCount; i++) { stress[6 * i] = 1; stress[6 * i + 3] = 0.5 }
const field = nodalStressField(mesh, stress)
// Wall time and CPU time of this process: on a shared, oversubscribed machine the CPU time is
// the steadier figure for single-threaded kernels.
const time = (label: string, fn: () => unknown, reps = 5): unknown => {
  let best = Infinity, bestCpu = Infinity, out: unknown
  for (let r = 0; r < reps; r++) {
    const c0 = process.cpuUsage(), t0 = performance.now()
    out = fn()
    const wall = performance.now() - t0, c = process.cpuUsage(c0)
    best = Math.min(best, wall); bestCpu = Math.min(bestCpu, (c.user + c.system) / 1000)
  }
  console.log(`${label}: best of ${reps} wall ${best.toFixed(1)} ms, cpu ${bestCpu.toFixed(1)} ms`)
  return out
}
console.log(`elements ${mesh.elementCount}, nodes ${mesh.nodeCount}`)
const faces = time('extractBoundaryFaces', () => extractBoundaryFaces(mesh)) as ReturnType<typeof extractBoundaryFaces>
time('computeSurfaceTractions', () => computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces))
time('faces + tractions', () => { const f = extractBoundaryFaces(mesh); return computeSurfaceTractions(allocateSurfaceTractions(f), mesh, field, f) })
console.log(`boundary faces ${faces.count} (expected ${12 * n * n})`)

const { allocateElementBalance, computeElementBalance, computeBodyBalance, percentiles } = await import('../../src/mechanics/balanceAudit.ts')
const { allocateNodalInvariants, computeNodalInvariants } = await import('../../src/mechanics/invariants.ts')
const tr = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
const eb = time('computeElementBalance', () => computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, field, [0, 0, -1])) as ReturnType<typeof computeElementBalance>
time('computeBodyBalance', () => computeBodyBalance(mesh, faces, tr, [0, 0, -1]))
time('percentiles of the indicator', () => percentiles(eb.indicator, [50, 95, 100]))
time('computeNodalInvariants', () => computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), stress), 3)
