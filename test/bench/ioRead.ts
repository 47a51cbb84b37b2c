/**
 * Reader throughput (seeded): CSV bundles and a native container of a hex8 box carrying the
 * cantilever stress field with seeded noise, read several times; prints a table and a JSON line.
 * Two CSV datasets: "full" numbers written with up to 17 significant digits (shortest round-trip
 * form of arbitrary doubles, the slow path of the number parser), and "7-digit" numbers as solvers
 * usually print them (%.6e-like). Wall time and this process's CPU time are both shown: on a shared
 * machine the CPU time is the steadier figure.
 * Run: npx tsx test/bench/ioRead.ts [cellsPerSide=60]
 */
import { boxMesh } from '../../src/model/boxMesh.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { readModelFiles } from '../../src/io/detect.ts'
import type { Model } from '../../src/model/model.ts'
import { modelOf } from '../io/testModels.ts'

const n = Number(process.argv[2] ?? 60)
const runs = 4
let seed = 12345
const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32)

function makeModel(digits: number | null): Model {
  const mesh = boxMesh({ nx: n, ny: n, nz: n, lx: 1, ly: 1, lz: 1, y0: -0.5 }, 'hex8')
  const model = modelOf(mesh, true)
  const round = (v: number) => (digits === null ? v : Number(v.toPrecision(digits)))
  for (let i = 0; i < model.stress.length; i++) model.stress[i] = round(model.stress[i] + rnd() * 1e3)
  for (let i = 0; i < mesh.coords.length; i++) mesh.coords[i] = round(mesh.coords[i] + (rnd() - 0.5) * 1e-6)
  for (let i = 0; i < model.displacement!.length; i++) model.displacement![i] = round(model.displacement![i])
  return model
}

const cpuMs = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000 }
function time(f: () => unknown): { wall: number; cpu: number } {
  let wall = Infinity, cpu = Infinity
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now(), c0 = cpuMs()
    f()
    wall = Math.min(wall, performance.now() - t0)
    cpu = Math.min(cpu, cpuMs() - c0)
  }
  return { wall, cpu }
}

const enc = new TextEncoder()
const dec = new TextDecoder()
const results: Record<string, unknown>[] = []
const row = (label: string, bytes: number, t: { wall: number; cpu: number }) => {
  const mb = bytes / 1e6
  console.log(`${label.padEnd(28)} ${mb.toFixed(1).padStart(6)} MB  wall ${t.wall.toFixed(0).padStart(5)} ms ${(mb / (t.wall / 1e3)).toFixed(0).padStart(4)} MB/s  cpu ${t.cpu.toFixed(0).padStart(5)} ms ${(mb / (t.cpu / 1e3)).toFixed(0).padStart(4)} MB/s`)
  results.push({ label, bytes, wallMs: t.wall, cpuMs: t.cpu, wallMBs: mb / (t.wall / 1e3), cpuMBs: mb / (t.cpu / 1e3) })
}

let nodes = 0, elements = 0
for (const [label, digits] of [['full', null], ['7-digit', 7]] as const) {
  const model = makeModel(digits)
  nodes = model.mesh.nodeCount; elements = model.mesh.elementCount
  // Files as a reader gets them: bytes from disk or a drop, decoded once (flat strings).
  const raw = writeCsvBundle(model).map((f) => ({ name: f.name, data: enc.encode(f.text) }))
  const files = raw.map((f) => ({ name: f.name, text: dec.decode(f.data) }))
  const bytes = raw.reduce((s, f) => s + f.data.length, 0)
  row(`CSV ${label}, parse`, bytes, time(() => readCsvBundle(files)))
  row(`CSV ${label}, decode + parse`, bytes, time(() => readModelFiles(raw)))
  if (digits === null) {
    const native = writeNative(model)
    row('native container', native.length, time(() => readNative(native)))
  }
}
console.log(`(${nodes} nodes, ${elements} hex8 elements, best of ${runs})`)
console.log(JSON.stringify({ bench: 'ioRead', nodes, elements, runs, results }))
