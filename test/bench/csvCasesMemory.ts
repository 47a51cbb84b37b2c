/**
 * Peak memory of the command line reading a CSV bundle of many load cases, in a fresh process:
 *   npx tsx test/bench/csvCasesMemory.ts --write <dir> [elements=100000] [cases=50] [seed=1]
 *                                  writes a tet4 bundle with `cases` nodal stress cases
 *   npx tsx test/bench/csvCasesMemory.ts <dir> [--eager]
 *                                  reads it as the commands do (loadModelAsync: file by file) or,
 *                                  with --eager, every text at once (loadModel), then runs the
 *                                  audit's analysis; prints {"peakRssBytes", "modelBytes", ...}
 *   npx tsx test/bench/csvCasesMemory.ts --empty   the idle size (a one-cell model, same path)
 * The budget is the issue's: idle + 3 × the bytes of the model's arrays (every case's fields
 * counted). Peak = VmHWM of this process (memoryProbe.ts says why not maxRSS).
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { writeCsvBundle } from '../../src/io/index.ts'
import type { Model } from '../../src/model/model.ts'
import type { LoadCase } from '../../src/model/loadCases.ts'
import { loadModel, loadModelAsync } from '../../src/cli/loadModel.ts'
import { analysisInputOf, runAnalysis } from '../../src/mechanics/analysisPipeline.ts'
import { syntheticModel } from './syntheticModel.ts'

/** VmHWM of this process in bytes (as memoryProbe.ts, which runs as a script and so is not imported). */
function highWaterRss(): number | null {
  const m = /VmHWM:\s*(\d+)\s*kB/.exec(readFileSync('/proc/self/status', 'utf8'))
  return m ? Number(m[1]) * 1024 : null
}

/** The model with `k` cases: case j is the synthetic stress times (1 + j/10), so no two are alike. */
function withCases(model: Model, k: number): Model {
  const cases: LoadCase[] = Array.from({ length: k }, (_, j) => {
    const s = new Float64Array(model.stress.length)
    for (let i = 0; i < s.length; i++) s[i] = (1 + j / 10) * model.stress[i]
    return { name: `case-${j + 1}`, description: '', bodyForce: model.bodyForce, stress: s, displacement: null }
  })
  return { ...model, stress: cases[0].stress, cases, combinations: [] }
}

/** Bytes of the model's arrays: the mesh and every case's fields. */
function modelBytes(m: Model): number {
  let b = m.mesh.coords.byteLength + m.mesh.nodeIds.byteLength
  for (const k of m.mesh.blocks) b += k.conn.byteLength + k.ids.byteLength + (k.part?.byteLength ?? 0)
  for (const c of m.cases ?? [{ stress: m.stress, displacement: m.displacement }]) b += c.stress.byteLength + (c.displacement?.byteLength ?? 0)
  return b
}

const args = process.argv.slice(2)
if (args[0] === '--write') {
  const [dir, elements = '100000', cases = '50', seed = '1'] = args.slice(1)
  mkdirSync(dir, { recursive: true })
  const model = withCases(syntheticModel('tet4', Number(elements), Number(seed)), Number(cases))
  for (const f of writeCsvBundle(model)) writeFileSync(`${dir}/${f.name}`, f.text)
} else {
  const dir = args[0] === '--empty' ? null : args[0]
  let model: Model
  if (dir === null) {
    const tmp = `${process.env.TMPDIR ?? '/tmp'}/tractus-empty-${process.pid}`
    mkdirSync(tmp, { recursive: true })
    for (const f of writeCsvBundle(syntheticModel('tet4', 6, 1))) writeFileSync(`${tmp}/${f.name}`, f.text)
    model = (await loadModelAsync(tmp)).model
  } else {
    model = (args.includes('--eager') ? loadModel(dir) : await loadModelAsync(dir)).model
  }
  const r = runAnalysis(analysisInputOf(model), { balancePrecision: 'single' })
  const keep = [r.faces.count, r.bodyBalance.relative, model.cases?.length ?? 1]
  process.stdout.write(JSON.stringify({ peakRssBytes: highWaterRss(), modelBytes: modelBytes(model), cases: model.cases?.length ?? 1, elements: model.mesh.elementCount, keep: keep.length }) + '\n')
}
