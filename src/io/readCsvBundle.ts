/**
 * Reads a CSV bundle (nodes.csv, elements.csv, stress.csv, optional displacement.csv and
 * model.json, matched by base name, case-insensitively; model.json "files" may name them
 * otherwise) into a Model. Each file is read in its own dialect (src/io/csvDialect.ts), its
 * columns matched by our names or as model.json maps them (src/io/bundleLayout.ts). Every
 * problem is an InputError naming file, line and column or element id and how to fix it;
 * nothing half-loaded is returned. Numbers are stored as written: units in model.json or in the
 * headers label them, they do not convert them; a model whose units nobody declared loads with
 * a warning. Nodes keep the order of the nodes file; elements are grouped into one block per
 * type; quadratic elements are checked (src/io/quadraticElementChecks.ts) after orientation.
 */
import { createMesh } from '../model/createMesh.ts'
import type { BlockInput } from '../model/createMesh.ts'
import { elementType } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { LengthUnit, StressUnit } from '../model/units.ts'
import { BASE_ROLES, DISPLACEMENT_FIELDS, ELEMENT_NODAL_STRESS_FIELDS, EMPTY_LAYOUT, NODE_FIELDS, STRESS_FIELDS, dialectSettingsFor, readBundleLayout } from './bundleLayout.ts'
import type { BundleLayout } from './bundleLayout.ts'
import { readNumericTable } from './csvTable.ts'
import type { NumericTable, NumericTableSpec, TableInfo } from './csvTable.ts'
import { readTablesInPieces } from './csvPieces.ts'
import type { PieceLane, TableOutcome, TableRequest } from './csvPieces.ts'
import { checkBlockOrientation, reorientElements, reorientedWarning } from './elementOrientation.ts'
import { buildIdIndex, isDuplicate, isStrictlyAscending, rowOfId } from './idIndex.ts'
import type { IdIndex } from './idIndex.ts'
import { fileIntake, unitsWarning } from './intakeReport.ts'
import type { FileIntake, IntakeReport, ReadModel, UnitSource } from './intakeReport.ts'
import { parseJsonText, readModelMeta } from './modelJson.ts'
import { planCases, readOtherCases } from './caseFiles.ts'
import type { CasePlan } from './caseFiles.ts'
import { checkQuadraticBlock, quadraticFindingMessage } from './quadraticElementChecks.ts'
import { readElementTable } from './readElementTable.ts'
import type { ElementTable, ElementTableSpec } from './readElementTable.ts'
import { elementNodalField } from './elementNodalRows.ts'
import { partAveragedStress } from '../model/stressField.ts'
import type { StressField } from '../model/stressField.ts'
import type { RawElementBlock } from './readElementTable.ts'
import { assertWithinLimit, limitFor } from './sizeGuard.ts'
import { sourceBytes, sourceText } from './csvBytes.ts'
import type { CsvSource } from './csvBytes.ts'

export interface CsvFile extends CsvSource {
  /** File name, possibly with folders ("run3/nodes.csv"); only the base name matters. */
  readonly name: string
  /**
   * The file's UTF-8 bytes (as read from disk or a Blob: the readers' way, src/io/csvBytes.ts), or
   * its text (encoded when read). Either may be a getter that reads the file each time (the
   * command line reads files one at a time, so a bundle of many load cases never holds all of
   * them): the reader takes it once per file and keeps none.
   */
  readonly bytes?: Uint8Array
  readonly text?: string
  /** Its size when known without reading it (bytes on disk); checked against the size limit instead of the bytes' or text's length. */
  readonly size?: number
}

/** The size checked against the limit: the given size, else the length of the bytes or text. */
function sizeOfFile(f: CsvFile): number {
  return f.size ?? (f.bytes !== undefined ? f.bytes.length : f.text?.length ?? 0)
}

export interface CsvBundleOptions {
  /** Model name when model.json gives none (default "model"). */
  readonly name?: string
  /** Largest accepted file, in bytes or characters (default limitFor its name: a JSON or a CSV file's). */
  readonly maxBytes?: number
  /**
   * Units the user chose when opening the files (the browser's intake), for those that neither
   * model.json nor the headers declare; the model still carries the undeclared-units warning.
   */
  readonly units?: { readonly length?: LengthUnit; readonly stress?: StressUnit }
}

export const BUNDLE_FILES = ['nodes.csv', 'elements.csv', 'stress.csv', 'displacement.csv', 'model.json'] as const
export const REQUIRED_BUNDLE_FILES = ['nodes.csv', 'elements.csv', 'stress.csv'] as const
const REQUIRED_ROLES = ['nodes', 'elements', 'stress'] as const

export const NODE_COLUMNS = NODE_FIELDS
export const STRESS_COLUMNS = STRESS_FIELDS
export const DISPLACEMENT_COLUMNS = DISPLACEMENT_FIELDS

export function baseName(name: string): string {
  const i = Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\'))
  return name.slice(i + 1)
}

/** The files of a bundle by role, the files that are not part of it, and load-case files (stress.NAME) not read yet. */
export interface BundleFiles<T> {
  readonly byRole: ReadonlyMap<string, T>
  readonly modelJson: T | undefined
  readonly ignored: readonly string[]
  readonly cases: ReadonlyMap<string, T>
}

const DEFAULT_NAME = /^((?:nodes|elements|stress|displacement)(?:\.[^./\\]+)?)\.csv$/

/**
 * Sorts the given files into the bundle's roles: model.json "files" names first, then our names
 * (nodes.csv, ..., stress.NAME.csv); missing required files are an error listing what was given.
 */
export function sortBundleFiles<T extends { readonly name: string }>(files: readonly T[], layout: BundleLayout = EMPTY_LAYOUT): BundleFiles<T> {
  const mappedRole = new Map<string, string>()
  for (const [role, name] of layout.files) mappedRole.set(baseName(name).toLowerCase(), role)
  const byRole = new Map<string, T>()
  const cases = new Map<string, T>()
  const ignored: string[] = []
  let modelJson: T | undefined
  for (const f of files) {
    const b = baseName(f.name).toLowerCase()
    if (b === 'model.json') {
      if (modelJson) throw new InputError('bad-argument', `two files named model.json were given: ${modelJson.name} and ${f.name}; give one model at a time`, { file: f.name })
      modelJson = f
      continue
    }
    let role = mappedRole.get(b)
    if (role === undefined) {
      const m = DEFAULT_NAME.exec(b)
      // A default name whose role model.json gives to another file is not part of the bundle.
      if (m && !layout.files.has(m[1])) role = m[1]
    }
    if (role === undefined) { ignored.push(f.name); continue }
    const into = (BASE_ROLES as readonly string[]).includes(role) ? byRole : cases
    const prev = into.get(role)
    if (prev && into === cases) throw new InputError('bad-argument', `two files for load case "${role.slice(role.indexOf('.') + 1)}": ${prev.name} and ${f.name} (case names match without regard to letter case); keep one`, { file: f.name })
    if (prev) throw new InputError('bad-argument', `two files named ${baseName(prev.name)} were given: ${prev.name} and ${f.name}; give one model at a time`, { file: f.name })
    into.set(role, f)
  }
  // --- load cases: a bundle may hold stress.NAME.csv files only ---
  const hasCaseStress = [...cases.keys()].some((r) => r.startsWith('stress.'))
  const missing = REQUIRED_ROLES.filter((r) => !byRole.has(r) && !(r === 'stress' && hasCaseStress))
  if (missing.length) {
    const got = files.length ? files.map((f) => f.name).join(', ') : 'no files'
    const names = missing.map((r) => (layout.files.has(r) ? `${layout.files.get(r)} (model.json files.${r})` : `${r}.csv`))
    throw new InputError('missing-file', `missing ${names.join(', ')}; got: ${got}. A CSV bundle needs nodes.csv, elements.csv and stress.csv (displacement.csv and model.json are optional); if yours are named differently, name them in model.json, e.g. "files": {"${missing[0]}": "${missing[0]}_results.txt"}`)
  }
  return { byRole, modelJson, ignored, cases }
}

export function readCsvBundle(files: readonly CsvFile[], options: CsvBundleOptions = {}): ReadModel {
  return assembleBundle(planBundle(files, options), options, READ_IN_PLACE)
}

/**
 * The same model as readCsvBundle, with the rows of the first case's tables (nodes, elements,
 * stress, displacement) read in pieces on other threads (src/io/csvPieces.ts): `lanes` are the
 * helper threads, the calling thread reads the first piece of every table. Same bits, same
 * messages; a helper that fails (not an input error) makes it read on one thread instead.
 */
export async function readCsvBundleInPieces(files: readonly CsvFile[], options: CsvBundleOptions, lanes: readonly PieceLane[]): Promise<ReadModel> {
  const plan = planBundle(files, options)
  if (lanes.length === 0) return assembleBundle(plan, options, READ_IN_PLACE)
  const t = plan.tables
  const requests: TableRequest[] = [
    { kind: 'numeric', file: t.nodes.file, spec: t.nodes.spec },
    { kind: 'elements', file: t.elements.file, spec: t.elements.spec },
    { kind: 'numeric', file: t.stress.file, spec: t.stress.spec },
    ...(t.displacement ? [{ kind: 'numeric' as const, file: t.displacement.file, spec: t.displacement.spec }] : []),
  ]
  const read = await readTablesInPieces(requests, lanes)
  if (read === null) return assembleBundle(plan, options, READ_IN_PLACE)
  return assembleBundle(plan, options, preRead(read))
}

/** How the assembly gets the first case's tables: read in place, or handed over already read. */
interface TableSource {
  numeric(file: CsvFile, spec: NumericTableSpec): NumericTable
  elements(file: CsvFile, spec: ElementTableSpec): ElementTable
}

const READ_IN_PLACE: TableSource = {
  numeric: (f, spec) => readNumericTable(f.name, sourceBytes(f), spec),
  elements: (f, spec) => readElementTable(f.name, sourceBytes(f), spec),
}

/** Tables read in pieces: each returned (or its error thrown) when the assembly asks for it, so messages come in the one-thread order. */
function preRead(read: ReadonlyMap<CsvFile, TableOutcome>): TableSource {
  const take = (f: CsvFile): NumericTable | ElementTable => {
    const r = read.get(f)
    if (!r) throw new RangeError(`${f.name} was not read in pieces`)
    if (!r.ok) throw r.error
    return r.table
  }
  return { numeric: (f) => take(f) as NumericTable, elements: (f) => take(f) as ElementTable }
}

/** What the bundle holds and how each file of the first case is read; nothing read yet but model.json. */
interface BundlePlan {
  readonly meta: ReturnType<typeof readModelMeta> | null
  readonly layout: BundleLayout
  readonly plan: CasePlan<CsvFile>
  readonly warnings: string[]
  readonly tables: {
    readonly nodes: { readonly file: CsvFile; readonly spec: NumericTableSpec }
    readonly elements: { readonly file: CsvFile; readonly spec: ElementTableSpec }
    readonly stress: { readonly file: CsvFile; readonly spec: NumericTableSpec }
    readonly displacement: { readonly file: CsvFile; readonly spec: NumericTableSpec } | null
  }
}

function planBundle(files: readonly CsvFile[], options: CsvBundleOptions): BundlePlan {
  const limit = (f: CsvFile): number => options.maxBytes ?? limitFor(f.name)
  // model.json first: its "files" say which files are the bundle.
  const jsonFiles = files.filter((f) => baseName(f.name).toLowerCase() === 'model.json')
  // Sizes first (before model.json is parsed), of every file named like a bundle file.
  for (const f of files) {
    const b = baseName(f.name).toLowerCase()
    if (b === 'model.json' || DEFAULT_NAME.test(b)) assertWithinLimit(f.name, sizeOfFile(f), limit(f))
  }
  const json = jsonFiles.length === 1 ? parseJsonText(jsonFiles[0].name, sourceText(jsonFiles[0])) : null
  const meta = jsonFiles.length === 1 ? readModelMeta(jsonFiles[0].name, json) : null
  const layout = meta ? readBundleLayout(jsonFiles[0].name, json as Record<string, unknown>) : EMPTY_LAYOUT
  const { byRole, ignored, cases } = sortBundleFiles(files, layout)
  for (const f of byRole.values()) assertWithinLimit(f.name, sizeOfFile(f), limit(f))
  const warnings: string[] = ignored.map((n) => `ignored ${n}: not part of a CSV bundle`)
  // --- load cases (caseFiles.ts): the first case's files are read here, the others by readOtherCases ---
  const plan = planCases(byRole, cases, json, jsonFiles.length === 1 ? jsonFiles[0].name : null)
  if (meta) warnings.push(...meta.warnings)
  const spec = (role: string, fields: readonly string[], quantity: 'length' | 'stress') => ({ role, fields, quantity, settings: dialectSettingsFor(layout, role), columns: layout.columns.get(role) })
  const dispFile = plan.cases[0].displacement
  return {
    meta, layout, plan, warnings,
    tables: {
      nodes: { file: byRole.get('nodes')!, spec: spec('nodes', NODE_FIELDS, 'length') },
      elements: { file: byRole.get('elements')!, spec: { settings: dialectSettingsFor(layout, 'elements'), columns: layout.columns.get('elements'), types: layout.types, nodeOrder: layout.nodeOrder } },
      stress: { file: plan.cases[0].stress, spec: { ...spec('stress', STRESS_FIELDS, 'stress'), elementNodal: ELEMENT_NODAL_STRESS_FIELDS } },
      displacement: dispFile ? { file: dispFile, spec: spec('displacement', DISPLACEMENT_FIELDS, 'length') } : null,
    },
  }
}

function assembleBundle(bp: BundlePlan, options: CsvBundleOptions, source: TableSource): ReadModel {
  const { meta, layout, plan, warnings } = bp
  const nodesFile = bp.tables.nodes.file
  const elementsFile = bp.tables.elements.file
  const stressFile = bp.tables.stress.file
  const dispFile = bp.tables.displacement?.file
  const spec = (role: string, fields: readonly string[], quantity: 'length' | 'stress') => ({ role, fields, quantity, settings: dialectSettingsFor(layout, role), columns: layout.columns.get(role) })

  // Nodes: order of the nodes file; ids checked unique.
  const nodes = source.numeric(nodesFile, bp.tables.nodes.spec)
  const nodeIndex = indexOrFail(nodes, nodesFile.name, 'node')
  const coords = nodes.values
  const nodeIds = nodes.ids
  const N = nodes.rows

  // Elements: node ids → indices, element ids unique across blocks, orientation, quadratic checks.
  const elementTable = source.elements(elementsFile, bp.tables.elements.spec)
  const raw = elementTable.blocks
  checkElementIdsUnique(raw, elementsFile.name)
  const used = new Uint8Array(N)
  const blocks: BlockInput[] = []
  const invertedIds: number[] = []
  let invertedTotal = 0
  for (const rb of raw) {
    const conn = resolveNodes(rb, nodeIndex, nodesFile.name, elementsFile.name, used)
    const o = checkBlockOrientation(coords, rb.type, conn)
    if (o.degenerate >= 0) {
      const e = o.degenerate
      throw new InputError('zero-volume', `degenerate ${rb.type} element: volume ${o.degenerateVolume.toPrecision(3)} is about zero for its size ${o.degenerateSize.toPrecision(3)} (coincident or flat corners); check its node ids and their coordinates`, { file: elementsFile.name, line: rb.lines[e], elementId: rb.ids[e] })
    }
    if (o.inverted.length) {
      reorientElements(conn, rb.type, o.inverted)
      for (let i = 0; i < o.inverted.length && invertedIds.length < 10; i++) invertedIds.push(rb.ids[o.inverted[i]])
      invertedTotal += o.inverted.length
    }
    const q = checkQuadraticBlock(coords, rb.type, conn)
    if (q) {
      throw new InputError(q.kind === 'mid-edge' ? 'mid-edge-node' : 'negative-jacobian', quadraticFindingMessage(q, rb.type, conn, nodeIds), { file: elementsFile.name, line: rb.lines[q.element], elementId: rb.ids[q.element] })
    }
    blocks.push({ type: rb.type, conn, ids: rb.ids, part: rb.part })
  }
  if (invertedTotal) warnings.push(`${elementsFile.name}: ${reorientedWarning(invertedIds, invertedTotal)}`)

  // Stress: one row per node used by an element, or (with an element column) one row per
  // element and node, kept as read and averaged within each part for display.
  const stressTable = source.numeric(stressFile, bp.tables.stress.spec)
  let stress: Float64Array
  let stressField: StressField | null = null
  if (stressTable.ids2) {
    // --- element-nodal ---
    stressField = elementNodalField(stressTable, {
      blocks: blocks.map((b, k) => ({ type: b.type, conn: b.conn, ids: raw[k].ids })), nodeIds, nodeIndex,
      stressFile: stressFile.name, elementsFile: elementsFile.name, nodesFile: nodesFile.name,
      elementColumn: stressTable.info.labels[0], nodeColumn: stressTable.info.labels[1],
    })
    stress = partAveragedStress(createMesh(coords, blocks, nodeIds), stressField)
  } else {
    const r = nodalRows(stressTable, 6, 'stress', { nodeIds, nodeIndex, used, raw, blocks, nodesFile: nodesFile.name, file: stressFile.name })
    stress = r.values
    const hasStress = r.has
    const unusedWithout = hasStress ? countUnusedWithout(used, hasStress) : 0
    if (unusedWithout) warnings.push(`${stressFile.name}: ${unusedWithout} node${unusedWithout === 1 ? '' : 's'} used by no element ha${unusedWithout === 1 ? 's' : 've'} no stress row; stress set to zero there`)
  }

  let displacement: Float64Array | null = null
  let dispTable: NumericTable | null = null
  if (dispFile) {
    const dt = source.numeric(dispFile, bp.tables.displacement!.spec)
    dispTable = dt
    displacement = nodalRows(dt, 3, 'displacement', { nodeIds, nodeIndex, used, raw, blocks, nodesFile: nodesFile.name, file: dispFile.name }).values
  }

  // Units: model.json, else the headers, else the defaults with a warning.
  const read: { file: string; info: TableInfo }[] = [{ file: nodesFile.name, info: nodes.info }]
  if (dispFile && dispTable) read.push({ file: dispFile.name, info: dispTable.info })
  const length = resolveUnit('length', meta?.declaredUnits.length ?? null, read, meta?.units.length ?? 'm', options.units?.length)
  const stressUnit = resolveUnit('stress', meta?.declaredUnits.stress ?? null, [{ file: stressFile.name, info: stressTable.info }], meta?.units.stress ?? 'Pa', options.units?.stress)
  const units = { length: length.unit as LengthUnit, stress: stressUnit.unit as StressUnit }
  const unitSources = { length: length.source, stress: stressUnit.source }

  const intakeFiles: FileIntake[] = [
    fileIntake(nodesFile.name, 'nodes', nodes.info.dialect, nodes.info.ignored),
    fileIntake(elementsFile.name, 'elements', elementTable.info.dialect, elementTable.info.ignored),
    fileIntake(stressFile.name, 'stress', stressTable.info.dialect, stressTable.info.ignored),
  ]
  if (dispFile && dispTable) intakeFiles.push(fileIntake(dispFile.name, 'displacement', dispTable.info.dialect, dispTable.info.ignored))
  const left = intakeFiles.filter((f) => f.ignoredColumns.length)
  if (left.length) warnings.push(`columns left out (not used by this tool): ${left.map((f) => `${f.file}: ${f.ignoredColumns.map((c) => `"${c}"`).join(', ')}`).join('; ')}`)
  const unitsText = unitsWarning(units, unitSources, 'csv')
  if (unitsText) warnings.push(unitsText)
  const intake: IntakeReport = { format: 'csv', files: intakeFiles, unitSources, unitsDeclared: unitsText === null, unitsWarning: unitsText }

  // --- load cases ---
  const caseIntake: FileIntake[] = []
  const loadCases = plan.described ? readOtherCases(plan, {
    nodeIndex, nodeIds, bodyForce: meta?.bodyForce ?? [0, 0, 0],
    firstStress: { file: stressFile.name, table: stressTable, values: stress },
    firstDisplacement: dispFile && dispTable && displacement ? { file: dispFile.name, table: dispTable, values: displacement } : null,
    firstStressField: stressField,
    readElementNodal(f, role) {
      // the same element-nodal reading as the first case's file, in that file's dialect settings
      const t = readNumericTable(f.name, sourceBytes(f), {
        ...spec('stress', STRESS_FIELDS, 'stress'), settings: dialectSettingsFor(layout, role), columns: layout.columns.get(role) ?? spec('stress', STRESS_FIELDS, 'stress').columns,
        elementNodal: ELEMENT_NODAL_STRESS_FIELDS,
      })
      caseIntake.push(fileIntake(f.name, role, t.info.dialect, t.info.ignored))
      if (!t.ids2) {
        throw new InputError('header', `one row per node, while ${stressFile.name} holds one row per element and node; give every case in the same form (a column "element" beside "node")`, { file: f.name, line: 1 })
      }
      const field = elementNodalField(t, {
        blocks: blocks.map((b, k) => ({ type: b.type, conn: b.conn, ids: raw[k].ids })), nodeIds, nodeIndex,
        stressFile: f.name, elementsFile: elementsFile.name, nodesFile: nodesFile.name,
        elementColumn: t.info.labels[0], nodeColumn: t.info.labels[1],
      })
      return { field, stress: partAveragedStress(createMesh(coords, blocks, nodeIds), field) }
    },
    readTable(f, role, kind) {
      const base = kind === 'stress' ? spec('stress', STRESS_FIELDS, 'stress') : spec('displacement', DISPLACEMENT_FIELDS, 'length')
      const t = readNumericTable(f.name, sourceBytes(f), { ...base, settings: dialectSettingsFor(layout, role), columns: layout.columns.get(role) ?? base.columns })
      caseIntake.push(fileIntake(f.name, role, t.info.dialect, t.info.ignored))
      return t
    },
  }) : null
  intakeFiles.push(...caseIntake)

  const mesh = createMesh(coords, blocks, nodeIds)
  return {
    ...(stressField ? { stressField } : {}),
    name: meta?.name ?? options.name ?? 'model',
    description: meta?.description ?? '',
    units,
    mesh,
    stress,
    displacement,
    bodyForce: loadCases ? loadCases[0].bodyForce! : meta?.bodyForce ?? [0, 0, 0],
    ...(meta?.parts ? { parts: meta.parts } : {}),
    ...(loadCases ? { cases: loadCases, combinations: plan.combinations } : {}),
    warnings,
    intake,
  }
}

/**
 * One unit from model.json (`declared`) or the headers of `tables`; two that disagree are an
 * InputError naming both.
 */
function resolveUnit(kind: 'length' | 'stress', declared: string | null, tables: readonly { file: string; info: TableInfo }[], fallback: string, chosen?: string): { unit: string; source: UnitSource } {
  let fromHeader: { unit: string; file: string; line: number; column: string } | null = null
  for (const t of tables) {
    const u = t.info.unit
    if (!u) continue
    const here = { unit: u.unit.unit, file: t.file, line: t.info.dialect.headerLine, column: u.column }
    if (fromHeader && fromHeader.unit !== here.unit) {
      throw new InputError('bad-unit', `the header says ${here.unit}, but ${fromHeader.file} column "${fromHeader.column}" says ${fromHeader.unit}; lengths share one unit: make the headers agree`, { file: here.file, line: here.line, column: here.column })
    }
    fromHeader = fromHeader ?? here
  }
  if (declared !== null) {
    if (fromHeader && fromHeader.unit !== declared) {
      throw new InputError('bad-unit', `the header says ${fromHeader.unit}, but model.json "units.${kind}" says ${declared}; make them agree, or leave one of them out`, { file: fromHeader.file, line: fromHeader.line, column: fromHeader.column })
    }
    return { unit: declared, source: 'model.json' }
  }
  if (fromHeader) return { unit: fromHeader.unit, source: 'header' }
  if (chosen) return { unit: chosen, source: 'chosen' }
  return { unit: fallback, source: 'default' }
}

function indexOrFail(t: NumericTable, file: string, what: string): IdIndex {
  const ix = buildIdIndex(t.ids)
  if (isDuplicate(ix)) {
    throw new InputError('duplicate-id', `${what} id ${ix.id} appears twice (lines ${t.lines[ix.firstRow]} and ${t.lines[ix.secondRow]}); ids must be unique`, { file, line: t.lines[ix.secondRow], column: 'id' })
  }
  return ix
}

function checkElementIdsUnique(raw: readonly RawElementBlock[], file: string): void {
  // Ids ascending within and across blocks (the usual numbering) are unique: no index needed.
  let ascending = true, last = 0
  for (const b of raw) {
    if (b.ids.length && (b.ids[0] <= last || !isStrictlyAscending(b.ids))) { ascending = false; break }
    if (b.ids.length) last = b.ids[b.ids.length - 1]
  }
  if (ascending) return
  let total = 0
  for (const b of raw) total += b.ids.length
  const ids = new Int32Array(total)
  const lines = new Int32Array(total)
  let k = 0
  for (const b of raw) { ids.set(b.ids, k); lines.set(b.lines, k); k += b.ids.length }
  const ix = buildIdIndex(ids)
  if (isDuplicate(ix)) {
    const [l1, l2] = [lines[ix.firstRow], lines[ix.secondRow]].sort((a, b) => a - b)
    throw new InputError('duplicate-id', `element id ${ix.id} appears twice (lines ${l1} and ${l2}); ids must be unique`, { file, line: l2, column: 'id', elementId: ix.id })
  }
}

/**
 * The values of a nodal table (stress, displacement) in node order: the table's own array when its
 * rows follow the nodes file (the usual layout), else each row moved to its node's slot (`has`
 * marks the nodes with a row). A node an element uses without a row is an error.
 */
function nodalRows(t: NumericTable, width: number, kind: 'stress' | 'displacement', c: {
  nodeIds: Int32Array; nodeIndex: IdIndex; used: Uint8Array; raw: readonly RawElementBlock[]; blocks: readonly BlockInput[]; nodesFile: string; file: string
}): { values: Float64Array; has: Uint8Array | null } {
  if (sameIds(t.ids, c.nodeIds)) return { values: t.values, has: null }
  const values = new Float64Array(width * c.nodeIds.length)
  const has = scatterRows(t, width, values, c.nodeIndex, c.nodesFile, c.file)
  const missing = firstUsedWithout(c.used, has)
  if (missing >= 0) {
    const el = findElementUsing(c.raw, c.blocks, missing)
    throw new InputError(kind === 'stress' ? 'missing-stress' : 'missing-displacement', `no ${kind} row for node ${c.nodeIds[missing]}, which element ${el.id} uses; every node of an element needs one`, { file: c.file, elementId: el.id })
  }
  return { values, has }
}

/** Replaces user node ids by node indices (in place) and marks used nodes. */
function resolveNodes(rb: RawElementBlock, nodeIndex: IdIndex, nodesName: string, file: string, used: Uint8Array): Int32Array {
  const conn = rb.nodeIds
  const nn = elementType(rb.type).nodeCount
  // The dense table looked up here directly (a call per entry otherwise); same result as rowOfId.
  const dense = nodeIndex.dense, rowOf = rowOfId
  const dn = dense ? dense.length : 0
  for (let i = 0; i < conn.length; i++) {
    const id = conn[i]
    const r = dense ? (id >= 0 && id < dn ? dense[id] : -1) : rowOf(nodeIndex, id)
    if (r < 0) {
      const e = (i / nn) | 0
      throw new InputError('missing-node', `node ${conn[i]} is not in ${nodesName}; add it there, or correct the element's node ids`, { file, line: rb.lines[e], column: `n${(i % nn) + 1}`, elementId: rb.ids[e] })
    }
    conn[i] = r
    used[r] = 1
  }
  return conn
}

/** Copies each row's values to its node's slot; a row for an unknown node or a second row for a node is an error. */
function scatterRows(t: NumericTable, width: number, out: Float64Array, nodeIndex: IdIndex, nodesName: string, file: string): Uint8Array {
  const has = new Uint8Array(out.length / width)
  const v = t.values
  for (let r = 0; r < t.rows; r++) {
    const id = t.ids[r]
    const n = rowOfId(nodeIndex, id)
    if (n < 0) throw new InputError('missing-node', `node ${id} is not in ${nodesName}; remove the row, or add the node there`, { file, line: t.lines[r], column: 'id' })
    if (has[n]) {
      const first = t.ids.indexOf(id)
      throw new InputError('duplicate-id', `node ${id} has two rows (lines ${t.lines[first]} and ${t.lines[r]}); keep one`, { file, line: t.lines[r], column: 'id' })
    }
    has[n] = 1
    for (let k = 0; k < width; k++) out[n * width + k] = v[r * width + k]
  }
  return has
}

/** True when the two id lists are equal entry by entry. */
function sameIds(a: Int32Array, b: Int32Array): boolean {
  if (a.length !== b.length) return false
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false
  return true
}

function firstUsedWithout(used: Uint8Array, has: Uint8Array): number {
  for (let i = 0; i < used.length; i++) if (used[i] && !has[i]) return i
  return -1
}

function countUnusedWithout(used: Uint8Array, has: Uint8Array): number {
  let n = 0
  for (let i = 0; i < used.length; i++) if (!used[i] && !has[i]) n++
  return n
}

/** The first element that uses node index `node` (error path only). */
function findElementUsing(raw: readonly RawElementBlock[], blocks: readonly BlockInput[], node: number): { id: number } {
  for (let b = 0; b < blocks.length; b++) {
    const conn = blocks[b].conn
    const nn = elementType(blocks[b].type).nodeCount
    const i = conn.indexOf(node)
    if (i >= 0) return { id: raw[b].ids[(i / nn) | 0] }
  }
  return { id: 0 }
}
