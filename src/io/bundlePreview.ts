/**
 * A look at a set of files before they are loaded, from their first bytes only (the browser
 * reads at most PREVIEW_BYTES of each, cut at the last line end, so this stays bounded whatever
 * the model's size): whether the files read as a bundle as they are, whether they declare their
 * units, and, for the column-mapping step of the intake, each file's first rows, its columns and
 * the fields our names or the user's names suggest for them. The mapping the user completes
 * becomes the keys of a model.json ("files", "columns", "units"), so what is loaded is what a
 * saved model.json would load next time.
 *
 * Pure: no DOM, no Node; the same reading functions as the load run on the samples.
 */
import { InputError } from '../model/errors.ts'
import type { LengthUnit, StressUnit } from '../model/units.ts'
import { EMPTY_LAYOUT, NODE_FIELDS, dialectSettingsFor, readBundleLayout } from './bundleLayout.ts'
import type { BundleLayout } from './bundleLayout.ts'
import { detectDialect, splitLine } from './csvDialect.ts'
import type { Separator } from './csvDialect.ts'
import { readNumericTable } from './csvTable.ts'
import { splitHeaderUnit } from './headerUnits.ts'
import { parseJsonText, readModelMeta } from './modelJson.ts'
import { baseName, sortBundleFiles } from './readCsvBundle.ts'
import { readElementTable } from './readElementTable.ts'
import { DISPLACEMENT_FIELDS, ELEMENT_NODAL_STRESS_FIELDS, STRESS_FIELDS } from './bundleLayout.ts'

/** Bytes of each file the preview reads; rows beyond are not looked at. */
export const PREVIEW_BYTES = 64 * 1024
/** Rows of each file shown in the mapping step. */
export const PREVIEW_ROWS = 5

export interface SampleFile {
  readonly name: string
  /** The file's first bytes as text, cut at a line end (model.json whole). */
  readonly text: string
}

export type IntakeRole = 'nodes' | 'elements' | 'stress' | 'displacement'
export const INTAKE_ROLES: readonly IntakeRole[] = ['nodes', 'elements', 'stress', 'displacement']

export interface FilePreview {
  readonly name: string
  readonly separator: Separator | null
  readonly hasHeader: boolean
  /** Header names as written, or "column k" for a file without a header. */
  readonly columns: readonly string[]
  readonly rows: readonly (readonly string[])[]
  /** Why the file's layout could not be detected, or null. */
  readonly problem: string | null
}

export interface BundlePreview {
  readonly files: readonly FilePreview[]
  /** The parsed model.json, or null. */
  readonly json: Record<string, unknown> | null
  /** Null when the files read as a bundle as they are; else the reader's message. */
  readonly problem: string | null
  /** Whether the files (model.json or the headers) declare each unit. */
  readonly unitsDeclared: { readonly length: boolean; readonly stress: boolean }
  /** The message of a model.json that does not read (the load reports it; no mapping then), or null. */
  readonly jsonError: string | null
}

/** The user's mapping: per file its role, per role each field's 0-based column (-1: none), and the units. */
export interface IntakeMapping {
  readonly roles: Readonly<Record<string, IntakeRole | ''>>
  readonly columns: Readonly<Record<string, Readonly<Record<string, number>>>>
  /** Chosen units; null until chosen (asked only where the files do not declare them). */
  readonly units: { readonly length: LengthUnit | null; readonly stress: StressUnit | null }
}

/** The fields the mapping step asks for, per role; optional ones may stay unmapped. */
export const MAPPING_FIELDS: Readonly<Record<IntakeRole, readonly { field: string; optional?: boolean }[]>> = {
  nodes: NODE_FIELDS.map((field) => ({ field })),
  elements: [{ field: 'id' }, { field: 'type' }, { field: 'part', optional: true }, { field: 'nodes' }],
  // "element" mapped: one row per element and node (element-nodal); else one row per node.
  stress: [{ field: 'element', optional: true }, ...STRESS_FIELDS.map((field) => ({ field }))],
  displacement: DISPLACEMENT_FIELDS.map((field) => ({ field })),
}

const isJsonName = (n: string) => baseName(n).toLowerCase() === 'model.json'

/** The preview of a set of files (samples of their first bytes). */
export function previewBundle(samples: readonly SampleFile[]): BundlePreview {
  const jsonFile = samples.find((f) => isJsonName(f.name))
  let json: Record<string, unknown> | null = null
  let layout: BundleLayout = EMPTY_LAYOUT
  let declared = { length: false, stress: false }
  let problem: string | null = null
  let jsonError: string | null = null
  try {
    if (jsonFile) {
      const v = parseJsonText(jsonFile.name, jsonFile.text)
      const meta = readModelMeta(jsonFile.name, v)
      json = v as Record<string, unknown>
      layout = readBundleLayout(jsonFile.name, json)
      declared = { length: meta.declaredUnits.length !== null, stress: meta.declaredUnits.stress !== null }
    }
  } catch (e) {
    if (!(e instanceof InputError)) throw e
    // A broken model.json is the load's to report, with its line; nothing to map here.
    jsonError = e.message
  }
  const data = samples.filter((f) => !isJsonName(f.name))
  try {
    const { byRole } = sortBundleFiles(samples, layout)
    for (const [role, f] of byRole) {
      const settings = dialectSettingsFor(layout, role)
      if (role === 'elements') { readElementTable(f.name, f.text, { settings, columns: layout.columns.get(role), types: layout.types, nodeOrder: layout.nodeOrder }); continue }
      const fields = role === 'nodes' ? NODE_FIELDS : role === 'stress' ? STRESS_FIELDS : DISPLACEMENT_FIELDS
      const t = readNumericTable(f.name, f.text, { role, fields, quantity: role === 'stress' ? 'stress' : 'length', settings, columns: layout.columns.get(role), ...(role === 'stress' ? { elementNodal: ELEMENT_NODAL_STRESS_FIELDS } : {}) })
      if (t.info.unit && (role === 'nodes' || role === 'displacement')) declared = { ...declared, length: true }
      if (t.info.unit && role === 'stress') declared = { ...declared, stress: true }
    }
  } catch (e) {
    if (!(e instanceof InputError)) throw e
    // Only what a mapping fixes stops the load here: files not found, columns not found.
    if (e.kind === 'missing-file' || e.kind === 'header') problem = e.message
  }
  return { files: data.map((f) => filePreview(f, layout)), json, problem, unitsDeclared: declared, jsonError }
}

function filePreview(f: SampleFile, layout: BundleLayout): FilePreview {
  try {
    const d = detectDialect(f.name, f.text, dialectSettingsFor(layout, roleByName(f.name) ?? ''), 'numeric', roleByName(f.name) ?? 'nodes')
    const lines = f.text.split(/\r\n|\n|\r/)
    const split = (l: string) => splitLine(l, d.separator).map((s) => s.trim())
    const header = d.headerLine > 0 ? split(lines[d.headerLine - 1]) : null
    const rows: string[][] = []
    for (let i = d.headerLine > 0 ? d.headerLine : d.startLine - 1; i < lines.length && rows.length < PREVIEW_ROWS; i++) {
      const l = lines[i].trim()
      if (l === '' || l.startsWith('#')) continue
      rows.push(split(lines[i]))
    }
    const width = Math.max(header?.length ?? 0, ...rows.map((r) => r.length))
    const columns = header ?? Array.from({ length: width }, (_, k) => `column ${k + 1}`)
    return { name: f.name, separator: d.separator, hasHeader: header !== null, columns, rows, problem: null }
  } catch (e) {
    if (!(e instanceof InputError)) throw e
    return { name: f.name, separator: null, hasHeader: false, columns: [], rows: [], problem: e.message }
  }
}

/** The role a file name suggests (our names, or words like "node", "conn", "stress"), or null. */
export function roleByName(name: string): IntakeRole | null {
  const b = baseName(name).toLowerCase()
  // Stress and displacement first: "nodal_stress" names a stress file, not the nodes.
  if (/stress|sig|result/.test(b)) return 'stress'
  if (/disp|deform/.test(b)) return 'displacement'
  if (/elem|conn|topo|cell/.test(b)) return 'elements'
  if (/node|coord|point|grid|xyz/.test(b)) return 'nodes'
  return null
}

/** Words by which a header may name each field (after lower-casing, a unit and all but letters and digits left out). */
const FIELD_WORDS: Readonly<Record<string, readonly string[]>> = {
  id: ['id', 'node', 'nodeid', 'nid', 'nodenumber', 'label', 'number', 'no', 'nr'],
  x: ['x', 'coordx', 'xcoord', 'xcoordinate', 'posx'], y: ['y', 'coordy', 'ycoord', 'ycoordinate', 'posy'], z: ['z', 'coordz', 'zcoord', 'zcoordinate', 'posz'],
  element: ['element', 'elem', 'elementid', 'eid', 'elementnumber', 'el'],
  type: ['type', 'elementtype', 'eltype', 'kind', 'shape', 'topology'],
  part: ['part', 'material', 'mat', 'body', 'region', 'group', 'partid'],
  nodes: ['n1', 'node1', 'nodes', 'connectivity', 'conn', 'c1'],
  sxx: ['sxx', 's11', 'sigmaxx', 'stressxx', 'sx', 'sigxx'], syy: ['syy', 's22', 'sigmayy', 'stressyy', 'sy', 'sigyy'], szz: ['szz', 's33', 'sigmazz', 'stresszz', 'sz', 'sigzz'],
  sxy: ['sxy', 's12', 'txy', 'tauxy', 'sigmaxy', 'stressxy', 'syx', 's21'], syz: ['syz', 's23', 'tyz', 'tauyz', 'sigmayz', 'stressyz', 'szy', 's32'],
  sxz: ['sxz', 's13', 'txz', 'tauxz', 'sigmaxz', 'stressxz', 'szx', 's31', 'tzx', 'tauzx'],
  ux: ['ux', 'u1', 'dx', 'dispx', 'displacementx', 'ux1'], uy: ['uy', 'u2', 'dy', 'dispy', 'displacementy'], uz: ['uz', 'u3', 'dz', 'dispz', 'displacementz'],
}

const norm = (s: string) => splitHeaderUnit(s).bare.toLowerCase().replace(/[^a-z0-9]/g, '')

/** How well a column name fits a field: 2 a name of the field, 1 one that starts with a name of the field, 0 none. */
function fit(column: string, field: string, role: IntakeRole): number {
  const c = norm(column)
  // In a stress file "node" is the node column of element-nodal rows; "id" takes it otherwise.
  // In an element file the id is the element's.
  const words = role === 'stress' && field === 'id' ? ['node', 'id', 'nodeid', 'nid']
    : role === 'elements' && field === 'id' ? ['id', ...FIELD_WORDS.element] : FIELD_WORDS[field] ?? [field]
  if (words.includes(c)) return 2
  return words.some((w) => w.length >= 2 && c.startsWith(w)) ? 1 : 0
}

/** The mapping the names suggest: roles by file name and content, columns by name similarity, units as given. */
export function suggestMapping(preview: BundlePreview, units: IntakeMapping['units']): IntakeMapping {
  const roles: Record<string, IntakeRole | ''> = {}
  const taken = new Set<IntakeRole>()
  for (const f of preview.files) {
    const r = roleByName(f.name) ?? roleByColumns(f)
    roles[f.name] = r && !taken.has(r) ? r : ''
    if (r) taken.add(r)
  }
  const columns: Record<string, Record<string, number>> = {}
  for (const f of preview.files) {
    const role = roles[f.name]
    if (role) columns[role] = suggestColumns(f, role)
  }
  return { roles, columns, units }
}

function roleByColumns(f: FilePreview): IntakeRole | null {
  const has = (field: string, role: IntakeRole) => f.columns.some((c) => fit(c, field, role) === 2)
  if (has('sxx', 'stress')) return 'stress'
  if (has('ux', 'displacement')) return 'displacement'
  if (has('type', 'elements')) return 'elements'
  if (has('x', 'nodes')) return 'nodes'
  return null
}

/** Each field's best column (by name; a file without a header in our order), each column once. */
export function suggestColumns(f: FilePreview, role: IntakeRole): Record<string, number> {
  const out: Record<string, number> = {}
  const used = new Set<number>()
  for (const { field, optional } of MAPPING_FIELDS[role]) {
    let best = -1, score = 0
    if (f.hasHeader) {
      f.columns.forEach((c, k) => { const s = fit(c, field, role); if (!used.has(k) && s > score) { best = k; score = s } })
    } else if (!optional) {
      // No header: our order (id first, then the fields), the element nodes from column 3 or 4.
      const order = MAPPING_FIELDS[role].filter((x) => !x.optional).map((x) => x.field)
      best = order.indexOf(field)
      if (best >= f.columns.length) best = -1
    }
    out[field] = best
    if (best >= 0) used.add(best)
  }
  return out
}

/** What is still missing in a mapping, in words; empty when it is complete. */
export function mappingProblems(preview: BundlePreview, m: IntakeMapping): string[] {
  const out: string[] = []
  if (!preview.unitsDeclared.length && !m.units.length) out.push('Choose the length unit (the files do not state it).')
  if (!preview.unitsDeclared.stress && !m.units.stress) out.push('Choose the stress unit (the files do not state it).')
  const files = new Map<IntakeRole, string[]>()
  for (const [name, r] of Object.entries(m.roles)) if (r) files.set(r, [...(files.get(r) ?? []), name])
  for (const r of INTAKE_ROLES) {
    const named = files.get(r) ?? []
    if (named.length === 0 && r !== 'displacement') out.push(`Choose the ${r} file.`)
    if (named.length > 1) out.push(`${named.join(' and ')} are both marked as ${r}; keep one.`)
  }
  for (const f of preview.files) {
    const r = m.roles[f.name]
    if (!r) continue
    const cols = m.columns[r] ?? {}
    const seen = new Map<number, string>()
    for (const { field, optional } of MAPPING_FIELDS[r]) {
      const c = cols[field] ?? -1
      if (c < 0) { if (!optional) out.push(`${f.name}: choose the column of ${fieldLabel(r, field, cols)}.`); continue }
      const other = seen.get(c)
      if (other) out.push(`${f.name}: ${f.columns[c]} is chosen for both ${other} and ${field}.`)
      seen.set(c, field)
    }
  }
  return out
}

/** The field as the mapping step names it ("node" for the id of an element-nodal stress row). */
export function fieldLabel(role: IntakeRole, field: string, cols: Readonly<Record<string, number>>): string {
  if (role === 'stress' && field === 'id') return (cols.element ?? -1) >= 0 ? 'node' : 'node id'
  if (role === 'elements' && field === 'nodes') return 'first node'
  return FIELD_SYMBOLS[field] ?? field
}

/** Stress components as an engineer writes them. */
const FIELD_SYMBOLS: Readonly<Record<string, string>> = { sxx: 'σxx', syy: 'σyy', szz: 'σzz', sxy: 'τxy', syz: 'τyz', sxz: 'τxz' }

/**
 * model.json for a complete mapping: the given model.json's keys kept, "files" and "columns"
 * from the mapping, "units" when `withUnits` (a saved file declares them; the load itself takes
 * them as chosen, so the warning about undeclared units stays).
 */
export function mappingModelJson(preview: BundlePreview, m: IntakeMapping, withUnits: boolean): Record<string, unknown> {
  const files: Record<string, string> = {}
  const columns: Record<string, Record<string, string | number>> = {}
  for (const f of preview.files) {
    const r = m.roles[f.name]
    if (!r) continue
    files[r] = baseName(f.name)
    const cols = m.columns[r] ?? {}
    const ref = (c: number): string | number => {
      const name = f.columns[c]
      // The header text when it names one column only, else the column's number.
      return f.hasHeader && name !== '' && f.columns.filter((x) => x.toLowerCase() === name.toLowerCase()).length === 1 ? name : c + 1
    }
    const out: Record<string, string | number> = {}
    const elementNodal = r === 'stress' && (cols.element ?? -1) >= 0
    for (const { field } of MAPPING_FIELDS[r]) {
      const c = cols[field] ?? -1
      if (c < 0) continue
      out[elementNodal && field === 'id' ? 'node' : field] = ref(c)
    }
    columns[r] = out
  }
  const base = { ...(preview.json ?? {}) }
  delete base.files
  delete base.columns
  const units = { ...(m.units.length ? { length: m.units.length } : {}), ...(m.units.stress ? { stress: m.units.stress } : {}) }
  return { ...base, files, columns, ...(withUnits && (units.length || units.stress) ? { units: { ...(base.units as object | undefined), ...units } } : {}) }
}
