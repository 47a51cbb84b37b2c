/**
 * Load cases at about 10^6 elements (tet4 and hex8, seeded synthetic blocks):
 * - one single-case cut as the app runs it (boundary faces and tractions given), against all
 *   cases of the same cut at once (sectionEnvelope.ts: the stencil once, then one pass per case;
 *   50 cases and 2 combinations), and their ratio (the bound: at most 3);
 * - switching the case: the fields of a combination of 50 cases (modelForCase) and the analysis
 *   pipeline on them with the mesh's boundary faces kept, what the worker does on a switch;
 * - the bytes of 50 cases, nodal and element-nodal (Float64 values, 6 per row).
 * Runs alone: npx tsx test/bench/loadCases.ts [--elements N] [--cases K] [--json]; `npm run bench`
 * runs it too (benchLoadCases). Checks run outside the timed loops.
 */
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
import { runAnalysis } from '../../src/mechanics/analysisPipeline.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { syntheticModel } from './syntheticModel.ts'
import { measure } from './timing.ts'

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
  switchFieldsMs: number
  switchPipelineMs: number
  bytesNodal50: number
  bytesElementNodal50: number
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

export function benchLoadCases(elements: number, k: number, log: (s: string) => void = () => {}): LoadCaseFigures[] {
  const out: LoadCaseFigures[] = []
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
    const sw = measure(() => modelForCase(model, 'all-mean'), { runs: 5, budgetMs: 4000 })
    const m = sw.value
    const pipe = measure(() => runAnalysis({ mesh, stress: nodalStressField(mesh, m.stress), bodyForce: m.bodyForce }, { faces }), { runs: 3, budgetMs: 8000 })
    let rows = 0
    for (const b of mesh.blocks) rows += b.ids.length * elementType(b.type).nodeCount
    out.push({
      type, elements: mesh.elementCount, nodes: mesh.nodeCount, cases: k,
      singleCutMs: single.medianMs, allCasesMs: all.medianMs, ratio: all.medianMs / single.medianMs,
      ratioCpu: all.cpuMs / single.cpuMs, ratioRegionsCpu: allR.cpuMs / singleR.cpuMs,
      singleCutRegionsMs: singleR.medianMs, allCasesRegionsMs: allR.medianMs, ratioRegions: allR.medianMs / singleR.medianMs,
      stencilEntries: env.stencilEntries,
      switchFieldsMs: sw.medianMs, switchPipelineMs: pipe.medianMs,
      bytesNodal50: 50 * 6 * 8 * mesh.nodeCount, bytesElementNodal50: 50 * 6 * 8 * rows + 4 * rows,
    })
  }
  return out
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const argv = process.argv.slice(2)
  const opt = (name: string, dflt: number) => { const i = argv.indexOf(name); return i < 0 ? dflt : Number(argv[i + 1]) }
  const figures = benchLoadCases(Math.round(opt('--elements', 1e6)), Math.round(opt('--cases', 50)), (s) => process.stderr.write(s + '\n'))
  if (!argv.includes('--json')) {
    const mb = (b: number) => `${(b / 2 ** 20).toFixed(0)} MiB`
    for (const f of figures) {
      console.log(`${f.type} ${f.elements} elements, ${f.nodes} nodes: one cut ${f.singleCutMs.toFixed(1)} ms; ${f.cases} cases + 2 combinations at once ${f.allCasesMs.toFixed(1)} ms (× ${f.ratio.toFixed(2)}; ${f.stencilEntries} stencil entries); with regions ${f.singleCutRegionsMs.toFixed(1)} ms against ${f.allCasesRegionsMs.toFixed(1)} ms (× ${f.ratioRegions.toFixed(2)}); CPU-time ratios × ${f.ratioCpu.toFixed(2)} and × ${f.ratioRegionsCpu.toFixed(2)}; switch: fields ${f.switchFieldsMs.toFixed(0)} ms, pipeline ${f.switchPipelineMs.toFixed(0)} ms; 50 cases: nodal ${mb(f.bytesNodal50)}, element-nodal ${mb(f.bytesElementNodal50)}`)
    }
  }
  console.log(JSON.stringify({ loadCases: figures }))
}
