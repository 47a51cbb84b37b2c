/**
 * Runs the analysis pipeline (src/mechanics/analysisPipeline.ts) on a mesh and nodal stress, the
 * way the app and the CLI run it. `elements` and `body` name the element and body balance for the
 * tests written against those names.
 */
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { runAnalysis } from '../../src/mechanics/analysisPipeline.ts'
import type { AnalysisOptions } from '../../src/mechanics/analysisPipeline.ts'

export function runCore(mesh: Mesh, stress: Float64Array, bodyForce: Vec3 = [0, 0, 0], options: AnalysisOptions = {}) {
  const r = runAnalysis({ mesh, stress: nodalStressField(mesh, stress), bodyForce }, options)
  return { ...r, elements: r.elementBalance, body: r.bodyBalance }
}

export function maxAbs(a: ArrayLike<number>): number {
  let m = 0
  for (let i = 0; i < a.length; i++) { const v = Math.abs(a[i]); if (v > m) m = v }
  return m
}
