/**
 * `npm run bench [-- --json] [-- --elements N] [-- --large L] [-- --seed S]` (`npm run -s bench --
 * --json` for JSON alone on stdout: npm's own banner goes to stdout too). Development runs:
 * --elements 100000 (the large model is then 10^6).
 *
 * Seeded synthetic blocks (syntheticModel.ts: tet4, the same tetrahedra as straight-sided tet10,
 * and hex8) with about N elements each (default 10^6) and a smooth analytic stress field, plus a
 * tet4 block of about L elements (default 10 N, so 10^7) for the load pipeline. For each kernel:
 * the median of several runs (one or two at the large size), its multiple of the streaming limit
 * (a pass that only reads what the kernel must read) and, on the tet4 block a decade smaller where
 * it is cheap, its speed-up over a plain baseline (string-keyed Map boundary; per-element objects
 * section cut). Then the cost growth of every kernel per type over three sizes a decade apart, the
 * growth of the whole load (read, faces, tractions, balance, patches) from N to L, the section cut
 * per type, lines, load cases (test/bench/loadCases.ts: all cases of a cut at once against one
 * cut, the case switch, the bytes of 50 cases), and the peak memory of a separate process. Checks of the results run outside
 * the timed loops. Prints a table then the JSON; with --json only the JSON (progress to stderr).
 */
import { spawnSync } from 'node:child_process'
import { mkdtempSync, rmSync, statSync } from 'node:fs'
import os from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { Model } from '../../src/model/model.ts'
import { readCsvBundle, readNative, writeCsvBundle, writeNative } from '../../src/io/index.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance } from '../../src/mechanics/balanceAudit.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { benchCutModel, cutInputs, cutRatiosInTurns } from './sectionCut.ts'
import type { CutBenchType, CutInputs } from './sectionCut.ts'
import { findLoadPatches } from '../../src/mechanics/loadPatches.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../src/mechanics/invariants.ts'
import { syntheticModel, cellsPerSide } from './syntheticModel.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { streamBytes, streamConnCoords, streamConnCoordsStress, streamEachByte } from './streamingLimit.ts'
import { asDiskFiles, bytesOfFiles } from './diskFiles.ts'
import { baselineBoundary } from './baseline/boundaryBaseline.ts'
import { baselineCut } from './baseline/cutBaseline.ts'
import { growthExponent, measure, measureTogether } from './timing.ts'
import { benchLines } from './lines.ts'
import { benchLoadCases, loadCaseLines } from './loadCases.ts'
import { detectAll } from './dialectDetection.ts'
import type { Timing } from './timing.ts'
import { partsCost } from './partsCost.ts'
import { benchCsvParallel, startBenchLanes } from './csvParallel.ts'
import type { ParallelCsvFigure } from './csvParallel.ts'

// ---------------------------------------------------------------- options
const argv = process.argv.slice(2)
const jsonOnly = argv.includes('--json')
const opt = (name: string, dflt: number): number => {
  const i = argv.indexOf(name)
  if (i < 0) return dflt
  const v = Number(argv[i + 1])
  if (!Number.isFinite(v) || v <= 0) { process.stderr.write(`bench: ${name} needs a positive number\n`); process.exit(1) }
  return v
}
const ELEMENTS = Math.round(opt('--elements', 1e6))
const LARGE = Math.round(opt('--large', 10 * ELEMENTS))
const SEED = Math.round(opt('--seed', 20261201))
const t0All = performance.now()
const log = (s: string) => process.stderr.write(s + '\n')

type KernelName = 'boundary' | 'audit' | 'elementBalance' | 'patches' | 'cut' | 'cutRegions' | 'readCsv' | 'readNative'
const KERNELS: readonly KernelName[] = ['boundary', 'audit', 'elementBalance', 'patches', 'cut', 'cutRegions', 'readCsv', 'readNative']
type BenchType = 'tet4' | 'tet10' | 'hex8'
const TYPES: readonly BenchType[] = ['tet4', 'tet10', 'hex8']

interface KernelFigure {
  /** null where the kernel was not run at this size (`skipped` says why). */
  medianMs: number
  /** Median CPU time of the same runs (see timing.ts: on a shared machine the fairer figure). */
  cpuMs: number
  /** Kernel time over the streaming-limit time (1 = as fast as reading the data). */
  vsStreaming: number
  /** Baseline time over kernel time (our speed-up), null where there is no baseline. */
  vsBaseline: number | null
  streamingMs: number
  baselineMs: number | null
  /** The same ratios from CPU times. */
  vsStreamingCpu: number
  vsBaselineCpu: number | null
  runs: number
  /** The first, cold call (what a one-shot command-line run pays). */
  firstMs: number
  mbPerS?: number
  skipped?: string
  /** readCsv only: the dialect detection and column mapping alone (test/bench/dialectDetection.ts), ms and share of the read. */
  detectionMs?: number
  detectionShare?: number
}

interface ModelFigures {
  type: BenchType
  cellsPerSide: number
  elements: number
  nodes: number
  modelBytes: number
  csvBytes: number
  kernels: Record<KernelName, KernelFigure> & {
    /** The CSV read in pieces on worker threads (csvParallel.ts): not in the growth fits, 10^6 blocks only. */
    readCsvParallel?: ParallelCsvFigure
  }
  checks: Record<string, number | boolean>
}

/** Runs per size: more for small models so medians stay steady. */
function runsFor(elements: number, large: number): number {
  return elements >= 5e5 ? large : elements >= 5e4 ? large * 2 : large * 4
}

function relDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let num = 0, den = 0
  for (let k = 0; k < a.length; k++) { num = Math.max(num, Math.abs(a[k] - b[k])); den = Math.max(den, Math.abs(a[k]), Math.abs(b[k])) }
  return den > 0 ? num / den : num
}

function sameArray(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i] && !(Number.isNaN(a[i]) && Number.isNaN(b[i]))) return false
  return true
}

// ---------------------------------------------------------------- one model
interface BenchOptions {
  /** Time the plain baselines too (slow: only on a small tet4 block). */
  readonly baselines: boolean
  /** Time the CSV read (off for the large block: its CSV texts would not fit in V8 strings). */
  readonly csv: boolean
  /** Fewer runs and shorter warm-ups: the growth sizes and the large block. */
  readonly quick: boolean
}

function benchModel(model: Model, o: BenchOptions, label: string): ModelFigures {
  const { mesh, stress, bodyForce } = model
  const E = mesh.elementCount
  const type = mesh.blocks[0].type as BenchType
  const n = cellsPerSide(type, E)
  const large = E >= 3e6
  // 10^7: one timed run after one warm-up (the first call is reported as firstMs); 10^6: 3-5.
  const R = large ? 1 : runsFor(E, o.quick ? 3 : 5)
  const minRuns = large ? 1 : o.quick ? 2 : 3
  const warm = (w: number) => ({ runs: R, minRuns, warmup: large ? 1 : w, warmupMs: large ? 0 : o.quick ? 300 : 1000 })
  const streamRuns = { runs: large ? 3 : runsFor(E, 7), warmupMs: large ? 0 : 1000 }
  const checks: Record<string, number | boolean> = {}
  const figure = (t: Timing<unknown>, streaming: Timing<unknown>, baseline: Timing<unknown> | null): KernelFigure => ({
    medianMs: t.medianMs, cpuMs: t.cpuMs,
    vsStreaming: t.medianMs / streaming.medianMs, vsBaseline: baseline === null ? null : baseline.medianMs / t.medianMs,
    streamingMs: streaming.medianMs, baselineMs: baseline?.medianMs ?? null,
    vsStreamingCpu: t.cpuMs / streaming.cpuMs, vsBaselineCpu: baseline === null ? null : baseline.cpuMs / t.cpuMs,
    runs: t.samplesMs.length, firstMs: t.firstMs,
  })

  log(`${label}: boundary faces with tractions`)
  const field = nodalStressField(mesh, stress)
  const boundary = measure(() => { const f = extractBoundaryFaces(mesh); return { faces: f, tractions: computeSurfaceTractions(allocateSurfaceTractions(f), mesh, field, f) } }, warm(3))
  const { faces, tractions } = boundary.value
  const streamCC = measure(() => streamConnCoords(mesh), streamRuns)
  checks.boundaryFaces = faces.count
  checks.boundaryFacesExpected = type === 'hex8' ? 6 * n * n : 12 * n * n
  let boundaryBaseline: Timing<unknown> | null = null
  if (o.baselines) {
    log(`${label}: plain boundary baseline`)
    const base = measure(() => baselineBoundary(mesh, stress), { runs: E >= 5e5 ? 1 : 3, minRuns: 1, warmup: 0, warmupMs: 0 })
    boundaryBaseline = base
    const sum = [0, 0, 0], sumBase = [0, 0, 0]
    for (let f = 0; f < faces.count; f++) for (let k = 0; k < 3; k++) sum[k] += Math.abs(tractions.force[3 * f + k])
    for (const f of base.value) for (let k = 0; k < 3; k++) sumBase[k] += Math.abs(f.force[k])
    checks.boundaryEqualsBaselineCount = base.value.length === faces.count
    checks.boundaryForceVsBaseline = relDiff(sum, sumBase)
  }

  log(`${label}: balance audit`)
  // the audit, the element balance alone and their streaming pass in turns (measureTogether)
  const auditRun = () => ({ elements: computeElementBalance(allocateElementBalance(E, 'single'), mesh, field, bodyForce), body: computeBodyBalance(mesh, faces, tractions, bodyForce) })
  const [audit, elementBalance, streamCCS] = measureTogether([
    auditRun,
    () => computeElementBalance(allocateElementBalance(E, 'single'), mesh, field, bodyForce),
    () => streamConnCoordsStress(mesh, stress),
  ], { rounds: large ? 3 : runsFor(E, 7), warmup: large ? 1 : 3, warmupMs: large ? 0 : o.quick ? 300 : 1000 })
  const auditValue = audit.value as ReturnType<typeof auditRun>
  checks.bodyBalanceRelative = auditValue.body.relative
  let maxIndicator = 0
  for (let i = 0; i < E; i++) if (auditValue.elements.indicator[i] > maxIndicator) maxIndicator = auditValue.elements.indicator[i]
  checks.elementIndicatorMax = maxIndicator

  log(`${label}: load-entry patches`)
  // The patch rule over the boundary faces (growth by the lower level, folds, parts); the nodal
  // von Mises it takes its reference from is computed once, outside the timing.
  const vonMises = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), stress).vonMises
  const patches = measure(() => findLoadPatches(mesh, faces, tractions, vonMises), warm(3))
  checks.loadPatches = patches.value.patches.length

  // the cut, the same cut split into regions (assemblies: sectionRegions.ts) and their streaming
  // pass in turns (measureTogether)
  log(`${label}: section cut, plain and with regions`)
  const cutRun = () => cutSection(mesh, field, bodyForce, BENCH_PLANE, { faces, tractions, polygons: false })
  const [cut, cutRegions, streamCut] = measureTogether([
    cutRun,
    () => cutSection(mesh, field, bodyForce, BENCH_PLANE, { faces, tractions, polygons: false, regions: true }),
    () => streamConnCoords(mesh),
  ], large ? { rounds: 5, warmup: 3, warmupMs: 0 } : { rounds: runsFor(E, 11), warmup: 15 })
  const r = (cut.value as ReturnType<typeof cutRun>).result
  checks.cutElements = r.cutElements
  checks.cutFreeBodyRelative = r.freeBody.relative
  checks.cutRegions = (cutRegions.value as ReturnType<typeof cutRun>).result.regions!.length
  checks.cutUnmappedPoints = r.unmappedPoints
  let cutBaseline: Timing<unknown> | null = null
  if (o.baselines) {
    log(`${label}: plain cut baseline`)
    const base = measure(() => baselineCut(mesh, stress, BENCH_PLANE.point, BENCH_PLANE.normal), { runs: E >= 5e5 ? 1 : 3, minRuns: 1, warmup: E >= 5e5 ? 0 : 1, warmupMs: 0 })
    cutBaseline = base
    checks.cutForceVsBaseline = relDiff(r.force, base.value.force)
    checks.cutAreaVsBaseline = relDiff([r.area], [base.value.area])
  }

  let readCsv: KernelFigure
  let csvBytes = 0
  if (o.csv) {
    log(`${label}: CSV read`)
    // The files' bytes, as the command line and the browser read them (src/io/csvBytes.ts).
    const files = asDiskFiles(writeCsvBundle(model))
    csvBytes = bytesOfFiles(files)
    // one warm-up and three timed reads (1–2 s each for tet10 and hex8: one read alone was at the
    // mercy of a busy spell on a shared machine)
    const csv = measure(() => readCsvBundle(files), { runs: runsFor(E, 3), minRuns: o.quick ? 1 : minRuns, warmup: 1, warmupMs: 0, budgetMs: Infinity })
    const streamCsv = measure(() => streamEachByte(files.map((f) => f.bytes!)), { runs: runsFor(E, 3) })
    checks.csvRoundTripCoords = sameArray(csv.value.mesh.coords, mesh.coords)
    checks.csvRoundTripStress = sameArray(csv.value.stress, stress)
    checks.csvRoundTripConn = sameArray(csv.value.mesh.blocks[0].conn, mesh.blocks[0].conn)
    // What finding out how the files are written costs: dialect and header mapping, no rows read.
    const detection = measure(() => detectAll(files), { runs: 11, minRuns: 3, warmup: 2, warmupMs: 0 })
    readCsv = { ...figure(csv, streamCsv, null), mbPerS: csvBytes / 1e6 / (csv.medianMs / 1000), detectionMs: detection.medianMs, detectionShare: detection.cpuMs / csv.cpuMs }
  } else {
    readCsv = {
      medianMs: NaN, cpuMs: NaN, vsStreaming: NaN, vsBaseline: null, streamingMs: NaN, baselineMs: null, vsStreamingCpu: NaN, vsBaselineCpu: null,
      runs: 0, firstMs: NaN, mbPerS: NaN, skipped: 'not run at this size: the CSV texts the bench writes for the block exceed what one V8 string holds (about 512 MiB); see the CSV read of the 10^6 blocks',
    }
  }

  log(`${label}: native read`)
  const bytes = writeNative(model)
  const native = measure(() => readNative(bytes, 'bench.tractus'), large ? { runs: 3, warmup: 1, warmupMs: 0 } : { runs: runsFor(E, o.quick ? 5 : 11), warmup: 5 })
  const streamNative = measure(() => streamBytes(bytes), { runs: runsFor(E, 11) })
  checks.nativeRoundTrip = sameArray(native.value.mesh.coords, mesh.coords) && sameArray(native.value.stress, stress) && sameArray(native.value.mesh.blocks[0].conn, mesh.blocks[0].conn)

  const kernels: Record<KernelName, KernelFigure> = {
    boundary: figure(boundary, streamCC, boundaryBaseline),
    audit: figure(audit, streamCCS, null),
    elementBalance: figure(elementBalance, streamCCS, null),
    patches: figure(patches, streamCC, null),
    cut: figure(cut, streamCut, cutBaseline),
    cutRegions: figure(cutRegions, streamCut, null),
    readCsv,
    readNative: { ...figure(native, streamNative, null), mbPerS: bytes.byteLength / 1e6 / (native.medianMs / 1000) },
  }
  return { type, cellsPerSide: n, elements: E, nodes: mesh.nodeCount, modelBytes: bytes.byteLength, csvBytes, kernels, checks }
}

/**
 * The whole load as the command line runs it, timed as one: native read, boundary faces with
 * tractions, element and body balance, load-entry patches (nodal von Mises for their reference
 * included). 10^6: one warm-up and three runs; the middle size two runs; 10^7 one run (its kernels
 * were warmed by the smaller blocks of the same run).
 */
function benchLoad(model: Model, label: string): { elements: number; medianMs: number; cpuMs: number; runs: number } {
  log(`${label}: whole load`)
  const bytes = writeNative(model)
  const E = model.mesh.elementCount
  const t = measure(() => {
    const m = readNative(bytes, 'bench.tractus')
    const field = nodalStressField(m.mesh, m.stress)
    const faces = extractBoundaryFaces(m.mesh)
    const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), m.mesh, field, faces)
    const elements = computeElementBalance(allocateElementBalance(m.mesh.elementCount, 'single'), m.mesh, field, m.bodyForce)
    const body = computeBodyBalance(m.mesh, faces, tractions, m.bodyForce)
    const vm = computeNodalInvariants(allocateNodalInvariants(m.mesh.nodeCount), m.stress).vonMises
    const patches = findLoadPatches(m.mesh, faces, tractions, vm)
    return elements.indicator.length + body.relative + patches.patches.length
  }, E >= 5e6 ? { runs: 1, minRuns: 1, warmup: 0, warmupMs: 0 } : E >= 2e6 ? { runs: 2, minRuns: 2, warmup: 0, warmupMs: 0 } : { runs: 3, minRuns: 2, warmup: 1, warmupMs: 0 })
  return { elements: E, medianMs: t.medianMs, cpuMs: t.cpuMs, runs: t.samplesMs.length }
}

// ---------------------------------------------------------------- memory in a fresh process
/**
 * Runs first, while this process is still small: the tet4 model is written by a child, then one
 * probe reads a one-cell model (idle) and one the real file (peak), each in its own process.
 */
function memoryProbe(elements: number, seed: number): { peakRssBytes: number; idleRssBytes: number; modelBytes: number } {
  const dir = mkdtempSync(join(os.tmpdir(), 'tractus-bench-'))
  try {
    const file = join(dir, 'bench.tractus')
    const probe = fileURLToPath(new URL('./memoryProbe.ts', import.meta.url))
    const tsx = import.meta.resolve('tsx')
    const once = (...args: string[]): string => {
      const res = spawnSync(process.execPath, ['--import', tsx, probe, ...args], { encoding: 'utf8' })
      if (res.status !== 0) throw new Error(`memory probe ${args.join(' ')} failed: ${res.stderr}`)
      return res.stdout
    }
    const peakOf = (out: string): number => JSON.parse(out.trim().split('\n').pop()!).peakRssBytes as number
    once('--write', file, String(elements), String(seed))
    return { idleRssBytes: peakOf(once('--empty')), peakRssBytes: peakOf(once(file)), modelBytes: statSync(file).size }
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

// ---------------------------------------------------------------- main
log(`bench: seed ${SEED}, about ${ELEMENTS} elements per type and ${LARGE} in the large tet4 block, ${os.cpus().length} cpus, Node ${process.version}, load average ${os.loadavg()[0].toFixed(2)}`)
const loadBefore = os.loadavg()[0]
const loadSamples: number[] = [loadBefore]
log('memory: separate processes')
const memory = memoryProbe(ELEMENTS, SEED)

// Per type: the blocks a decade and two decades smaller first (growth; the tet4 one a decade
// smaller also times the plain baselines, cheap there), then the full block, whose section cut is
// also timed per type back to back (test/bench/sectionCut.ts). What each full block's cut needs
// (the block itself, its faces and tractions) is kept until the three cuts are timed in turns
// after the loop; the smaller blocks are dropped as soon as they are timed.
const models: Record<string, ModelFigures> = {}
const growthByType: Record<string, { elements: number[]; kernels: Record<string, { exponent: number; timesMs: number[]; cpuMs: number[] }> }> = {}
const cutRows: Record<string, Record<string, number>> = {}
// what each type's cut needs, kept until the three are timed in turns after the loop
const cutInputsByType: Partial<Record<CutBenchType, CutInputs>> = {}
let baselineModel: ModelFigures | null = null
const loadRuns: { elements: number; medianMs: number; cpuMs: number; runs: number }[] = []
// Worker threads for the CSV read in pieces, started once (their start-up is reported apart).
log('CSV read in pieces: starting worker threads')
const csvLanes = await startBenchLanes()
for (const type of TYPES) {
  const runs: ModelFigures[] = []
  for (const size of [Math.round(ELEMENTS / 100), Math.round(ELEMENTS / 10)]) {
    const m = syntheticModel(type, size, SEED)
    const withBaselines = type === 'tet4' && size === Math.round(ELEMENTS / 10)
    const figures = benchModel(m, { baselines: withBaselines, csv: true, quick: true }, `growth ${type} ${m.mesh.elementCount}`)
    if (withBaselines) baselineModel = figures
    runs.push(figures)
  }
  const model = syntheticModel(type, ELEMENTS, SEED)
  models[type] = benchModel(model, { baselines: false, csv: true, quick: false }, `${type} ${model.mesh.elementCount}`)
  if (csvLanes.up) {
    log(`${type}: CSV read in pieces`)
    models[type].kernels.readCsvParallel = await benchCsvParallel(model, csvLanes.lanes, 3)
  }
  runs.push(models[type])
  log(`section cut per type: ${type}`)
  cutInputsByType[type] = cutInputs(model)
  cutRows[type] = benchCutModel(cutInputsByType[type]!, log, 1)
  const sizes = runs.map((g) => g.elements)
  const kernels: Record<string, { exponent: number; timesMs: number[]; cpuMs: number[] }> = {}
  for (const k of KERNELS) {
    const times = runs.map((g) => g.kernels[k].medianMs)
    kernels[k] = { exponent: growthExponent(sizes, times), timesMs: times, cpuMs: runs.map((g) => g.kernels[k].cpuMs) }
  }
  growthByType[type] = { elements: sizes, kernels }
  loadSamples.push(os.loadavg()[0])
}
await csvLanes.lanes.close()
// the types' cuts in turns, for their ratios to the tet4 cut (sectionCut.ts: cutRatiosInTurns)
log('section cut: the three types in turns')
const cutTurns = cutRatiosInTurns(cutInputsByType)
for (const t of TYPES) delete cutInputsByType[t]
const cutByType = { rows: cutRows, inTurns: cutTurns.times, rounds: cutTurns.rounds, tet10OverTet4: cutTurns.tet10OverTet4, hex8OverTet4: cutTurns.hex8OverTet4 }
// today's `growth` key: tet4
const growth = growthByType.tet4.kernels
const growthSizes = growthByType.tet4.elements

// The large tet4 block: the load pipeline at about 10^7 (the CSV read is not run there, see
// benchModel), and the whole load at a size between, for its growth over three sizes.
// The three loads back to back, so they share the compiler's state (the per-type runs in between
// would otherwise leave the first one better warmed than the others).
{
  const m = syntheticModel('tet4', ELEMENTS, SEED)
  loadRuns.push(benchLoad(m, `load tet4 ${m.mesh.elementCount}`))
}
{
  const mid = Math.round(Math.sqrt(ELEMENTS * LARGE))
  const m = syntheticModel('tet4', mid, SEED)
  loadRuns.push(benchLoad(m, `load tet4 ${m.mesh.elementCount}`))
}
{
  const large = syntheticModel('tet4', LARGE, SEED)
  models['tet4-large'] = benchModel(large, { baselines: false, csv: false, quick: true }, `tet4-large ${large.mesh.elementCount}`)
  loadRuns.push(benchLoad(large, `load tet4 ${large.mesh.elementCount}`))
  loadSamples.push(os.loadavg()[0])
}
const loadGrowth = {
  elements: loadRuns.map((r) => r.elements), timesMs: loadRuns.map((r) => r.medianMs), cpuMs: loadRuns.map((r) => r.cpuMs),
  exponent: growthExponent(loadRuns.map((r) => r.elements), loadRuns.map((r) => r.medianMs)),
  exponentCpu: growthExponent(loadRuns.map((r) => r.elements), loadRuns.map((r) => r.cpuMs)),
}

// ---------------------------------------------------------------- assemblies at load (partsCost.ts)
// What the part list, per-part faces, tractions and balance, the interfaces, and the faces against
// parts meshed apart add to the whole load: a one-part tet4 block with a part column, and the same
// block as four slabs of parts sharing nodes (three interfaces).
log('assemblies: the load with its part work, one part and four slabs')
const partsAtLoad = {
  onePart: partsCost(syntheticModel('tet4', ELEMENTS, SEED, 0.1, 1), 5),
  fourParts: partsCost(syntheticModel('tet4', ELEMENTS, SEED, 0.1, 4), 5),
}
loadSamples.push(os.loadavg()[0])

// Lines through the model: grid, point location, sampling and linearisation (test/bench/lines.ts).
log('lines: grid, point location, sampling, linearisation')
const lines = benchLines(syntheticModel('tet4', ELEMENTS, SEED), SEED)

// Load cases (test/bench/loadCases.ts): 50 cases and 2 combinations on tet4 and hex8 blocks, all
// cases of a cut at once against one cut, the case switch the worker runs (tet4), their memory.
const LOAD_CASES = 50
log(`load cases: ${LOAD_CASES} cases and 2 combinations`)
const loadCases = benchLoadCases(ELEMENTS, LOAD_CASES, log, { switchTypes: ['tet4'] })
loadSamples.push(os.loadavg()[0])

const tet = models.tet4
const k = tet.kernels
const memLimit = memory.idleRssBytes + 3 * tet.modelBytes
interface Target { name: string; appliesAt: string; value: number | null; cpu: number | null; pass: boolean; cpuPass: boolean | null }
const atMost = (name: string, appliesAt: string, value: number | null, cpu: number | null, limit: number): Target =>
  ({ name, appliesAt, value, cpu, pass: value !== null && value <= limit, cpuPass: cpu === null ? null : cpu <= limit })
const atLeast = (name: string, appliesAt: string, value: number | null, cpu: number | null, limit: number): Target =>
  ({ name, appliesAt, value, cpu, pass: value !== null && value >= limit, cpuPass: cpu === null ? null : cpu >= limit })
// `cpu`: the same figure from CPU time, shown beside the wall-clock one on a shared machine.
const targets: Target[] = []
for (const type of TYPES) {
  const m = models[type], x = m.kernels, at = `${type}, ${m.elements} elements`
  targets.push(atMost('boundary faces with tractions ≤ 500 ms', at, x.boundary.medianMs, x.boundary.cpuMs, 500))
  targets.push(atMost('element balance ≤ 5 × its streaming pass', at, x.elementBalance.vsStreaming, x.elementBalance.vsStreamingCpu, 5))
  targets.push(atMost('balance audit (element + body) ≤ 5 × streaming', at, x.audit.vsStreaming, x.audit.vsStreamingCpu, 5))
  targets.push(atMost('section cut with free body ≤ 4 × its streaming pass', at, x.cut.vsStreaming, x.cut.vsStreamingCpu, 4))
  if (type !== 'tet4') {
    const ratio = type === 'tet10' ? cutByType.tet10OverTet4! : cutByType.hex8OverTet4!
    targets.push(atMost(`${type} cut ≤ 3 × tet4 cut (same elements)`, at, ratio.medianOverTet4, ratio.cpuOverTet4, 3))
  }
  targets.push(atLeast('native read ≥ 1000 MB/s', at, x.readNative.mbPerS!, m.modelBytes / 1e3 / x.readNative.cpuMs, 1000))
  targets.push(atLeast('CSV read ≥ 150 MB/s (one thread)', at, x.readCsv.mbPerS!, m.csvBytes / 1e3 / x.readCsv.cpuMs, 150))
  const par = x.readCsvParallel
  targets.push(atLeast(`CSV read in pieces ≥ 1.4 × one thread (${par?.threads ?? 0} threads, load average ${f(par?.loadAverage[0])})`, at, par ? par.vsOneThread : null, null, 1.4))
  if (type === 'tet4') targets.push(atMost('dialect detection and column mapping < 10 % of the CSV read', at, x.readCsv.detectionMs! / x.readCsv.medianMs, x.readCsv.detectionShare!, 0.1))
}
const bk = baselineModel!.kernels, atBase = `tet4, ${baselineModel!.elements} elements (baselines are timed a decade below the main size)`
targets.push(atLeast('boundary ≥ 5 × the plain baseline', atBase, bk.boundary.vsBaseline, bk.boundary.vsBaselineCpu, 5))
targets.push(atMost('tet4 element balance audit ≤ 400 ms', `tet4, ${tet.elements} elements`, k.audit.medianMs, k.audit.cpuMs, 400))
targets.push(atMost('tet4 section cut with free body ≤ 20 ms', `tet4, ${tet.elements} elements`, k.cut.medianMs, k.cut.cpuMs, 20))
targets.push(atMost('regions add ≤ 25 % to the tet4 cut', `tet4, ${tet.elements} elements`, k.cutRegions.medianMs / k.cut.medianMs - 1, k.cutRegions.cpuMs / k.cut.cpuMs - 1, 0.25))
for (const [name, pc] of [['one part', partsAtLoad.onePart], ['four parts sharing nodes', partsAtLoad.fourParts]] as const) {
  targets.push(atMost(`parts and interfaces add ≤ 25 % to the load (${name})`, `tet4, ${pc.elements} elements`, pc.addedMedianWall, pc.addedMedian, 0.25))
}
targets.push(atMost('whole load growth exponent ≤ 1.1', `tet4, ${loadGrowth.elements.join(', ')} elements`, loadGrowth.exponent, loadGrowth.exponentCpu, 1.1))
for (const c of loadCases) {
  const at = `${c.type}, ${c.elements} elements, ${c.cases} cases + 2 combinations`
  targets.push(atMost('all cases of a cut at once ≤ 3 × one cut', at, c.ratio, c.ratioCpu, 3))
  targets.push(atMost('all cases of a cut at once, per region ≤ 3 × one cut with regions', at, c.ratioRegions, c.ratioRegionsCpu, 3))
  if (c.switchMs !== null) targets.push(atMost('case switch in the worker (to the combination of every case) ≤ 1000 ms', at, c.switchMs, c.switchCpuMs, 1000))
}
targets.push({ name: 'peak RSS ≤ idle + 3 × model bytes (MB)', appliesAt: `tet4, ${tet.elements} elements`, value: memory.peakRssBytes / 1e6, cpu: null, pass: memory.peakRssBytes <= memLimit, cpuPass: null })
const totalSeconds = (performance.now() - t0All) / 1000

const result = {
  kernels: tet.kernels,
  elements: tet.elements,
  modelBytes: tet.modelBytes,
  peakRssBytes: memory.peakRssBytes,
  idleRssBytes: memory.idleRssBytes,
  seed: SEED,
  machine: { loadAverage: [loadBefore, os.loadavg()[0]], loadSamples, cpus: os.cpus().length, cpuModel: os.cpus()[0]?.model ?? 'unknown', node: process.version, platform: `${os.platform()} ${os.arch()}`, totalMemBytes: os.totalmem() },
  models,
  growth: { elements: growthSizes, kernels: growth },
  growthByType,
  loadGrowth,
  sectionCutByType: cutByType,
  partsAtLoad,
  lines,
  loadCases,
  baselines: { elements: baselineModel!.elements, boundary: bk.boundary, cut: bk.cut, checks: baselineModel!.checks },
  targets,
  totalSeconds,
}

if (!jsonOnly) process.stdout.write(renderTables() + '\n')
process.stdout.write(JSON.stringify(result, null, 2) + '\n')

// ---------------------------------------------------------------- text tables
function f(v: number | null | undefined, digits = 3): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '-'
  const a = Math.abs(v)
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return v.toExponential(2)
  return a >= 100 ? v.toFixed(0) : v.toPrecision(digits)
}
function pad(rows: string[][]): string {
  const w: number[] = []
  for (const r of rows) r.forEach((c, i) => { w[i] = Math.max(w[i] ?? 0, c.length) })
  return rows.map((r) => r.map((c, i) => (i === 0 ? c.padEnd(w[i]) : c.padStart(w[i]))).join('  ')).join('\n')
}
function renderTables(): string {
  const out: string[] = []
  out.push(`Tractus benchmarks: seed ${SEED}, ${result.machine.cpus} × ${result.machine.cpuModel}, Node ${process.version}, ${result.machine.platform}`)
  out.push(`Load average at start ${f(loadBefore)}, during ${loadSamples.slice(1).map((v) => f(v)).join(', ')}, at end ${f(os.loadavg()[0])} (above ${result.machine.cpus}, other processes share the cores and wall-clock times grow; cpu ms counts this process only)`)
  for (const [name, m] of Object.entries(models)) {
    out.push('')
    out.push(`${name}: ${m.type} block, ${m.cellsPerSide}³ cells: ${m.elements} elements, ${m.nodes} nodes, native ${f(m.modelBytes / 1e6)} MB${m.csvBytes ? `, CSV ${f(m.csvBytes / 1e6)} MB` : ''}`)
    const rows = [['kernel', 'median ms', 'cpu ms', 'streaming ms', '× streaming', '× str. cpu', 'baseline ms', 'speed-up ×', 'MB/s', 'runs', 'first ms']]
    for (const kn of KERNELS) {
      const x = m.kernels[kn]
      rows.push([kn, f(x.medianMs), f(x.cpuMs), f(x.streamingMs), f(x.vsStreaming), f(x.vsStreamingCpu), f(x.baselineMs), f(x.vsBaseline), f(x.mbPerS), String(x.runs), f(x.firstMs)])
    }
    out.push(pad(rows))
    for (const kn of KERNELS) if (m.kernels[kn].skipped) out.push(`${kn}: ${m.kernels[kn].skipped}`)
    const par = m.kernels.readCsvParallel
    if (par) out.push(`readCsvParallel: ${f(par.medianMs)} ms, ${f(par.mbPerS)} MB/s on ${par.threads} threads, ${f(par.vsOneThread)} × one thread (${f(par.oneThreadMs)} ms, runs interleaved, load average ${f(par.loadAverage[0])} → ${f(par.loadAverage[1])}), same model ${par.same}; workers up in ${f(csvLanes.startMs)} ms`)
    out.push('checks: ' + Object.entries(m.checks).map(([a, b]) => `${a} ${typeof b === 'number' ? f(b) : b}`).join(', '))
  }
  out.push('')
  const bm = baselineModel!
  out.push(`Plain baselines (tet4, ${bm.elements} elements): boundary ${f(bm.kernels.boundary.baselineMs)} ms (${f(bm.kernels.boundary.vsBaseline)} × slower than ours), cut ${f(bm.kernels.cut.baselineMs)} ms (${f(bm.kernels.cut.vsBaseline)} ×)`)
  out.push('')
  out.push('Section cut per element type (free body included, polygons off; sweep: 200 sections, one run)')
  const ct = [['type', 'elements', 'nodes', 'cut elements', 'median ms', 'min ms', 'cpu ms', 'with polygons ms', 'sweep ms', 'unmapped']]
  for (const [t, r] of Object.entries(cutByType.rows)) ct.push([t, String(r.elements), String(r.nodes), String(r.cutElements), f(r.cutMedianMs), f(r.cutMinMs), f(r.cutCpuMs), f(r.cutWithPolygonsMedianMs), f(r.sweep200MedianMs), String(r.unmappedPoints)])
  out.push(pad(ct))
  out.push(`Cuts in turns (${cutByType.rounds} rounds): ${Object.entries(cutByType.inTurns).map(([t, r]) => `${t} ${f(r.cutMedianMs)} ms (min ${f(r.cutMinMs)})`).join(', ')}`)
  out.push(`tet10 / tet4: median ${f(cutByType.tet10OverTet4?.medianOverTet4)}, min ${f(cutByType.tet10OverTet4?.minOverTet4)}, cpu ${f(cutByType.tet10OverTet4?.cpuOverTet4)}; hex8 / tet4: median ${f(cutByType.hex8OverTet4?.medianOverTet4)}, min ${f(cutByType.hex8OverTet4?.minOverTet4)}, cpu ${f(cutByType.hex8OverTet4?.cpuOverTet4)}`)
  for (const type of TYPES) {
    const gt = growthByType[type]
    out.push('')
    out.push(`Cost growth (${type}), time ∝ elements^exponent over ${gt.elements.join(', ')} elements (median wall; cpu exponent beside)`)
    const g = [['kernel', ...gt.elements.map((e) => `${e} ms`), 'exponent', 'cpu exponent']]
    for (const kn of KERNELS) g.push([kn, ...gt.kernels[kn].timesMs.map((t) => f(t)), f(gt.kernels[kn].exponent), f(growthExponent(gt.elements, gt.kernels[kn].cpuMs))])
    out.push(pad(g))
  }
  out.push('')
  out.push(`Whole load (tet4: native read, boundary faces with tractions, element and body balance, patches), time ∝ elements^${f(loadGrowth.exponent)} (cpu ${f(loadGrowth.exponentCpu)})`)
  out.push(pad([['elements', ...loadGrowth.elements.map(String)], ['median ms', ...loadGrowth.timesMs.map((t) => f(t))], ['cpu ms', ...loadGrowth.cpuMs.map((t) => f(t))]]))
  out.push('')
  out.push('Assemblies at load (tet4): the whole load, then the part work the engine adds (part list; with two parts or more each part\'s faces, tractions, balance and the interfaces) and the faces against parts meshed apart (inside the patches stage), and the boundary extraction\'s recording of the faces between parts (with minus without part numbers)')
  const pt = [['model', 'elements', 'parts', 'interfaces', 'load cpu ms', 'parts cpu ms', 'interface faces cpu ms', 'pairs in extraction cpu ms', 'added (min cpu)', 'added (median cpu)', 'added (median wall)', '≤ 25 %']]
  for (const [name, pc] of [['one part', partsAtLoad.onePart], ['four slabs', partsAtLoad.fourParts]] as const) {
    pt.push([name, String(pc.elements), String(pc.parts), String(pc.interfaces), f(pc.loadCpuMs.median), f(pc.partsCpuMs.median), f(pc.interfaceFacesCpuMs.median), f(pc.extractionPartsCpuMs.median), `${f(100 * pc.addedMin)} %`, `${f(100 * pc.addedMedian)} %`, `${f(100 * pc.addedMedianWall)} %`, pc.addedMedian <= 0.25 ? '✓' : '✗'])
  }
  out.push(pad(pt))
  out.push('')
  out.push(`Lines (tet4, ${lines.elements} elements): grid ${f(lines.gridMs)} ms (${f(lines.gridVsStreaming)} × streaming, ${f(lines.gridItemsPerElement)} entries per element), point location ${f(lines.locateUsPerPoint)} µs per point, 1000-point line ${f(lines.sampleMs)} ms, linearisation across the block ${f(lines.lineariseMs)} ms (${lines.segments} segments); checks ${Object.entries(lines.checks).map(([a, b]) => `${a} ${typeof b === 'number' ? f(b) : b}`).join(', ')}`)
  out.push('')
  out.push(`Load cases (${LOAD_CASES} cases + 2 combinations; all cases of a cut at once ≤ 3 × one cut, the case switch ≤ 1 s)`)
  const mark = (ok: boolean) => (ok ? '✓' : '✗')
  for (const c of loadCases) {
    out.push(`${c.type}: all at once ${mark(c.ratio <= 3)} × ${f(c.ratio)} (cpu ${mark(c.ratioCpu <= 3)} × ${f(c.ratioCpu)}), per region ${mark(c.ratioRegions <= 3)} × ${f(c.ratioRegions)} (cpu ${mark(c.ratioRegionsCpu <= 3)} × ${f(c.ratioRegionsCpu)})` +
      (c.switchMs !== null ? `; case switch ${mark(c.switchMs <= 1000)} ${f(c.switchMs)} ms (cpu ${mark(c.switchCpuMs! <= 1000)} ${f(c.switchCpuMs)} ms)` : ''))
  }
  for (const line of loadCaseLines(loadCases)) out.push(line)
  out.push('')
  out.push(`Memory (separate process: native read, boundary, audit, one cut; peak = VmHWM): peak ${f(memory.peakRssBytes / 1e6)} MB, idle ${f(memory.idleRssBytes / 1e6)} MB, limit idle + 3 × ${f(tet.modelBytes / 1e6)} MB = ${f(memLimit / 1e6)} MB`)
  out.push('')
  out.push('Targets (stated for 10^6 elements per type; ratios to the yardsticks of this run)')
  out.push(pad([['target', 'applies at', 'measured', 'result', 'from cpu time', 'result'], ...targets.map((t) => [t.name, t.appliesAt, f(t.value), t.pass ? 'met' : 'MISSED', f(t.cpu), t.cpuPass === null ? '' : t.cpuPass ? 'met' : 'MISSED'])]))
  out.push('')
  out.push(`Total ${f(totalSeconds)} s`)
  return out.join('\n')
}
