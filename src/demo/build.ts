/**
 * Generator of the bundled demo models (a Node script: `npm run demo`, `npm run demo -- --large`,
 * `npm run demo -- --only bolted-bracket` for one of them). Meshes our own four invented scenarios, solves them with the demo's linear-elastic solver, checks
 * their statics, and writes each as a native container, model.json and a CSV bundle under
 * public/demo/<id>/ (the tunnel's CSV files are not committed: they would push the committed files
 * past about 15 MB; public/demo/.gitignore),
 * plus public/demo/index.json listing them. `--large` also writes a finer tunnel block (several
 * hundred thousand elements, native container only) to public/demo/tunnel-block-large/, which is
 * not committed (public/demo/.gitignore). `--out <dir>` writes elsewhere.
 */
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { writeCsvBundle } from '../io/writeCsvBundle.ts'
import { writeNative } from '../io/nativeContainer.ts'
import type { Model } from '../model/model.ts'
import { demoModel, roundSignificant } from './demoModel.ts'
import { buildLiftingLug, LUG_DEFAULTS, LUG_DESCRIPTION, LUG_SLING_ANGLES, lugMeshLevel } from './liftingLug.ts'
import { lugStatics } from './lugStatics.ts'
import type { Combination, LoadCase } from '../model/loadCases.ts'
import type { Vec3 } from '../model/model.ts'
import { nodalStressField } from '../model/stressField.ts'
import { sectionEnvelope } from '../mechanics/sectionEnvelope.ts'
import type { ElasticProblem, ElasticSolution } from './solveElastic.ts'
import { solveElastic } from './solveElastic.ts'
import { buildTunnelBlock, interpolateTunnelField, TUNNEL_DEFAULTS, TUNNEL_DESCRIPTION, tunnelHierarchy, tunnelMeshLevel } from './tunnelBlock.ts'
import type { TunnelSpec } from './tunnelBlock.ts'
import { tunnelStatics } from './tunnelStatics.ts'
import { buildPipeSegment, PIPE_DEFAULTS, pipeDescription, pipeLame, pipeMeshLevel } from './pipeSegment.ts'
import { pipeStatics } from './pipeStatics.ts'
import { BRACKET_DEFAULTS, BRACKET_GEOMETRY, BRACKET_PART_NAMES, boltGroupTensions, bracketDescription, buildBoltedBracket } from './boltedBracket.ts'
import { createMesh } from '../model/createMesh.ts'
import { cutSection } from '../mechanics/sectionCut.ts'

interface IndexEntry {
  id: string
  name: string
  description: string
  units: { length: string; stress: string }
  elements: number
  nodes: number
  file: string
  files: { native: string; csv: string[] | null }
  bytes: number
  onDemand?: boolean
}

const args = process.argv.slice(2)
const large = args.includes('--large')
/** `--only <id>`: regenerate one scenario and keep the other entries of index.json as they are. */
const onlyAt = args.indexOf('--only')
const only = onlyAt >= 0 ? args[onlyAt + 1] : null
const outAt = args.indexOf('--out')
const outDir = outAt >= 0 ? args[outAt + 1] : join('public', 'demo')

const pct = (v: number) => `${(100 * v).toFixed(3)} %`
const fmt = (v: number, d = 1) => v.toFixed(d)

/** Solves and reports CPU time too: on a shared machine the wall time says little. */
function solveTimed(problem: ElasticProblem): { sol: ElasticSolution; cpu: number } {
  const c0 = process.cpuUsage()
  const sol = solveElastic(problem)
  const c = process.cpuUsage(c0)
  return { sol, cpu: (c.user + c.system) / 1e6 }
}

function printStats(id: string, sol: ElasticSolution, cpu: number, multigrid = false): void {
  const s = sol.stats
  console.log(`${id}: ${s.elements} hex8 elements, ${s.nodes} nodes, ${s.freeDofs} free dofs, ${s.matrixBlocks} 3×3 blocks; solve ${fmt(s.assemblySeconds + s.solveSeconds + s.recoverySeconds, 2)} s wall, ${fmt(cpu, 2)} s CPU`)
  console.log(`  assembly ${fmt(s.assemblySeconds, 2)} s, ${multigrid ? 'multigrid' : 'block-Jacobi'} PCG ${fmt(s.solveSeconds, 2)} s (${s.iterations} iterations, relative residual ${s.relativeResidual.toExponential(2)}), stress recovery ${fmt(s.recoverySeconds, 2)} s`)
}

/** Solves, prints the figures, and rounds coordinates (9 digits), stress and displacement (6) as the files carry them. */
function solveRounded(id: string, problem: ElasticProblem): { sol: ElasticSolution; coords: Float64Array; stress: Float64Array; disp: Float64Array } {
  const { sol, cpu } = solveTimed(problem)
  printStats(id, sol, cpu)
  return { sol, coords: roundSignificant(problem.coords.slice(), 9), stress: roundSignificant(sol.stress, 6), disp: roundSignificant(sol.displacement, 6) }
}

/**
 * Writes the native container, model.json and the CSV bundle. `commitCsv` false: the CSV files are
 * still written (every scenario exists in both forms) but not listed, and public/demo/.gitignore
 * keeps them out of the repository.
 */
function writeModel(id: string, model: Model, commitCsv: boolean, writeCsv = true): { native: string; csv: string[] | null; bytes: number } {
  const dir = join(outDir, id)
  if (existsSync(dir)) rmSync(dir, { recursive: true })
  mkdirSync(dir, { recursive: true })
  const nativeName = `${id}.tractus`
  const bytes = writeNative(model)
  writeFileSync(join(dir, nativeName), bytes)
  let total = bytes.length
  const names: string[] = []
  for (const f of writeCsvBundle(model)) {
    // model.json goes with every scenario (it says what the data is); the tables only when asked.
    if (!writeCsv && f.name !== 'model.json') continue
    writeFileSync(join(dir, f.name), f.text)
    const size = Buffer.byteLength(f.text)
    if (commitCsv || f.name === 'model.json') total += size
    else console.log(`  wrote ${relative('.', join(dir, f.name))} (${(size / 1e6).toFixed(2)} MB, not committed)`)
    if (f.name !== 'model.json') names.push(`${id}/${f.name}`)
  }
  console.log(`  wrote ${relative('.', dir)}: native ${(bytes.length / 1e6).toFixed(2)} MB; ${(total / 1e6).toFixed(2)} MB listed in index.json`)
  return { native: `${id}/${nativeName}`, csv: commitCsv ? [...names, `${id}/model.json`] : null, bytes: total }
}

function lug(): IndexEntry {
  const id = 'lifting-lug'
  const sc = buildLiftingLug({ ...LUG_DEFAULTS, ...lugMeshLevel(2) })
  const { sol, coords, stress, disp } = solveRounded(id, sc.problem)
  const st = lugStatics(sc, stress, sol.reaction)
  console.log(`  pin load ${fmt(Math.hypot(...st.pinForce) / 1000, 3)} kN; section y = ${fmt(st.sectionY, 2)} mm: force error ${pct(st.sectionForceError)}, moment error ${pct(st.sectionMomentError)}`)
  console.log(`  body balance residual ${pct(st.balance.relative)} of gross ${fmt(st.balance.gross / 1000, 2)} kN; hole-wall peak hoop stress ${fmt(st.peakHoopStress)} MPa at ${fmt(st.peakHoopAngleDeg)}° = ${fmt(st.peakHoopStress / st.nominalStress, 2)} × nominal ${fmt(st.nominalStress, 2)} MPa`)
  const base = demoModel('Steel lifting lug (invented demo)', LUG_DESCRIPTION, sc.units, sc.bodyForce, coords, sc.problem.conn, stress, disp)
  const model = lugCases(base, sc.shankTop)
  // The lug's CSV tables are not committed (the extra load cases would push the committed files
  // past about 15 MB); its container carries every case.
  const files = writeModel(id, model, false)
  return { id, name: model.name, description: model.description, units: sc.units, elements: sol.stats.elements, nodes: sol.stats.nodes, file: files.native, files: { native: files.native, csv: files.csv }, bytes: files.bytes }
}

/**
 * The lug's load cases: the sling pulling at other angles from the lug's axis (each solved on its
 * own), a combination, and the governing angle at the neck (the shank's top, where the head
 * starts), computed from the section envelope and written into the model's description.
 */
function lugCases(model: Model, neckY: number): Model {
  const angles = LUG_SLING_ANGLES
  const cases: LoadCase[] = angles.map((angleDeg) => {
    const name = `sling-${angleDeg}`
    const description = `pin pull 50 kN at ${angleDeg}° from the lug's axis, in the plate's plane${angleDeg === LUG_DEFAULTS.angleDeg ? ' (the design angle)' : ''}`
    if (angleDeg === LUG_DEFAULTS.angleDeg) return { name, description, bodyForce: null, stress: model.stress, displacement: model.displacement }
    const sc = buildLiftingLug({ ...LUG_DEFAULTS, ...lugMeshLevel(2), angleDeg })
    const { sol, cpu } = solveTimed(sc.problem)
    console.log(`  case ${name}: solved in ${fmt(cpu, 2)} s CPU`)
    // no displacement for the extra cases: it would push the committed files past their budget
    return { name, description, bodyForce: null, stress: roundSignificant(sol.stress, 6), displacement: null }
  })
  const combinations: Combination[] = [{ name: 'proof', factors: { [`sling-${LUG_DEFAULTS.angleDeg}`]: 2 } }]
  const withCases: Model = { ...model, cases, combinations }
  const plane = { point: [0, neckY, LUG_DEFAULTS.thickness / 2] as Vec3, normal: [0, 1, 0] as Vec3 }
  const env = sectionEnvelope(model.mesh, cases.map((c) => ({ name: c.name, field: nodalStressField(model.mesh, c.stress) })), [], plane)
  const e = env.envelope!
  // in-plane bending: about the plate's normal z, the section axis of the larger second moment (e1)
  const e1z = Math.abs(env.cases[0].section.axes.e1[2]) > 0.5
  const inPlane = e1z ? e.bending[0] : e.bending[1]
  const big = (x: { max: number; maxCase: string; min: number; minCase: string }) => (Math.abs(x.max) >= Math.abs(x.min) ? { v: x.max, c: x.maxCase } : { v: x.min, c: x.minCase })
  const m = big(inPlane), n = big(e.axial)
  const v = big(Math.abs(e.shear[0].max) + Math.abs(e.shear[0].min) > Math.abs(e.shear[1].max) + Math.abs(e.shear[1].min) ? e.shear[0] : e.shear[1])
  const neck = `Load cases: the sling pulls at ${angles.map((a) => `${a}°`).join(', ')} from the lug's axis (cases ${cases.map((c) => c.name).join(', ')}; ` +
    `sling-${LUG_DEFAULTS.angleDeg} is the design angle), and the combination "proof" is twice the design case (an example of a proof load). ` +
    `At the neck, the section y = ${fmt(neckY, 0)} mm where the head begins, the in-plane bending moment is largest at ${cases.find((c) => c.name === m.c)!.name.slice(6)}° ` +
    `(${m.c}: ${fmt(Math.abs(m.v) / 1e6, 2)} kN·m), the pull along the axis at ${n.c.slice(6)}° (${fmt(Math.abs(n.v) / 1000, 1)} kN) and the shear across it at ${v.c.slice(6)}° ` +
    `(${fmt(Math.abs(v.v) / 1000, 1)} kN): the angle that governs the neck is ${m.c.slice(6)}° (computed by the demo generator from the section envelope). `
  console.log(`  ${neck}`)
  // the case text goes before the closing caution, which stays last
  return { ...withCases, description: model.description.replace('Caution:', neck + 'Caution:') }
}

function pipe(): IndexEntry {
  const id = 'pipe-segment'
  const spec = { ...PIPE_DEFAULTS, ...pipeMeshLevel(1) }
  const sc = buildPipeSegment(spec)
  const { sol, cpu } = solveTimed(sc.problem)
  printStats(id, sol, cpu)
  const coords = roundSignificant(sc.problem.coords.slice(), 9)
  const stress = roundSignificant(sol.stress, 6)
  const disp = roundSignificant(sol.displacement, 6)
  const st = pipeStatics(sc, stress)
  const lame = pipeLame(spec)
  console.log(`  section z = ${fmt(st.z)} mm: thrust error ${pct(st.axialError)}, shear ${pct(st.shearError)}, moment ${pct(st.momentError)}`)
  console.log(`  line through the wall at mid-length: membrane hoop ${fmt(st.membraneHoop, 2)} MPa vs Lamé ${fmt(lame.hoopMembrane, 2)} (${pct(st.membraneHoopError)}), bending hoop ${fmt(st.bendingHoop, 2)} vs ${fmt(st.bendingHoopLame, 2)}, bore hoop ${fmt(st.boreHoop, 2)} vs ${fmt(lame.hoopInner, 2)} (${pct(st.boreHoopError)})`)
  const model = demoModel('Thick pipe segment under pressure (invented demo)', pipeDescription(spec), sc.units, sc.bodyForce, coords, sc.problem.conn, stress, disp)
  // Native container and model.json only: the CSV bundle would triple the committed size.
  const files = writeModel(id, model, false, false)
  return { id, name: model.name, description: model.description, units: sc.units, elements: sol.stats.elements, nodes: sol.stats.nodes, file: files.native, files: { native: files.native, csv: files.csv }, bytes: files.bytes }
}

/** The last tunnel solved, whose displacement starts the next finer one's iterations. */
let previousTunnel: { spec: TunnelSpec; u: Float64Array } | null = null

function tunnel(level: number, id: string, commitCsv: boolean): IndexEntry {
  const spec = { ...TUNNEL_DEFAULTS, ...tunnelMeshLevel(level) }
  const sc = buildTunnelBlock(spec)
  const initialGuess = previousTunnel ? interpolateTunnelField(previousTunnel.spec, previousTunnel.u, spec) : undefined
  // The large variant takes a multigrid cycle over the coarser levels as its preconditioner.
  const multigrid = level >= 3 ? tunnelHierarchy(TUNNEL_DEFAULTS, level) : undefined
  const { sol, cpu } = solveTimed({ ...sc.problem, maxIterations: 50000, initialGuess, multigrid })
  previousTunnel = { spec, u: sol.displacement }
  printStats(id, sol, cpu, multigrid !== undefined)
  const coords = roundSignificant(sc.problem.coords.slice(), 9)
  const stress = roundSignificant(sol.stress, 6)
  const disp = roundSignificant(sol.displacement, 6)
  const st = tunnelStatics(sc, stress)
  console.log(`  base carries ${fmt(st.baseForce[1], 0)} kN vs weight + overburden ${fmt(st.expectedBase, 0)} kN: error ${pct(st.baseError)}; body balance residual ${pct(st.balance.relative)}`)
  console.log(`  wall hoop stress (compression +): springline ${fmt(st.springline, 0)} kPa vs Kirsch ${fmt(st.springlineKirsch, 0)}; crown ${fmt(st.crown, 0)} / invert ${fmt(st.invert, 0)} vs ${fmt(st.crownKirsch, 0)}; RMS deviation ${pct(st.wallRmsDeviation)} of p = ${fmt(st.p, 0)} kPa`)
  const name = level >= 3 ? 'Rock mass round a tunnel, fine mesh (invented demo)' : 'Rock mass round a tunnel (invented demo)'
  const model = demoModel(name, TUNNEL_DESCRIPTION, sc.units, sc.bodyForce, coords, sc.problem.conn, stress, disp)
  // The large variant's CSV bundle would run to hundreds of MB: native container only.
  const files = writeModel(id, model, commitCsv, level < 3)
  return { id, name, description: model.description, units: sc.units, elements: sol.stats.elements, nodes: sol.stats.nodes, file: files.native, files: { native: files.native, csv: files.csv }, bytes: files.bytes, ...(level >= 3 ? { onDemand: true } : {}) }
}

/**
 * The bolted bracket assembly: parts with names (model.json "parts"; the native container of
 * version 1 carries the part numbers only), and its model card with the elastic bolt-group
 * tensions beside the section force through each bolt at mid-gap.
 */
function bracket(): IndexEntry {
  const id = 'bolted-bracket'
  // 5 mm cells (2 × 2 elements across a bolt): the committed demos stay near 15 MB
  const spec = { ...BRACKET_DEFAULTS, cell: 5 }
  const sc = buildBoltedBracket(spec)
  const { sol, coords, stress, disp } = solveRounded(id, sc.problem)
  const mesh = createMesh(coords, [{ type: 'hex8', conn: sc.problem.conn, part: sc.part }])
  const g = BRACKET_GEOMETRY
  const cut = cutSection(mesh, nodalStressField(mesh, stress), sc.bodyForce, { point: [0, 0, g.base + g.gap / 2], normal: [0, 0, 1] }, { regions: true }).result
  const section = g.bolts.map((_, b) => cut.regions!.find((r) => r.parts[0] === 3 + b)?.axial ?? NaN)
  const elastic = boltGroupTensions(spec.load, g.patch.x, g.patch.y, g.bolts)
  console.log(`  bolt tensions (kN), elastic method / section at mid-gap: ${elastic.map((e, b) => `${fmt(e / 1000, 2)} / ${fmt(section[b] / 1000, 2)}`).join(', ')}; sum ${fmt(section.reduce((a, b) => a + b, 0) / 1000, 2)} kN`)
  const applied = (f: readonly number[]) => f[2]
  const model: Model = {
    name: 'Bolted bracket assembly (invented demo)', description: bracketDescription(spec, elastic, section, applied(sc.applied)), units: sc.units,
    bodyForce: sc.bodyForce, warnings: [], mesh, stress, displacement: disp,
    parts: Object.entries(BRACKET_PART_NAMES).map(([k, name]) => ({ part: Number(k), name, bodyForce: null })),
  }
  const files = writeModel(id, model, false, false)
  return { id, name: model.name, description: model.description, units: sc.units, elements: sol.stats.elements, nodes: sol.stats.nodes, file: files.native, files: { native: files.native, csv: files.csv }, bytes: files.bytes }
}

const t0 = performance.now()
mkdirSync(outDir, { recursive: true })
const builders: Record<string, () => IndexEntry> = {
  'lifting-lug': lug, 'tunnel-block': () => tunnel(2, 'tunnel-block', false), 'pipe-segment': pipe, 'bolted-bracket': bracket,
}
if (only !== null && !(only in builders)) throw new Error(`--only: no scenario "${only}"; the scenarios are ${Object.keys(builders).join(', ')}`)
// The committed files stay under about 15 MB: the native containers, the CSV bundle of the lug only.
const entries: IndexEntry[] = only === null
  ? Object.values(builders).map((b) => b())
  : (JSON.parse(readFileSync(join(outDir, 'index.json'), 'utf8')) as { scenarios: IndexEntry[] }).scenarios.filter((e) => !e.onDemand)
if (only !== null) {
  const entry = builders[only](), at = entries.findIndex((e) => e.id === only)
  if (at >= 0) entries[at] = entry; else entries.push(entry)
}
const largeId = 'tunnel-block-large'
if (large) entries.push(tunnel(3, largeId, false))
else if (existsSync(join(outDir, largeId, `${largeId}.tractus`))) console.log(`  (keeping the earlier ${largeId}; not listed: run with --large to list it again)`)
writeFileSync(join(outDir, 'index.json'), JSON.stringify({ scenarios: entries }, null, 2) + '\n')
let committed = 0
for (const e of entries) if (!e.onDemand) committed += e.bytes
console.log(`demo models written to ${outDir} in ${fmt((performance.now() - t0) / 1000)} s; committed scenarios total ${(committed / 1e6).toFixed(2)} MB`)
