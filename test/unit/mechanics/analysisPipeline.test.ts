/**
 * The analysis pipeline chains the kernels in one order and reports each stage; both drivers give
 * the results of the kernels called one by one (the reference here: each kernel's own reference
 * test checks it against its published source), and stages handed in from elsewhere are used as
 * they are, not computed again.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { Model, Vec3 } from '../../../src/model/model.ts'
import { computeBalanceVerdict } from '../../../src/mechanics/balanceVerdict.ts'
import { ANALYSIS_STAGES, analysisInputOf, runAnalysis, runAnalysisAsync } from '../../../src/mechanics/analysisPipeline.ts'
import type { AnalysisStage, StageReport } from '../../../src/mechanics/analysisPipeline.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../../src/mechanics/tractions.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../../src/mechanics/invariants.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance } from '../../../src/mechanics/balanceAudit.ts'
import { findLoadPatches } from '../../../src/mechanics/loadPatches.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'

const mesh = boxMesh({ nx: 3, ny: 2, nz: 2, lx: 3, ly: 1, lz: 1 }, 'hex20')
// A bar pulled along x with a little bending (σxx linear in z) and a non-equilibrated σyy(x).
const values = stressField(mesh, (x, _y, z) => [100 + 20 * (z - 0.5), 3 * x, 0, 0, 0, 1])
const field = nodalStressField(mesh, values)
const bodyForce: Vec3 = [0, 0, -2]

/** The stages one by one, as each kernel's own caller would run them. */
function byHand(precision: 'double' | 'single') {
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
  const invariants = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), values)
  const elementBalance = computeElementBalance(allocateElementBalance(mesh.elementCount, precision), mesh, field, bodyForce)
  const bodyBalance = computeBodyBalance(mesh, faces, tractions, bodyForce)
  const loadPatches = findLoadPatches(mesh, faces, tractions, invariants.vonMises, { threshold: 0.1 })
  const verdict = computeBalanceVerdict(faces, tractions, loadPatches, bodyBalance, elementBalance, bodyForce)
  return { faces, tractions, invariants, elementBalance, bodyBalance, loadPatches, verdict }
}

describe('runAnalysis', () => {
  it('reports every stage once, in order, with its result and a wall time', () => {
    const seen: StageReport[] = []
    const r = runAnalysis({ mesh, stress: field, bodyForce }, { loadPatches: { threshold: 0.1 } }, (s) => seen.push(s))
    expect(seen.map((s) => s.stage)).toEqual(['faces', 'tractions', 'invariants', 'elementBalance', 'bodyBalance', 'loadPatches', 'verdict'])
    expect(ANALYSIS_STAGES).toEqual(seen.map((s) => s.stage))
    for (const s of seen) {
      expect(s.result).toBe(r[s.stage])
      expect(s.ms).toBeGreaterThanOrEqual(0)
    }
  })

  it('equals the kernels run one by one, in double and in single precision storage', () => {
    for (const precision of ['double', 'single'] as const) {
      const r = runAnalysis({ mesh, stress: field, bodyForce }, { balancePrecision: precision, loadPatches: { threshold: 0.1 } })
      expect(r).toEqual(byHand(precision))
      expect(r.elementBalance.indicator).toBeInstanceOf(precision === 'single' ? Float32Array : Float64Array)
    }
  })

  it('analysisInputOf wraps a model\'s nodal stress and takes its body force unless one is given', () => {
    const model: Model = { name: 'bar', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress: values, displacement: null, bodyForce, warnings: [] }
    const input = analysisInputOf(model)
    expect(input.stress.layout).toBe('nodal')
    expect(input.stress.values).toBe(values)
    input.stress.rows.forEach((r, b) => expect(r).toBe(mesh.blocks[b].conn))
    expect(input.bodyForce).toEqual(bodyForce)
    expect(analysisInputOf(model, [1, 2, 3]).bodyForce).toEqual([1, 2, 3])
  })
})

describe('runAnalysisAsync', () => {
  it('awaits beforeStage before each stage and gives the same results as runAnalysis', async () => {
    const order: string[] = []
    const r = await runAnalysisAsync({ mesh, stress: field, bodyForce }, { loadPatches: { threshold: 0.1 } }, {
      beforeStage: async (stage) => { order.push(`before ${stage}`); await new Promise((ok) => setTimeout(ok, 0)) },
    }, ({ stage }) => order.push(`done ${stage}`))
    expect(order).toEqual(ANALYSIS_STAGES.flatMap((s) => [`before ${s}`, `done ${s}`]))
    expect(r).toEqual(byHand('double'))
  })

  it('uses offloaded stages as given (the worker\'s pool) and computes the rest', async () => {
    const hand = byHand('single')
    const reported: AnalysisStage[] = []
    const r = await runAnalysisAsync({ mesh, stress: field, bodyForce }, { loadPatches: { threshold: 0.1 } }, {
      offloaded: { elementBalance: Promise.resolve(hand.elementBalance), invariants: Promise.resolve(hand.invariants) },
    }, ({ stage }) => reported.push(stage))
    expect(r.elementBalance).toBe(hand.elementBalance)
    expect(r.invariants).toBe(hand.invariants)
    expect(r.loadPatches).toEqual(hand.loadPatches)
    expect(reported).toEqual([...ANALYSIS_STAGES])
  })

  it('a failing offloaded stage fails the run with its own error', async () => {
    const broken = Promise.reject(new Error('pool worker lost'))
    broken.catch(() => undefined)
    await expect(runAnalysisAsync({ mesh, stress: field, bodyForce }, {}, { offloaded: { elementBalance: broken } })).rejects.toThrow('pool worker lost')
  })
})
