/**
 * The load cases of a CSV bundle: which files hold which case, the cases and combinations that
 * model.json describes, and the reading of every case after the first.
 *
 * - `stress.csv` (and `displacement.csv`) is the case named `default`; `stress.NAME.csv` (and
 *   `displacement.NAME.csv`) is case NAME: letters, digits, "-" and "_", matched without regard to
 *   letter case like the file names; `all` is reserved. A bundle may hold case files only.
 * - model.json `"cases": [{"name", "description", "bodyForce"}]` describes cases in the order
 *   listed (a case's own ρb; the model's `bodyForce` is the default for cases that name none);
 *   `"combinations": [{"name", "factors": {"case": factor}}]` (factors of cases only; a
 *   combination's ρb is the factored sum).
 * - Order: the listed cases, then `default`, then the others by name; the first is the model's
 *   first case, read by readCsvBundle as before; `readOtherCases` reads the rest here.
 * - Every case file holds the same nodes as the first case's file (any order): a missing or an
 *   extra id is an InputError naming it. Stress here is nodal; ρb in stress / length.
 */
import { InputError } from '../model/errors.ts'
import type { StressField } from '../model/stressField.ts'
import type { Combination, LoadCase } from '../model/loadCases.ts'
import { ALL_CASES, CASE_NAME, DEFAULT_CASE, checkCombination, sameCaseName } from '../model/loadCases.ts'
import type { Vec3 } from '../model/model.ts'
import type { NumericTable } from './csvTable.ts'
import { rowOfId } from './idIndex.ts'
import type { IdIndex } from './idIndex.ts'

/** One planned case: its name and description, own ρb (null: the model's) and its files. */
export interface PlannedCase<T> {
  readonly name: string
  readonly description: string
  readonly bodyForce: Vec3 | null
  readonly stress: T
  readonly stressRole: string
  readonly displacement: T | undefined
  readonly displacementRole: string
}

export interface CasePlan<T> {
  /** In the model's order; [0] is the first case. */
  readonly cases: readonly PlannedCase<T>[]
  readonly combinations: readonly Combination[]
  /** True when the bundle says anything about cases (case files or model.json keys). */
  readonly described: boolean
}

type Obj = Record<string, unknown>

function baseOf(name: string): string {
  const i = Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\'))
  return name.slice(i + 1)
}

/**
 * Sorts the bundle's stress and displacement files into cases and reads model.json's "cases" and
 * "combinations" (`json`: the parsed model.json, or null). `byRole` holds stress and displacement
 * (the default case), `caseFiles` the stress.NAME and displacement.NAME roles.
 */
export function planCases<T extends { readonly name: string }>(
  byRole: ReadonlyMap<string, T>, caseFiles: ReadonlyMap<string, T>, json: unknown, jsonFile: string | null,
): CasePlan<T> {
  interface Found { name: string; stress?: T; stressRole?: string; displacement?: T; displacementRole?: string }
  const found = new Map<string, Found>()
  const slot = (name: string): Found => {
    const key = name.toLowerCase()
    let f = found.get(key)
    if (!f) { f = { name }; found.set(key, f) }
    return f
  }
  const put = (kind: 'stress' | 'displacement', name: string, role: string, file: T): void => {
    const f = slot(name)
    const prev = f[kind]
    if (prev) throw new InputError('bad-argument', `two files for load case "${f.name}": ${prev.name} and ${file.name}; keep one (${kind}.csv is the case "${DEFAULT_CASE}")`, { file: file.name })
    f[kind] = file
    if (kind === 'stress') f.stressRole = role; else f.displacementRole = role
  }
  const s0 = byRole.get('stress'), d0 = byRole.get('displacement')
  if (s0) put('stress', DEFAULT_CASE, 'stress', s0)
  if (d0) put('displacement', DEFAULT_CASE, 'displacement', d0)
  for (const [role, file] of caseFiles) {
    const dot = role.indexOf('.')
    const kind = role.slice(0, dot) as 'stress' | 'displacement'
    // the name as the user spelled it: from the file name when it follows ours, else the role
    const b = baseOf(file.name)
    const spelled = b.toLowerCase() === `${role}.csv` ? b.slice(dot + 1, b.length - 4) : role.slice(dot + 1)
    if (!CASE_NAME.test(spelled)) throw new InputError('bad-argument', `"${spelled}" is not a load case name: use letters, digits, "-" and "_" only (rename the file to ${kind}.NAME.csv)`, { file: file.name })
    if (sameCaseName(spelled, ALL_CASES)) throw new InputError('bad-argument', `"${spelled}" is reserved (it asks for every case at once); rename the file`, { file: file.name })
    put(kind, spelled, role, file)
  }
  for (const f of found.values()) {
    if (!f.stress) throw new InputError('missing-file', `displacement of load case "${f.name}" without its stress: add ${f.name === DEFAULT_CASE ? 'stress.csv' : `stress.${f.name}.csv`}, or remove this file`, { file: f.displacement!.name })
  }

  const o = (typeof json === 'object' && json !== null && !Array.isArray(json) ? json : {}) as Obj
  const file = jsonFile ?? 'model.json'
  const listed: PlannedCase<T>[] = []
  if (o.cases !== undefined) {
    const how = 'cases must be a list like [{"name": "dead", "description": "self weight", "bodyForce": [0, 0, -77000]}]'
    if (!Array.isArray(o.cases)) throw new InputError('bad-json', how, { file, field: 'cases' })
    o.cases.forEach((c: unknown, i) => {
      const at = `cases[${i}]`
      if (typeof c !== 'object' || c === null || Array.isArray(c)) throw new InputError('bad-json', how, { file, field: at })
      const r = c as Obj
      for (const k of Object.keys(r)) if (!['name', 'description', 'bodyForce'].includes(k)) throw new InputError('bad-json', `unknown key "${k}"; a case takes name, description and bodyForce`, { file, field: `${at}.${k}` })
      if (typeof r.name !== 'string' || !CASE_NAME.test(r.name)) throw new InputError('bad-json', `a case needs a name of letters, digits, "-" and "_" (got ${JSON.stringify(r.name)})`, { file, field: `${at}.name` })
      const name = r.name
      if (listed.some((x) => sameCaseName(x.name, name))) throw new InputError('bad-json', `case "${name}" is listed twice; list each case once`, { file, field: `${at}.name` })
      const f = found.get(name.toLowerCase())
      if (!f) {
        const have = [...found.values()].map((x) => x.name).join(', ') || 'none'
        throw new InputError('missing-file', `case "${name}" has no stress file: add ${sameCaseName(name, DEFAULT_CASE) ? 'stress.csv' : `stress.${name}.csv`} (the cases given as files: ${have})`, { file, field: `${at}.name` })
      }
      if (r.description !== undefined && typeof r.description !== 'string') throw new InputError('bad-json', 'a case\'s description must be a string', { file, field: `${at}.description` })
      let bodyForce: Vec3 | null = null
      if (r.bodyForce !== undefined) {
        const b = r.bodyForce
        if (!Array.isArray(b) || b.length !== 3 || !b.every((x) => typeof x === 'number' && Number.isFinite(x))) {
          throw new InputError('bad-json', 'a case\'s bodyForce must be three finite numbers [bx, by, bz] (force per volume, model units)', { file, field: `${at}.bodyForce` })
        }
        bodyForce = [b[0], b[1], b[2]]
      }
      listed.push(planned(name, typeof r.description === 'string' ? r.description : '', bodyForce, f))
    })
  }
  const rest = [...found.values()].filter((f) => !listed.some((x) => sameCaseName(x.name, f.name)))
  rest.sort((a, b) => (sameCaseName(a.name, DEFAULT_CASE) ? -1 : sameCaseName(b.name, DEFAULT_CASE) ? 1 : a.name.toLowerCase() < b.name.toLowerCase() ? -1 : 1))
  const cases = [...listed, ...rest.map((f) => planned(f.name, '', null, f))]
  if (cases.length === 0) {
    throw new InputError('missing-file', 'no stress file: a CSV bundle needs stress.csv, or one stress.NAME.csv per load case, beside nodes.csv and elements.csv')
  }

  const combinations: Combination[] = []
  if (o.combinations !== undefined) {
    if (!Array.isArray(o.combinations)) throw new InputError('bad-json', 'combinations must be a list like [{"name": "ULS-1", "factors": {"dead": 1.35, "imposed": 1.5}}]', { file, field: 'combinations' })
    o.combinations.forEach((c: unknown, i) => {
      const at = `combinations[${i}]`
      if (typeof c !== 'object' || c === null || Array.isArray(c)) throw new InputError('bad-json', 'a combination is an object like {"name": "ULS-1", "factors": {"dead": 1.35}}', { file, field: at })
      const r = c as Obj
      for (const k of Object.keys(r)) if (!['name', 'factors'].includes(k)) throw new InputError('bad-json', `unknown key "${k}"; a combination takes name and factors`, { file, field: `${at}.${k}` })
      const combo = checkCombination(cases, { name: r.name, factors: r.factors }, { file, field: at })
      if (combinations.some((x) => sameCaseName(x.name, combo.name))) throw new InputError('bad-json', `combination "${combo.name}" is listed twice; give each its own name`, { file, field: `${at}.name` })
      combinations.push(combo)
    })
  }
  return { cases, combinations, described: caseFiles.size > 0 || o.cases !== undefined || o.combinations !== undefined }

  function planned(name: string, description: string, bodyForce: Vec3 | null, f: Found): PlannedCase<T> {
    return { name, description, bodyForce, stress: f.stress!, stressRole: f.stressRole!, displacement: f.displacement, displacementRole: f.displacementRole ?? '' }
  }
}

/** What readOtherCases needs of the bundle already read (the first case's tables and the nodes). */
export interface CaseReadContext<T> {
  readonly nodeIndex: IdIndex
  readonly nodeIds: Int32Array
  /** Reads one stress (6 values) or displacement (3 values) table of a role. */
  readTable(file: T, role: string, kind: 'stress' | 'displacement'): NumericTable
  /** The first case's tables and arrays as read (the reference node sets). */
  readonly firstStress: { readonly file: string; readonly table: NumericTable; readonly values: Float64Array }
  readonly firstDisplacement: { readonly file: string; readonly table: NumericTable; readonly values: Float64Array } | null
  /** The model's ρb (the default for cases that name none). */
  readonly bodyForce: Vec3
  /**
   * Set when the first case's stress is element-nodal: every other case's stress file is read
   * the same way (one row per element and node, checked complete by the element-nodal reader)
   * into its field and its display average.
   */
  readonly firstStressField?: StressField | null
  readElementNodal?(file: T, role: string): { readonly field: StressField; readonly stress: Float64Array }
}

/**
 * Every case of the plan as a LoadCase: the first from the arrays already read, the others read
 * here, each on the same node set as the first case's file (any row order).
 */
export function readOtherCases<T extends { readonly name: string }>(plan: CasePlan<T>, ctx: CaseReadContext<T>): LoadCase[] {
  const N = ctx.nodeIds.length
  checkCaseMemory(plan.cases.length, 6 * N, plan.cases.filter((c) => c.displacement).length * 3 * N, plan.cases[0].stress.name)
  const out: LoadCase[] = []
  const refStress = nodeSet(ctx.firstStress.table, ctx.nodeIndex, N)
  const refDisp = ctx.firstDisplacement ? nodeSet(ctx.firstDisplacement.table, ctx.nodeIndex, N) : null
  let dispRef = ctx.firstDisplacement ? { file: ctx.firstDisplacement.file, set: refDisp! } : null
  plan.cases.forEach((c, i) => {
    const bodyForce = c.bodyForce ?? [ctx.bodyForce[0], ctx.bodyForce[1], ctx.bodyForce[2]]
    if (i === 0) {
      out.push({
        name: c.name, description: c.description, bodyForce, stress: ctx.firstStress.values, displacement: ctx.firstDisplacement?.values ?? null,
        ...(ctx.firstStressField ? { stressField: ctx.firstStressField } : {}),
      })
      return
    }
    let stress: Float64Array
    let stressField: StressField | null = null
    if (ctx.firstStressField && ctx.readElementNodal) {
      // --- element-nodal: every case in the first case's form ---
      const r = ctx.readElementNodal(c.stress, c.stressRole)
      stress = r.stress
      stressField = r.field
    } else {
      const st = ctx.readTable(c.stress, c.stressRole, 'stress')
      stress = placeRows(st, 6, ctx, c.stress.name, { file: ctx.firstStress.file, set: refStress }, 'stress')
    }
    let displacement: Float64Array | null = null
    if (c.displacement) {
      const dt = ctx.readTable(c.displacement, c.displacementRole, 'displacement')
      if (!dispRef) dispRef = { file: c.displacement.name, set: nodeSet(dt, ctx.nodeIndex, N) }
      displacement = placeRows(dt, 3, ctx, c.displacement.name, dispRef, 'displacement')
    }
    out.push({ name: c.name, description: c.description, bodyForce, stress, ...(stressField ? { stressField } : {}), displacement })
  })
  return out
}

/** The node indices that have a row in `t` (its ids are known nodes: the first case's reading checked them). */
function nodeSet(t: NumericTable, nodeIndex: IdIndex, N: number): Uint8Array {
  const has = new Uint8Array(N)
  for (let r = 0; r < t.rows; r++) {
    const n = rowOfId(nodeIndex, t.ids[r])
    if (n >= 0) has[n] = 1
  }
  return has
}

/**
 * The table's rows in node order (width values per node), checking that its node set is the
 * reference's: an id not in the reference (or not a node at all), a second row for a node, or a
 * reference node without a row is an InputError naming the id.
 */
function placeRows<T>(t: NumericTable, width: number, ctx: CaseReadContext<T>, file: string, ref: { file: string; set: Uint8Array }, kind: string): Float64Array {
  const N = ctx.nodeIds.length
  // the usual layout: the rows in the order of the nodes file, every node present
  if (t.rows === N) {
    let same = true
    for (let i = 0; i < N; i++) if (t.ids[i] !== ctx.nodeIds[i]) { same = false; break }
    if (same) {
      for (let i = 0; i < N; i++) {
        if (!ref.set[i]) throw new InputError('missing-node', `node ${ctx.nodeIds[i]} has a row here but none in ${ref.file}; every case holds the same nodes: remove the row or add it there`, { file, line: t.lines[i], column: 'id' })
      }
      return t.values
    }
  }
  const out = new Float64Array(width * N)
  const seen = new Uint8Array(N)
  const v = t.values
  for (let r = 0; r < t.rows; r++) {
    const id = t.ids[r]
    const n = rowOfId(ctx.nodeIndex, id)
    if (n < 0 || !ref.set[n]) throw new InputError('missing-node', `node ${id} has a row here but none in ${ref.file}; every case holds the same nodes: remove the row or add it there`, { file, line: t.lines[r], column: 'id' })
    if (seen[n]) {
      const first = t.ids.indexOf(id)
      throw new InputError('duplicate-id', `node ${id} has two rows (lines ${t.lines[first]} and ${t.lines[r]}); keep one`, { file, line: t.lines[r], column: 'id' })
    }
    seen[n] = 1
    for (let k = 0; k < width; k++) out[n * width + k] = v[r * width + k]
  }
  for (let n = 0; n < N; n++) {
    if (ref.set[n] && !seen[n]) throw new InputError(kind === 'stress' ? 'missing-stress' : 'missing-displacement', `no row for node ${ctx.nodeIds[n]}, which ${ref.file} has; every case holds the same nodes: add its row`, { file })
  }
  return out
}

/**
 * Most bytes the load cases' fields may take together (Float64 values): 4 GiB. Fifty cases of a
 * 10^6-element tet4 model (about 1.8·10^5 nodes) take 0.4 GiB nodal and 9 GiB element-nodal; a
 * browser tab holds a few GiB at most, and the command line's peak stays within its idle size plus
 * three times the model's arrays only while they fit in memory at all. Beyond the limit the
 * reader refuses before it reads the cases, saying how much they would take.
 */
export const MAX_CASE_FIELD_BYTES = 4 * 2 ** 30

/** Refuses load cases whose fields together (`stressValues` and `displacementValues` numbers per case and in all) would pass MAX_CASE_FIELD_BYTES. */
export function checkCaseMemory(cases: number, stressValuesPerCase: number, displacementValues: number, file: string): void {
  const bytes = 8 * (cases * stressValuesPerCase + displacementValues)
  if (bytes <= MAX_CASE_FIELD_BYTES) return
  const gib = (b: number) => (b / 2 ** 30).toFixed(1)
  throw new InputError('too-large', `${cases} load cases need ${gib(bytes)} GiB for their fields (${stressValuesPerCase / 6} stress rows × 6 values × 8 bytes each, and the displacements), more than the ${gib(MAX_CASE_FIELD_BYTES)} GiB this tool holds at once: split the cases over several models (each with the same nodes and elements), or drop the cases you do not review`, { file })
}
