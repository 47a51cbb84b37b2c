/**
 * The section's envelope over load cases for the exports and the review report: rows of
 * component, extreme, value, unit and governing case (values in the display units, rounding noise
 * read as 0 on screen and in the report, never in CSV or JSON), and each governing case's whole
 * resultant (the concurrent values). CSV and JSON carry every digit.
 */
import type { EnvelopeEntry, EnvelopeReply, ModelSummary, ResultantEnvelope } from '../../workers/protocol.ts'
import type { UnitSystem } from '../model/units.ts'
import { convert, denoise, formatNumber, noiseFloor, unitLabel } from './format.ts'

const COMPONENTS: readonly { key: string; label: string; q: 'force' | 'moment'; env: (e: ResultantEnvelope) => EnvelopeEntry }[] = [
  { key: 'axial', label: 'Axial force N', q: 'force', env: (e) => e.axial },
  { key: 'shear1', label: 'Shear force V₁', q: 'force', env: (e) => e.shear[0] },
  { key: 'shear2', label: 'Shear force V₂', q: 'force', env: (e) => e.shear[1] },
  { key: 'torque', label: 'Torque T', q: 'moment', env: (e) => e.torque },
  { key: 'bending1', label: 'Bending moment M₁', q: 'moment', env: (e) => e.bending[0] },
  { key: 'bending2', label: 'Bending moment M₂', q: 'moment', env: (e) => e.bending[1] },
]

export interface EnvelopeRow {
  readonly key: string
  readonly label: string
  readonly side: 'largest' | 'smallest'
  /** Model units; display units; the display value with the rounding-noise rule. */
  readonly model: number
  readonly value: number
  readonly shown: number
  readonly unit: string
  /** The governing case; null where the component is rounding noise in every case. */
  readonly governing: string | null
}

export function envelopeRows(reply: EnvelopeReply, m: ModelSummary, system: UnitSystem): EnvelopeRow[] {
  if (!reply.envelope) return []
  const over = reply.combinationsOnly ? reply.cases.filter((c) => c.kind === 'combination') : reply.cases
  const fF = noiseFloor(over.flatMap((c) => [c.axial, ...c.shear]))
  const fM = noiseFloor(over.flatMap((c) => [c.torque, ...c.bending]))
  return COMPONENTS.flatMap((k) => {
    const e = k.env(reply.envelope!)
    const floor = k.q === 'force' ? fF : fM
    const noise = Math.abs(e.max) <= floor && Math.abs(e.min) <= floor
    return (['largest', 'smallest'] as const).map((side) => {
      const model = side === 'largest' ? e.max : e.min
      return {
        key: k.key, label: k.label, side, model, value: convert(model, m.units, k.q, system), shown: convert(denoise(model, floor), m.units, k.q, system),
        unit: unitLabel(k.q, system), governing: noise ? null : side === 'largest' ? e.maxCase : e.minCase,
      }
    })
  })
}

/** Each governing case's resultant in display units: [name, N, V1, V2, T, M1, M2]. */
export function concurrentRows(reply: EnvelopeReply, m: ModelSummary, system: UnitSystem): { name: string; values: number[] }[] {
  const rows = envelopeRows(reply, m, system)
  const names = [...new Set(rows.map((r) => r.governing).filter((x): x is string => x !== null))]
  return names.map((name) => {
    const c = reply.cases.find((x) => x.name === name)!
    const v = [c.axial, c.shear[0], c.shear[1], c.torque, c.bending[0], c.bending[1]]
    return { name, values: v.map((x, i) => convert(x, m.units, i < 3 ? 'force' : 'moment', system)) }
  })
}

const csvField = (s: string | number): string => {
  const t = String(s)
  return /[",\n]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t
}

export function envelopeCsv(reply: EnvelopeReply, m: ModelSummary, system: UnitSystem): string {
  const lines = [
    `# Tractus section envelope over ${reply.combinationsOnly ? 'the combinations only' : 'every load case and combination'}: ${m.name.replace(/[\r\n]/g, ' ')}`,
    `# plane point ${reply.plane.point.join(' ')} normal ${reply.plane.normal.join(' ')} (model units ${m.units.length}); section axes e1 ${reply.axes.e1.join(' ')}, e2 ${reply.axes.e2.join(' ')}, e3 ${reply.axes.e3.join(' ')}; moments about the section centroid`,
    'component,extreme,value,unit,governing case',
    ...envelopeRows(reply, m, system).map((r) => [csvField(r.label), r.side, csvField(r.value), csvField(r.unit), csvField(r.governing ?? '')].join(',')),
    '',
    `case,N [${unitLabel('force', system)}],V1,V2,T [${unitLabel('moment', system)}],M1,M2`,
    ...reply.cases.map((c) => [csvField(c.name), ...[c.axial, c.shear[0], c.shear[1], c.torque, c.bending[0], c.bending[1]].map((x, i) => String(convert(x, m.units, i < 3 ? 'force' : 'moment', system)))].join(',')),
  ]
  return lines.join('\n') + '\n'
}

export function envelopeJson(reply: EnvelopeReply, m: ModelSummary, system: UnitSystem): string {
  return JSON.stringify({
    model: m.name, modelUnits: m.units, displayUnits: system, plane: reply.plane, axes: reply.axes,
    over: reply.combinationsOnly ? 'combinations' : 'all', envelope: reply.envelope, cases: reply.cases, regions: reply.regions,
  }, null, 2)
}

/** "1.234 kN" for the report's tables. */
export function shownValue(r: EnvelopeRow): string {
  return formatNumber(r.shown)
}

/** One line per component for the snapshot: largest and smallest value with unit, and their governing cases. */
export interface EnvelopeLine {
  readonly label: string
  readonly largest: string
  readonly largestCase: string
  readonly smallest: string
  readonly smallestCase: string
}

export function envelopeLines(reply: EnvelopeReply, m: ModelSummary, system: UnitSystem): EnvelopeLine[] {
  const rows = envelopeRows(reply, m, system)
  const out: EnvelopeLine[] = []
  for (let i = 0; i + 1 < rows.length; i += 2) {
    const hi = rows[i], lo = rows[i + 1]
    out.push({ label: hi.label, largest: `${formatNumber(hi.shown)} ${hi.unit}`, largestCase: hi.governing ?? '—', smallest: `${formatNumber(lo.shown)} ${lo.unit}`, smallestCase: lo.governing ?? '—' })
  }
  return out
}

/** True when the envelope was computed on `plane` (the one on screen), up to round-off of the model's size. */
export function envelopeOnPlane(reply: EnvelopeReply, plane: { readonly point: readonly number[]; readonly normal: readonly number[] }, size: number): boolean {
  const a = reply.plane, n = Math.hypot(...a.normal), k = Math.hypot(...plane.normal)
  const same = a.normal.every((v, i) => Math.abs(v / n - plane.normal[i] / k) < 1e-9)
  const off = a.normal.reduce((s, v, i) => s + (v / n) * (a.point[i] - plane.point[i]), 0)
  return same && Math.abs(off) <= 1e-9 * Math.max(size, 1e-300)
}
