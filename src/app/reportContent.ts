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
import { patchRow, sectionRows } from './exports.ts'
import { convert, formatNumber } from './format.ts'
import type { AuditSummary, ModelSummary, SeriesKey, SweepReply } from '../../workers/protocol.ts'
import type { LineReply } from '../../workers/protocol.ts'
import type { LineSeries } from '../state/lineSlice.ts'
import { frameNote, linearisationTables, linePointTable, lineSeries, lineSeriesValues } from './lineExport.ts'
import { LINEARISATION_CAUTION, LINEARISATION_METHOD } from '../mechanics/linearisation.ts'
import { offsetsInDisplay, SERIES, seriesInDisplay, sweepTable, worstResidual } from './sweepSeries.ts'

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
  readonly sweep: SweepReply | null
  readonly shown: Readonly<Record<SeriesKey, boolean>>
  /** PNG snapshot of the view as a data URL, or null. */
  readonly snapshot: string | null
  // A line through the model (its values and linearisation) and the series its chart shows.
  readonly line?: LineReply | null
  readonly lineShown?: Readonly<Record<LineSeries, boolean>>
}

const PNG_DATA_URL = /^data:image\/png;base64,[A-Za-z0-9+/]+=*$/

const fmt = (v: number): string => formatNumber(v)
const vec = (v: readonly number[]): string => `(${v.map(fmt).join(', ')})`

function equilibriumTable(a: AuditSummary, input: ReportInput): ReportTable {
  const { units } = input.model, sys = input.system
  const F = displayUnitLabel('force', sys), M = displayUnitLabel('moment', sys), S = displayUnitLabel('stress', sys)
  const f = (v: number): number => convert(v, units, 'force', sys)
  const m = (v: number): number => convert(v, units, 'moment', sys)
  const b = a.body
  return {
    kind: 'table', id: 'equilibrium', heading: 'Equilibrium of the whole body',
    note: 'Residual = surface integral of the traction plus the body force integral; element indicator = |element residual| / gross load.',
    head: ['Figure', 'Value', 'Unit'],
    rows: [
      ['Residual force', vec(b.force.map(f)), F],
      ['Residual moment', vec(b.moment.map(m)), M],
      ['Residual / gross load', fmt(b.relative), '–'],
      ['Verdict', a.verdict.reason, '–'],
      ['Of the residual, free surface', vec(a.freeSurfaceForce.map(f)), F],
      ['Gross load', fmt(f(b.gross)), F],
      ['Body force total', vec(b.bodyForceTotal.map(f)), F],
      ['Volume', fmt(convert(b.volume, units, 'volume', sys)), displayUnitLabel('volume', sys)],
      ['Element indicator, median', fmt(a.indicator.p50), '–'],
      ['Element indicator, 95th percentile', fmt(a.indicator.p95), '–'],
      ['Element indicator, largest', fmt(a.indicator.max), '–'],
      ['Free surface area', fmt(convert(a.freeSurface.area, units, 'area', sys)), displayUnitLabel('area', sys)],
      ['Free surface mean |t|', fmt(convert(a.freeSurface.mean, units, 'stress', sys)), S],
      ['Free surface peak |t|', fmt(convert(a.freeSurface.peak, units, 'stress', sys)), S],
    ],
  }
}

function patchTable(a: AuditSummary, input: ReportInput): ReportTable {
  const sys = input.system
  const L = displayUnitLabel('length', sys), A = displayUnitLabel('area', sys), F = displayUnitLabel('force', sys), S = displayUnitLabel('stress', sys)
  return {
    kind: 'table', id: 'patches', heading: 'Load-entry patches',
    note: `Surface areas whose traction exceeds ${fmt(convert(a.threshold, input.model.units, 'stress', sys))} ${S}.` + (a.patches.length ? '' : ' None were found.'),
    head: ['#', 'Faces', `Area [${A}]`, `Centroid [${L}]`, `Force [${F}]`, `|F| [${F}]`, `Peak |t| [${S}]`, `Mean |t| [${S}]`],
    rows: a.patches.map((p) => {
      const r = patchRow(p, input.model.units, sys)
      return [String(r.id), String(r.faces), fmt(r.area), vec(r.centroid), vec(r.force), fmt(r.forceMagnitude), fmt(r.peak), fmt(r.mean)]
    }),
  }
}

function sectionTable(r: SectionResult, input: ReportInput): ReportTable {
  const L = displayUnitLabel('length', input.system)
  const f = (v: number): number => convert(v, input.model.units, 'length', input.system)
  return {
    kind: 'table', id: 'section', heading: 'Current section',
    note: r.empty ? 'The plane misses the body.'
      : `Plane through ${vec(r.plane.point.map(f))} ${L}, unit normal ${vec(r.plane.normal)}. What the +n side exerts on the −n side; moments about the section centroid; ${r.cutElements} elements cut.`,
    head: ['Figure', 'Value', 'Unit'],
    rows: r.empty ? [] : sectionRows(r, input.model.units, input.system).map((x) => [x.label, fmt(x.value), x.unit]),
  }
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
  for (const q of ['force', 'moment'] as const) {
    const lines = SERIES.filter((d) => d.quantity === q && input.shown[d.key]).map((d) => {
      const v = seriesInDisplay(s, d.key, units, sys)
      for (let k = 0; k < v.length; k++) if (s.empty[k]) v[k] = NaN
      return { label: `${d.symbol} ${d.label}`, colour: d.colour, values: v }
    })
    if (!lines.length) continue
    blocks.push({
      kind: 'diagram', id: `diagram-${q}`, heading: q === 'force' ? 'Forces along the part' : 'Moments along the part',
      xLabel, yLabel: `${q === 'force' ? 'Force' : 'Moment'} [${displayUnitLabel(q, sys)}]`,
      geometry: diagramGeometry(x, lines, 720, 260, M, domain),
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
    note: `${s.offsets.length} parallel sections; section axes per section (e₃ = m), moments about each section's centroid. Largest free-body residual (force / gross or moment / (gross · L)): ${formatNumber(worstResidual(s), 2)}.`,
    head: t.head, rows: t.rows,
  })
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

export function buildReportContent(input: ReportInput): ReportContent {
  const m = input.model
  const sys = input.system
  const facts: [string, string][] = [
    ['Model', m.name || 'Unnamed model'],
    ...(m.description ? [['Description', m.description] as [string, string]] : []),
    ['Source', m.source],
    ['Mesh', `${m.elementCount} elements (${Object.entries(m.elementTypes).map(([k, v]) => `${k} ${v}`).join(', ')}), ${m.nodeCount} nodes`],
    ['Model units', `length ${m.units.length}, stress ${m.units.stress}`],
    ['Shown in', `${sys === 'SI' ? 'SI' : 'US customary'}: ${(['length', 'force', 'moment', 'stress'] as const).map((q) => displayUnitLabel(q, sys)).join(', ')}`],
    ['Made', input.date.toISOString().replace(/\.\d+Z$/, 'Z')],
  ]
  for (const w of m.warnings) facts.push(['Reader note', w])
  const blocks: ReportBlock[] = []
  if (input.snapshot && PNG_DATA_URL.test(input.snapshot)) {
    blocks.push({ kind: 'image', id: 'snapshot', heading: 'View', src: input.snapshot, alt: 'Snapshot of the model view' })
  }
  if (input.audit) {
    blocks.push(equilibriumTable(input.audit, input))
    blocks.push(patchTable(input.audit, input))
  }
  if (input.section) blocks.push(sectionTable(input.section, input))
  if (input.sweep) blocks.push(...sweepBlocks(input.sweep, input))
  if (input.line) blocks.push(...lineBlocks(input.line, input))
  return { title: `Review report: ${m.name || 'Unnamed model'}`, facts, caution: input.caution, blocks }
}
