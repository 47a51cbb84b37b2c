/**
 * The worker's side of a section sweep: runs the sweep kernel on the loaded model with its cached
 * boundary faces and tractions, and packs the six section quantities into typed arrays, so the
 * app thread never loops over elements or section records.
 */
import type { Model, Vec3 } from '../src/model/model.ts'
import { unitNormal } from '../src/mechanics/plane.ts'
import { sweepSections } from '../src/mechanics/sectionSweep.ts'
import { modelStressField } from '../src/model/stressField.ts'
import type { BoundaryFaces, SurfaceTractions } from '../src/mechanics/types.ts'
import { projectReference, referenceOf } from '../src/mechanics/sectionAxes.ts'
import type { SectionAxesChoice } from '../src/mechanics/sectionAxes.ts'
import type { Combination } from '../src/model/loadCases.ts'
import { casesOf, combinationsOf } from '../src/model/loadCases.ts'
import { packSweepCases, SWEEP_COMPONENTS, sweepEnvelopes } from '../src/mechanics/sweepEnvelope.ts'
import type { SweepCases } from '../src/mechanics/sweepEnvelope.ts'
import type { SweepCaseRequest, SweepReply } from './protocol.ts'

/** [min, max] of x·m over the nodes (length units); m need not be unit (unitNormal: zero is an InputError). */
export function extentAlong(coords: Float64Array, normal: Vec3): [number, number] {
  const [mx, my, mz] = unitNormal(normal, 'sweep direction')
  let lo = Infinity, hi = -Infinity
  for (let i = 0; i < coords.length; i += 3) {
    const d = coords[i] * mx + coords[i + 1] * my + coords[i + 2] * mz
    if (d < lo) lo = d
    if (d > hi) hi = d
  }
  return lo <= hi ? [lo, hi] : [0, 0]
}

export function sweepAlong(
  model: Model, faces: BoundaryFaces, tractions: SurfaceTractions, normal: Vec3, count: number, from?: number, to?: number,
  axes: SectionAxesChoice = { kind: 'principal' },
): SweepReply {
  const extent = extentAlong(model.mesh.coords, normal)
  // One reference for every section (checked once: a reference parallel to the normal is an input error).
  const m = unitNormal(normal, 'sweep direction')
  const reference = referenceOf(m, axes)
  projectReference(m, reference)
  // The end planes sit a hair inside the body: a plane through the very end face cuts nothing.
  const inset = (extent[1] - extent[0]) * 1e-6
  const a = from ?? extent[0] + inset
  const b = to ?? extent[1] - inset
  const { offsets, results } = sweepSections(model.mesh, modelStressField(model), model.bodyForce, normal, a, b, count, { faces, tractions, axes: { kind: axes.kind, reference } })
  const n = results.length
  const out = {
    axial: new Float64Array(n), shear1: new Float64Array(n), shear2: new Float64Array(n), torque: new Float64Array(n),
    bending1: new Float64Array(n), bending2: new Float64Array(n), freeBodyRelative: new Float64Array(n),
    freeBodyMomentRelative: new Float64Array(n), empty: new Uint8Array(n),
  }
  for (let k = 0; k < n; k++) {
    const r = results[k]
    out.axial[k] = r.axial
    out.shear1[k] = r.shear[0]
    out.shear2[k] = r.shear[1]
    out.torque[k] = r.torque
    out.bending1[k] = r.bending[0]
    out.bending2[k] = r.bending[1]
    out.freeBodyRelative[k] = r.freeBody.relative
    out.freeBodyMomentRelative[k] = r.freeBody.momentRelative
    out.empty[k] = r.empty ? 1 : 0
  }
  return { normal: m, extent, offsets, ...out, axes: { kind: axes.kind, reference } }
}

/**
 * Every case and combination of `base` (with the app's combinations) at the sweep's own sections,
 * with the sweep's section axes; null when the model has a single case and no combination.
 */
export function sweepCasesAlong(base: Model, sweep: SweepReply, request: SweepCaseRequest): SweepCases | null {
  const model = withCombinations(base, request.combinations)
  if (casesOf(model).length + combinationsOf(model).length < 2) return null
  const only = request.combinationsOnly === true && combinationsOf(model).length > 0
  const envs = sweepEnvelopes(model, sweep.normal, sweep.offsets, { axes: sweep.axes, regions: false, combinationsOnly: only })
  return packSweepCases(envs, only)
}

/** The model with the app's combinations after its own (an app combination replaces a model's of the same name). */
export function withCombinations(model: Model, extra: readonly Combination[]): Model {
  if (extra.length === 0) return model
  const own = combinationsOf(model).filter((c) => !extra.some((x) => x.name.toLowerCase() === c.name.toLowerCase()))
  return { ...model, combinations: [...own, ...extra] }
}

export function sweepTransfer(r: SweepReply): ArrayBuffer[] {
  const own = [r.offsets, r.axial, r.shear1, r.shear2, r.torque, r.bending1, r.bending2, r.freeBodyRelative, r.freeBodyMomentRelative, r.empty].map((a) => a.buffer as ArrayBuffer)
  const c = r.cases
  if (!c) return own
  return [
    ...own,
    ...c.cases.flatMap((x) => SWEEP_COMPONENTS.map((key) => x[key].buffer as ArrayBuffer)),
    ...SWEEP_COMPONENTS.flatMap((key) => { const e = c.envelope[key]; return [e.max, e.maxCase, e.min, e.minCase].map((a) => a.buffer as ArrayBuffer) }),
  ]
}
