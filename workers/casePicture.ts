/**
 * The analysis of another load case on the loaded mesh, for the engine worker's case switch
 * (showCase). What depends only on the mesh was built at load and is kept: the boundary faces,
 * the surface's geometry (positions, normals, triangles; they stay on the GPU), the feature edges
 * and the assembly's triangle groups. A switch computes and sends only what the case changes:
 *
 *   tractions → invariants (surface) → body balance → load patches → element balance → verdict
 *   → surface scalars and patch labels → extras (displacement, components, extremes)
 *
 * The stages are those of the analysis pipeline (src/mechanics/analysisPipeline.ts) with one
 * difference: the principal stresses, which only the surface's colours read, are computed at the
 * surface's nodes alone (about a seventh of the nodes of a 10^6-element block); von Mises, which the
 * load patches take a percentile of over every node, at every node. The element balance, which
 * needs no faces, may run on the engine's pool beside the other stages. Same kernels, same values, bit
 * for bit (test/unit/workers/casePicture.test.ts checks them against the pipeline's). The body
 * balance takes the body's volume and centroid from the load (they do not depend on the stress).
 *
 * Units: the model's (see src/mechanics/types.ts). Layouts: surfaceTriangles.ts.
 */
import type { Mesh, Model, Vec3 } from '../src/model/model.ts'
import type { AnalysisInput } from '../src/mechanics/analysisPipeline.ts'
import { displayStressOf } from '../src/mechanics/analysisPipeline.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../src/mechanics/tractions.ts'
import { principalStressesAt, vonMisesAt } from '../src/mechanics/invariants.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance } from '../src/mechanics/balanceAudit.ts'
import { findLoadPatches } from '../src/mechanics/loadPatches.ts'
import type { LoadPatchOptions } from '../src/mechanics/loadPatches.ts'
import { computeBalanceVerdict, LEAST_BALANCED_COUNT } from '../src/mechanics/balanceVerdict.ts'
import type { BalanceVerdictResult, IndicatorSpread } from '../src/mechanics/balanceVerdict.ts'
import { buildSurfaceScalars, SURFACE_QUANTITIES } from '../src/mechanics/surfaceTriangles.ts'
import type { SurfaceInvariants, SurfaceQuantity, SurfaceScalars } from '../src/mechanics/surfaceTriangles.ts'
import { allocateStressJump, computeStressJump } from '../src/mechanics/stressJump.ts'
import { buildComponentScalars } from '../src/mechanics/componentScalars.ts'
import { GLOBAL_AXES } from '../src/mechanics/componentAxes.ts'
import { scalarExtremes } from '../src/mechanics/scalarExtremes.ts'
import { gatherNodalVectors, maxDisplacement, surfaceDisplacement } from '../src/mechanics/deformation.ts'
import { caseAssembly } from './assembly.ts'
import type { LoadExtras, ScalarExtremes } from './protocol.ts'
import type { BodyBalance, BoundaryFaces, ElementBalance, LoadPatches, SurfaceTractions } from '../src/mechanics/types.ts'

/** The distinct nodes of the boundary faces, ascending (Int32Array). */
export function surfaceNodesOf(faces: BoundaryFaces, nodeCount: number): Int32Array {
  const seen = new Uint8Array(nodeCount)
  const nodes = faces.nodes
  let n = 0
  for (let i = 0; i < nodes.length; i++) {
    const p = nodes[i]
    if (p >= 0 && seen[p] === 0) { seen[p] = 1; n++ }
  }
  const out = new Int32Array(n)
  for (let p = 0, k = 0; p < nodeCount; p++) if (seen[p]) out[k++] = p
  return out
}

/**
 * Von Mises at every node and σ1 ≥ σ2 ≥ σ3 at `surfaceNodes` (NaN at the other nodes) of the
 * nodal stress (6 per node): the kernels of invariants.ts, the principal values without their
 * directions (the same values: the directions are worked out after them).
 */
export function surfaceInvariants(stress: Float64Array, surfaceNodes: Int32Array): SurfaceInvariants {
  const N = stress.length / 6
  const vonMises = new Float64Array(N)
  for (let i = 0; i < N; i++) vonMises[i] = vonMisesAt(stress, 6 * i)
  const principal = new Float64Array(3 * N).fill(NaN)
  for (let k = 0; k < surfaceNodes.length; k++) {
    const i = surfaceNodes[k]
    principalStressesAt(stress, 6 * i, principal, 3 * i, undefined, 0)
  }
  return { vonMises, principal }
}

/** The case's analysis on the kept faces (the pipeline's results, the invariants at the surface). */
export interface CaseAnalysis {
  readonly tractions: SurfaceTractions
  readonly invariants: SurfaceInvariants
  readonly elementBalance: ElementBalance
  readonly bodyBalance: BodyBalance
  readonly loadPatches: LoadPatches
  readonly verdict: BalanceVerdictResult
}

/** The stages that need no element balance: tractions, invariants at the surface, body balance, load patches. */
export type SurfaceStages = Pick<CaseAnalysis, 'tractions' | 'invariants' | 'bodyBalance' | 'loadPatches'>

/**
 * The case's stages on the kept boundary faces that need no element balance; `mark(stage)` is
 * called as each begins (the engine's stage clock). The engine's pool may compute the element
 * balance meanwhile (it needs no faces), which is why it comes after these.
 */
export function surfaceStages(
  input: AnalysisInput, faces: BoundaryFaces, basis: Pick<CaseBasis, 'surfaceNodes' | 'body'>, rule: LoadPatchOptions | undefined, mark: (stage: string) => void,
): SurfaceStages {
  const mesh: Mesh = input.mesh
  mark('tractions')
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, input.stress, faces)
  mark('invariants')
  const invariants = surfaceInvariants(displayStressOf(input), basis.surfaceNodes)
  mark('bodyBalance')
  const bodyBalance = computeBodyBalance(mesh, faces, tractions, input.bodyForce, basis.body)
  mark('loadPatches')
  const loadPatches = findLoadPatches(mesh, faces, tractions, invariants.vonMises, rule)
  return { tractions, invariants, bodyBalance, loadPatches }
}

/**
 * The verdict stage on the surface's stages and the element balance (single precision, as at
 * load): the whole case analysis. `spread`: the indicator's spread when computed elsewhere (the
 * engine's pool, beside the surface's scalars).
 */
export function withVerdict(
  input: AnalysisInput, faces: BoundaryFaces, early: SurfaceStages, elementBalance: ElementBalance, mark: (stage: string) => void, spread?: IndicatorSpread,
): CaseAnalysis {
  mark('verdict')
  const verdict = computeBalanceVerdict(faces, early.tractions, early.loadPatches, early.bodyBalance, elementBalance, input.bodyForce, LEAST_BALANCED_COUNT, spread)
  return { ...early, elementBalance, verdict }
}

/** The whole case analysis on one thread: the surface's stages, the element balance, the verdict. */
export function analyseCaseOnSurface(
  input: AnalysisInput, faces: BoundaryFaces, basis: Pick<CaseBasis, 'surfaceNodes' | 'body'>, rule: LoadPatchOptions | undefined, mark: (stage: string) => void,
): CaseAnalysis {
  const early = surfaceStages(input, faces, basis, rule, mark)
  mark('elementBalance')
  const balance = computeElementBalance(allocateElementBalance(input.mesh.elementCount, 'single'), input.mesh, input.stress, input.bodyForce)
  return withVerdict(input, faces, early, balance, mark)
}

/**
 * What a case switch keeps of the load (the surface's geometry itself went to the main thread):
 * the surface's vertex runs, the feature edges' end nodes, the surface's nodes, and the body's
 * volume and centroid (L³, L).
 */
export interface CaseBasis {
  readonly faceVertexStart: Int32Array
  readonly edgeNodes: Int32Array
  readonly surfaceNodes: Int32Array
  readonly body: { readonly volume: number; readonly centroid: Vec3 }
}

/**
 * What a load adds for the deformed shape, the component quantities and the extremes markers
 * (protocol LoadExtras): displacement on the surface vertices and the edge ends, the components
 * in global axes, and the extremes of every surface quantity.
 */
export function loadExtras(model: Model, faces: BoundaryFaces, nodalStress: Float64Array, scalars: Readonly<Record<SurfaceQuantity, Float32Array>>, edgeNodes: Int32Array): LoadExtras {
  const u = model.displacement
  const extremes = {} as Record<SurfaceQuantity, ScalarExtremes>
  for (const q of SURFACE_QUANTITIES) extremes[q] = scalarExtremes(scalars[q])
  return {
    deformation: u ? { surface: surfaceDisplacement(faces, u), edges: gatherNodalVectors(edgeNodes, u), max: maxDisplacement(u) } : null,
    components: buildComponentScalars(faces, model.mesh.coords, nodalStress, u, GLOBAL_AXES),
    extremes,
  }
}

/** Element-nodal stress: the stress jump per node, scaled by the reference stress of the patch rule; null for nodal stress. */
export function jumpOf(mesh: Mesh, stress: AnalysisInput['stress'], patches: LoadPatches): Float32Array | null {
  return stress.layout === 'nodal' ? null : computeStressJump(allocateStressJump(mesh.nodeCount), mesh, stress, patches.referenceStress)
}

/**
 * The case's surface on the load's vertex runs (CaseShown's parts but the summary): the scalars
 * and patch labels, the extras, the assembly's case figures (null with one part).
 */
export function caseSurface(
  model: Model, faces: BoundaryFaces, basis: CaseBasis, analysis: Pick<CaseAnalysis, 'tractions' | 'invariants' | 'elementBalance' | 'loadPatches'>, input: AnalysisInput,
): { surface: SurfaceScalars; extras: LoadExtras; assembly: ReturnType<typeof caseAssembly> } {
  const { tractions, invariants, elementBalance: balance, loadPatches: patches } = analysis
  const surface = buildSurfaceScalars(faces, basis.faceVertexStart, tractions, invariants, balance.indicator, patches.faceLabel, jumpOf(model.mesh, input.stress, patches))
  const extras = loadExtras(model, faces, displayStressOf(input), surface.scalars, basis.edgeNodes)
  return { surface, extras, assembly: caseAssembly(model, input.stress) }
}
