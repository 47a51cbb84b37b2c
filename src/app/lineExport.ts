/**
 * The figures of a line through the model, shared by the Line card, its CSV export and the review
 * report, so all three show the same numbers: the chart's series, the linearisation table and
 * the rows of sampled points. Model-unit values are converted to the display system here; a
 * point outside the body is a gap (an empty CSV field, "outside" in tables), never a zero.
 */
import type { ModelUnits, Quantity, UnitSystem } from '../model/units.ts'
import { displayUnitLabel } from '../model/units.ts'
import type { ComponentAxes, LineReply, Linearisation, ModelSummary } from '../../workers/protocol.ts'
import type { LineSeries } from '../state/lineSlice.ts'
import { componentSymbols, convert, formatNumber } from './format.ts'

export interface LineSeriesDef {
  readonly key: LineSeries
  readonly symbol: string
  readonly label: string
  readonly quantity: Quantity
  readonly colour: string
}

/** Colours of the line chart's series (readable on white, apart in hue and lightness). */
const COLOURS: Readonly<Record<LineSeries, string>> = {
  s0: '#1b6ca8', s1: '#b0226a', s2: '#2e8540', s3: '#8a5a00', s4: '#6b4fa0', s5: '#0f7c7c',
  vonMises: '#1d2329', principal1: '#c2410c', principal3: '#1d4ed8', displacement: '#7a7f85',
}

/** The chart's series in the axes the components are shown in. */
export function lineSeries(axes: ComponentAxes): LineSeriesDef[] {
  const sym = componentSymbols(axes)
  const words = axes.kind === 'cylindrical'
    ? ['radial stress', 'hoop stress', 'axial stress', 'shear stress', 'shear stress', 'shear stress']
    : ['normal stress', 'normal stress', 'normal stress', 'shear stress', 'shear stress', 'shear stress']
  const comps = (['s0', 's1', 's2', 's3', 's4', 's5'] as const).map((key, k): LineSeriesDef => ({ key, symbol: sym[k], label: `${words[k]} ${sym[k]}`, quantity: 'stress', colour: COLOURS[key] }))
  return [
    ...comps,
    { key: 'vonMises', symbol: 'σvM', label: 'von Mises stress', quantity: 'stress', colour: COLOURS.vonMises },
    { key: 'principal1', symbol: 'σ₁', label: 'largest principal stress σ₁', quantity: 'stress', colour: COLOURS.principal1 },
    { key: 'principal3', symbol: 'σ₃', label: 'smallest principal stress σ₃', quantity: 'stress', colour: COLOURS.principal3 },
    { key: 'displacement', symbol: '|u|', label: 'displacement |u|', quantity: 'length', colour: COLOURS.displacement },
  ]
}

/** The values of one series along the line in model units (NaN at gaps). */
export function lineSeriesValues(r: LineReply, key: LineSeries): Float64Array {
  const n = r.held.length
  const out = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    if (!r.held[i]) { out[i] = NaN; continue }
    switch (key) {
      case 'vonMises': out[i] = r.vonMises[i]; break
      case 'principal1': out[i] = r.principal[3 * i]; break
      case 'principal3': out[i] = r.principal[3 * i + 2]; break
      case 'displacement': out[i] = r.displacement ? Math.hypot(r.displacement[3 * i], r.displacement[3 * i + 1], r.displacement[3 * i + 2]) : NaN; break
      default: out[i] = r.components[6 * i + Number(key.slice(1))]
    }
  }
  return out
}

/** The words for the frame's in-plane axes, by the rule that chose them. */
export function frameNote(l: Linearisation): string {
  switch (l.frame.rule) {
    case 'axis': return 'e1 through the wall, e2 hoop, e3 meridional (about the cylinder axis)'
    case 'bending': return 'e1 through the wall; e2, e3 the principal directions of the in-plane bending'
    case 'membrane': return 'e1 through the wall; e2, e3 the principal directions of the in-plane membrane stress'
    default: return 'e1 through the wall; e2, e3 from the global axes (no in-plane stress to orient them)'
  }
}

/** Names of the frame's six components (order 11, 22, 33, 12, 23, 13). */
export function frameComponentNames(l: Linearisation): readonly string[] {
  return l.frame.rule === 'axis'
    ? ['σ₁₁ through the wall', 'σ₂₂ hoop', 'σ₃₃ meridional', 'τ₁₂', 'τ₂₃', 'τ₁₃']
    : ['σ₁₁ through the wall', 'σ₂₂', 'σ₃₃', 'τ₁₂', 'τ₂₃', 'τ₁₃']
}

export interface LinearisationTables {
  /** [part, at the start, at the end] of the equivalent stresses, display units. */
  readonly equivalents: readonly (readonly [string, string, string])[]
  /** [component, membrane, bending at the start] in the line's frame, display units. */
  readonly components: readonly (readonly [string, string, string])[]
  readonly unit: string
  readonly criterion: string
  readonly thickness: string
}

/** The linearisation as the card and the report show it. */
export function linearisationTables(l: Linearisation, units: ModelUnits, system: UnitSystem): LinearisationTables {
  const s = (v: number): string => formatNumber(convert(v, units, 'stress', system))
  const criterion = l.criterion === 'vonMises' ? 'von Mises' : 'Tresca'
  const names = frameComponentNames(l)
  return {
    unit: displayUnitLabel('stress', system),
    criterion,
    thickness: `${formatNumber(convert(l.thickness, units, 'length', system))} ${displayUnitLabel('length', system)}`,
    equivalents: [
      ['Membrane', s(l.membraneEquivalent), s(l.membraneEquivalent)],
      ['Membrane + bending', s(l.membranePlusBendingEquivalent.from), s(l.membranePlusBendingEquivalent.to)],
      ['Peak', s(l.peakEquivalent.from), s(l.peakEquivalent.to)],
      ['Total', s(l.totalEquivalent.from), s(l.totalEquivalent.to)],
    ],
    components: names.map((n, k) => [n, s(l.membraneLocal[k]), k === 1 || k === 2 ? s(l.bendingLocal[k]) : '–'] as const),
  }
}

/** CSV field: quote when needed, and defuse leading formula characters for spreadsheets. */
function field(v: string | number): string {
  let t = typeof v === 'number' ? (Number.isFinite(v) ? String(v) : '') : v
  if (typeof v === 'string' && /^[=+\-@]/.test(t)) t = "'" + t
  return /[",\n\r]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t
}

/**
 * The line as CSV: comment lines with the model, the ends and the linearisation, then one row
 * per point: distance, x, y, z, in_body, the six stress components in global axes, those in the
 * chosen axes when they are cylindrical, von Mises, σ1, σ2, σ3, and the displacement when the
 * model has it. Display units; points outside the body have empty value fields.
 */
export function lineCsv(m: ModelSummary, r: LineReply, system: UnitSystem): string {
  const units = m.units
  const L = displayUnitLabel('length', system), S = displayUnitLabel('stress', system)
  const len = (v: number): number => convert(v, units, 'length', system)
  const st = (v: number): number => convert(v, units, 'stress', system)
  const lines = [
    `# Tractus line: ${m.name.replace(/[\r\n]/g, ' ')}`,
    `# from ${r.from.map(len).join(' ')} to ${r.to.map(len).join(' ')} ${L}; ${r.held.length} points; stress in ${S}, lengths in ${L}`,
  ]
  const l = r.linearisation
  if (l) {
    const t = linearisationTables(l, units, system)
    lines.push(`# linearisation (ASME BPVC VIII-2 Part 5 Annex 5-A), ${t.criterion}, thickness ${t.thickness}: ` +
      t.equivalents.map(([n, a, b]) => `${n.toLowerCase()} ${a} / ${b}`).join('; ') + ` ${t.unit} (start / end)`)
  } else if (r.refused) lines.push(`# not linearised: ${r.refused.replace(/[\r\n]/g, ' ')}`)
  const cyl = r.axes.kind === 'cylindrical'
  const head = ['distance', 'x', 'y', 'z', 'in_body', 'sxx', 'syy', 'szz', 'sxy', 'syz', 'sxz',
    ...(cyl ? ['srr', 'stt', 'szz_axis', 'srt', 'stz', 'srz'] : []), 'von_mises', 's1', 's2', 's3',
    ...(r.displacement ? ['ux', 'uy', 'uz'] : [])]
  lines.push(head.join(','))
  for (let i = 0; i < r.held.length; i++) {
    const inside = r.held[i] > 0
    const val = (v: number): string | number => (inside ? v : '')
    const row: (string | number)[] = [len(r.distance[i]), len(r.points[3 * i]), len(r.points[3 * i + 1]), len(r.points[3 * i + 2]), inside ? 1 : 0]
    for (let k = 0; k < 6; k++) row.push(val(st(r.stress[6 * i + k])))
    if (cyl) for (let k = 0; k < 6; k++) row.push(val(st(r.components[6 * i + k])))
    row.push(val(st(r.vonMises[i])), val(st(r.principal[3 * i])), val(st(r.principal[3 * i + 1])), val(st(r.principal[3 * i + 2])))
    if (r.displacement) for (let k = 0; k < 3; k++) row.push(val(len(r.displacement[3 * i + k])))
    lines.push(row.map(field).join(','))
  }
  return lines.join('\n') + '\n'
}

/** Rows of the report's table of points: distance, the components in the chosen axes, von Mises, |u|. */
export function linePointTable(r: LineReply, units: ModelUnits, system: UnitSystem): { head: string[]; rows: string[][] } {
  const L = displayUnitLabel('length', system), S = displayUnitLabel('stress', system)
  const sym = componentSymbols(r.axes)
  const head = [`Distance [${L}]`, ...sym.map((x) => `${x} [${S}]`), `von Mises [${S}]`, ...(r.displacement ? [`|u| [${L}]`] : [])]
  const rows: string[][] = []
  const u = lineSeriesValues(r, 'displacement')
  for (let i = 0; i < r.held.length; i++) {
    const d = formatNumber(convert(r.distance[i], units, 'length', system))
    if (!r.held[i]) { rows.push([d, 'outside the body', ...Array(head.length - 2).fill('')]); continue }
    rows.push([
      d, ...[0, 1, 2, 3, 4, 5].map((k) => formatNumber(convert(r.components[6 * i + k], units, 'stress', system))),
      formatNumber(convert(r.vonMises[i], units, 'stress', system)),
      ...(r.displacement ? [formatNumber(convert(u[i], units, 'length', system))] : []),
    ])
  }
  return { head, rows }
}
