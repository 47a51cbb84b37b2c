/**
 * Focused measure of what regions add to one section cut at about 10^6 elements (tet4, tet10,
 * hex8; the seeded blocks and plane of `npm run bench`): plain cuts and cuts with
 * `regions: true` interleaved (so a load change on a shared machine hits both alike), a garbage
 * collection before each timed cut as in timing.ts, the lowest and the median CPU time of each
 * (process.cpuUsage: this process only) and of the wall time, and the load average. `npm run
 * bench` times the same pair as kernels `cut` and `cutRegions` (its target: tet4).
 * Run: npx tsx test/bench/regionsCost.ts [tet4|tet10|hex8] [rounds]
 */
import os from 'node:os'
import v8 from 'node:v8'
import vm from 'node:vm'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { syntheticModel } from './syntheticModel.ts'

v8.setFlagsFromString('--expose-gc')
const gc = vm.runInNewContext('gc') as () => void

/** The seed of `npm run bench` (run.ts, --seed). */
const SEED = 20261201
const types = (process.argv[2] ? [process.argv[2]] : ['tet4', 'tet10', 'hex8']) as ('tet4' | 'tet10' | 'hex8')[]
const rounds = Number(process.argv[3] ?? 31)
const stat = (a: number[]) => { const s = [...a].sort((x, y) => x - y); return { min: s[0], median: s[s.length >> 1] } }
const pct = (x: number) => `${x >= 0 ? '+' : ''}${(100 * x).toFixed(0)} %`
for (const type of types) {
  const model = syntheticModel(type, 1e6, SEED)
  const field = nodalStressField(model.mesh, model.stress)
  const faces = extractBoundaryFaces(model.mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), model.mesh, field, faces)
  const time = (regions: boolean): { cpu: number; wall: number } => {
    gc()
    const c0 = process.cpuUsage(), t0 = performance.now()
    cutSection(model.mesh, field, model.bodyForce, BENCH_PLANE, { faces, tractions, polygons: false, regions })
    const wall = performance.now() - t0, c = process.cpuUsage(c0)
    return { cpu: (c.user + c.system) / 1000, wall }
  }
  for (let i = 0; i < 10; i++) { time(false); time(true) } // warm-up
  const load0 = os.loadavg()[0]
  const plain: { cpu: number; wall: number }[] = [], withRegions: { cpu: number; wall: number }[] = []
  for (let i = 0; i < rounds; i++) { plain.push(time(false)); withRegions.push(time(true)) }
  const loadAverage = (load0 + os.loadavg()[0]) / 2
  const pc = stat(plain.map((t) => t.cpu)), rc = stat(withRegions.map((t) => t.cpu))
  const pw = stat(plain.map((t) => t.wall)), rw = stat(withRegions.map((t) => t.wall))
  const res = cutSection(model.mesh, field, model.bodyForce, BENCH_PLANE, { faces, tractions, regions: true }).result
  const out = {
    bench: 'regionsCost', type, elements: model.mesh.elementCount, cutElements: res.cutElements, regions: res.regions!.length, rounds,
    plainCpuMs: pc, regionsCpuMs: rc, plainWallMs: pw, regionsWallMs: rw,
    addedMin: rc.min / pc.min - 1, addedMedian: rc.median / pc.median - 1,
    addedMinWall: rw.min / pw.min - 1, addedMedianWall: rw.median / pw.median - 1, loadAverage,
  }
  console.log(`${type}: CPU plain ${pc.min.toFixed(1)} / ${pc.median.toFixed(1)} ms (min / median), with regions ${rc.min.toFixed(1)} / ${rc.median.toFixed(1)} ms: ${pct(out.addedMin)} / ${pct(out.addedMedian)}; ` +
    `wall ${pw.min.toFixed(1)} / ${pw.median.toFixed(1)} ms and ${rw.min.toFixed(1)} / ${rw.median.toFixed(1)} ms: ${pct(out.addedMinWall)} / ${pct(out.addedMedianWall)}; load average ${loadAverage.toFixed(1)}`)
  console.log(JSON.stringify(out))
}
