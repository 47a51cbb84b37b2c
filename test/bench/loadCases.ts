/**
 * Load cases at about 10^6 elements (tet4 and hex8, seeded synthetic blocks):
 * - one single-case cut as the app runs it (boundary faces and tractions given), against all
 *   cases of the same cut at once (sectionEnvelope.ts: the stencil once, then one pass per case;
 *   50 cases and 2 combinations), and their ratio (the bound: at most 3);
 * - switching the case, the steps the engine worker takes (workers/engine.worker.ts, showCase;
 *   workers/casePicture.ts): the case's fields (modelForCase; for a combination of all 50 cases,
 *   the factored sum), the case's analysis with the load's boundary faces kept, and the case's
 *   part of the picture (the surface's scalars on the load's geometry, the component scalars and
 *   their extremes); for a combination of every case and for one case;
 * - the bytes of 50 cases, nodal and element-nodal (Float64 values, 6 per row; element-nodal adds
 *   one Int32 rows index shared by every case).
 * Runs alone: npx tsx test/bench/loadCases.ts [--elements N] [--cases K] [--json]; `npm run bench`
 * runs it too (benchLoadCases, the switch on tet4 only: the issue states it for tet4, and a hex8
 * switch takes seconds). Checks run outside the timed loops.
 */
import os from 'node:os'
import { fileURLToPath } from 'node:url'
import type { Model } from '../../src/model/model.ts'
import type { LoadCase } from '../../src/model/loadCases.ts'
import { modelForCase } from '../../src/model/loadCases.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { elementType } from '../../src/model/elementTypes.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { sectionEnvelope } from '../../src/mechanics/sectionEnvelope.ts'
import { analysisInputOf } from '../../src/mechanics/analysisPipeline.ts'
import { surfaceVertexRuns } from '../../src/mechanics/surfaceTriangles.ts'
import { buildFeatureEdges } from '../../src/mechanics/featureEdges.ts'
import { bodyVolumeOf } from '../../src/mechanics/balanceAudit.ts'
import { analyseCaseOnSurface, caseSurface, surfaceNodesOf } from '../../workers/casePicture.ts'
import type { CaseBasis } from '../../workers/casePicture.ts'
import type { BoundaryFaces } from '../../src/mechanics/types.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { syntheticModel } from './syntheticModel.ts'
import { measure, median } from './timing.ts'

export interface LoadCaseFigures {
  type: string
  elements: number
  nodes: number
  cases: number
  singleCutMs: number
  allCasesMs: number
  /** allCasesMs / singleCutMs (the bound: ≤ 3). */
  ratio: number
  /** The same with regions on both sides (the single cut with `regions: true`, the envelope per region). */
  singleCutRegionsMs: number
  allCasesRegionsMs: number
  ratioRegions: number
  /** The two ratios from median CPU times (fairer on a shared machine, see timing.ts). */
  ratioCpu: number
  ratioRegionsCpu: number
  stencilEntries: number
  /** The switch to the combination of every case, in parts (median wall ms; null where not run). */
  switchFieldsMs: number | null
  switchPipelineMs: number | null
  switchPictureMs: number | null
  /** The whole switch to that combination (fields, pipeline, picture), median wall and CPU ms. */
  switchMs: number | null
  switchCpuMs: number | null
  /** The whole switch to one case (no sum), median wall and CPU ms. */
  switchCaseMs: number | null
  switchCaseCpuMs: number | null
  bytesNodal50: number
  bytesElementNodal50: number
  /** Load average (1 min) when this type's runs ended. */
  loadAverage: number
}

/** The model with `k` cases: case j is the synthetic stress times (1 + j/10) plus j Pa on σxy, so no two are alike. */
function withCases(model: Model, k: number): Model {
  const cases: LoadCase[] = Array.from({ length: k }, (_, j) => {
    const s = new Float64Array(model.stress.length)
    const f = 1 + j / 10
    for (let i = 0; i < s.length; i++) s[i] = f * model.stress[i] + (i % 6 === 3 ? j : 0)
    return { name: `case-${j + 1}`, description: '', bodyForce: model.bodyForce, stress: s, displacement: null }
  })
  const all = Object.fromEntries(cases.map((c) => [c.name, 1 / k]))
  return { ...model, stress: cases[0].stress, cases, combinations: [{ name: 'all-mean', factors: all }, { name: 'two', factors: { 'case-1': 1.35, 'case-2': 1.5 } }] }
}

/**
 * What the engine worker does to show another case (analyseCase there, workers/casePicture.ts):
 * the case's fields, the case's analysis on the kept faces (the principal stresses at the
 * surface's nodes only, the body's volume from the load), and the case's part of the picture
 * (the surface's scalars and patch labels on the load's vertex runs, the component scalars and
 * the extremes; the geometry and the feature edges are the load's). Returns the three times (ms).
 */
function caseSwitch(model: Model, faces: BoundaryFaces, basis: CaseBasis, name: string): { fieldsMs: number; pipelineMs: number; pictureMs: number } {
  const t0 = performance.now()
  const m = modelForCase(model, name)
  const t1 = performance.now()
  const input = analysisInputOf(m)
  const r = analyseCaseOnSurface(input, faces, basis, undefined, () => {})
  const t2 = performance.now()
  caseSurface(m, faces, basis, r, input)
  return { fieldsMs: t1 - t0, pipelineMs: t2 - t1, pictureMs: performance.now() - t2 }
}

/** What the load leaves for the switches (the worker's pictureOf): vertex runs, edge nodes, surface nodes, the body's volume. */
function caseBasisOf(model: Model, faces: BoundaryFaces): CaseBasis {
  return {
    faceVertexStart: surfaceVertexRuns(faces).faceVertexStart, edgeNodes: buildFeatureEdges(model.mesh.coords, faces).nodes,
    surfaceNodes: surfaceNodesOf(faces, model.mesh.nodeCount), body: bodyVolumeOf(model.mesh, faces),
  }
}

export function benchLoadCases(
  elements: number, k: number, log: (s: string) => void = () => {}, options: { switchTypes?: readonly string[] } = {},
): LoadCaseFigures[] {
  const out: LoadCaseFigures[] = []
  const switchTypes = options.switchTypes ?? ['tet4', 'hex8']
  for (const type of ['tet4', 'hex8'] as const) {
    log(`load cases: ${type}, about ${elements} elements, ${k} cases`)
    const model = withCases(syntheticModel(type, elements, 1), k)
    const mesh = model.mesh
    const field = nodalStressField(mesh, model.stress)
    const faces = extractBoundaryFaces(mesh)
    const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
    const single = measure(() => cutSection(mesh, field, model.bodyForce, BENCH_PLANE, { faces, tractions }), { runs: 9, budgetMs: 6000 })
    const cases = model.cases!.map((c) => ({ name: c.name, field: nodalStressField(mesh, c.stress) }))
    const all = measure(() => sectionEnvelope(mesh, cases, model.combinations!, BENCH_PLANE), { runs: 9, budgetMs: 8000 })
    const singleR = measure(() => cutSection(mesh, field, model.bodyForce, BENCH_PLANE, { faces, tractions, regions: true }), { runs: 9, budgetMs: 6000 })
    const allR = measure(() => sectionEnvelope(mesh, cases, model.combinations!, BENCH_PLANE, { regions: true }), { runs: 9, budgetMs: 8000 })
    // checks (outside the timed loops): case 1 of the envelope is the single cut
    const one = single.value.result, env = all.value
    const d = Math.hypot(env.cases[0].section.force[0] - one.force[0], env.cases[0].section.force[1] - one.force[1], env.cases[0].section.force[2] - one.force[2])
    if (!(d <= 1e-9 * Math.hypot(...one.force))) throw new Error(`bench check: the envelope's first case differs from the single cut by ${d}`)
    let sw: { parts: { fieldsMs: number; pipelineMs: number; pictureMs: number }[]; all: ReturnType<typeof measure>; one: ReturnType<typeof measure> } | null = null
    if (switchTypes.includes(type)) {
      log(`load cases: ${type}, case switch`)
      const parts: { fieldsMs: number; pipelineMs: number; pictureMs: number }[] = []
      const basis = caseBasisOf(model, faces)
      const all = measure(() => parts.push(caseSwitch(model, faces, basis, 'all-mean')), { runs: 5, minRuns: 3, budgetMs: 6000 })
      const one = measure(() => caseSwitch(model, faces, basis, 'case-7'), { runs: 5, minRuns: 3, budgetMs: 6000 })
      sw = { parts: parts.slice(-all.samplesMs.length), all, one }
    }
    const part = (key: 'fieldsMs' | 'pipelineMs' | 'pictureMs') => (sw ? median(sw.parts.map((p) => p[key])) : null)
    let rows = 0
    for (const b of mesh.blocks) rows += b.ids.length * elementType(b.type).nodeCount
    out.push({
      type, elements: mesh.elementCount, nodes: mesh.nodeCount, cases: k,
      singleCutMs: single.medianMs, allCasesMs: all.medianMs, ratio: all.medianMs / single.medianMs,
      ratioCpu: all.cpuMs / single.cpuMs, ratioRegionsCpu: allR.cpuMs / singleR.cpuMs,
      singleCutRegionsMs: singleR.medianMs, allCasesRegionsMs: allR.medianMs, ratioRegions: allR.medianMs / singleR.medianMs,
      stencilEntries: env.stencilEntries,
      switchFieldsMs: part('fieldsMs'), switchPipelineMs: part('pipelineMs'), switchPictureMs: part('pictureMs'),
      switchMs: sw ? sw.all.medianMs : null, switchCpuMs: sw ? sw.all.cpuMs : null,
      switchCaseMs: sw ? sw.one.medianMs : null, switchCaseCpuMs: sw ? sw.one.cpuMs : null,
      bytesNodal50: 50 * 6 * 8 * mesh.nodeCount, bytesElementNodal50: 50 * 6 * 8 * rows + 4 * rows,
      loadAverage: os.loadavg()[0],
    })
  }
  return out
}

/** The figures as text lines (this script's output and `npm run bench`'s table). */
export function loadCaseLines(figures: readonly LoadCaseFigures[]): string[] {
  const mb = (b: number) => `${(b / 1e6).toFixed(0)} MB`
  const ms = (v: number | null) => (v === null ? '-' : v.toFixed(0))
  return figures.flatMap((f) => [
    `${f.type} ${f.elements} elements, ${f.nodes} nodes (load average ${f.loadAverage.toFixed(1)}): one cut ${f.singleCutMs.toFixed(1)} ms; ${f.cases} cases + 2 combinations at once ${f.allCasesMs.toFixed(1)} ms ` +
      `(× ${f.ratio.toFixed(2)}, cpu × ${f.ratioCpu.toFixed(2)}; ${f.stencilEntries} stencil entries); with regions ${f.singleCutRegionsMs.toFixed(1)} ms against ${f.allCasesRegionsMs.toFixed(1)} ms ` +
      `(× ${f.ratioRegions.toFixed(2)}, cpu × ${f.ratioRegionsCpu.toFixed(2)})`,
    (f.switchMs === null ? `${f.type}` : `${f.type} case switch in the worker: to the combination of all ${f.cases} cases ${ms(f.switchMs)} ms (cpu ${ms(f.switchCpuMs)}: fields ${ms(f.switchFieldsMs)}, ` +
      `pipeline ${ms(f.switchPipelineMs)}, picture ${ms(f.switchPictureMs)}), to one case ${ms(f.switchCaseMs)} ms (cpu ${ms(f.switchCaseCpuMs)});`) +
      ` 50 cases hold: nodal ${mb(f.bytesNodal50)}, element-nodal ${mb(f.bytesElementNodal50)} (Float64 stress)`,
  ])
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const argv = process.argv.slice(2)
  const opt = (name: string, dflt: number) => { const i = argv.indexOf(name); return i < 0 ? dflt : Number(argv[i + 1]) }
  const figures = benchLoadCases(Math.round(opt('--elements', 1e6)), Math.round(opt('--cases', 50)), (s) => process.stderr.write(s + '\n'))
  if (!argv.includes('--json')) {
    for (const line of loadCaseLines(figures)) console.log(line)
  }
  console.log(JSON.stringify({ loadCases: figures }))
}
