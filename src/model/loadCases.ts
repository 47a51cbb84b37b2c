/**
 * Load cases and combinations: several stress (and displacement) fields on one mesh, each a named
 * case, and named factor sets of cases (combinations).
 *
 * Tractions, section resultants and balance residuals are linear in the stress, so the field of a
 * combination is the factored sum of its cases' field VALUES in the same layout (nodal rows, or
 * element-nodal rows on the same rows index), and every figure of it follows by superposition.
 * Von Mises and principal stresses are not linear: they are computed from the combined field,
 * never combined themselves. The nodal display values of an element-nodal field are an average,
 * which is linear, so the combined display values are the factored sum of the cases' display values.
 *
 * `modelForCase(model, name)` returns the model with the stress, stress field, displacement and
 * body force of that case or combination, so the pipeline and every kernel stay single-case.
 * `Model.stress` etc. are those of the first case (`model.cases[0]`).
 *
 * Units: stress in model stress units, displacement in model length units, ρb in stress / length.
 * Layouts as Model: stress Float64Array(6·N) xx yy zz xy yz xz; displacement Float64Array(3·N).
 */
import { InputError } from './errors.ts'
import type { Model, Vec3 } from './model.ts'
import type { StressField } from './stressField.ts'

/**
 * One load case.
 * - `name`: as the user spelled it (model.json, else the file name); matched without regard to case.
 * - `bodyForce`: the case's own ρb; null = the model's `bodyForce` (the reader fills it in, so a
 *   model read from files has every case's ρb resolved).
 * - `stress`: nodal stress for display (6·N); `stressField`: the element-nodal field when the
 *   input was element-nodal (absent for nodal input).
 */
export interface LoadCase {
  readonly name: string
  readonly description: string
  readonly bodyForce: Vec3 | null
  readonly stress: Float64Array
  readonly stressField?: StressField
  readonly displacement: Float64Array | null
}

/** A named factor set: the factored sum Σ factors[case] · case. Factors are of cases, never of other combinations. */
export interface Combination {
  readonly name: string
  readonly factors: Readonly<Record<string, number>>
}

/** The case name of a model without cases (and of `stress.csv` in a bundle). */
export const DEFAULT_CASE = 'default'
/** The reserved name that asks for every case and combination at once (command line, envelope). */
export const ALL_CASES = 'all'
/** What a case or combination name may hold. */
export const CASE_NAME = /^[A-Za-z0-9_-]+$/

/** A model with the element-nodal field of its shown case, where the input had one. */
type WithCases = Model & { readonly stressField?: StressField }

/** The cases of a model; a model without cases has one, `default`, made of its own fields. */
export function casesOf(model: Model): readonly LoadCase[] {
  const m = model as WithCases
  if (m.cases && m.cases.length > 0) return m.cases
  return [{
    name: DEFAULT_CASE, description: '', bodyForce: null, stress: model.stress, displacement: model.displacement,
    ...(m.stressField ? { stressField: m.stressField } : {}),
  }]
}

export function combinationsOf(model: Model): readonly Combination[] {
  return (model as WithCases).combinations ?? []
}

/** Every name a user may pick: the cases in order, then the combinations in order. */
export function caseNames(model: Model): string[] {
  return [...casesOf(model).map((c) => c.name), ...combinationsOf(model).map((c) => c.name)]
}

/** The first case's name (what the model shows when no case is named). */
export function firstCaseName(model: Model): string {
  return casesOf(model)[0].name
}

/** True when the two names are the same case (names match without regard to letter case). */
export function sameCaseName(a: string, b: string): boolean {
  return a.toLowerCase() === b.toLowerCase()
}

export type CaseRef = { readonly kind: 'case'; readonly case: LoadCase } | { readonly kind: 'combination'; readonly combination: Combination }

/** The case or combination called `name`; an unknown name is an InputError listing the known ones. */
export function findCase(model: Model, name: string): CaseRef {
  const c = casesOf(model).find((x) => sameCaseName(x.name, name))
  if (c) return { kind: 'case', case: c }
  const k = combinationsOf(model).find((x) => sameCaseName(x.name, name))
  if (k) return { kind: 'combination', combination: k }
  throw new InputError('bad-argument', `no load case or combination "${name}"; this model has ${describeNames(model)}`)
}

/** "cases a, b and combinations c" for messages. */
export function describeNames(model: Model): string {
  const cases = casesOf(model).map((c) => c.name)
  const combos = combinationsOf(model).map((c) => c.name)
  return `case${cases.length === 1 ? '' : 's'} ${cases.join(', ')}${combos.length ? `; combination${combos.length === 1 ? '' : 's'} ${combos.join(', ')}` : ''}`
}

/**
 * Checks a combination against the cases: a known case per factor, finite factors, at least one
 * factor, a name of letters, digits, - and _ that is no case's and not `all`. `where` names the
 * source in the message (a file, or "the combination" in the app). Returns the factors keyed by
 * the cases' own spelling.
 */
export function checkCombination(cases: readonly { readonly name: string }[], combo: { name: unknown; factors: unknown }, where: { file?: string; field: string }): Combination {
  const bad = (field: string, message: string): never => { throw new InputError('bad-json', message, { ...(where.file ? { file: where.file } : {}), field }) }
  const name = combo.name
  if (typeof name !== 'string' || !CASE_NAME.test(name)) bad(`${where.field}.name`, `a combination needs a name of letters, digits, "-" and "_", like "ULS-1" (got ${JSON.stringify(name)})`)
  const n = name as string
  if (sameCaseName(n, ALL_CASES)) bad(`${where.field}.name`, `"${n}" is reserved (it asks for every case at once); name the combination otherwise`)
  if (cases.some((c) => sameCaseName(c.name, n))) bad(`${where.field}.name`, `"${n}" is already the name of a load case; give the combination a name of its own`)
  const f = combo.factors
  if (typeof f !== 'object' || f === null || Array.isArray(f)) bad(`${where.field}.factors`, `factors must map case names to numbers, like {"dead": 1.35, "imposed": 1.5}`)
  const out: Record<string, number> = {}
  const entries = Object.entries(f as Record<string, unknown>)
  if (entries.length === 0) bad(`${where.field}.factors`, `combination "${n}" has no factors; give at least one, like {"${cases[0]?.name ?? 'dead'}": 1}`)
  for (const [k, v] of entries) {
    const c = cases.find((x) => sameCaseName(x.name, k))
    if (!c) bad(`${where.field}.factors.${k}`, `combination "${n}" names "${k}", which is not a load case (factors are of cases, not of other combinations); the cases are ${cases.map((x) => x.name).join(', ')}`)
    if (typeof v !== 'number' || !Number.isFinite(v)) bad(`${where.field}.factors.${k}`, `the factor of "${k}" in combination "${n}" must be a finite number, got ${JSON.stringify(v) ?? String(v)}`)
    if (out[c!.name] !== undefined) bad(`${where.field}.factors.${k}`, `combination "${n}" gives case "${c!.name}" two factors; give it one`)
    out[c!.name] = v as number
  }
  return { name: n, factors: out }
}

/** out = Σ f_k · arrays_k, element by element (out is zeroed first); returns out. */
export function factoredSum(out: Float64Array, factors: readonly number[], arrays: readonly Float64Array[]): Float64Array {
  out.fill(0)
  for (let k = 0; k < arrays.length; k++) {
    const f = factors[k], a = arrays[k]
    if (f === 0) continue
    for (let i = 0; i < out.length; i++) out[i] += f * a[i]
  }
  return out
}

/**
 * The fields of a combination as a LoadCase: stress, element-nodal field (on the first case's
 * rows, which the readers give every case), displacement (null unless every case has one) and
 * ρb, each the factored sum. `model` supplies the cases and the default ρb.
 */
export function combinedCase(model: Model, combo: Combination): LoadCase {
  const cases = casesOf(model)
  const picked = Object.entries(combo.factors).map(([name, f]) => {
    const c = cases.find((x) => sameCaseName(x.name, name))
    if (!c) throw new InputError('bad-argument', `combination "${combo.name}" names "${name}", which is not a load case of this model; the cases are ${cases.map((x) => x.name).join(', ')}`)
    return { c, f }
  })
  const factors = picked.map((p) => p.f)
  const stress = factoredSum(new Float64Array(model.stress.length), factors, picked.map((p) => p.c.stress))
  const fields = picked.map((p) => p.c.stressField)
  let stressField: StressField | undefined
  if (fields.every((x) => x !== undefined) && fields.length > 0) {
    const first = fields[0]!
    stressField = { values: factoredSum(new Float64Array(first.values.length), factors, fields.map((x) => x!.values)), rows: first.rows, layout: first.layout }
  }
  const disps = picked.map((p) => p.c.displacement)
  const displacement = disps.every((d) => d !== null) && disps.length > 0 ? factoredSum(new Float64Array(disps[0]!.length), factors, disps as Float64Array[]) : null
  const bodyForce: Vec3 = [0, 0, 0]
  for (const p of picked) {
    const b = p.c.bodyForce ?? model.bodyForce
    for (let k = 0; k < 3; k++) bodyForce[k] += p.f * b[k]
  }
  return { name: combo.name, description: describeFactors(combo), bodyForce, stress, displacement, ...(stressField ? { stressField } : {}) }
}

/** "1.35 × dead + 1.5 × imposed" */
export function describeFactors(combo: Combination): string {
  return Object.entries(combo.factors).map(([k, f], i) => {
    const s = `${Math.abs(f)} × ${k}`
    return i === 0 ? (f < 0 ? `−${s}` : s) : `${f < 0 ? '−' : '+'} ${s}`
  }).join(' ')
}

/** The case (fields as given) or combination (fields summed) called `name`, as a LoadCase. */
export function caseFields(model: Model, name: string): LoadCase {
  const ref = findCase(model, name)
  return ref.kind === 'case' ? ref.case : combinedCase(model, ref.combination)
}

/**
 * The model with the stress, stress field, displacement and ρb of case or combination `name`
 * (the cases and combinations lists stay, so the result can be switched again). An unknown name
 * is an InputError listing the known ones.
 */
export function modelForCase(model: Model, name: string): Model {
  const c = caseFields(model, name)
  const { stressField: _drop, ...rest } = model as WithCases
  return {
    ...rest,
    stress: c.stress,
    displacement: c.displacement,
    bodyForce: c.bodyForce ?? model.bodyForce,
    ...(c.stressField ? { stressField: c.stressField } : {}),
  } as Model
}
