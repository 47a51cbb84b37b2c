/**
 * `npx tsx test/bench/elementChunks.ts [elements] [--app]`: a section cut with regions and drawn
 * polygons over every element against the same cut scanning only the element chunks the plane
 * meets, alternating on the same 35 planes (src/mechanics/elementChunks.ts), and the chunks' build, on the bench's seeded tet4 block
 * (or the app's generated cantilever block with --app), default 10^6 elements. CPU medians; the
 * load average beside them. Checks that both ways give the same force and cut elements.
 */
import os from 'node:os'
import { syntheticModel } from './syntheticModel.ts'
import { syntheticModel as appBlock } from '../../workers/syntheticModel.ts'
import { measure } from './timing.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { buildElementChunks } from '../../src/mechanics/elementChunks.ts'
import { modelStressField } from '../../src/model/stressField.ts'

const argv = process.argv.slice(2)
const E = Number(argv.find((a) => !a.startsWith('--')) ?? 1e6)
const app = argv.includes('--app')
const model = app ? appBlock({ kind: 'block', elements: E }) : syntheticModel('tet4', E, 1)
const mesh = model.mesh
const faces = extractBoundaryFaces(mesh)
const field = modelStressField(model)
const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
const build = measure(() => buildElementChunks(mesh), { runs: 5 })
const chunks = build.value
// a drag: the plane moves a little each cut, across x near a quarter of the block; the two ways
// alternate on the same planes, so a shared machine's load falls on both alike
const x0 = app ? 1 : 0.25
const cutAt = (k: number, withChunks: boolean) => cutSection(mesh, field, model.bodyForce, { point: [x0 + 0.001 * k, 0.01, 0.01], normal: [1, 0, 0.2] },
  { faces, tractions, polygons: true, regions: true, chunks: withChunks ? chunks : null })
const cpuNow = (): number => { const c = process.cpuUsage(); return (c.user + c.system) / 1e3 }
const times = { plain: [] as number[], fast: [] as number[] }
let same = true
for (let k = 0; k < 40; k++) {
  const c0 = cpuNow(), a = cutAt(k, false), c1 = cpuNow(), b = cutAt(k, true), c2 = cpuNow()
  if (k >= 5) { times.plain.push(c1 - c0); times.fast.push(c2 - c1) }
  same &&= a.result.force.every((v, i) => Object.is(v, b.result.force[i])) && a.result.cutElements === b.result.cutElements
}
const med = (v: number[]): number => [...v].sort((x, y) => x - y)[v.length >> 1]
const plain = { cpuMs: med(times.plain) }, fast = { cpuMs: med(times.fast) }
const f = (v: number) => v.toFixed(1)
console.log(`${app ? 'app cantilever' : 'bench'} block, ${mesh.elementCount} tet4, ${chunks.count.length} chunks, load average ${os.loadavg()[0].toFixed(2)}`)
console.log(`  chunks' build: ${f(build.medianMs)} ms (cpu ${f(build.cpuMs)})`)
console.log(`  cut, every element scanned: cpu median ${f(plain.cpuMs)} ms`)
console.log(`  cut, met chunks only:       cpu median ${f(fast.cpuMs)} ms, ×${f(plain.cpuMs / fast.cpuMs)}`)
console.log(`  same force and cut elements both ways, every plane: ${same ? 'yes' : 'NO'}`)
