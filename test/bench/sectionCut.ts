/**
 * Benchmark of the section cut and the section sweep on a seeded synthetic tet4 block of about
 * 10^6 elements (invented data, see syntheticModel.ts). Prints a table and a JSON line.
 *
 * Goals (from the task, checked by eye here, never in a unit test): one cut in ≤ 20 ms with
 * polygons off, within ~4× a plain pass that reads the connectivity and node distances; a sweep
 * of 200 sections well under 1 s. Run: npx tsx test/bench/sectionCut.ts [elements]
 */
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { sweepSections } from '../../src/mechanics/sectionSweep.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { Mesh } from '../../src/model/model.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { syntheticModel } from './syntheticModel.ts'
import { measure } from './timing.ts'

const elements = Number(process.argv[2] ?? 1_000_000)
const model = syntheticModel('tet4', elements, 7)
const { mesh, stress, bodyForce } = model
const faces = extractBoundaryFaces(mesh)
const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, stress), faces)

/** The floor: node distances plus one read of every element's corners and their distances. */
function readPass(mesh: Mesh): number {
  const x = mesh.coords, N = mesh.nodeCount
  const d = new Float64Array(N)
  const p = BENCH_PLANE.point, m = BENCH_PLANE.normal
  for (let i = 0; i < N; i++) d[i] = (x[3 * i] - p[0]) * m[0] + (x[3 * i + 1] - p[1]) * m[1] + (x[3 * i + 2] - p[2]) * m[2]
  let s = 0
  for (const b of mesh.blocks) {
    const conn = b.conn
    for (let i = 0; i < conn.length; i++) s += d[conn[i]]
  }
  return s
}

const floor = measure(() => readPass(mesh), 15, 3)
const cut = measure(() => cutSection(mesh, stress, bodyForce, BENCH_PLANE, { faces, tractions }), 15, 3)
const cutPolys = measure(() => cutSection(mesh, stress, bodyForce, BENCH_PLANE, { faces, tractions, polygons: true }), 5, 1)
const sweep = measure(() => sweepSections(mesh, stress, bodyForce, BENCH_PLANE.normal, 0.02, 1.5, 200, { faces, tractions }), 5, 1)

const r = cut.value.result
// the machine is shared: the fastest run and the CPU time show the cost of the code, the median
// wall time what a loaded machine gives
const min = (t: { samplesMs: number[] }) => Math.min(...t.samplesMs)
const rows = {
  elements: mesh.elementCount, nodes: mesh.nodeCount, boundaryFaces: faces.count, cutElements: r.cutElements,
  readPassMedianMs: +floor.medianMs.toFixed(2), readPassMinMs: +min(floor).toFixed(2),
  cutMedianMs: +cut.medianMs.toFixed(2), cutMinMs: +min(cut).toFixed(2), cutCpuMs: +cut.cpuMs.toFixed(2),
  cutOverReadPassMin: +(min(cut) / min(floor)).toFixed(2), cutOverReadPassCpu: +(cut.cpuMs / floor.cpuMs).toFixed(2),
  cutWithPolygonsMedianMs: +cutPolys.medianMs.toFixed(2), cutWithPolygonsMinMs: +min(cutPolys).toFixed(2),
  sweep200MedianMs: +sweep.medianMs.toFixed(1), sweep200MinMs: +min(sweep).toFixed(1), sweep200CpuMs: +sweep.cpuMs.toFixed(1),
  sweepSectionsNonEmpty: sweep.value.results.filter((x) => !x.empty).length,
  freeBodyRelative: r.freeBody.relative,
}
console.table(rows)
console.log(JSON.stringify({ bench: 'sectionCut', ...rows }))
