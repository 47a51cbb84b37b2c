/**
 * What reading the way solvers and spreadsheets write costs (seeded): a generated bundle of about
 * 10^6 tet4 elements (test/bench/syntheticModel.ts) read by readCsvBundle as written (comma,
 * decimal point) and rewritten in other dialects (semicolon with decimal commas, tab, runs of
 * spaces with `D` exponents, mapped headers and file names with units in the headers); the
 * detection and column mapping alone (detectDialect and the header of each file) against the
 * whole read; and the quadratic-element checks on a tet10 block of about 10^6 elements. Median of
 * several runs, wall and CPU time; a table and a JSON line. Checks (the same numbers from every
 * dialect) run outside the timed loops.
 * Run: npx tsx test/bench/csvDialects.ts [--elements N] [--runs R]
 */
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import type { WrittenCsvFile } from '../../src/io/writeCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { checkQuadraticBlock } from '../../src/io/quadraticElementChecks.ts'
import { detectAll } from './dialectDetection.ts'
import { syntheticModel } from './syntheticModel.ts'
import v8 from 'node:v8'
import vm from 'node:vm'
import { measure, median } from './timing.ts'

const argv = process.argv.slice(2)
const opt = (name: string, dflt: number): number => {
  const i = argv.indexOf(name)
  return i < 0 ? dflt : Number(argv[i + 1])
}
const ELEMENTS = opt('--elements', 1e6)
/** Significant digits of the numbers written (0: the shortest round-trip form, up to 17). */
const DIGITS = opt('--digits', 0)
const RUNS = opt('--runs', 5)
const log = (s: string) => process.stderr.write(s + '\n')

log(`generating a tet4 block of about ${ELEMENTS} elements`)
const model = syntheticModel('tet4', ELEMENTS, 7)
if (DIGITS > 0) {
  // As solvers print them (%.6e-like): the parser's fast path.
  const round = (a: Float64Array) => { for (let i = 0; i < a.length; i++) a[i] = Number(a[i].toPrecision(DIGITS)) }
  round(model.mesh.coords); round(model.stress)
}
const plain = writeCsvBundle(model)
const bytesOf = (files: readonly WrittenCsvFile[]) => files.reduce((s, f) => s + f.text.length, 0)

/** The same bundle in another dialect: every line's fields re-joined, numbers rewritten by `num`. */
function rewrite(files: readonly WrittenCsvFile[], sep: string, num: (s: string) => string, extra: { json?: object; rename?: Record<string, string>; header?: (role: string, h: string) => string } = {}): WrittenCsvFile[] {
  const out: WrittenCsvFile[] = []
  for (const f of files) {
    if (f.name === 'model.json') {
      const meta = JSON.parse(f.text) as Record<string, unknown>
      out.push({ name: f.name, text: JSON.stringify({ ...meta, ...extra.json }) })
      continue
    }
    const role = f.name.replace(/\.csv$/, '')
    const lines = f.text.split('\n')
    const head = extra.header ? extra.header(role, lines[0]) : lines[0]
    const body = lines.slice(1).map((l) => l.split(',').map(num).join(sep))
    out.push({ name: extra.rename?.[f.name] ?? f.name, text: [head.split(',').join(sep), ...body].join('\n') })
  }
  return out
}

const variants: { label: string; files: WrittenCsvFile[] }[] = [
  { label: 'comma, decimal point', files: plain },
  { label: 'comma, decimal point (again)', files: plain },
  { label: 'semicolon, decimal comma', files: rewrite(plain, ';', (s) => s.replace('.', ',')) },
  { label: 'tab', files: rewrite(plain, '\t', (s) => s) },
  { label: 'spaces, D exponents', files: rewrite(plain, '  ', (s) => s.replace(/(\d)e/, '$1D')) },
  {
    label: 'mapped names, units, extra',
    files: rewrite(plain, ',', (s) => s, {
      rename: { 'nodes.csv': 'mesh_nodes.txt', 'stress.csv': 'nodal_stress.txt' },
      json: { files: { nodes: 'mesh_nodes.txt', stress: 'nodal_stress.txt' }, columns: { nodes: { id: 'Node' }, stress: { id: 'Node', sxx: 'S11' } }, units: { length: 'm' } },
      header: (role, h) => role === 'nodes' ? 'Node,x [m],y [m],z [m]' : role === 'stress' ? h.replace('id', 'Node').replace('sxx', 'S11 (Pa)') : h,
    }),
  },
]

// A collection before each timed read, so one read's garbage is not billed to the next (as in
// timing.ts, which sets the flag too).
v8.setFlagsFromString('--expose-gc')
const gc = vm.runInNewContext('gc') as () => void
// Rounds that read every variant once, so the optimiser's warm-up and the machine's load fall on
// all of them alike; the median of the rounds per variant.
const samples = variants.map(() => ({ wall: [] as number[], cpu: [] as number[] }))
let reference: ReturnType<typeof readCsvBundle> | null = null
const same: boolean[] = variants.map(() => true)
const readable = variants.map((v) => { try { readCsvBundle(v.files); return true } catch (e) { log(`  ${v.label} not read: ${e instanceof Error ? e.message : String(e)}`); return false } })
for (let round = -1; round < RUNS; round++) {
  log(`round ${round + 1} of ${RUNS} (0: warm-up)`)
  // Each round starts at another variant: the first read after the others' garbage is slower,
  // and no variant should always be first.
  variants.forEach((_, n) => {
    const i = (n + round + variants.length) % variants.length
    const v = variants[i]
    if (!readable[i]) return
    gc()
    const c0 = process.cpuUsage(), t0 = performance.now()
    const m = readCsvBundle(v.files)
    const wall = performance.now() - t0, c = process.cpuUsage(c0)
    if (round >= 0) { samples[i].wall.push(wall); samples[i].cpu.push((c.user + c.system) / 1000) }
    if (reference === null) reference = m
    const r = reference as ReturnType<typeof readCsvBundle>
    same[i] = same[i] && r.stress.every((x, k) => Object.is(x, m.stress[k])) && r.mesh.coords.every((x, k) => Object.is(x, m.mesh.coords[k]))
  })
}
const results: Record<string, unknown>[] = []
variants.forEach((v, i) => {
  if (!readable[i]) return
  const mb = bytesOf(v.files) / 1e6
  const medianMs = median(samples[i].wall), cpuMs = median(samples[i].cpu)
  results.push({ label: v.label, mb, medianMs, cpuMs, mbPerS: mb / (medianMs / 1e3), cpuMbPerS: mb / (cpuMs / 1e3), sameNumbers: same[i] })
})

/** Detection and mapping alone: the dialect and header of each file, the columns matched; no rows. */
const detection = variants.filter((v) => v.label === 'comma, decimal point' || v.label === 'semicolon, decimal comma').map((v) => ({ label: v.label, t: measure(() => detectAll(v.files), { runs: 21, minRuns: 5, warmup: 3, warmupMs: 0 }) }))

log('quadratic-element checks on a tet10 block')
const n10 = Math.max(1, Math.round(Math.cbrt(ELEMENTS / 6)))
const tet10 = boxMesh({ nx: n10, ny: n10, nz: n10, lx: 1, ly: 1, lz: 1 }, 'tet10')
const block = tet10.blocks[0]
const check = measure(() => checkQuadraticBlock(tet10.coords, block.type, block.conn), { runs: RUNS, minRuns: 3, warmup: 2, warmupMs: 0 })

const base = results[0] as { medianMs: number; cpuMs: number } | undefined
console.log(`tet4 block: ${model.mesh.elementCount} elements, ${model.mesh.nodeCount} nodes, ${(bytesOf(plain) / 1e6).toFixed(1)} MB of CSV`)
for (const r of results as { label: string; mb: number; medianMs: number; cpuMs: number; mbPerS: number; cpuMbPerS: number; sameNumbers: boolean }[]) {
  const over = base ? `${(((r.cpuMs / base.cpuMs) - 1) * 100).toFixed(1).padStart(6)} % cpu vs plain` : ''
  console.log(`${r.label.padEnd(30)} ${r.mb.toFixed(1).padStart(6)} MB  wall ${r.medianMs.toFixed(0).padStart(5)} ms ${r.mbPerS.toFixed(0).padStart(4)} MB/s  cpu ${r.cpuMs.toFixed(0).padStart(5)} ms ${r.cpuMbPerS.toFixed(0).padStart(4)} MB/s  ${over}  same numbers: ${r.sameNumbers}`)
}
for (const d of detection) {
  const r = (results as { label: string; medianMs: number }[]).find((x) => x.label === d.label)
  console.log(`detection + mapping, ${d.label}: ${d.t.medianMs.toFixed(2)} ms wall, ${d.t.cpuMs.toFixed(2)} ms cpu${r ? ` = ${((100 * d.t.medianMs) / r.medianMs).toFixed(2)} % of the read` : ''}`)
}
console.log(`quadratic checks, ${block.ids.length} tet10: wall ${check.medianMs.toFixed(0)} ms, cpu ${check.cpuMs.toFixed(0)} ms (${(check.medianMs * 1e6 / block.ids.length).toFixed(0)} ns per element), result ${check.value === null ? 'no finding' : 'finding'}`)
console.log(JSON.stringify({ bench: 'csvDialects', elements: model.mesh.elementCount, results, detection: detection.map((d) => ({ label: d.label, medianMs: d.t.medianMs, cpuMs: d.t.cpuMs })), quadraticCheck: { elements: block.ids.length, medianMs: check.medianMs, cpuMs: check.cpuMs } }))
