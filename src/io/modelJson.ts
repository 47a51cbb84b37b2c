/**
 * The optional model.json of a CSV bundle:
 * `{"name": string, "description": string, "units": {"length": LengthUnit, "stress": StressUnit},
 *   "bodyForce": [bx, by, bz]}`, every key optional, and the keys of the bundle's layout (files,
 * csv, columns, types, nodeOrder: src/io/bundleLayout.ts). Units only label the numbers; nothing
 * is converted. bodyForce is ρ·b in model units (stress / length). A unit left out is not
 * declared (`declaredUnits` says which were): the reader may take it from the CSV headers, and
 * warns when nothing declares it.
 */
import { InputError } from '../model/errors.ts'
import { jsonErrorOffset } from './jsonErrorPosition.ts'
import type { PartInfo, Vec3 } from '../model/model.ts'
import { DEFAULT_UNITS, LENGTH_TO_M, STRESS_TO_PA, isLengthUnit, isStressUnit } from '../model/units.ts'
import type { LengthUnit, ModelUnits, StressUnit } from '../model/units.ts'
import { LAYOUT_KEYS } from './bundleLayout.ts'

export interface ModelMeta {
  readonly name: string | null
  readonly description: string
  /** The declared units, defaults (m, Pa) filled in where none was declared. */
  readonly units: ModelUnits
  /** What "units" declared; null where it said nothing. */
  readonly declaredUnits: { readonly length: LengthUnit | null; readonly stress: StressUnit | null }
  readonly bodyForce: Vec3
  readonly warnings: readonly string[]
  /** "parts": names and own body forces, by part number (absent when the key is not given). */
  readonly parts?: readonly PartInfo[]
}

const KNOWN_KEYS: readonly string[] = ['name', 'description', 'units', 'bodyForce', 'parts', 'cases', 'combinations', ...LAYOUT_KEYS]

/** Parses JSON text; a syntax error names the line and column when the platform reports a position. */
export function parseJsonText(file: string, text: string): unknown {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text
  if (body.trim() === '') throw new InputError('empty-file', 'the file is empty', { file })
  try {
    return JSON.parse(body)
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e)
    const pos = jsonErrorOffset(body)
    if (pos >= 0) {
      const before = body.slice(0, pos)
      const line = before.split('\n').length
      const col = pos - before.lastIndexOf('\n')
      throw new InputError('bad-json', `not valid JSON at column ${col} (${msg})`, { file, line })
    }
    throw new InputError('bad-json', `not valid JSON (${msg})`, { file })
  }
}

/** Reads the validated metadata of a model from a parsed JSON value. `file` names the source in messages. */
export function readModelMeta(file: string, value: unknown, fieldPrefix = ''): ModelMeta {
  const f = (k: string) => fieldPrefix + k
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new InputError('bad-json', 'expected a JSON object like {"name": "...", "units": {"length": "m", "stress": "Pa"}}', { file })
  }
  const o = value as Record<string, unknown>
  const warnings: string[] = []
  let name: string | null = null
  if (o.name !== undefined) {
    if (typeof o.name !== 'string') throw new InputError('bad-json', 'name must be a string', { file, field: f('name') })
    name = o.name
  }
  let description = ''
  if (o.description !== undefined) {
    if (typeof o.description !== 'string') throw new InputError('bad-json', 'description must be a string', { file, field: f('description') })
    description = o.description
  }
  let units: ModelUnits = DEFAULT_UNITS
  let declaredUnits: ModelMeta['declaredUnits'] = { length: null, stress: null }
  if (o.units !== undefined) {
    const u = o.units
    if (typeof u !== 'object' || u === null || Array.isArray(u)) {
      throw new InputError('bad-json', 'units must be an object like {"length": "mm", "stress": "MPa"}', { file, field: f('units') })
    }
    const ur = u as Record<string, unknown>
    const length = ur.length ?? DEFAULT_UNITS.length
    const stress = ur.stress ?? DEFAULT_UNITS.stress
    if (typeof length !== 'string' || !isLengthUnit(length)) {
      throw new InputError('bad-unit', `unknown length unit ${JSON.stringify(length)}; use one of ${Object.keys(LENGTH_TO_M).join(', ')}`, { file, field: f('units.length') })
    }
    if (typeof stress !== 'string' || !isStressUnit(stress)) {
      throw new InputError('bad-unit', `unknown stress unit ${JSON.stringify(stress)}; use one of ${Object.keys(STRESS_TO_PA).join(', ')}`, { file, field: f('units.stress') })
    }
    units = { length, stress }
    declaredUnits = { length: ur.length === undefined ? null : length, stress: ur.stress === undefined ? null : stress }
  }
  let bodyForce: Vec3 = [0, 0, 0]
  if (o.bodyForce !== undefined) {
    const b = o.bodyForce
    if (!Array.isArray(b) || b.length !== 3 || !b.every((x) => typeof x === 'number' && Number.isFinite(x))) {
      throw new InputError('bad-json', 'bodyForce must be three finite numbers [bx, by, bz] (force per volume, model units)', { file, field: f('bodyForce') })
    }
    bodyForce = [b[0], b[1], b[2]]
  }
  if (fieldPrefix === '') {
    for (const k of Object.keys(o)) if (!KNOWN_KEYS.includes(k)) warnings.push(`${file}: unknown key "${k}" ignored`)
  }
  const parts = o.parts === undefined ? undefined : readParts(file, o.parts, f('parts'))
  return { name, description, units, declaredUnits, bodyForce, warnings, ...(parts ? { parts } : {}) }
}

/**
 * "parts": {"1": "bracket"} or {"1": {"name": "bracket", "bodyForce": [0, 0, -77000]}} (a part's
 * own ρb in model units, for assemblies of several materials; it overrides the model's).
 */
function readParts(file: string, value: unknown, field: string): PartInfo[] {
  const how = 'parts must map part numbers to a name or to {"name": ..., "bodyForce": [bx, by, bz]}, like {"1": "bracket"}'
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw new InputError('bad-json', how, { file, field })
  const out: PartInfo[] = []
  for (const [key, v] of Object.entries(value as Record<string, unknown>)) {
    const at = `${field}.${key}`
    const part = Number(key)
    if (!/^\d+$/.test(key) || !Number.isSafeInteger(part)) throw new InputError('bad-json', `"${key}" is not a part number (a whole number ≥ 0); ${how}`, { file, field: at })
    if (typeof v === 'string') { out.push({ part, name: v, bodyForce: null }); continue }
    if (typeof v !== 'object' || v === null || Array.isArray(v)) throw new InputError('bad-json', how, { file, field: at })
    const r = v as Record<string, unknown>
    if (r.name !== undefined && typeof r.name !== 'string') throw new InputError('bad-json', 'a part\'s name must be a string', { file, field: `${at}.name` })
    let bodyForce: Vec3 | null = null
    if (r.bodyForce !== undefined) {
      const b = r.bodyForce
      if (!Array.isArray(b) || b.length !== 3 || !b.every((x) => typeof x === 'number' && Number.isFinite(x))) {
        throw new InputError('bad-json', 'a part\'s bodyForce must be three finite numbers [bx, by, bz] (force per volume, model units)', { file, field: `${at}.bodyForce` })
      }
      bodyForce = [b[0], b[1], b[2]]
    }
    out.push({ part, name: typeof r.name === 'string' ? r.name : '', bodyForce })
  }
  return out.sort((a, b) => a.part - b.part)
}
