/**
 * What the review report says, as plain records: the heading facts, the tables as strings and
 * the diagrams as geometry. Pure (no DOM), so it is unit-tested; src/app/reportDocument.ts turns
 * it into one self-contained HTML file with DOM calls only (every string becomes a text node).
 */
import type { SectionResult } from '../mechanics/types.ts'
import type { UnitSystem } from '../model/units.ts'
import { displayUnitLabel } from '../model/units.ts'
import { diagramGeometry } from './diagramGeometry.ts'
import type { DiagramGeometry } from './diagramGeometry.ts'
import { axesLines, patchRow, patchRuleText, sectionRows } from './exports.ts'
import { convert, denoise, formatNumber, noiseFloor } from './format.ts'
import type { AuditSummary, ModelSummary, SeriesKey, SweepReply } from '../../workers/protocol.ts'
import type { LineReply } from '../../workers/protocol.ts'
import type { LineSeries } from '../state/lineSlice.ts'
import { frameNote, linearisationTables, linePointTable, lineSeries, lineSeriesValues } from './lineExport.ts'
import { LINEARISATION_CAUTION, LINEARISATION_METHOD } from '../mechanics/linearisation.ts'
import type { ReviewFields } from '../state/store.ts'
import { concurrentRows, envelopeRows, shownValue } from './envelopeExport.ts'
import type { EnvelopeReply } from '../../workers/protocol.ts'
import { envelopeAlong, envelopeAlongExtremes, offsetsInDisplay, SERIES, seriesInDisplay, sweepTable, worstResidual } from './sweepSeries.ts'
import { interfaceTable, loadPathTable, partTable, regionTable } from './assemblyTables.ts'
import type { AssemblySummary } from '../../workers/protocol.ts'

export interface ReportTable {
  readonly kind: 'table'
  readonly id: string
  readonly heading: string
  readonly note?: string
  readonly head: readonly string[]
  readonly rows: readonly (readonly string[])[]
}

export interface ReportImage {
  readonly kind: 'image'
  readonly id: string
  readonly heading: string
  /** A data:image/png;base64 URL (nothing else is accepted). */
  readonly src: string
  readonly alt: string
}

export interface ReportDiagram {
  readonly kind: 'diagram'
  readonly id: string
  readonly heading: string
  readonly xLabel: string
  readonly yLabel: string
  readonly geometry: DiagramGeometry
}

export type ReportBlock = ReportTable | ReportImage | ReportDiagram

export interface ReportContent {
  readonly title: string
  /** Label/value pairs under the title: model, source, units, date... */
  readonly facts: readonly (readonly [string, string])[]
  readonly caution: string
  readonly blocks: readonly ReportBlock[]
}

export interface ReportInput {
  readonly model: ModelSummary
  readonly system: UnitSystem
  /** When the report was made (shown as ISO 8601, UTC). */
  readonly date: Date
  readonly caution: string
  readonly audit: AuditSummary | null
  readonly section: SectionResult | null
  /** --- assemblies: the parts and interfaces (absent or null with one part) --- */
  readonly assembly?: AssemblySummary | null
  readonly sweep: SweepReply | null
  readonly shown: Readonly<Record<SeriesKey, boolean>>
  /** PNG snapshot of the view as a data URL, or null. */
  readonly snapshot: string | null
  // A line through the model (its values and linearisation) and the series its chart shows.
  readonly line?: LineReply | null
  readonly lineShown?: Readonly<Record<LineSeries, boolean>>
  /** The reviewer's fields (title, project, people, revision, load case, notes); empty ones are left out. */
  readonly review?: ReviewFields
  /** The tool's version (package.json). */
  readonly version?: string
  // --- load cases: the section's envelope over the cases, when the cut card shows it ---
  readonly envelope?: EnvelopeReply | null
}

const PNG_DATA_URL = /^data:image\/png;base64,[A-Za-z0-9+/]+=*$/

const fmt = (v: number): string => formatNumber(v)
/** A vector as read: components below `floor` (display units; the rounding-noise rule of format.ts) shown as 0. */
const vec = (v: readonly number[], floor = 0): string => `(${v.map((x) => fmt(denoise(x, floor))).join(', ')})`

/** The model's size (its bounds' diagonal, length units): what coordinates are judged against. */
function modelSize(m: ModelSummary): number {
  const { min, max } = m.bounds
  return Math.hypot(max[0] - min[0], max[1] - min[1], max[2] - min[2])
}

function equilibriumTable(a: AuditSummary, input: ReportInput): ReportTable {
  const { units } = input.model, sys = input.system
  const F = displayUnitLabel('force', sys), M = displayUnitLabel('moment', sys), S = displayUnitLabel('stress', sys), L = displayUnitLabel('length', sys)
  const f = (v: number): number => convert(v, units, 'force', sys)
  const m = (v: number): number => convert(v, units, 'moment', sys)
  const l = (v: number): number => convert(v, units, 'length', sys)
  const b = a.body
  // Forces with forces (and the gross load), moments with moments, points against the model's size.
  const fFloor = noiseFloor([...b.force, ...b.bodyForceTotal, ...a.freeSurfaceForce].map(f), f(b.gross))
  const mFloor = noiseFloor(b.moment.map(m))
  const lFloor = noiseFloor([], l(modelSize(input.model)))
  return {
    kind: 'table', id: 'equilibrium', heading: 'Equilibrium of the whole body',
    note: 'Residual = surface integral of the traction plus the body force integral; element indicator = |element residual| / gross load.',
    head: ['Figure', 'Value', 'Unit'],
    rows: [
      ['Residual force', vec(b.force.map(f), fFloor), F],
      ['Residual moment', vec(b.moment.map(m), mFloor), M],
      ['Residual moment taken about (volume centroid)', vec(b.about.map(l), lFloor), L],
      ['Residual / gross load', fmt(b.relative), '–'],
      ['Verdict', a.verdict.reason, '–'],
      ['Of the residual, free surface', vec(a.freeSurfaceForce.map(f), fFloor), F],
      ['Gross load', fmt(f(b.gross)), F],
      ['Body force total', vec(b.bodyForceTotal.map(f), fFloor), F],
      ['Volume', fmt(convert(b.volume, units, 'volume', sys)), displayUnitLabel('volume', sys)],
      ['Element indicator, median', fmt(a.indicator.p50), '–'],
      ['Element indicator, 95th percentile', fmt(a.indicator.p95), '–'],
      ['Element indicator, largest', fmt(a.indicator.max), '–'],
      ...(a.leastBalanced ?? []).map((e, i): string[] => [i === 0 ? 'Least balanced elements (id: indicator)' : '', `${e.id}: ${fmt(e.indicator)}`, '–']),
      ['Free surface area', fmt(convert(a.freeSurface.area, units, 'area', sys)), displayUnitLabel('area', sys)],
      ['Free surface mean |t|', fmt(convert(a.freeSurface.mean, units, 'stress', sys)), S],
      ['Free surface peak |t|', fmt(convert(a.freeSurface.peak, units, 'stress', sys)), S],
    ],
  }
}

/** The patches in two tables: their figures, then their vectors (one wide table would not fit a page). */
function patchTables(a: AuditSummary, input: ReportInput): ReportTable[] {
  const sys = input.system
  const L = displayUnitLabel('length', sys), A = displayUnitLabel('area', sys), F = displayUnitLabel('force', sys), M = displayUnitLabel('moment', sys), S = displayUnitLabel('stress', sys)
  const rows = a.patches.map((p) => patchRow(p, input.model.units, sys))
  const fFloor = noiseFloor(rows.flatMap((r) => r.force)), mFloor = noiseFloor(rows.flatMap((r) => r.moment))
  const lFloor = noiseFloor([], convert(modelSize(input.model), input.model.units, 'length', sys))
  const parts = new Set(rows.map((r) => r.part)).size > 1
  const rule = a.fractions ? `Patches: ${patchRuleText(a)}. ` : ''
  const figures: ReportTable = {
    kind: 'table', id: 'patches', heading: 'Load-entry patches',
    note: `${rule}Start level ${fmt(convert(a.threshold, input.model.units, 'stress', sys))} ${S}` +
      (a.lowerThreshold !== undefined ? `, join level ${fmt(convert(a.lowerThreshold, input.model.units, 'stress', sys))} ${S}.` : '.') + (a.patches.length ? '' : ' None were found.'),
    head: ['#', ...(parts ? ['Part'] : []), 'Faces', `Area [${A}]`, `|F| [${F}]`, `|M| about centroid [${M}]`, `Peak |t| [${S}]`, `Mean |t| [${S}]`],
    rows: rows.map((r) => [
      String(r.id), ...(parts ? [String(r.part)] : []), String(r.faces), fmt(r.area), fmt(denoise(r.forceMagnitude, fFloor)),
      fmt(denoise(r.momentMagnitude, mFloor)), fmt(r.peak), fmt(r.mean),
    ]),
  }
  if (!rows.length) return [figures]
  const vectors: ReportTable = {
    kind: 'table', id: 'patch-vectors', heading: 'Load-entry patches: centroid, force and moment',
    note: 'Force ∫ t dA over each patch and its moment about the patch\'s centroid, in x, y, z.',
    head: ['#', `Centroid [${L}]`, `Force [${F}]`, `Moment [${M}]`],
    rows: rows.map((r) => [String(r.id), vec(r.centroid, lFloor), vec(r.force, fFloor), vec(r.moment, mFloor)]),
  }
  return [figures, vectors]
}

function sectionTable(r: SectionResult, input: ReportInput): ReportTable {
  const L = displayUnitLabel('length', input.system)
  const f = (v: number): number => convert(v, input.model.units, 'length', input.system)
  const size = modelSize(input.model)
  if (r.empty) return { kind: 'table', id: 'section', heading: 'Current section', note: 'The plane misses the body.', head: ['Figure', 'Value', 'Unit'], rows: [] }
  const axes = axesLines(r)
  return {
    kind: 'table', id: 'section', heading: 'Current section',
    note: `Plane through ${vec(r.plane.point.map(f), 1e-6 * f(size))} ${L}, unit normal ${axes.e3}. What the +n side exerts on the −n side; moments about the section centroid; ${r.cutElements} elements cut. Section axes: ${axes.kind}.`,
    head: ['Figure', 'Value', 'Unit'],
    rows: [
      ['Axis e₁', axes.e1, '–'], ['Axis e₂', axes.e2, '–'], ['Axis e₃ = n', axes.e3, '–'],
      ...sectionRows(r, input.model.units, input.system, size).map((x) => [x.label, fmt(x.shown), x.unit]),
    ],
  }
}

/** The section's envelope over the load cases: the extremes with their governing case, then each governing case's resultant. */
function envelopeTables(e: EnvelopeReply, input: ReportInput): ReportTable[] {
  const rows = envelopeRows(e, input.model, input.system)
  const F = displayUnitLabel('force', input.system), M = displayUnitLabel('moment', input.system)
  return [{
    kind: 'table', id: 'envelope', heading: 'Envelope of the current section over the load cases',
    note: `Over ${e.combinationsOnly ? 'the combinations only' : `every case and combination (${e.cases.map((c) => c.name).join(', ')})`}; section axes as for the current section, moments about its centroid.`,
    head: ['Component', 'Extreme', 'Value', 'Unit', 'Governing case'],
    rows: rows.map((r) => [r.label, r.side, shownValue(r), r.unit, r.governing ?? '—']),
  }, {
    kind: 'table', id: 'envelope-concurrent', heading: 'Concurrent values of the governing cases',
    note: 'Each governing case\'s whole resultant in section axes.',
    head: ['Case', `N [${F}]`, `V₁ [${F}]`, `V₂ [${F}]`, `T [${M}]`, `M₁ [${M}]`, `M₂ [${M}]`],
    rows: concurrentRows(e, input.model, input.system).map((c) => [c.name, ...c.values.map((v) => fmt(v))]),
  }]
}

function sweepBlocks(s: SweepReply, input: ReportInput): ReportBlock[] {
  const { units } = input.model, sys = input.system
  const x = offsetsInDisplay(s, units, sys)
  const L = displayUnitLabel('length', sys)
  const blocks: ReportBlock[] = []
  const xLabel = `Position x·m along m = ${vec(s.normal)} [${L}]`
  const Lf = convert(1, units, 'length', sys)
  const domain: [number, number] = [s.extent[0] * Lf, s.extent[1] * Lf]
  const M = { left: 64, right: 12, top: 10, bottom: 28 }
  // One diagram per internal force, all six unless the chart hides some. Diagrams of one kind
  // (forces, moments) share one vertical scale, so a torque of round-off size beside bending
  // moments of kN·m reads as the flat line it is, not as a curve blown up to fill its own axes.
  const series = SERIES.filter((d) => input.shown[d.key]).map((d) => {
    const v = seriesInDisplay(s, d.key, units, sys)
    for (let k = 0; k < v.length; k++) if (s.empty[k]) v[k] = NaN
    return { d, v }
  })
  const span = (q: 'force' | 'moment'): [number, number] => {
    let lo = Infinity, hi = -Infinity
    for (const { d, v } of series) if (d.quantity === q) for (const y of v) if (Number.isFinite(y)) { lo = Math.min(lo, y); hi = Math.max(hi, y) }
    return lo <= hi ? [lo, hi] : [0, 1]
  }
  const shared = { force: span('force'), moment: span('moment') }
  for (const { d, v } of series) {
    blocks.push({
      kind: 'diagram', id: `diagram-${d.key}`, heading: `${d.label} ${d.symbol} along the part`,
      xLabel, yLabel: `${d.symbol} [${displayUnitLabel(d.quantity, sys)}]`,
      geometry: diagramGeometry(x, [{ label: `${d.symbol} ${d.label}`, colour: d.colour, values: v }], 720, 180, M, domain, shared[d.quantity]),
    })
  }
  const res = Float64Array.from(s.freeBodyRelative, (v, k) => (s.empty[k] ? NaN : v))
  const resM = Float64Array.from(s.freeBodyMomentRelative, (v, k) => (s.empty[k] ? NaN : v))
  blocks.push({
    kind: 'diagram', id: 'diagram-residual', heading: 'Free-body residual along the part',
    xLabel, yLabel: 'Residual (relative)',
    geometry: diagramGeometry(x, [
      { label: 'Force residual / gross', colour: '#4a545e', values: res },
      { label: 'Moment residual / (gross · L)', colour: '#9a6a2a', values: resM },
    ], 720, 160, M, domain),
  })
  const t = sweepTable(s, units, sys)
  blocks.push({
    kind: 'table', id: 'sweep', heading: 'Sections along the part',
    note: `${s.cases && input.model.shownCase ? `Load case ${input.model.shownCase}: ` : ''}${s.offsets.length} parallel sections; ${s.axes?.kind === 'reference' ? 'reference axes' : 'principal axes per section'} with one reference for all (${(s.axes?.reference ?? [0, 0, 0]).map((v) => formatNumber(denoise(v, 1e-9), 3)).join(', ')}), e₃ = m; moments about each section's centroid. Largest free-body residual (force / gross or moment / (gross · L)): ${formatNumber(worstResidual(s), 2)}.`,
    head: t.head, rows: t.rows,
  })
  return blocks
}

/**
 * The envelope along the part (the sweep over every case and combination): per component its
 * extremes over the whole part with where and which case governs, a diagram of the largest and
 * smallest value per section, and the per-section table in two halves (forces, moments), each cell
 * the value with its governing case.
 */
function envelopeAlongBlocks(s: SweepReply, input: ReportInput): ReportBlock[] {
  const c = s.cases
  const rows = c ? envelopeAlong(s, input.model.units, input.system) : null
  if (!c || !rows) return []
  const sys = input.system
  const L = displayUnitLabel('length', sys)
  const over = c.combinationsOnly ? 'the combinations only' : `every load case and combination (${c.cases.map((x) => x.name).join(', ')})`
  const unitOf = (q: 'force' | 'moment'): string => displayUnitLabel(q, sys)
  const blocks: ReportBlock[] = []
  const extremes = envelopeAlongExtremes(rows)
  blocks.push({
    kind: 'table', id: 'envelope-along-extremes', heading: 'Envelope along the part: the extremes',
    note: `Over ${over}, at the ${s.offsets.length} sections of the sweep; section axes as in the sweep, moments about each section's centroid. Position x·m along m = ${vec(s.normal)}.`,
    head: ['Component', 'Largest', 'At', 'Governing case', 'Smallest', 'At', 'Governing case'],
    rows: SERIES.map((d, i) => {
      const e = extremes[i], u = unitOf(d.quantity)
      if (!Number.isFinite(e.max)) return [`${d.label} ${d.symbol}`, '—', '—', '—', '—', '—', '—']
      // a component that is rounding noise all along has no place and no governing case
      return [`${d.label} ${d.symbol} [${u}]`, fmt(e.max), e.maxCase ? `${fmt(e.maxAt)} ${L}` : '—', e.maxCase ?? '—', fmt(e.min), e.minCase ? `${fmt(e.minAt)} ${L}` : '—', e.minCase ?? '—']
    }),
  })
  const x = offsetsInDisplay(s, input.model.units, sys)
  const Lf = convert(1, input.model.units, 'length', sys)
  const domain: [number, number] = [s.extent[0] * Lf, s.extent[1] * Lf]
  const M = { left: 64, right: 12, top: 10, bottom: 28 }
  SERIES.forEach((d, i) => {
    if (!input.shown[d.key]) return
    const hi = Float64Array.from(rows, (r) => r.cells[i]?.maxShown ?? NaN)
    const lo = Float64Array.from(rows, (r) => r.cells[i]?.minShown ?? NaN)
    blocks.push({
      kind: 'diagram', id: `diagram-envelope-${d.key}`, heading: `Envelope of ${d.label.toLowerCase()} ${d.symbol} along the part`,
      xLabel: `Position x·m [${L}]`, yLabel: `${d.symbol} [${unitOf(d.quantity)}]`,
      geometry: diagramGeometry(x, [{ label: `${d.symbol} largest`, colour: d.colour, values: hi }, { label: `${d.symbol} smallest`, colour: '#4a545e', values: lo }], 720, 180, M, domain),
    })
  })
  const cell = (r: (typeof rows)[number], i: number, side: 'max' | 'min'): string => {
    const e = r.cells[i]
    if (!e) return '—'
    const v = side === 'max' ? e.maxShown : e.minShown, g = side === 'max' ? e.maxCase : e.minCase
    return g ? `${fmt(v)} (${g})` : fmt(v)
  }
  for (const q of ['force', 'moment'] as const) {
    const keys = SERIES.map((d, i) => ({ d, i })).filter(({ d }) => d.quantity === q)
    blocks.push({
      kind: 'table', id: `envelope-along-${q === 'force' ? 'forces' : 'moments'}`, heading: `Envelope along the part: ${q === 'force' ? 'forces' : 'moments'} [${unitOf(q)}]`,
      note: 'Per section the largest and the smallest value, the governing case in brackets; — where the plane misses the body.',
      head: [`Position [${L}]`, ...keys.flatMap(({ d }) => [`${d.symbol} largest`, `${d.symbol} smallest`])],
      rows: rows.map((r) => [fmt(r.position), ...keys.flatMap(({ i }) => [cell(r, i, 'max'), cell(r, i, 'min')])]),
    })
  }
  return blocks
}

/** The line through the model: its diagram, its linearisation and the table of its points. */
function lineBlocks(r: LineReply, input: ReportInput): ReportBlock[] {
  const { units } = input.model, sys = input.system
  const L = displayUnitLabel('length', sys), S = displayUnitLabel('stress', sys)
  const f = (v: number): number => convert(v, units, 'length', sys)
  const ends = `from ${vec(r.from.map(f))} to ${vec(r.to.map(f))} ${L}`
  const blocks: ReportBlock[] = []
  if (r.outside) {
    return [{ kind: 'table', id: 'line', heading: 'Line through the model', note: `The line ${ends} lies wholly outside the body.`, head: [], rows: [] }]
  }
  const x = Float64Array.from(r.distance, f)
  const shown = input.lineShown
  const defs = lineSeries(r.axes).filter((d) => d.quantity === 'stress' && (!shown || shown[d.key]))
  const lines = (defs.length ? defs : lineSeries(r.axes).filter((d) => d.key === 'vonMises')).map((d) => ({
    label: d.label, colour: d.colour, values: Float64Array.from(lineSeriesValues(r, d.key), (v) => convert(v, units, 'stress', sys)),
  }))
  const M = { left: 64, right: 12, top: 10, bottom: 28 }
  blocks.push({
    kind: 'diagram', id: 'diagram-line', heading: 'Stress along the line',
    xLabel: `Distance along the line ${ends} [${L}]`, yLabel: `Stress [${S}]`,
    geometry: diagramGeometry(x, lines, 720, 240, M, [0, f(r.length)]),
  })
  const l = r.linearisation
  if (l) {
    const t = linearisationTables(l, units, sys)
    blocks.push({
      kind: 'table', id: 'linearisation', heading: 'Through-thickness linearisation',
      note: `${LINEARISATION_METHOD}. Wall thickness along the line ${t.thickness}; ${t.criterion} equivalent stress. Frame: ${frameNote(l)}. ${r.warnings.join(' ')} ${LINEARISATION_CAUTION}`.replace(/\s+/g, ' ').trim(),
      head: ['Part', `At the start [${S}]`, `At the end [${S}]`],
      rows: t.equivalents.map((row) => [...row]),
    })
    blocks.push({
      kind: 'table', id: 'linearisation-components', heading: 'Linearised components in the line\'s frame',
      note: 'Bending only for σ₂₂ and σ₃₃ (Annex 5-A); at the end it is the negative of the value at the start.',
      head: ['Component', `Membrane [${S}]`, `Bending at the start [${S}]`],
      rows: t.components.map((row) => [...row]),
    })
  } else {
    blocks.push({ kind: 'table', id: 'linearisation', heading: 'Through-thickness linearisation', note: `Not linearised: ${r.refused ?? 'no reason given'}.`, head: [], rows: [] })
  }
  const p = linePointTable(r, units, sys)
  blocks.push({
    kind: 'table', id: 'line', heading: 'Points along the line',
    note: `${r.held.length} points ${ends}; components in ${r.axes.kind === 'cylindrical' ? 'cylindrical axes r, θ, z' : 'global axes'}; points outside the body are marked.`,
    head: p.head, rows: p.rows,
  })
  return blocks
}

/** "nodes.csv: 972 724 bytes, SHA-256 3f1c…" for each input file. */
function inputFacts(m: ModelSummary): [string, string][] {
  if (!m.inputs || m.inputs.length === 0) return [['Input', m.source.startsWith('synthetic:') ? 'generated in the browser (no input file)' : m.source]]
  return m.inputs.map((f) => ['Input file', `${f.name}: ${f.bytes.toLocaleString('en-US').replace(/,/g, ' ')} bytes, SHA-256 ${f.sha256 ?? (m.digestsPending ? 'still being computed (make the report again in a moment)' : 'not available in this browser')}`])
}

/** The regions of the current cut, the parts, the load path (per-part free bodies) and the interfaces. */
function assemblyBlocks(input: ReportInput): ReportTable[] {
  const { units } = input.model, sys = input.system, a = input.assembly ?? null
  const out: ReportTable[] = []
  const r = input.section
  if (r && !r.empty && r.regions && r.regions.length > 1) {
    out.push({ kind: 'table', id: 'regions', heading: 'Regions of the current section', note: 'Connected pieces of one part, largest force first; what the +n side exerts on the −n side, moments about each region\'s own centroid in its own section axes.', ...regionTable(r, a, units, sys) })
  }
  if (!a) return out
  out.push({ kind: 'table', id: 'parts', heading: 'Parts', note: 'Each part\'s own free body: its boundary includes its faces against other parts; residual of ∮ t dA + ∫ ρb dV over the part, relative to its gross load.', ...partTable(a, units, sys) })
  const sumF = [0, 1, 2].map((k) => a.parts.reduce((s, p) => s + p.balance.force[k], 0))
  const mis = [0, 1, 2].map((k) => a.interfaces.reduce((s, i) => s + i.force[k] + i.reverseForce[k], 0))
  const body = input.audit?.body.force
  const F = convert(1, units, 'force', sys)
  const check = body ? ` Sum over the parts of the residual forces ${vec(sumF.map((v) => v * F))} ${displayUnitLabel('force', sys)}; the whole body's residual ${vec(body.map((v) => v * F))} plus the interface mismatches ${vec(mis.map((v) => v * F))}.` : ''
  out.push({ kind: 'table', id: 'load-path', heading: 'Load path: where the load enters each part', note: `Per part, the external load-entry patches and the interfaces (the force the other part exerts on it), then the part's residual.${check}`, ...loadPathTable(a, input.audit?.patches ?? [], units, sys) })
  if (a.interfaces.length) out.push({ kind: 'table', id: 'interfaces', heading: 'Interfaces between parts', note: 'Force that part a exerts on part b (b\'s faces and stress), moment about the interface centroid; mismatch |F_ab + F_ba| over the interface\'s gross load (zero for nodal stress with shared nodes).', ...interfaceTable(a, units, sys) })
  return out
}

export function buildReportContent(input: ReportInput): ReportContent {
  const m = input.model
  const sys = input.system
  const r = input.review
  const filled = (label: string, v: string | undefined): [string, string][] => (v && v.trim() ? [[label, v.trim()]] : [])
  const shownIn = sys === 'SI' ? 'SI' : sys === 'US' ? 'US customary' : 'chosen units'
  const facts: [string, string][] = [
    ...filled('Title', r?.title),
    ...filled('Project', r?.project),
    ['Model', m.name || 'Unnamed model'],
    ...filled('Author', r?.author),
    ...filled('Checker', r?.checker),
    ...filled('Revision', r?.revision),
    ['Load case', r?.loadCase.trim() || 'the model\'s one stress field (no load case named)'],
    ...(m.description ? [['Description', m.description] as [string, string]] : []),
    ['Source', m.source],
    ...inputFacts(m),
    ['Stress', m.stressLayout === 'element-nodal' ? 'element-nodal (a value per element node, averaged within each part for display)' : 'nodal (one value per node)'],
    ['Mesh', `${m.elementCount} elements (${Object.entries(m.elementTypes).map(([k, v]) => `${k} ${v}`).join(', ')}), ${m.nodeCount} nodes`],
    ['Model units', `length ${m.units.length}, stress ${m.units.stress}`],
    ['Shown in', `${shownIn}: ${(['length', 'force', 'moment', 'stress'] as const).map((q) => displayUnitLabel(q, sys)).join(', ')}`],
    ['Made with', `Tractus ${input.version ?? ''}`.trim()],
    ['Made', input.date.toISOString().replace(/\.\d+Z$/, 'Z')],
    ...filled('Notes', r?.notes),
  ]
  for (const w of m.warnings) facts.push(['Reader note', w])
  const blocks: ReportBlock[] = []
  if (input.snapshot && PNG_DATA_URL.test(input.snapshot)) {
    blocks.push({ kind: 'image', id: 'snapshot', heading: 'View', src: input.snapshot, alt: 'Snapshot of the model view' })
  }
  if (input.audit) {
    blocks.push(equilibriumTable(input.audit, input))
    blocks.push(...patchTables(input.audit, input))
  }
  if (input.section) blocks.push(sectionTable(input.section, input))
  blocks.push(...assemblyBlocks(input))
  if (input.envelope?.envelope) blocks.push(...envelopeTables(input.envelope, input))
  if (input.sweep) blocks.push(...sweepBlocks(input.sweep, input), ...envelopeAlongBlocks(input.sweep, input))
  if (input.line) blocks.push(...lineBlocks(input.line, input))
  return { title: `Review report: ${m.name || 'Unnamed model'}`, facts, caution: input.caution, blocks }
}
