/**
 * Focused measure of what regions add to one section cut at about 10^6 elements (tet4, hex8):
 * plain cuts and cuts with `regions: true` interleaved (so a load change on a shared machine
 * hits both alike), the lowest and the median CPU time of each (process.cpuUsage: this process
 * only). `npm run bench` times the same pair as kernels `cut` and `cutRegions`.
 * Run: npx tsx test/bench/regionsCost.ts [tet4|hex8] [rounds]
 */
import os from 'node:os'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { syntheticModel } from './syntheticModel.ts'

const types = (process.argv[2] ? [process.argv[2]] : ['tet4', 'hex8']) as ('tet4' | 'hex8')[]
const rounds = Number(process.argv[3] ?? 31)
for (const type of types) {
  const model = syntheticModel(type, 1e6, 1)
  const field = nodalStressField(model.mesh, model.stress)
  const faces = extractBoundaryFaces(model.mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), model.mesh, field, faces)
  const cpu = (regions: boolean): number => {
    const c0 = process.cpuUsage()
    cutSection(model.mesh, field, [0, 0, 0], BENCH_PLANE, { faces, tractions, regions })
    const c = process.cpuUsage(c0)
    return (c.user + c.system) / 1000
  }
  for (let i = 0; i < 10; i++) { cpu(false); cpu(true) } // warm-up
  const plain: number[] = [], withRegions: number[] = []
  for (let i = 0; i < rounds; i++) { plain.push(cpu(false)); withRegions.push(cpu(true)) }
  const stat = (a: number[]) => { const s = [...a].sort((x, y) => x - y); return { min: s[0], median: s[s.length >> 1] } }
  const p = stat(plain), r = stat(withRegions)
  const res = cutSection(model.mesh, field, [0, 0, 0], BENCH_PLANE, { faces, tractions, regions: true }).result
  const out = {
    bench: 'regionsCost', type, elements: model.mesh.elementCount, cutElements: res.cutElements, regions: res.regions!.length, rounds,
    plainCpuMs: p, regionsCpuMs: r, addedMin: r.min / p.min - 1, addedMedian: r.median / p.median - 1, loadAverage: os.loadavg()[0],
  }
  console.log(`${type}: plain ${p.min.toFixed(1)} / ${p.median.toFixed(1)} ms CPU (min / median), with regions ${r.min.toFixed(1)} / ${r.median.toFixed(1)} ms: +${(100 * out.addedMin).toFixed(0)} % / +${(100 * out.addedMedian).toFixed(0)} %; load average ${out.loadAverage.toFixed(1)}`)
  console.log(JSON.stringify(out))
}
