/**
 * `npx tsx test/bench/kernelFocus.ts [--types tet4,tet10,hex8] [--kernels read,balance,audit,cut]
 * [--elements N] [--runs R]`: the per-type kernels of `npm run bench` alone (same seeded blocks,
 * same plane), for working on one kernel without the whole run. Prints CPU min and median, the
 * ratio to the kernel's streaming pass (CPU medians), MB/s for the native read (from CPU time),
 * and the load average beside every line.
 */
import os from 'node:os'
import { readNative, writeNative } from '../../src/io/index.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance } from '../../src/mechanics/balanceAudit.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { syntheticModel } from './syntheticModel.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { streamBytes, streamConnCoords, streamConnCoordsStress } from './streamingLimit.ts'
import { measure } from './timing.ts'

const argv = process.argv.slice(2)
const arg = (name: string, dflt: string): string => { const i = argv.indexOf(name); return i < 0 ? dflt : argv[i + 1] }
const types = arg('--types', 'tet4,tet10,hex8').split(',') as ('tet4' | 'tet10' | 'hex8')[]
const kernels = arg('--kernels', 'read,balance,cut').split(',')
const E = Number(arg('--elements', '1000000'))
const runs = Number(arg('--runs', '9'))
const SEED = 20261201

const load = () => os.loadavg()[0].toFixed(1)
const min = (a: readonly number[]) => Math.min(...a)
function cpuSamples<T>(fn: () => T, n = runs): { min: number; median: number; value: T } {
  // measure() keeps the CPU median only; time each run here for the minimum too.
  const cpu: number[] = []
  let value: T = fn()
  for (let i = 0; i < 2; i++) value = fn()
  const t = measure(() => {
    const c0 = process.cpuUsage()
    const v = fn()
    const c = process.cpuUsage(c0)
    cpu.push((c.user + c.system) / 1000)
    return v
  }, { runs: n, minRuns: n, warmup: 0, warmupMs: 0, budgetMs: Infinity })
  value = t.value
  const s = [...cpu].sort((a, b) => a - b)
  return { min: min(cpu), median: s[s.length >> 1], value }
}

for (const type of types) {
  const model = syntheticModel(type, E, SEED)
  const { mesh, stress, bodyForce } = model
  const field = nodalStressField(mesh, stress)
  const line = (what: string, t: { min: number; median: number }, stream: { median: number } | null, extra = '') =>
    console.log(`${type.padEnd(5)} ${what.padEnd(14)} cpu min ${t.min.toFixed(1).padStart(7)} ms  median ${t.median.toFixed(1).padStart(7)} ms${stream ? `  ${(t.median / stream.median).toFixed(2)}× streaming (${stream.median.toFixed(1)} ms)` : ''}${extra}  load ${load()}`)
  if (kernels.includes('read')) {
    const bytes = writeNative(model)
    const s = cpuSamples(() => streamBytes(bytes))
    const t = cpuSamples(() => readNative(bytes, 'bench.tractus'))
    line('native read', t, s, `  ${(bytes.byteLength / 1e3 / t.median).toFixed(0)} MB/s (min ${(bytes.byteLength / 1e3 / t.min).toFixed(0)})`)
  }
  if (kernels.includes('balance') || kernels.includes('audit')) {
    const s = cpuSamples(() => streamConnCoordsStress(mesh, stress))
    const t = cpuSamples(() => computeElementBalance(allocateElementBalance(mesh.elementCount, 'single'), mesh, field, bodyForce))
    line('elem balance', t, s)
    if (kernels.includes('audit')) {
      const faces = extractBoundaryFaces(mesh)
      const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
      const b = cpuSamples(() => computeBodyBalance(mesh, faces, tractions, bodyForce))
      line('body balance', b, s)
    }
  }
  if (kernels.includes('cut')) {
    const faces = extractBoundaryFaces(mesh)
    const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
    const s = cpuSamples(() => streamConnCoords(mesh))
    const t = cpuSamples(() => cutSection(mesh, field, bodyForce, BENCH_PLANE, { faces, tractions, polygons: false }), Math.max(runs, 15))
    line('cut', t, s, `  (${t.value.result.cutElements} cut elements)`)
  }
}
