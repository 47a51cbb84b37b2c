/**
 * The envelope of a section over load cases and combinations: for each resultant component in
 * section axes (axial N, shears V1 V2, torque T, bendings M1 M2), the largest and the smallest
 * value, the case or combination that governs each, and that case's whole resultant (the
 * concurrent values), for the section and for each of its regions.
 *
 * All cases of a cut at once: the stencil (sectionStencil.ts: polygons, quadrature points and
 * their interpolation weights) is built once, each case is one pass over the section's own
 * element-nodes, and each combination is the factored sum of its cases' integrals (exact by
 * superposition: the integrals are linear in the stress). Section axes and centroids are the
 * geometry's, the same for every case.
 *
 * Units: forces S·L², moments S·L³ in model units (as SectionResult).
 */
import type { Combination } from '../model/loadCases.ts'
import { sameCaseName } from '../model/loadCases.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { CompiledStencil, StencilOptions } from './sectionStencil.ts'
import { CASE_SLOTS, buildSectionStencil, compileStencil, stencilIntegrals, stencilRecord } from './sectionStencil.ts'
import type { SectionPlane, SectionResult } from './types.ts'

/** Largest and smallest value of one component and the cases that govern them (first in order on a tie). */
export interface EnvelopeEntry {
  readonly max: number
  readonly maxCase: string
  readonly min: number
  readonly minCase: string
}

/** The envelope of one resultant in section axes (the shape `tractus cut --case all --json` prints). */
export interface ResultantEnvelope {
  readonly axial: EnvelopeEntry
  readonly torque: EnvelopeEntry
  readonly shear: readonly [EnvelopeEntry, EnvelopeEntry]
  readonly bending: readonly [EnvelopeEntry, EnvelopeEntry]
}

/** A resultant in section axes: what an envelope ranges over. */
export type AxisResultant = Pick<SectionResult, 'axial' | 'shear' | 'torque' | 'bending'>

/** The envelope of `rows` (name, resultant), in their order; null when there are none. */
export function resultantEnvelope(rows: readonly { readonly name: string; readonly r: AxisResultant }[]): ResultantEnvelope | null {
  if (rows.length === 0) return null
  const entry = (get: (r: AxisResultant) => number): EnvelopeEntry => {
    let max = get(rows[0].r), min = max, maxCase = rows[0].name, minCase = maxCase
    for (let i = 1; i < rows.length; i++) {
      const v = get(rows[i].r)
      if (v > max) { max = v; maxCase = rows[i].name }
      if (v < min) { min = v; minCase = rows[i].name }
    }
    return { max, maxCase, min, minCase }
  }
  return {
    axial: entry((r) => r.axial),
    torque: entry((r) => r.torque),
    shear: [entry((r) => r.shear[0]), entry((r) => r.shear[1])],
    bending: [entry((r) => r.bending[0]), entry((r) => r.bending[1])],
  }
}

/** One case's (or combination's) figures on the section: the section record and its regions'. */
export interface CaseSection {
  readonly name: string
  readonly kind: 'case' | 'combination'
  readonly section: SectionResult
  readonly regions: readonly SectionResult[]
}

export interface SectionEnvelope {
  /** Every case, then every combination, in order. */
  readonly cases: readonly CaseSection[]
  /** Over the cases and combinations (or the combinations only); null when there is nothing to envelope. */
  readonly envelope: ResultantEnvelope | null
  /** Per region (largest area first): its area, centroid, parts and envelope. */
  readonly regions: readonly { readonly area: number; readonly centroid: Vec3; readonly parts: readonly number[]; readonly envelope: ResultantEnvelope | null }[]
  readonly combinationsOnly: boolean
  /** Element-node entries of the section's stencil (its size: what each case's pass walks before merging). */
  readonly stencilEntries: number
}

export interface EnvelopeOptions extends StencilOptions {
  /** Envelope over the combinations only (every case is still reported). */
  readonly combinationsOnly?: boolean
}

/**
 * Every case's and combination's section figures and their envelope, from one stencil.
 * `cases`: name and stress field per case (the fields on `mesh`'s rows); combinations name cases
 * of that list (matched without regard to letter case).
 */
export function sectionEnvelope(
  mesh: Mesh, cases: readonly { readonly name: string; readonly field: StressField }[], combinations: readonly Combination[],
  plane: SectionPlane, options: EnvelopeOptions = {},
): SectionEnvelope {
  // the stencil's element entries are views of storage the next build reuses: it is compiled
  // (for every rows index the cases have) within this call
  const s = buildSectionStencil(mesh, plane, options)
  const width = CASE_SLOTS * (1 + s.regionCount)
  // one compiled stencil per rows index (every case of a model shares one); two cases on the
  // same rows are integrated in one walk (stencilIntegrals)
  let compiled: CompiledStencil | null = null
  const ints = cases.map(() => new Float64Array(width))
  for (let i = 0; i < cases.length; i++) {
    const c = cases[i]
    if (!compiled || !sameRows(compiled.rows, c.field.rows)) compiled = compileStencil(s, mesh, c.field)
    const next = cases[i + 1]
    if (next && sameRows(compiled.rows, next.field.rows)) {
      stencilIntegrals(ints[i], compiled, s.normal, c.field.values, ints[i + 1], next.field.values)
      i++
    } else stencilIntegrals(ints[i], compiled, s.normal, c.field.values)
  }
  const comboInts = combinations.map((k) => {
    const out = new Float64Array(width)
    for (const [name, f] of Object.entries(k.factors)) {
      const i = cases.findIndex((c) => sameCaseName(c.name, name))
      if (i < 0) throw new RangeError(`combination "${k.name}" names "${name}", which is not among the cases given`)
      const src = ints[i]
      for (let j = 0; j < width; j++) out[j] += f * src[j]
    }
    return out
  })
  const rowsOf = (name: string, kind: CaseSection['kind'], v: Float64Array): CaseSection => ({
    name, kind, section: stencilRecord(s, v, 0),
    regions: Array.from({ length: s.regionCount }, (_, g) => stencilRecord(s, v, 1 + g)),
  })
  const all: CaseSection[] = [
    ...cases.map((c, i) => rowsOf(c.name, 'case', ints[i])),
    ...combinations.map((k, i) => rowsOf(k.name, 'combination', comboInts[i])),
  ]
  const over = options.combinationsOnly ? all.filter((c) => c.kind === 'combination') : all
  const envelope = resultantEnvelope(over.map((c) => ({ name: c.name, r: c.section })))
  const regions = Array.from({ length: s.regionCount }, (_, g) => {
    const first = all[0].regions[g]
    return { area: first.area, centroid: first.centroid, parts: s.regionParts[g], envelope: resultantEnvelope(over.map((c) => ({ name: c.name, r: c.regions[g] }))) }
  })
  return { cases: all, envelope, regions, combinationsOnly: options.combinationsOnly === true, stencilEntries: s.entries }
}

function sameRows(a: readonly Int32Array[], b: readonly Int32Array[]): boolean {
  return a.length === b.length && a.every((r, i) => r === b[i])
}
