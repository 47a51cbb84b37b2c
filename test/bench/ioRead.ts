/**
 * Reader throughput: a seeded CSV bundle and native container of a hex8 box with the cantilever
 * stress field, read several times; prints a table and a JSON line. Run: npx tsx test/bench/ioRead.ts [cellsPerSide]
 * Numbers of the stress field are perturbed with seeded noise so they have full-length decimals,
 * as solver output does.
 */
import { boxMesh } from '../../src/demo/boxMesh.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { modelOf } from '../io/testModels.ts'
import { readModelFiles } from '../../src/io/detect.ts'

const n = Number(process.argv[2] ?? 60)
const mesh = boxMesh({ nx: n, ny: n, nz: n, lx: 1, ly: 1, lz: 1, y0: -0.5 }, 'hex8')
const model = modelOf(mesh, true)
let seed = 12345
const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32)
for (let i = 0; i < model.stress.length; i++) model.stress[i] += rnd() * 1e3
for (let i = 0; i < mesh.coords.length; i++) mesh.coords[i] += (rnd() - 0.5) * 1e-6
// Files as a reader gets them: bytes from disk or a drop, decoded once (flat strings).
const enc = new TextEncoder()
const raw = writeCsvBundle(model).map((f) => ({ name: f.name, data: enc.encode(f.text) }))
const dec = new TextDecoder()
const files = raw.map((f) => ({ name: f.name, text: dec.decode(f.data) }))
const bytes = raw.reduce((s, f) => s + f.data.length, 0)
const runs = 4
const csvTimes: number[] = []
const decodeTimes: number[] = []
for (let r = 0; r < runs; r++) {
  const t0 = performance.now()
  readCsvBundle(files)
  csvTimes.push(performance.now() - t0)
  const t1 = performance.now()
  readModelFiles(raw)
  decodeTimes.push(performance.now() - t1)
}
const native = writeNative(model)
const natTimes: number[] = []
for (let r = 0; r < runs; r++) {
  const t0 = performance.now()
  readNative(native)
  natTimes.push(performance.now() - t0)
}
const best = (a: number[]) => Math.min(...a)
const csvMBs = bytes / 1e6 / (best(csvTimes) / 1e3)
const natMBs = native.length / 1e6 / (best(natTimes) / 1e3)
console.log(`nodes ${mesh.nodeCount}, elements ${mesh.elementCount}`)
console.log(`CSV bundle     ${(bytes / 1e6).toFixed(1)} MB   best ${best(csvTimes).toFixed(0)} ms   ${csvMBs.toFixed(0)} MB/s`)
console.log(`CSV bytes→Model ${(bytes / 1e6).toFixed(1)} MB   best ${best(decodeTimes).toFixed(0)} ms   ${(bytes / 1e6 / (best(decodeTimes) / 1e3)).toFixed(0)} MB/s (UTF-8 decoding included)`)
console.log(`native         ${(native.length / 1e6).toFixed(1)} MB   best ${best(natTimes).toFixed(0)} ms   ${natMBs.toFixed(0)} MB/s`)
console.log(JSON.stringify({ bench: 'ioRead', nodes: mesh.nodeCount, elements: mesh.elementCount, csvBytes: bytes, csvMs: csvTimes, csvMBs, csvWithDecodeMs: decodeTimes, nativeBytes: native.length, nativeMs: natTimes, nativeMBs: natMBs }))
