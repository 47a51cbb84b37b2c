/**
 * The engine worker: keeps the loaded model and does every O(elements) job for the app, one job at
 * a time (the client queues them). Replies move their typed arrays by transfer. Input problems come
 * back as values ({ok: false, error}) with the file and line; anything else is a real bug and
 * rejects, and the client shows it and respawns the worker.
 */
import * as Comlink from 'comlink'
import { readModelFiles, readModelFilesInPieces } from '../src/io/index.ts'
import { jobBuffers } from '../src/io/csvPieces.ts'
import type { ReadModel } from '../src/io/intakeReport.ts'
import { isInputError } from '../src/model/errors.ts'
import type { Mesh, Model, Vec3 } from '../src/model/model.ts'
import { analysisInputOf, displayStressOf, runAnalysisAsync } from '../src/mechanics/analysisPipeline.ts'
import type { AnalysisInput, AnalysisStage, OffloadedStages } from '../src/mechanics/analysisPipeline.ts'
import { cutSection } from '../src/mechanics/sectionCut.ts'
import { allocateElementBalance, computeElementBalance } from '../src/mechanics/balanceAudit.ts'
import { modelStressField, nodalStressField } from '../src/model/stressField.ts'
import { extentAlong, sweepAlong, sweepCasesAlong, sweepTransfer, withCombinations } from './sweep.ts'
import { sortTrianglesSpatially, surfaceClusters } from '../src/mechanics/surfaceClusters.ts'
import { buildSurfaceTriangles, fillVertexPatch } from '../src/mechanics/surfaceTriangles.ts'
import { findLoadPatches } from '../src/mechanics/loadPatches.ts'
import { computeBalanceVerdict } from '../src/mechanics/balanceVerdict.ts'
import type { BalanceVerdictResult } from '../src/mechanics/balanceVerdict.ts'
import { LEAST_BALANCED_COUNT } from '../src/mechanics/balanceVerdict.ts'
import { projectReference } from '../src/mechanics/sectionAxes.ts'
import type { SectionAxesChoice } from '../src/mechanics/sectionAxes.ts'
import { ELEMENT_TYPES } from '../src/model/elementTypes.ts'
import { elementIdOf } from '../src/model/elementId.ts'
import { buildFeatureEdges } from '../src/mechanics/featureEdges.ts'
import { faceTransfer, sectionFace } from './sectionFace.ts'
import { readyPolygonViews } from '../src/mechanics/sectionDrawing.ts'
import { sampleSectionArrows, sampleSurfaceArrows } from '../src/mechanics/arrowSampling.ts'
import type { ArrowSamples } from '../src/mechanics/arrowSampling.ts'
import type { BodyBalance, BoundaryFaces, ElementBalance, LoadPatches, SectionPlane, SectionPolygons, SurfaceTractions } from '../src/mechanics/types.ts'
import type {
  AppError, ArrowBuffers, ArrowRequest, AuditSummary, ComputeOptions, CrashKind, CutInfo, CutOptions, CutReply, CutRequest, EngineApi,
  LeastBalancedElement, LoadedModel, ModelSource, ModelSummary, Outcome, PatchReply, PatchRule, ProbeRequest, ProgressCallback,
  SectionBuffers, SurfaceBuffers, InputFileRecord,
} from './protocol.ts'
import type { ComponentAxes, ComponentBuffers, LineReply, LineRequest, LoadExtras } from './protocol.ts'
import { buildComponentScalars } from '../src/mechanics/componentScalars.ts'
import type { ComponentScalars } from '../src/mechanics/componentScalars.ts'
import { checkAxes } from '../src/mechanics/componentAxes.ts'
import { displacementOnPolygons, faceMeanVectors, meanOverItems } from '../src/mechanics/deformation.ts'
import { buildElementGrid } from '../src/mechanics/elementGrid.ts'
import type { ElementGrid } from '../src/mechanics/elementGrid.ts'
import { analyseLine, lineThroughWall } from '../src/mechanics/lineAnalysis.ts'
import { syntheticModel } from './syntheticModel.ts'
import { readInputFiles, SLICE_BYTES } from './inputFiles.ts'
import { holdBackgroundDigests } from './inputDigest.ts'
import { buildElementChunks } from '../src/mechanics/elementChunks.ts'
import type { ElementChunks } from '../src/mechanics/elementChunks.ts'
import { tooLargeHint } from '../src/io/sizeGuard.ts'
import { casesOf, combinationsOf, findCase, firstCaseName, modelForCase } from '../src/model/loadCases.ts'
import type { Combination } from '../src/model/loadCases.ts'
import { sectionEnvelope } from '../src/mechanics/sectionEnvelope.ts'
import type { NodalInvariants, SectionResult } from '../src/mechanics/types.ts'
import type { AssemblySummary, CaseResultant, CaseShown, EnvelopeReply, EnvelopeRequest, SweepCaseRequest, SweepReply } from './protocol.ts'
import { probeModel } from './probe.ts'
import { KernelPool, POOL_MIN_ELEMENTS } from './kernelPool.ts'
import { checkLimit, loadAssembly, pieceFor, regionTriangles } from './assembly.ts'
import { caseSurface, jumpOf, loadExtras, surfaceNodesOf, surfaceStages, withVerdict } from './casePicture.ts'
import type { CaseBasis } from './casePicture.ts'
import type { PoolEndpoint, PoolRun } from './kernelPool.ts'
import type { PoolWorkerApi } from './kernelPool.worker.ts'

interface Loaded {
  model: Model
  // --- load cases: the model as read (every case), and the case shown ---
  base: Model
  shownCase: string
  faces: BoundaryFaces
  tractions: SurfaceTractions
  polygons: SectionPolygons | null
  /** Lines: the element grid, built on the first line through this model. */
  grid: ElementGrid | null
  /** Displacement at the current section's polygon vertices (3 per vertex), or null. */
  polygonDisplacement: Float64Array | null
  /** What finding the patches again needs: nodal von Mises, the element and body balance, the surface's vertex runs. */
  vonMises: Float64Array
  balance: ElementBalance
  body: BodyBalance
  /** What a case switch keeps of the load's picture: the surface's vertex runs, the feature edges' end nodes, the surface's nodes. */
  basis: CaseBasis
  /**
   * The elements in chunks with their boxes (elementChunks.ts) on a large model: built on a pool
   * worker once the model's first picture is shown (`pictureShown`), else here at the second cut.
   */
  chunks: ElementChunks | null
  /** Cuts made of this model so far; whether a pool worker is building the chunks. */
  cuts: number
  chunksOnPool: boolean
  /** The pool that builds the chunks once the first picture is shown (null: none, or asked already). */
  chunksPool: KernelPool | null
  /** Lets the input files' digests start (they wait for the first picture); the records with them. */
  startDigests: () => void
  digests: Promise<readonly InputFileRecord[]> | null
  /** The cut the app will likely ask for first (pictureShown), and the warm-up cut's reply kept for it (`cut` takes it once). */
  likelyCut: CutRequest | null
  prepared: { readonly key: string; readonly model: Model; readonly c: ReturnType<typeof computeCut> } | null
  /** A drag step's cut has been run once, thrown away, after the first cut shown (warmDrag). */
  dragWarmed: boolean
  /** Cuts asked for of this model (warmDrag runs only if none came after the one it follows). */
  cutsAsked: number
}

let current: Loaded | null = null
let computeOptions: ComputeOptions = {}
let pool: KernelPool | null = null

/** How long a load waits for the pool to come up before it runs without it (ms). */
const POOL_START_MS = 3000

/** Most pool workers we start, whatever the core count: beyond this the hand-over costs more than it saves. */
const MAX_POOL = 4

/** A pool worker behind comlink; a script that fails to load or a worker that dies rejects its call. */
function spawnPoolWorker(): PoolEndpoint {
  const w = new Worker(new URL('./kernelPool.worker.ts', import.meta.url), { type: 'module', name: 'tractus-pool' })
  const remote = Comlink.wrap<PoolWorkerApi>(w)
  const failure = new Promise<never>((_, reject) => {
    w.addEventListener('error', (ev) => { ev.preventDefault(); reject(new Error(ev.message || 'the pool worker stopped')) })
    w.addEventListener('messageerror', () => reject(new Error('a message to the pool worker could not be read')))
  })
  failure.catch(() => undefined)
  return {
    ping: () => Promise.race([remote.ping(), failure]),
    balance: (part, out) => Promise.race([remote.balance(part, out), failure]),
    invariants: (stress, out) => Promise.race([remote.invariants(stress, out), failure]),
    spread: (indicator, count) => Promise.race([remote.spread(indicator, count), failure]),
    csvPieces: (jobs) => Promise.race([remote.csvPieces(Comlink.transfer(jobs, jobBuffers(jobs))), failure]),
    chunks: (mesh) => Promise.race([remote.chunks(mesh), failure]),
    csvStream: (setup) => Promise.race([remote.csvStream(setup), failure]),
    terminate: () => { remote[Comlink.releaseProxy](); w.terminate() },
  }
}

/**
 * Starts the pool when the engine is configured, so its workers load their code while the page is
 * idle rather than during the first large load. One thread per core in all: the engine's own and
 * cores - 1 pool workers.
 */
function startPool(): void {
  pool?.dispose()
  pool = null
  if (typeof Worker === 'undefined') return
  const cores = Math.min(MAX_POOL + 1, Math.max(1, self.navigator?.hardwareConcurrency ?? 1))
  const size = (computeOptions.threads ?? cores) - 1
  if (size < 1) return
  const shared = self.crossOriginIsolated === true && typeof SharedArrayBuffer !== 'undefined' && computeOptions.sharing !== 'copy'
  pool = new KernelPool(size, spawnPoolWorker, shared ? 'shared' : 'copy')
}

/** Files of 16 MiB or more together are read in pieces on the pool (src/io/csvPieces.ts), when it is up. */
const PIECES_MIN_BYTES = 16 * 2 ** 20

/** The model of the files handed over: a large CSV bundle's first tables read in pieces on the pool, the same model bit for bit. */
async function readFiles(files: Parameters<typeof readModelFiles>[0], units: Extract<ModelSource, { kind: 'files' }>['units']) {
  const options = units ? { units } : {}
  const bytes = files.reduce((s, f) => s + (typeof f.data === 'string' ? f.data.length : f.data.byteLength), 0)
  const lanes = pool && bytes >= PIECES_MIN_BYTES && await pool.upWithin(POOL_START_MS) ? pool.csvLanes() : []
  return lanes.length ? readModelFilesInPieces(files, options, lanes) : readModelFiles(files, options)
}

/** Wall time of each load stage (ms), in order, for the summary. */
function stageClock(): { mark(stage: string): void; stages: [string, number][] } {
  const stages: [string, number][] = []
  let stage = '', t = performance.now()
  return {
    stages,
    mark(next: string) {
      const now = performance.now()
      if (stage) stages.push([stage, Math.round((now - t) * 10) / 10])
      stage = next; t = now
    },
  }
}

/** Progress at most every ~10 ms, so a fast job does not flood the main thread with messages. */
function throttle(cb: ProgressCallback | undefined): (stage: string, fraction: number) => void {
  let last = -Infinity
  return (stage, fraction) => {
    const now = performance.now()
    if (!cb || (now - last < 10 && fraction < 1)) return
    last = now
    void Promise.resolve(cb({ stage, fraction })).catch(() => undefined)
  }
}

/** What the progress line says while each analysis stage runs, and how far the load is then. */
const STAGE_PROGRESS: Record<AnalysisStage, [string, number]> = {
  faces: ['Boundary faces', 0.3], tractions: ['Surface tractions', 0.45], invariants: ['Principal stresses', 0.55],
  elementBalance: ['Element balance', 0.65], bodyBalance: ['Body balance', 0.8], loadPatches: ['Load patches', 0.85], verdict: ['Balance verdict', 0.9],
}

/** The event loop gets a turn between stages, so progress messages leave while we compute. */
const yieldTurn = (): Promise<void> => new Promise((r) => setTimeout(r, 0))

function toAppError(e: unknown): AppError | null {
  if (!isInputError(e)) return null
  const w = e.where
  return { message: e.message, file: w.file, line: w.line, hint: e.kind === 'too-large' ? tooLargeHint(w.file) : hintFor(e.kind) }
}

function hintFor(kind: string): string | undefined {
  switch (kind) {
    case 'missing-file': return 'Choose nodes.csv, elements.csv and stress.csv together (model.json and displacement.csv are optional), or one .tractus file.'
    case 'header': case 'column-count': return 'Check the header row and the number of values on that line.'
    case 'not-a-number': case 'not-finite': return 'Each value must be a finite decimal number.'
    case 'missing-node': case 'missing-stress': return 'Every element node needs a row in nodes.csv and in stress.csv.'
    default: return undefined
  }
}

function boundsOf(x: Float64Array): { min: [number, number, number]; max: [number, number, number] } {
  const min: [number, number, number] = [Infinity, Infinity, Infinity]
  const max: [number, number, number] = [-Infinity, -Infinity, -Infinity]
  for (let i = 0; i < x.length; i += 3) {
    for (let k = 0; k < 3; k++) {
      const v = x[i + k]
      if (v < min[k]) min[k] = v
      if (v > max[k]) max[k] = v
    }
  }
  if (!(min[0] <= max[0])) return { min: [0, 0, 0], max: [1, 1, 1] } // no nodes: a unit box keeps the camera finite
  return { min, max }
}

function typeCounts(mesh: Mesh): Record<string, number> {
  const out: Record<string, number> = {}
  for (const b of mesh.blocks) out[b.type] = (out[b.type] ?? 0) + b.ids.length
  return out
}

function arrowTransfer(a: ArrowSamples): ArrayBuffer[] {
  return [a.origins.buffer, a.vectors.buffer, a.normals.buffer, a.magnitudes.buffer, a.normalTraction.buffer, a.weights.buffer, a.item.buffer] as ArrayBuffer[]
}

function sourceLabel(source: ModelSource): string {
  if (source.kind === 'synthetic') return `synthetic:block:${source.spec.elements}`
  return source.label ?? 'files:' + source.files.map((f) => f.name).join(',')
}

function componentTransfer(c: ComponentScalars): Float32Array[] {
  return Object.values(c.scalars).filter((x): x is Float32Array => x !== undefined)
}

function extrasTransfer(x: LoadExtras): Float32Array[] {
  return [...(x.deformation ? [x.deformation.surface, x.deformation.edges] : []), ...componentTransfer(x.components)]
}

/** Centre (mean of the corners) and radius (farthest node from it) of global element g, length units. */
function elementSphere(mesh: Mesh, g: number): { centre: Vec3; radius: number } {
  const b = mesh.blocks.find((x) => g >= x.offset && g < x.offset + x.ids.length)!
  const topo = ELEMENT_TYPES[b.type]
  const nn = topo.nodeCount, base = nn * (g - b.offset), x = mesh.coords
  const c: Vec3 = [0, 0, 0]
  for (let a = 0; a < topo.cornerCount; a++) for (let k = 0; k < 3; k++) c[k] += x[3 * b.conn[base + a] + k] / topo.cornerCount
  let r = 0
  for (let a = 0; a < nn; a++) {
    const i = b.conn[base + a]
    r = Math.max(r, Math.hypot(x[3 * i] - c[0], x[3 * i + 1] - c[1], x[3 * i + 2] - c[2]))
  }
  return { centre: c, radius: r }
}

/** The audit the app shows, from the pipeline's results (the least balanced elements with their ids and places). */
function auditSummary(mesh: Mesh, body: BodyBalance, patches: LoadPatches, verdict: BalanceVerdictResult, balance: ElementBalance): AuditSummary {
  const leastBalanced: LeastBalancedElement[] = verdict.leastBalanced.map((g) => ({ id: elementIdOf(mesh, g), indicator: balance.indicator[g], ...elementSphere(mesh, g) }))
  return {
    body,
    indicator: verdict.indicator,
    patches: patches.patches,
    threshold: patches.threshold,
    lowerThreshold: patches.lowerThreshold,
    fractions: patches.fractions,
    featureAngle: patches.featureAngle,
    referenceStress: patches.referenceStress,
    freeSurface: patches.freeSurface,
    freeSurfaceForce: verdict.freeSurfaceForce,
    verdict: verdict.verdict,
    leastBalanced,
  }
}

/**
 * The axes of a cut or sweep along unit normal m: a reference parallel to m is replaced by the
 * default one, with a note that says so (the card shows it).
 */
function checkedAxes(m: Vec3, axes: SectionAxesChoice | undefined): { axes: SectionAxesChoice | undefined; note?: string } {
  if (!axes?.reference) return { axes }
  try {
    projectReference(m, axes.reference)
    return { axes }
  } catch (e) {
    if (!isInputError(e)) throw e
    return { axes: { kind: axes.kind }, note: `${e.message}. The default reference is used instead.` }
  }
}

/** The summary's figures of the mesh and the case (all but the source and the compute record). */
function summaryFigures(model: Model, faces: BoundaryFaces, stress: AnalysisInput['stress']): Omit<ModelSummary, 'source' | 'compute'> {
  const mesh = model.mesh
  return {
    name: String(model.name ?? ''), description: String(model.description ?? ''), units: model.units,
    nodeCount: mesh.nodeCount, elementCount: mesh.elementCount, boundaryFaceCount: faces.count,
    elementTypes: typeCounts(mesh), bounds: boundsOf(mesh.coords), bodyForce: model.bodyForce,
    warnings: [...model.warnings], stressLayout: stress.layout,
  }
}

/**
 * What a load sends: the surface triangles with their scalars, the feature edges, the extras,
 * the summary's figures of the mesh and the case, and the buffers to transfer; and what a case
 * switch keeps of it (the basis).
 */
function pictureOf(
  model: Model, faces: BoundaryFaces, tractions: SurfaceTractions, invariants: NodalInvariants, balance: ElementBalance, body: BodyBalance, patches: LoadPatches, input: AnalysisInput,
): { basis: CaseBasis; surface: SurfaceBuffers; extras: LoadExtras; assembly: AssemblySummary | null; summary: Omit<ModelSummary, 'source' | 'compute'>; buffers: ArrayBuffer[] } {
  const mesh = model.mesh, stress = input.stress
  const tri = buildSurfaceTriangles(mesh.coords, faces, tractions, invariants, balance.indicator, patches.faceLabel, jumpOf(mesh, stress, patches))
  const edges = buildFeatureEdges(mesh.coords, faces)
  // the triangles in spatial order, so that the scene can leave out clusters that cannot show
  sortTrianglesSpatially(tri.positions, tri.index, [tri.triangleFace])
  // --- assemblies: parts, interfaces; the surface's triangles grouped by part (in place, stable) ---
  const assembly = loadAssembly(model, stress, faces, tractions, patches.faceLabel, tri.index, tri.triangleFace, tri.faceVertexStart)
  const clusters = surfaceClusters(tri.positions, tri.index, assembly ? assembly.partTriangles : null)
  const surface: SurfaceBuffers = {
    positions: tri.positions, normals: tri.normals, index: tri.index, scalars: tri.scalars,
    ranges: tri.ranges, patch: tri.patch, triangleFace: tri.triangleFace, edges: edges.segments, clusters,
  }
  const extras = loadExtras(model, faces, displayStressOf(input), tri.scalars, edges.nodes)
  const buffers = [tri.positions, tri.normals, tri.index, tri.triangleFace, tri.patch, edges.segments, clusters.start, clusters.bounds, ...Object.values(tri.scalars), ...extrasTransfer(extras),
    ...(assembly ? [assembly.partTriangles, assembly.vertexPart, assembly.interfacePositions, assembly.interfaceTriangles] : [])].map((a) => a.buffer as ArrayBuffer)
  const basis: CaseBasis = {
    faceVertexStart: tri.faceVertexStart, edgeNodes: edges.nodes, surfaceNodes: surfaceNodesOf(faces, mesh.nodeCount),
    body: { volume: body.volume, centroid: body.centroid },
  }
  return { basis, surface, extras, assembly, summary: summaryFigures(model, faces, stress), buffers }
}

/** What a case switch sends (CaseShown): workers/casePicture.ts's case surface, the summary's figures, and the buffers to transfer. */
function casePictureOf(
  model: Model, faces: BoundaryFaces, basis: CaseBasis, analysis: Parameters<typeof caseSurface>[3], input: AnalysisInput,
): { surface: CaseShown['surface']; extras: LoadExtras; assembly: CaseShown['assembly'] | null; summary: Omit<ModelSummary, 'source' | 'compute'>; buffers: ArrayBuffer[] } {
  const { surface, extras, assembly } = caseSurface(model, faces, basis, analysis, input)
  const buffers = [surface.patch, ...Object.values(surface.scalars), ...extrasTransfer(extras)].map((a) => a.buffer as ArrayBuffer)
  return { surface, extras, assembly, summary: summaryFigures(model, faces, input.stress), buffers }
}

// --- load cases ---

/** The model with the app's own combinations after its own (the app's replace its own of the same name). */

/** The name of case or combination `name` as the model spells it. */
function findCaseName(model: Model, name: string): string {
  const r = findCase(model, name)
  return r.kind === 'case' ? r.case.name : r.combination.name
}

/** What the summary says about the cases: the list, the model's combinations and the case shown. */
function caseSummary(model: Model, shown: string): Pick<ModelSummary, 'cases' | 'combinations' | 'shownCase'> {
  return {
    cases: casesOf(model).map((c) => ({ name: c.name, description: c.description, bodyForce: c.bodyForce ?? model.bodyForce, displacement: c.displacement !== null })),
    combinations: combinationsOf(model).map((c) => ({ name: c.name, factors: { ...c.factors } })),
    shownCase: shown,
  }
}

/**
 * The analysis of another case on the loaded mesh (workers/casePicture.ts): the boundary faces and
 * the surface's geometry kept, only the case's scalars, audit and extras computed and sent;
 * `current` then holds the case's fields. Where the pool shares memory and the mesh is large, the
 * element balance runs there beside the surface's stages (the mesh is shared since the load, so
 * only the case's stress is copied); elsewhere on this thread.
 */
async function analyseCase(cur: Loaded, base: Model, name: string, rule: PatchRule | undefined): Promise<{ value: CaseShown; buffers: ArrayBuffer[] }> {
  const clock = stageClock()
  // the case's fields: for a combination, the factored sum of its cases'
  clock.mark('fields')
  const model = modelForCase(base, name)
  const mesh = model.mesh
  const input = analysisInputOf(model)
  const p = pool && pool.sharing === 'shared' && pool.size > 0 && mesh.elementCount >= POOL_MIN_ELEMENTS ? pool : null
  let run: PoolRun = { workers: 0, sharing: 'none' }
  const pooled = p?.elementBalance(mesh, input.stress, input.bodyForce).then((r) => { run = r.run; return r.value })
  pooled?.catch(() => undefined)
  const early = surfaceStages(input, cur.faces, cur.basis, rule, clock.mark)
  clock.mark('elementBalance')
  const balance = pooled
    ? await pooled.finally(() => p?.forget())
    : computeElementBalance(allocateElementBalance(mesh.elementCount, 'single'), mesh, input.stress, input.bodyForce)
  // the indicator's spread on the pool (it reads the shared balance in place) while the surface's scalars are built here
  const spread = pooled && p ? p.indicatorSpread(balance.indicator, LEAST_BALANCED_COUNT) : undefined
  spread?.catch(() => undefined)
  clock.mark('surfaceBuffers')
  const { surface, extras, assembly, summary: figures, buffers } = casePictureOf(model, cur.faces, cur.basis, { ...early, elementBalance: balance }, input)
  const analysis = withVerdict(input, cur.faces, early, balance, clock.mark, spread ? await spread : undefined)
  const { tractions, invariants, bodyBalance: body, loadPatches: patches, verdict } = analysis
  clock.mark('')
  const summary: ModelSummary = { ...figures, source: '', compute: { stagesMs: clock.stages, workers: run.workers, sharing: run.sharing, ...(run.fallback ? { fallback: run.fallback } : {}) } }
  cur.model = model
  cur.tractions = tractions
  cur.polygons = null
  cur.polygonDisplacement = null
  cur.vonMises = invariants.vonMises
  cur.balance = balance
  cur.body = body
  const value: CaseShown = { summary, surface, audit: auditSummary(mesh, body, patches, verdict, balance), extras, ...(assembly ? { assembly } : {}) }
  return { value, buffers }
}

/** Below this many elements a cut scans every element quickly enough: no chunks. */
const CHUNKS_MIN_ELEMENTS = 100_000

/**
 * The chunks of the loaded mesh: the same for every case, plane and normal. A pool worker builds
 * them after the load (a pass over the corners: 0.2 s in Node, about 1 s in the browser at 10^7
 * tet4), and the cuts until then scan every element; without a pool they are built here at the
 * second cut, so a single cut is not delayed and a drag pays it once.
 */
function chunksFor(cur: Loaded): ElementChunks | null {
  if (cur.chunks || cur.model.mesh.elementCount < CHUNKS_MIN_ELEMENTS || cur.chunksOnPool || cur.cuts++ === 0) return cur.chunks
  cur.chunks = buildElementChunks(cur.model.mesh)
  return cur.chunks
}

/**
 * Starts the chunks' build on the pool for the model just loaded (its mesh in shared memory).
 * Asked for when the app has shown the model's first picture (`pictureShown`), not with the load's
 * reply: on two cores the build (and the warm-up cut after it) would otherwise take a core from
 * the software rasteriser drawing that picture (at 10^7 elements on the generated block its frame
 * took 620-720 ms with them, 334-398 ms after them, measured).
 */
function chunksOnPool(p: KernelPool | null, loaded: Loaded): void {
  if (!p || loaded.model.mesh.elementCount < CHUNKS_MIN_ELEMENTS) return
  loaded.chunksOnPool = true
  p.elementChunks(loaded.model.mesh).then(
    (c) => {
      loaded.chunks ??= c; loaded.chunksOnPool = false
      if (current === loaded && c) warmCut(loaded)
    },
    () => { loaded.chunksOnPool = false },
  )
}

/**
 * A cut of the loaded model as the app asks for it (the reply, what it transfers, and the drawn
 * polygons the probe reads); `chunks` the element chunks to use (chunksFor).
 */
function computeCut(cur: Loaded, plane: SectionPlane, arrows: ArrowRequest, options: CutOptions, chunks: ElementChunks | null) {
  const { model, faces, tractions } = cur
  const started = performance.now()
  const n = Math.hypot(...plane.normal)
  const { axes, note } = checkedAxes([plane.normal[0] / n, plane.normal[1] / n, plane.normal[2] / n], options.axes)
  // --- assemblies: regions and a bounded section ---
  const field = modelStressField(model)
  const limit = checkLimit(options.limit, model)
  const { result, polygons, labels } = cutSection(model.mesh, field, model.bodyForce, plane, {
    faces, tractions, polygons: true, polygonViews: true, axes, regions: options.regions === true, limit, partPiece: pieceFor(model, field, limit), chunks,
  })
  const info: CutInfo = { ...(note ? { axesNote: note } : {}), ...(result.empty ? { extent: extentAlong(model.mesh.coords, plane.normal) } : {}) }
  if (!polygons || polygons.count === 0) {
    const value: CutReply = { result, buffers: null, computeMs: performance.now() - started, info }
    return { value, transfer: [] as ArrayBuffer[], polygons, polygonDisplacement: null }
  }
  const a = sampleSectionArrows(polygons, result.plane.normal, { mode: arrows.mode, budget: arrows.budget })
  // The deformed shape moves the section face and its arrows with the material.
  const u = model.displacement
  const pu = u ? displacementOnPolygons(model.mesh, u, polygons) : null
  // the full face and, for a software renderer, the light one drawn while dragging (sectionFace.ts)
  const f = sectionFace(polygons, result.plane.normal, options.lightFace, pu ? pu.subarray(3 * polygons.start[0]) : undefined, labels !== null && result.regions !== undefined)
  const regionTris = labels && result.regions && f.triangleElement ? regionTriangles(labels, result.regions.length, f.face.index, f.triangleElement) : null
  const arrowU = pu ? meanOverItems(a.item, polygons.start, pu) : undefined
  const buffers: SectionBuffers = {
    ...f.face, ranges: f.ranges, arrows: arrowU ? { ...a, displacement: arrowU } : a, ...(f.light ? { light: f.light } : {}),
  }
  const list = [...faceTransfer(f.face), ...faceTransfer(f.light), ...(arrowU ? [arrowU.buffer as ArrayBuffer] : [])]
  const value: CutReply = { result, buffers, computeMs: performance.now() - started, info, ...(regionTris ? { regionTriangles: regionTris } : {}) }
  return { value, transfer: [...list, ...arrowTransfer(a), ...(regionTris ? [regionTris.buffer as ArrayBuffer] : [])], polygons, polygonDisplacement: pu }
}

/**
 * One cut once the chunks are in: the cut the app said it will likely ask for first
 * (`pictureShown`: the section's switch as it stands), whose reply is kept for that request; else
 * one through the middle of the model, as the app asks for a section (regions, arrows), thrown
 * away. The first cut a user asks for would otherwise run the cut's code cold (interpreted, then
 * compiled while it runs: at 10^7 tet4 in the browser, 0.26–0.57 s against 0.1 s for the next
 * ones). It runs between the engine's jobs right after the load and costs one cut (a request
 * arriving meanwhile waits for it); the cut's kept arrays are then sized for this model with
 * room to spare (readyPolygonViews), and the next cuts reuse them.
 */
function warmCut(loaded: Loaded): void {
  try {
    const likely = loaded.likelyCut
    if (likely) {
      // the cut the app asks for when the section is switched on: kept for that request
      const c = computeCut(loaded, likely.plane, likely.arrows, likely.options, loaded.chunks)
      loaded.prepared = { key: cutRequestKey(likely), model: loaded.model, c }
    } else {
      const b = boundsOf(loaded.model.mesh.coords)
      const point: Vec3 = [(b.min[0] + b.max[0]) / 2, (b.min[1] + b.max[1]) / 2, (b.min[2] + b.max[2]) / 2]
      computeCut(loaded, { point, normal: [1, 0, 0] }, { mode: 'full', budget: WARM_ARROWS }, { regions: true }, loaded.chunks)
    }
    // makes new arrays where the sets are short: the kept reply's polygons (views) stay whole
    readyPolygonViews()
  } catch { /* only a warm-up: the user's own cut reports any error */ }
}

/**
 * A drag step's cut of the plane just shown, thrown away: run once per model with element
 * chunks, half a second after the first cut the app shows (while the user looks at it). The
 * first cuts of a drag ran slower than the later ones in the browser (at 10^7 elements: 304, 243,
 * 201, then about 150 ms of the engine's own compute), the code of a drag step's cut still being
 * compiled; this one pays for the first of them. It is left out when another cut was asked for
 * in the meantime; a request arriving while it runs waits for it (one cut). Its polygons take the
 * other set of kept arrays (polygonViews), so those of the cut shown, which the probe reads, stay
 * whole.
 */
function warmDrag(cur: Loaded, shown: CutRequest): void {
  if (current !== cur) return
  const light = shown.options.lightFace !== undefined
  try {
    computeCut(cur, shown.plane, light ? { ...shown.arrows, budget: 0 } : shown.arrows, { ...shown.options, regions: false, ...(light ? { lightFace: 'only' as const } : {}) }, cur.chunks)
  } catch { /* only a warm-up */ }
}

/** How long after the first cut shown its drag step's warm-up waits (ms): the section's first frame took 185-370 ms at 10^7. */
const DRAG_WARM_DELAY_MS = 500

/** A cut request as a key: the same request gives the same text (the client builds both the same way). */
function cutRequestKey(r: CutRequest): string {
  return JSON.stringify([r.plane.point, r.plane.normal, r.arrows.mode, r.arrows.budget, r.options.axes ?? null, r.options.regions === true, r.options.limit ?? null, r.options.lightFace ?? null])
}

/** How long the background digests pause after a cut starts and after it ends (ms): longer than a drag's pause between cuts. */
const DIGEST_HOLD_MS = 1500

/** Arrows sampled by the warm-up cut (the sampling's code runs; the count hardly matters). */
const WARM_ARROWS = 150

const api: EngineApi = {
  configure(options: ComputeOptions) {
    computeOptions = options
    startPool()
  },

  pictureShown(likelyCut?: CutRequest) {
    const cur = current
    if (cur) cur.likelyCut = likelyCut ?? null
    cur?.startDigests()
    if (!cur || !cur.chunksPool || cur.chunks) return
    const p = cur.chunksPool
    cur.chunksPool = null
    chunksOnPool(p, cur)
  },

  async load(source: ModelSource, onProgress?: ProgressCallback, rule?: PatchRule): Promise<Outcome<LoadedModel>> {
    const report = throttle(onProgress)
    const clock = stageClock()
    try {
      report(source.kind === 'files' ? 'Reading files' : 'Generating model', 0)
      await yieldTurn()
      clock.mark(source.kind === 'files' ? 'read' : 'generate')
      // The user's files come as Blobs and are read here, in slices (workers/inputFiles.ts).
      let inputs: readonly InputFileRecord[] | undefined
      let digested: Promise<InputFileRecord[]> | null = null
      // the files' digests wait for the first picture (pictureShown), not to share the cores with the load
      let startDigests = (): void => {}
      const gate = new Promise<void>((resolve) => { startDigests = resolve })
      let model: Model
      if (source.kind === 'files') {
        // a container straight into shared memory when the pool shares the model: no copy later
        const read = await readInputFiles(source.files, (f) => report('Reading files', 0.2 * f), SLICE_BYTES, pool?.sharing === 'shared' && pool.size > 0, gate)
        if (read.records.length > 0) { digested = read.inputs; inputs = read.records }
        clock.mark('parse')
        model = await readFiles(read.files, source.units)
      } else model = syntheticModel(source.spec)
      const mesh = model.mesh
      const input = analysisInputOf(model)
      let sharedMesh = mesh
      // The element balance and the invariants need no faces: on a pool they run beside the
      // boundary and traction stages, and the pipeline awaits them at their turn.
      const p = pool && mesh.elementCount >= POOL_MIN_ELEMENTS && await pool.upWithin(POOL_START_MS) ? pool : null
      let run: PoolRun = { workers: 0, sharing: 'none' }
      const offloaded: OffloadedStages = p
        ? {
            elementBalance: p.elementBalance(mesh, input.stress, input.bodyForce).then((r) => { run = r.run; return r.value }),
            invariants: p.nodalInvariants(displayStressOf(input)).then((r) => r.value),
          }
        : {}
      offloaded.elementBalance?.catch(() => undefined)
      offloaded.invariants?.catch(() => undefined)
      const { faces, tractions, invariants, elementBalance: balance, bodyBalance: body, loadPatches: patches, verdict } = await runAnalysisAsync(
        input, { balancePrecision: 'single', ...(rule ? { loadPatches: rule } : {}) },
        { offloaded, beforeStage: async (stage) => { report(...STAGE_PROGRESS[stage]); await yieldTurn(); clock.mark(stage) } },
        ({ stage }) => {
          if (stage !== 'elementBalance' || !p) return
          // The model keeps the pool's shared copies of its mesh in place of its own arrays (no
          // second copy), so a case switch's balance on the pool copies only the case's stress.
          sharedMesh = p.sharedMesh(mesh)
          p.forget()
        },
      )
      report('Surface buffers', 0.95); await yieldTurn()
      clock.mark('surfaceBuffers')
      const { basis, surface, extras, assembly, summary: figures, buffers } = pictureOf(model, faces, tractions, invariants, balance, body, patches, input)
      if (!inputs && source.kind === 'files') inputs = source.inputs
      clock.mark('')
      const summary: ModelSummary = {
        ...figures, source: sourceLabel(source),
        compute: { stagesMs: clock.stages, workers: run.workers, sharing: run.sharing, ...(run.fallback ? { fallback: run.fallback } : {}) },
        ...(inputs ? { inputs } : {}), ...(digested ? { digestsPending: true } : {}),
        stressLayout: input.stress.layout,
        unitsDeclared: (model as Partial<ReadModel>).intake?.unitsDeclared ?? true,
        ...caseSummary(model, firstCaseName(model)),
      }
      // Only now, with everything computed, does the new model replace the old one.
      if (sharedMesh !== mesh) model = { ...model, mesh: sharedMesh }
      current = {
        model, base: model, shownCase: firstCaseName(model), faces, tractions, polygons: null, grid: null, polygonDisplacement: null,
        vonMises: invariants.vonMises, balance, body, basis, chunks: null, cuts: 0, chunksOnPool: false, chunksPool: p,
        startDigests, digests: digested, likelyCut: null, prepared: null, dragWarmed: false, cutsAsked: 0,
      }
      report('Done', 1)
      const value: LoadedModel = { summary, surface, audit: auditSummary(mesh, body, patches, verdict, balance), extras, ...(assembly ? { assembly } : {}) }
      return Comlink.transfer({ ok: true, value }, buffers)
    } catch (e) {
      const error = toAppError(e)
      if (error) return { ok: false, error }
      throw e
    }
  },

  async inputDigests(): Promise<readonly InputFileRecord[] | null> {
    const cur = current
    if (!cur || !cur.digests) return null
    cur.startDigests()
    return cur.digests
  },

  async surfaceArrows(req: ArrowRequest): Promise<ArrowBuffers | null> {
    if (!current) return null
    const a = sampleSurfaceArrows(current.faces, current.tractions, { mode: req.mode, budget: req.budget })
    // The deformed shape moves each arrow with the mean displacement of its face's nodes.
    const u = current.model.displacement
    const du = u ? faceMeanVectors(current.faces, u, a.item) : null
    return Comlink.transfer(du ? { ...a, displacement: du } : a, [...arrowTransfer(a), ...(du ? [du.buffer as ArrayBuffer] : [])])
  },

  async cut(plane: SectionPlane, arrows: ArrowRequest, options: CutOptions = {}): Promise<Outcome<CutReply>> {
    if (!current) return { ok: false, error: { message: 'No model is loaded.' } }
    // the files' digests, if still running, pause for the cut and a moment after it (the next
    // cut of a drag comes within it): a cut has the core the digest would take
    holdBackgroundDigests(DIGEST_HOLD_MS)
    current.cutsAsked++
    // the warm-up cut's reply, when this is the request it was made for (on the same model and
    // case, before any other cut: its polygons are views the next views cut may reuse)
    const prepared = current.prepared
    current.prepared = null
    try {
      const ready = prepared && prepared.model === current.model && prepared.key === cutRequestKey({ plane, arrows, options })
      const c = ready ? prepared.c : computeCut(current, plane, arrows, options, chunksFor(current))
      holdBackgroundDigests(DIGEST_HOLD_MS)
      current.polygons = c.polygons
      current.polygonDisplacement = c.polygonDisplacement
      if (!current.dragWarmed && options.regions === true && current.chunks) {
        current.dragWarmed = true
        const cur = current, asked = cur.cutsAsked
        // once this reply's picture is likely out (its frame would share the cores), unless
        // another cut came meanwhile: see warmDrag
        setTimeout(() => { if (cur.cutsAsked === asked) warmDrag(cur, { plane, arrows, options }) }, DRAG_WARM_DELAY_MS)
      }
      return Comlink.transfer({ ok: true, value: c.value }, c.transfer)
    } catch (e) {
      // the kept polygons are views that the cut after next overwrites (polygonViews): drop them
      current.polygons = null
      current.polygonDisplacement = null
      const error = toAppError(e)
      if (error) return { ok: false, error }
      throw e
    }
  },

  async sweep(normal: Vec3, count: number, from?: number, to?: number, axes?: SectionAxesChoice, cases?: SweepCaseRequest) {
    if (!current) return { ok: false, error: { message: 'No model is loaded.' } }
    const { model, faces, tractions } = current
    try {
      const shown = sweepAlong(model, faces, tractions, normal, count, from, to, axes)
      // --- load cases: every case at the same sections, each plane's stencil built once ---
      const all = cases ? sweepCasesAlong(current.base, shown, cases) : null
      const value: SweepReply = all ? { ...shown, cases: all } : shown
      return Comlink.transfer({ ok: true as const, value }, sweepTransfer(value))
    } catch (e) {
      const error = toAppError(e)
      if (error) return { ok: false, error }
      throw e
    }
  },

  async patches(rule: PatchRule): Promise<Outcome<PatchReply>> {
    if (!current) return { ok: false, error: { message: 'No model is loaded.' } }
    const { model, faces, tractions, vonMises, balance, body } = current
    const faceVertexStart = current.basis.faceVertexStart
    const mesh = model.mesh
    const patches = findLoadPatches(mesh, faces, tractions, vonMises, rule)
    const verdict = computeBalanceVerdict(faces, tractions, patches, body, balance, model.bodyForce)
    const patchLabel = fillVertexPatch(new Float32Array(faceVertexStart[faces.count]), faceVertexStart, patches.faceLabel)
    const value: PatchReply = { audit: auditSummary(mesh, body, patches, verdict, balance), patchLabel }
    return Comlink.transfer({ ok: true as const, value }, [patchLabel.buffer as ArrayBuffer])
  },

  async probe(req: ProbeRequest) {
    if (!current) return null
    return probeModel(current.model.mesh, modelStressField(current.model), current.faces, req.section ? current.polygons : null, req,
      current.model.displacement, req.section ? current.polygonDisplacement : null)
  },

  async components(axes: ComponentAxes): Promise<Outcome<ComponentBuffers>> {
    if (!current) return { ok: false, error: { message: 'No model is loaded.' } }
    try {
      const { model, faces } = current
      const c = buildComponentScalars(faces, model.mesh.coords, model.stress, model.displacement, checkAxes(axes))
      return Comlink.transfer({ ok: true as const, value: c }, componentTransfer(c))
    } catch (e) {
      const error = toAppError(e)
      if (error) return { ok: false, error }
      throw e
    }
  },

  async line(req: LineRequest): Promise<Outcome<LineReply>> {
    if (!current) return { ok: false, error: { message: 'No model is loaded.' } }
    try {
      const { model } = current
      const grid = current.grid ?? (current.grid = buildElementGrid(model.mesh))
      const r = analyseLine(model.mesh, grid, analysisInputOf(model).stress, model.displacement, req)
      const s = r.samples
      // Components in global axes are the stress itself: a copy, so both can be transferred.
      const components = r.components === s.stress ? s.stress.slice() : r.components
      const dc = r.displacementComponents && r.displacementComponents === s.displacement ? r.displacementComponents.slice() : r.displacementComponents
      const value: LineReply = {
        from: r.from, to: r.to, length: s.length, axes: r.axes, criterion: req.criterion,
        points: s.points, distance: s.distance, stress: s.stress, components, vonMises: s.vonMises, principal: s.principal,
        displacement: s.displacement, displacementComponents: dc, held: s.held,
        linearisation: r.linearisation, refused: r.refused, warnings: r.warnings, outside: r.outside,
      }
      const list = [s.points, s.distance, s.stress, components, s.vonMises, s.principal, s.held, ...(s.displacement ? [s.displacement] : []), ...(dc ? [dc] : [])]
      return Comlink.transfer({ ok: true as const, value }, list.map((x) => x.buffer as ArrayBuffer))
    } catch (e) {
      const error = toAppError(e)
      if (error) return { ok: false, error }
      throw e
    }
  },

  async lineThroughWall(from: Vec3, to: Vec3) {
    if (!current) return null
    const grid = current.grid ?? (current.grid = buildElementGrid(current.model.mesh))
    return lineThroughWall(current.model.mesh, grid, from, to)
  },

  // --- load cases ---
  async showCase(name: string, combinations: readonly Combination[], rule?: PatchRule): Promise<Outcome<CaseShown>> {
    if (!current) return { ok: false, error: { message: 'No model is loaded.' } }
    try {
      const base = withCombinations(current.base, combinations)
      const reply = await analyseCase(current, base, name, rule)
      current.shownCase = findCaseName(base, name)
      const value: CaseShown = { ...reply.value, summary: { ...reply.value.summary, ...caseSummary(current.base, current.shownCase) } }
      return Comlink.transfer({ ok: true as const, value }, reply.buffers)
    } catch (e) {
      const error = toAppError(e)
      if (error) return { ok: false, error }
      throw e
    }
  },

  async envelope(plane: SectionPlane, request: EnvelopeRequest): Promise<Outcome<EnvelopeReply>> {
    if (!current) return { ok: false, error: { message: 'No model is loaded.' } }
    const started = performance.now()
    try {
      const base = withCombinations(current.base, request.combinations)
      const n = Math.hypot(...plane.normal)
      const { axes } = checkedAxes([plane.normal[0] / n, plane.normal[1] / n, plane.normal[2] / n], request.axes)
      const cases = casesOf(base).map((c) => ({ name: c.name, field: c.stressField ?? nodalStressField(base.mesh, c.stress) }))
      const env = sectionEnvelope(base.mesh, cases, combinationsOf(base), plane, { regions: true, axes, combinationsOnly: request.combinationsOnly })
      const resultant = (name: string, kind: 'case' | 'combination', r: SectionResult): CaseResultant => ({ name, kind, axial: r.axial, shear: r.shear, torque: r.torque, bending: r.bending })
      const first = env.cases[0].section
      const value: EnvelopeReply = {
        plane, combinationsOnly: env.combinationsOnly,
        cases: env.cases.map((c) => resultant(c.name, c.kind, c.section)),
        envelope: first.empty ? null : env.envelope,
        regions: env.regions.map((g, i) => ({ ...g, cases: env.cases.map((c) => resultant(c.name, c.kind, c.regions[i])) })),
        axes: { e1: first.axes.e1, e2: first.axes.e2, e3: first.axes.e3, kind: first.axes.kind },
        computeMs: performance.now() - started,
      }
      return { ok: true, value }
    } catch (e) {
      const error = toAppError(e)
      if (error) return { ok: false, error }
      throw e
    }
  },

  dispose() {
    current = null
    pool?.dispose()
    self.close()
  },
}

// The end-to-end build only (vite build --mode e2e): a deliberate failure, so the browser tests can
// check that the app recovers. The release build drops this branch, string and all.
if (import.meta.env.MODE === 'e2e') {
  api.crash = async (kind: CrashKind = 'throw'): Promise<void> => {
    // 'memory' asks for far more memory than any browser grants, so the allocation really fails.
    if (kind === 'memory') { new Float64Array(2 ** 40); return }
    throw new Error('deliberate failure inside the engine (test hook)')
  }
}

Comlink.expose(api)
