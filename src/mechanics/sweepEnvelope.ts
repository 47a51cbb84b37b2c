/**
 * Every load case and combination of a model along a sweep, and the envelope per section: what
 * `tractus sweep --case all` prints and what the app's sweep chart and review report show.
 *
 * Each section is one `sectionEnvelope` (sectionEnvelope.ts): its stencil (the polygons and
 * their interpolation weights, which do not depend on the case) is built once for the plane, and
 * each case is one pass over the section's own element-nodes; combinations are factored sums.
 *
 * `packSweepCases` lays the result out for the app as typed arrays: per case and combination the
 * six components in section axes, one value per section, and per component the largest and the
 * smallest value with the index of the governing case (-1 and NaN where the plane misses the
 * body). Units: forces S·L², moments S·L³ in model units.
 */
import { casesOf, combinationsOf } from '../model/loadCases.ts'
import type { Model, Vec3 } from '../model/model.ts'
import { nodalStressField } from '../model/stressField.ts'
import { sectionEnvelope } from './sectionEnvelope.ts'
import type { EnvelopeOptions, SectionEnvelope } from './sectionEnvelope.ts'
import type { SectionPlane, SectionResult } from './types.ts'

/** The envelope of every case and combination of `model` on one plane (regions unless `options.regions` is false). */
export function modelEnvelope(model: Model, plane: SectionPlane, options: EnvelopeOptions): SectionEnvelope {
  const cases = casesOf(model).map((c) => ({ name: c.name, field: c.stressField ?? nodalStressField(model.mesh, c.stress) }))
  return sectionEnvelope(model.mesh, cases, combinationsOf(model), plane, { regions: true, ...options })
}

/** One envelope per offset: the plane x·m = offset_k with unit normal m. */
export function sweepEnvelopes(model: Model, normal: Vec3, offsets: ArrayLike<number>, options: EnvelopeOptions): SectionEnvelope[] {
  const out: SectionEnvelope[] = []
  for (let k = 0; k < offsets.length; k++) {
    const o = offsets[k]
    out.push(modelEnvelope(model, { point: [o * normal[0], o * normal[1], o * normal[2]], normal }, options))
  }
  return out
}

/** The six components in section axes, in the order of the app's series. */
export const SWEEP_COMPONENTS = ['axial', 'shear1', 'shear2', 'torque', 'bending1', 'bending2'] as const
export type SweepComponent = (typeof SWEEP_COMPONENTS)[number]

const VALUE: Record<SweepComponent, (r: Pick<SectionResult, 'axial' | 'shear' | 'torque' | 'bending'>) => number> = {
  axial: (r) => r.axial, shear1: (r) => r.shear[0], shear2: (r) => r.shear[1],
  torque: (r) => r.torque, bending1: (r) => r.bending[0], bending2: (r) => r.bending[1],
}

/** One case's (or combination's) six components along the sweep, one value per section. */
export type CaseSeries = { readonly name: string; readonly kind: 'case' | 'combination' } & Readonly<Record<SweepComponent, Float64Array>>

/** Largest and smallest of one component per section, with the index (into `cases`) of the governing case. */
export interface SeriesEnvelope {
  readonly max: Float64Array
  readonly maxCase: Int32Array
  readonly min: Float64Array
  readonly minCase: Int32Array
}

/** Every case and combination along a sweep and the envelope per section, as typed arrays. */
export interface SweepCases {
  /** Every case, then every combination, in order. */
  readonly cases: readonly CaseSeries[]
  readonly envelope: Readonly<Record<SweepComponent, SeriesEnvelope>>
  /** The envelope ranges over the combinations only. */
  readonly combinationsOnly: boolean
}

/** Packs one envelope per section (sweepEnvelopes) into series; the governing case is the envelope's own pick. */
export function packSweepCases(envs: readonly SectionEnvelope[], combinationsOnly: boolean): SweepCases {
  const n = envs.length
  const first = envs[0]?.cases ?? []
  const cases: CaseSeries[] = first.map((c) => {
    const s = { name: c.name, kind: c.kind } as { name: string; kind: 'case' | 'combination' } & Record<SweepComponent, Float64Array>
    for (const key of SWEEP_COMPONENTS) s[key] = new Float64Array(n)
    return s
  })
  const index = new Map(first.map((c, i) => [c.name, i]))
  const envelope = {} as Record<SweepComponent, SeriesEnvelope>
  for (const key of SWEEP_COMPONENTS) envelope[key] = { max: new Float64Array(n).fill(NaN), maxCase: new Int32Array(n).fill(-1), min: new Float64Array(n).fill(NaN), minCase: new Int32Array(n).fill(-1) }
  for (let k = 0; k < n; k++) {
    const e = envs[k]
    e.cases.forEach((c, i) => { for (const key of SWEEP_COMPONENTS) cases[i][key][k] = VALUE[key](c.section) })
    // a plane that misses the body has no envelope
    if (!e.envelope || e.cases[0].section.empty) continue
    for (const key of SWEEP_COMPONENTS) {
      const x = key === 'axial' ? e.envelope.axial : key === 'torque' ? e.envelope.torque
        : key === 'shear1' ? e.envelope.shear[0] : key === 'shear2' ? e.envelope.shear[1] : key === 'bending1' ? e.envelope.bending[0] : e.envelope.bending[1]
      const t = envelope[key]
      t.max[k] = x.max; t.maxCase[k] = index.get(x.maxCase) ?? -1
      t.min[k] = x.min; t.minCase[k] = index.get(x.minCase) ?? -1
    }
  }
  return { cases, envelope, combinationsOnly }
}
