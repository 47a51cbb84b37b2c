/**
 * The analysis pipeline: the one place where the stages that follow reading a model are chained,
 * for the engine worker, the command line and the tests alike.
 *
 *   faces → tractions → invariants → elementBalance → bodyBalance → loadPatches → verdict
 *
 * boundary faces; surface tractions t = σn on them; nodal invariants (display values); the
 * element balance and the whole-body balance; the load-entry patches; the balance verdict (mesh
 * error or model error, balanceVerdict.ts) with the spread of the element indicator. Each stage reads the input
 * and what the stages before it produced, and is reported through `onStage` when it ends, with
 * its wall time (ms) and its result. Units are the model's (see types.ts).
 *
 * - `runAnalysis` runs every stage here, synchronously (the command line, the tests).
 * - `runAnalysisAsync` is the same chain for a caller that runs some stages elsewhere: it may hand
 *   in the two stages that need no boundary faces (invariants, element balance) as promises,
 *   started before the first stage so that they run beside the face stages (the engine worker's
 *   pool), and it awaits `beforeStage` before each stage (the worker reports progress and lets
 *   its event loop turn there).
 *
 * Stress comes as a StressField (src/model/stressField.ts), so nodal and element-nodal stress
 * take the same path; `analysisInputOf` gives a model's field (modelStressField) and its display
 * stress (element-nodal stress averaged within each part), which the invariants read.
 */
import type { Model, Mesh, Vec3 } from '../model/model.ts'
import { modelStressField, nodalDisplayStress } from '../model/stressField.ts'
import type { StressField } from '../model/stressField.ts'
import { extractBoundaryFaces } from './boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from './tractions.ts'
import { allocateNodalInvariants, computeNodalInvariants } from './invariants.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance } from './balanceAudit.ts'
import { findLoadPatches } from './loadPatches.ts'
import { computeBalanceVerdict } from './balanceVerdict.ts'
import type { BalanceVerdictResult } from './balanceVerdict.ts'
import type { LoadPatchOptions } from './loadPatches.ts'
import type { BodyBalance, BoundaryFaces, ElementBalance, LoadPatches, NodalInvariants, SurfaceTractions } from './types.ts'

export interface AnalysisInput {
  readonly mesh: Mesh
  readonly stress: StressField
  /** ρ·b, force per unit volume (stress / length). */
  readonly bodyForce: Vec3
  // --- element-nodal ---
  /** Nodal display stress (6·N) when the caller has it (a model's `stress`); else averaged here from `stress`. */
  readonly displayStress?: Float64Array
}

/** What the stages produce, one field per stage (same names). */
export interface AnalysisResult {
  readonly faces: BoundaryFaces
  readonly tractions: SurfaceTractions
  readonly invariants: NodalInvariants
  readonly elementBalance: ElementBalance
  readonly bodyBalance: BodyBalance
  readonly loadPatches: LoadPatches
  readonly verdict: BalanceVerdictResult
}

export type AnalysisStage = keyof AnalysisResult

/** The stages in the order they run. */
export const ANALYSIS_STAGES: readonly AnalysisStage[] = ['faces', 'tractions', 'invariants', 'elementBalance', 'bodyBalance', 'loadPatches', 'verdict']

export interface AnalysisOptions {
  /**
   * Storage of the element balance (see ElementBalance): 'double' (the default; the reference
   * tests check quadrature to 1e-12) or 'single' (the app and the command line).
   */
  readonly balancePrecision?: 'double' | 'single'
  readonly loadPatches?: LoadPatchOptions
  /** How many of the least balanced elements the verdict stage lists (default 5). */
  readonly leastBalanced?: number
  // --- load cases ---
  /** The mesh's boundary faces when already known (they do not depend on the case): switching the case skips that stage. */
  readonly faces?: BoundaryFaces
}

/** One finished stage: its name, its wall time (ms) and its result. */
export type StageReport = { [K in AnalysisStage]: { readonly stage: K; readonly ms: number; readonly result: AnalysisResult[K] } }[AnalysisStage]

export type StageCallback = (report: StageReport) => void

/** The stages that need no boundary faces, computed elsewhere and handed in as promises. */
export interface OffloadedStages {
  readonly invariants?: Promise<NodalInvariants>
  readonly elementBalance?: Promise<ElementBalance>
}

export interface AsyncAnalysisHooks {
  /** Started before the first stage; each is awaited at its turn instead of being computed here. */
  readonly offloaded?: OffloadedStages
  /** Awaited before each stage starts. */
  readonly beforeStage?: (stage: AnalysisStage) => void | Promise<void>
}

/**
 * The input of a loaded model: its stress field (element-nodal where it has one, else its nodal
 * stress through the connectivity), its display stress, its body force unless one is given.
 */
export function analysisInputOf(model: Model, bodyForce: Vec3 = model.bodyForce): AnalysisInput {
  return { mesh: model.mesh, stress: modelStressField(model), bodyForce, displayStress: model.stress }
}

/** The nodal stress the display and the invariants use. */
export function displayStressOf(input: AnalysisInput): Float64Array {
  return input.displayStress ?? nodalDisplayStress(input.stress, input.mesh)
}

/**
 * How each stage is computed. `done` holds the results of the stages before it (the order of
 * ANALYSIS_STAGES guarantees they are there).
 */
const STAGE_WORK: { readonly [K in AnalysisStage]: (input: AnalysisInput, options: AnalysisOptions, done: AnalysisResult) => AnalysisResult[K] } = {
  faces: ({ mesh }, o) => o.faces ?? extractBoundaryFaces(mesh),
  tractions: ({ mesh, stress }, _o, { faces }) => computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, stress, faces),
  invariants: (input) => {
    const nodal = displayStressOf(input)
    return computeNodalInvariants(allocateNodalInvariants(nodal.length / 6), nodal)
  },
  elementBalance: ({ mesh, stress, bodyForce }, o) =>
    computeElementBalance(allocateElementBalance(mesh.elementCount, o.balancePrecision ?? 'double'), mesh, stress, bodyForce),
  bodyBalance: ({ mesh, bodyForce }, _o, { faces, tractions }) => computeBodyBalance(mesh, faces, tractions, bodyForce),
  loadPatches: ({ mesh }, o, { faces, tractions, invariants }) => findLoadPatches(mesh, faces, tractions, invariants.vonMises, o.loadPatches),
  verdict: ({ bodyForce }, o, { faces, tractions, loadPatches, bodyBalance, elementBalance }) =>
    computeBalanceVerdict(faces, tractions, loadPatches, bodyBalance, elementBalance, bodyForce, o.leastBalanced),
}

/** Keeps a finished stage's result in `done` and reports it. */
function finish<K extends AnalysisStage>(done: Record<string, unknown>, stage: K, result: AnalysisResult[K], t0: number, onStage: StageCallback | undefined): void {
  done[stage] = result
  onStage?.({ stage, ms: performance.now() - t0, result } as StageReport)
}

/** Every stage, here and now. */
export function runAnalysis(input: AnalysisInput, options: AnalysisOptions = {}, onStage?: StageCallback): AnalysisResult {
  const done: Record<string, unknown> = {}
  for (const stage of ANALYSIS_STAGES) {
    const t0 = performance.now()
    finish(done, stage, STAGE_WORK[stage](input, options, done as unknown as AnalysisResult), t0, onStage)
  }
  return done as unknown as AnalysisResult
}

/** Every stage, with offloaded stages awaited at their turn and `beforeStage` awaited before each. */
export async function runAnalysisAsync(input: AnalysisInput, options: AnalysisOptions, hooks: AsyncAnalysisHooks, onStage?: StageCallback): Promise<AnalysisResult> {
  const done: Record<string, unknown> = {}
  const offloaded: Partial<Record<AnalysisStage, Promise<unknown>>> = hooks.offloaded ?? {}
  for (const stage of ANALYSIS_STAGES) {
    await hooks.beforeStage?.(stage)
    const t0 = performance.now()
    const away = offloaded[stage]
    finish(done, stage, away ? await away as AnalysisResult[typeof stage] : STAGE_WORK[stage](input, options, done as unknown as AnalysisResult), t0, onStage)
  }
  return done as unknown as AnalysisResult
}
