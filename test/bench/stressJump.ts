/**
 * The stress jump (src/mechanics/stressJump.ts) and the part-wise display average
 * (partAveragedStress, src/model/stressField.ts) on element-nodal stress (seeded): a generated
 * block of about 10^6 tet4 elements (4·10^6 element-node rows, two parts split at mid-length),
 * each row its node's stress with seeded noise. Yardstick: one pass that only streams the same
 * element-node rows (sums them), so the ratio says what the kernel costs beyond reading its input.
 * Median wall and CPU time; a table and a JSON line.
 * Run: npx tsx test/bench/stressJump.ts [--elements N]
 */
import { syntheticModel } from './syntheticModel.ts'
import { measure } from './timing.ts'
import { elementNodalCopy } from '../helpers/elementNodal.ts'
import { allocateStressJump, computeStressJump } from '../../src/mechanics/stressJump.ts'
import { partAveragedStress } from '../../src/model/stressField.ts'
import { mulberry32 } from '../../src/mechanics/seededRandom.ts'
import type { StressField } from '../../src/model/stressField.ts'

const argv = process.argv.slice(2)
const i = argv.indexOf('--elements')
const ELEMENTS = i < 0 ? 1e6 : Number(argv[i + 1])
const seed = 20261202
const model = syntheticModel('tet4', ELEMENTS, 7)
const mesh = {
  ...model.mesh,
  // Two parts: elements of the first half and of the second.
  blocks: model.mesh.blocks.map((b) => ({ ...b, part: Int32Array.from(b.ids, (_, e) => (b.offset + e < model.mesh.elementCount / 2 ? 1 : 2)) })),
}
const field: StressField = elementNodalCopy(mesh, model.stress, seed)
const rand = mulberry32(seed)
for (let k = 0; k < field.values.length; k++) field.values[k] *= 1 + 0.01 * (rand() - 0.5)
const rows = field.values.length / 6

/** Streams every element-node's row once (the yardstick). */
function stream(): number {
  let s = 0
  const v = field.values
  for (const r of field.rows) for (let k = 0; k < r.length; k++) { const o = 6 * r[k]; s += v[o] + v[o + 1] + v[o + 2] + v[o + 3] + v[o + 4] + v[o + 5] }
  return s
}
const out = allocateStressJump(mesh.nodeCount)
const display = new Float64Array(6 * mesh.nodeCount)
const base = measure(stream, { runs: 7 })
const jump = measure(() => computeStressJump(out, mesh, field, 100), { runs: 7 })
const avg = measure(() => partAveragedStress(mesh, field, display), { runs: 7 })
let max = 0
for (let n = 0; n < out.length; n++) if (out[n] > max) max = out[n]
console.log(`tet4 block: ${mesh.elementCount} elements, ${mesh.nodeCount} nodes, ${rows} element-node rows, seed ${seed}`)
console.log(`stream rows (yardstick)   wall ${base.medianMs.toFixed(0).padStart(5)} ms  cpu ${base.cpuMs.toFixed(0).padStart(5)} ms`)
console.log(`stress jump               wall ${jump.medianMs.toFixed(0).padStart(5)} ms  cpu ${jump.cpuMs.toFixed(0).padStart(5)} ms  ${(jump.medianMs / base.medianMs).toFixed(1)}× the stream (largest jump ${max.toFixed(4)})`)
console.log(`part-wise display average wall ${avg.medianMs.toFixed(0).padStart(5)} ms  cpu ${avg.cpuMs.toFixed(0).padStart(5)} ms  ${(avg.medianMs / base.medianMs).toFixed(1)}× the stream`)
console.log(JSON.stringify({ bench: 'stressJump', elements: mesh.elementCount, rows, seed, streamMs: base.medianMs, jumpMs: jump.medianMs, jumpCpuMs: jump.cpuMs, averageMs: avg.medianMs, averageCpuMs: avg.cpuMs }))
