/**
 * How a user's CSV bundle is laid out, as model.json declares it where names, headers and
 * dialects differ from ours. Every key is optional:
 *
 *   "files":     {"nodes": "mesh_nodes.txt", "elements": "conn.txt", "stress": "nodal_stress.txt",
 *                 "displacement": "...", "stress.NAME": "..."}
 *   "csv":       {"separator": ";", "decimal": ",", "skipLines": 3, "header": false,
 *                 "nodes": {"skipLines": 5}}
 *                top-level keys apply to every file; a file role as key holds what differs for
 *                that file (its keys win). separator: "," ";" "\t" (or "tab") " " (or "spaces":
 *                runs of spaces and tabs); decimal: "." or ","; skipLines: lines (blank and
 *                comment lines included) before the header, or the first row; header: false when
 *                the first line read is already a row.
 *   "columns":   {"nodes": {"id": "Node", "x": "X"}, "stress": {"sxx": "S11"},
 *                 "elements": {"id": "Elem", "type": "Kind", "part": "Mat", "nodes": ["N1", ...]}}
 *                keys are our field names, values the user's header text (case-insensitive, with
 *                or without its unit) or a 1-based column number (the only way in a file without
 *                a header). The element nodes are a list of columns, or the first node column
 *                alone (the nodes then run to the end of each row).
 *   "types":     {"their-name": "tet10"}   element type names, case-insensitive
 *   "nodeOrder": {"tet10": [0, 1, 2, 3, 4, 5, 6, 7, 9, 8]}   entry k = which of the user's node
 *                columns (0-based) holds our local node k; a permutation of 0..nodeCount-1.
 *
 * File roles: nodes, elements, stress, displacement, and further load cases stress.NAME and
 * displacement.NAME (read with the columns of stress and displacement).
 * Everything is validated here; a bad value is an InputError naming its key.
 */
import { ELEMENT_TYPES, ELEMENT_TYPE_NAMES, isElementTypeName } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { DecimalMark, DialectSettings, Separator } from './csvDialect.ts'

/** A column: the user's header text, or a 1-based column number. */
export type ColumnRef = string | number
export type ColumnMap = Readonly<Record<string, ColumnRef | readonly ColumnRef[]>>

export interface BundleLayout {
  /** "files": role → the user's file name (base name). */
  readonly files: ReadonlyMap<string, string>
  /** "csv" for every file, and per role. */
  readonly csv: DialectSettings
  readonly csvByRole: ReadonlyMap<string, DialectSettings>
  readonly columns: ReadonlyMap<string, ColumnMap>
  /** "types": the user's type names, lower-case → ours. */
  readonly types: ReadonlyMap<string, ElementTypeName>
  /** "nodeOrder": per type, entry k = the user's node column (0-based) holding our local node k. */
  readonly nodeOrder: ReadonlyMap<ElementTypeName, Int32Array>
}

export const BASE_ROLES = ['nodes', 'elements', 'stress', 'displacement'] as const
export const LAYOUT_KEYS = ['files', 'csv', 'columns', 'types', 'nodeOrder'] as const

export const NODE_FIELDS = ['id', 'x', 'y', 'z'] as const
export const STRESS_FIELDS = ['id', 'sxx', 'syy', 'szz', 'sxy', 'syz', 'sxz'] as const
/** A stress file with an element column: one row per element and node (element-nodal stress). */
export const ELEMENT_NODAL_STRESS_FIELDS = ['element', 'node', 'sxx', 'syy', 'szz', 'sxy', 'syz', 'sxz'] as const
export const DISPLACEMENT_FIELDS = ['id', 'ux', 'uy', 'uz'] as const
export const ELEMENT_FIELDS = ['id', 'type', 'part', 'nodes'] as const

export const EMPTY_LAYOUT: BundleLayout = { files: new Map(), csv: {}, csvByRole: new Map(), columns: new Map(), types: new Map(), nodeOrder: new Map() }

const CASE_ROLE = /^(stress|displacement)\.[^./\\]+$/

/** True for nodes, elements, stress, displacement, stress.NAME and displacement.NAME. */
export function isRole(s: string): boolean {
  return (BASE_ROLES as readonly string[]).includes(s) || CASE_ROLE.test(s)
}

/** Our field names of a role's file. */
export function fieldsOfRole(role: string): readonly string[] {
  if (role === 'nodes') return NODE_FIELDS
  if (role === 'elements') return ELEMENT_FIELDS
  return role.startsWith('stress') ? STRESS_FIELDS : DISPLACEMENT_FIELDS
}

/** The dialect settings of one role's file: the top-level "csv" keys, overridden by the role's. */
export function dialectSettingsFor(layout: BundleLayout, role: string): DialectSettings {
  const own = layout.csvByRole.get(role)
  return own ? { ...layout.csv, ...own } : layout.csv
}

type Obj = Record<string, unknown>
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v)

/** Reads the layout keys of a parsed model.json object. */
export function readBundleLayout(file: string, o: Obj): BundleLayout {
  const bad = (field: string, message: string): never => { throw new InputError('bad-json', message, { file, field }) }
  const roleList = `${BASE_ROLES.join(', ')}, stress.NAME or displacement.NAME`

  const files = new Map<string, string>()
  if (o.files !== undefined) {
    if (!isObj(o.files)) bad('files', 'files must be an object like {"nodes": "mesh_nodes.txt"}')
    const byName = new Map<string, string>()
    for (const [role, name] of Object.entries(o.files as Obj)) {
      if (!isRole(role)) bad(`files.${role}`, `"${role}" is not a file of a bundle; use ${roleList}`)
      if (typeof name !== 'string' || name.trim() === '') bad(`files.${role}`, `files.${role} must be a file name like "${role}.txt"`)
      const n = (name as string).trim()
      const other = byName.get(n.toLowerCase())
      if (other) bad(`files.${role}`, `files.${role} and files.${other} both name ${n}; one file per role`)
      byName.set(n.toLowerCase(), role)
      files.set(role, n)
    }
  }

  let csv: DialectSettings = {}
  const csvByRole = new Map<string, DialectSettings>()
  if (o.csv !== undefined) {
    if (!isObj(o.csv)) bad('csv', 'csv must be an object like {"separator": ";", "decimal": ","}')
    const top: Obj = {}
    for (const [k, v] of Object.entries(o.csv as Obj)) {
      if (isRole(k)) {
        if (!isObj(v)) bad(`csv.${k}`, `csv.${k} must be an object like {"skipLines": 2}`)
        csvByRole.set(k, readDialect(v as Obj, `csv.${k}`, bad))
      } else top[k] = v
    }
    csv = readDialect(top, 'csv', bad)
    for (const [role, own] of csvByRole) {
      const merged = { ...csv, ...own }
      if (merged.separator === ',' && merged.decimal === ',') bad(`csv.${role}.decimal`, `a comma cannot both separate the fields and mark decimals of ${role}; with decimal commas the separator is ";", tab or spaces`)
    }
  }

  const columns = new Map<string, ColumnMap>()
  if (o.columns !== undefined) {
    if (!isObj(o.columns)) bad('columns', 'columns must be an object like {"nodes": {"id": "Node", "x": "X"}}')
    for (const [role, m] of Object.entries(o.columns as Obj)) {
      if (!isRole(role)) bad(`columns.${role}`, `"${role}" is not a file of a bundle; use ${roleList}`)
      if (!isObj(m)) bad(`columns.${role}`, `columns.${role} must be an object like {"id": "Node"}`)
      // A stress file is nodal (id) or element-nodal (element, node): either set of keys may be mapped.
      const fields = role.startsWith('stress') ? [...fieldsOfRole(role), 'element', 'node'] : fieldsOfRole(role)
      const out: Record<string, ColumnRef | readonly ColumnRef[]> = {}
      for (const [field, ref] of Object.entries(m as Obj)) {
        const key = `columns.${role}.${field}`
        if (!fields.includes(field)) bad(key, `"${field}" is not a field of ${role}; the fields are ${fields.join(', ')}`)
        if (role === 'elements' && field === 'nodes' && Array.isArray(ref)) {
          if (ref.length === 0 || !ref.every(isColumnRef)) bad(key, `${key} must list the node columns, e.g. ["N1", "N2", ...] or [3, 4, ...], or name the first node column alone`)
          out[field] = ref as ColumnRef[]
        } else {
          if (!isColumnRef(ref)) bad(key, `${key} must be the header text of a column (e.g. "Node") or its number counted from 1`)
          out[field] = ref as ColumnRef
        }
      }
      columns.set(role, out)
    }
  }

  const types = new Map<string, ElementTypeName>()
  if (o.types !== undefined) {
    if (!isObj(o.types)) bad('types', 'types must be an object like {"their-name": "tet10"}')
    for (const [name, t] of Object.entries(o.types as Obj)) {
      const key = `types.${name}`
      if (name.trim() === '') bad(key, 'an element type name must not be empty')
      const ours = typeof t === 'string' ? t.trim().toLowerCase() : ''
      if (!isElementTypeName(ours)) bad(key, `${JSON.stringify(t)} is not a type this tool reads; map "${name}" to one of ${ELEMENT_TYPE_NAMES.join(', ')}`)
      const lower = name.trim().toLowerCase()
      if (isElementTypeName(lower) && lower !== ours) bad(key, `"${name}" is this tool's own name of ${lower}; it cannot mean ${ours}: rename the type in the file`)
      types.set(name.trim().toLowerCase(), ours as ElementTypeName)
    }
  }

  const nodeOrder = new Map<ElementTypeName, Int32Array>()
  if (o.nodeOrder !== undefined) {
    if (!isObj(o.nodeOrder)) bad('nodeOrder', 'nodeOrder must be an object like {"tet10": [0, 1, 2, 3, 4, 5, 6, 7, 9, 8]}')
    for (const [t, perm] of Object.entries(o.nodeOrder as Obj)) {
      const key = `nodeOrder.${t}`
      if (!isElementTypeName(t)) bad(key, `"${t}" is not a type this tool reads; use one of ${ELEMENT_TYPE_NAMES.join(', ')}`)
      const n = ELEMENT_TYPES[t as ElementTypeName].nodeCount
      const identity = `[${Array.from({ length: n }, (_, k) => k).join(', ')}]`
      if (!Array.isArray(perm) || perm.length !== n || !perm.every((k) => Number.isInteger(k) && k >= 0 && k < n)) {
        bad(key, `${key} must list ${n} node columns, each from 0 to ${n - 1} (entry k = which of your node columns holds our node k+1; ${identity} changes nothing)`)
      }
      const seen = new Uint8Array(n)
      for (const k of perm as number[]) {
        if (seen[k]) bad(key, `${key} lists column ${k} twice: it must be a permutation of 0..${n - 1}, each once`)
        seen[k] = 1
      }
      nodeOrder.set(t as ElementTypeName, Int32Array.from(perm as number[]))
    }
  }
  return { files, csv, csvByRole, columns, types, nodeOrder }
}

function isColumnRef(v: unknown): boolean {
  return (typeof v === 'string' && v.trim() !== '') || (typeof v === 'number' && Number.isInteger(v) && v >= 1)
}

const SEPARATORS: Readonly<Record<string, Separator>> = { ',': ',', ';': ';', '\t': '\t', tab: '\t', ' ': ' ', space: ' ', spaces: ' ' }
const DIALECT_KEYS = ['separator', 'decimal', 'skipLines', 'header']

function readDialect(o: Obj, at: string, bad: (field: string, message: string) => never): DialectSettings {
  const out: { separator?: Separator; decimal?: DecimalMark; skipLines?: number; header?: boolean } = {}
  for (const [k, v] of Object.entries(o)) {
    const key = `${at}.${k}`
    if (!DIALECT_KEYS.includes(k)) bad(key, `unknown key "${k}"; ${at} takes ${DIALECT_KEYS.join(', ')}${at === 'csv' ? `, and per file ${BASE_ROLES.join(', ')}` : ''}`)
    if (k === 'separator') {
      const sep = typeof v === 'string' ? SEPARATORS[v] ?? SEPARATORS[v.toLowerCase()] : undefined
      if (sep === undefined) bad(key, `separator ${JSON.stringify(v)} is not one this tool reads; use ",", ";", "\\t" (or "tab") or " " (or "spaces": runs of spaces and tabs)`)
      out.separator = sep
    } else if (k === 'decimal') {
      if (v !== '.' && v !== ',') bad(key, `decimal must be "." or ",", got ${JSON.stringify(v)}`)
      out.decimal = v as DecimalMark
    } else if (k === 'skipLines') {
      if (typeof v !== 'number' || !Number.isInteger(v) || v < 0 || v > 1e6) bad(key, `skipLines must be a whole number of lines ≥ 0, got ${JSON.stringify(v)}`)
      out.skipLines = v as number
    } else {
      if (typeof v !== 'boolean') bad(key, `header must be true or false, got ${JSON.stringify(v)}`)
      out.header = v as boolean
    }
  }
  if (out.separator === ',' && out.decimal === ',') bad(`${at}.decimal`, 'a comma cannot both separate the fields and mark decimals; with decimal commas the separator is ";", tab or spaces')
  return out
}
