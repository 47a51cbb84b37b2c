/**
 * The sweep's CSV and JSON exports: one row (CSV) or one array entry (JSON) per section, the six
 * components in section axes for every load case the chart draws (the case shown when none is
 * picked), the free-body residuals of the case shown, and with load cases the envelope per
 * section over every case and combination (largest, smallest and the governing case of each
 * component; the columns `tractus sweep --case all` prints). Values in the display units, every
 * digit.
 */
import type { ModelSummary, SweepReply } from '../../workers/protocol.ts'
import type { UnitSystem } from '../model/units.ts'
import { displayFactor } from '../model/units.ts'
import { unitLabel } from './format.ts'
import { csvField } from './exports.ts'
import { caseSeriesInDisplay, offsetsInDisplay, SERIES, seriesInDisplay } from './sweepSeries.ts'

/** The columns of the cases exported: name and the six components' values in display units. */
function caseColumns(s: SweepReply, m: ModelSummary, system: UnitSystem, drawn: readonly string[], shownCase: string | null) {
  const names = s.cases ? drawn.filter((n) => s.cases!.cases.some((c) => c.name === n)) : []
  if (names.length === 0) return [{ name: shownCase ?? 'case shown', values: SERIES.map((x) => seriesInDisplay(s, x.key, m.units, system)) }]
  return names.map((name) => ({ name, values: SERIES.map((x) => caseSeriesInDisplay(s, name, x.key, m.units, system)) }))
}

const finite = (v: number): string => (Number.isFinite(v) ? String(v) : '')

export function sweepCsv(m: ModelSummary, s: SweepReply, system: UnitSystem, drawn: readonly string[], shownCase: string | null): string {
  const L = unitLabel('length', system)
  const cols = caseColumns(s, m, system, drawn, shownCase)
  const env = s.cases
  const x = offsetsInDisplay(s, m.units, system)
  const head = [
    `position [${L}]`,
    ...cols.flatMap((c) => SERIES.map((k) => csvField(`${c.name} ${k.key} [${unitLabel(k.quantity, system)}]`))),
    csvField(`freebody_relative (${shownCase ?? 'case shown'})`), csvField(`freebody_moment_relative (${shownCase ?? 'case shown'})`),
    ...(env ? SERIES.flatMap((k) => [`${k.key}_max [${unitLabel(k.quantity, system)}]`, `${k.key}_max_case`, `${k.key}_min [${unitLabel(k.quantity, system)}]`, `${k.key}_min_case`]) : []),
  ]
  const lines = [
    `# Tractus sections along the part: ${m.name.replace(/[\r\n]/g, ' ')}`,
    `# ${s.offsets.length} planes with normal ${s.normal.join(' ')} at x·m = position; section axes ${s.axes.kind}, reference ${s.axes.reference.join(' ')}; moments about each section centroid`,
    ...(env ? [`# envelope over ${env.combinationsOnly ? 'the combinations only' : 'every load case and combination'}: ${env.cases.map((c) => c.name).join(' ')}`] : []),
    head.join(','),
  ]
  for (let k = 0; k < x.length; k++) {
    const missed = s.empty[k] === 1
    const cells = [String(x[k]), ...cols.flatMap((c) => c.values.map((v) => (missed ? '' : String(v[k])))),
      missed ? '' : String(s.freeBodyRelative[k]), missed ? '' : String(s.freeBodyMomentRelative[k])]
    if (env) {
      for (const key of SERIES) {
        const e = env.envelope[key.key], f = displayFactor(m.units, key.quantity, system)
        const ok = e.maxCase[k] >= 0
        cells.push(ok ? finite(e.max[k] * f) : '', ok ? csvField(env.cases[e.maxCase[k]].name) : '', ok ? finite(e.min[k] * f) : '', ok ? csvField(env.cases[e.minCase[k]].name) : '')
      }
    }
    lines.push(cells.join(','))
  }
  return lines.join('\n') + '\n'
}

export function sweepJson(m: ModelSummary, s: SweepReply, system: UnitSystem, drawn: readonly string[], shownCase: string | null): string {
  const cols = caseColumns(s, m, system, drawn, shownCase)
  const env = s.cases
  const list = (a: ArrayLike<number>) => Array.from(a, (v, k) => (s.empty[k] ? null : v))
  return JSON.stringify({
    model: m.name, modelUnits: m.units, displayUnits: system,
    units: { position: unitLabel('length', system), force: unitLabel('force', system), moment: unitLabel('moment', system) },
    normal: s.normal, axes: s.axes, positions: Array.from(offsetsInDisplay(s, m.units, system)), missesBody: Array.from(s.empty, (v) => v === 1),
    cases: cols.map((c) => ({ case: c.name, ...Object.fromEntries(SERIES.map((k, i) => [k.key, list(c.values[i])])) })),
    freeBody: { case: shownCase, forceRelative: list(s.freeBodyRelative), momentRelative: list(s.freeBodyMomentRelative) },
    ...(env ? {
      envelope: {
        over: env.combinationsOnly ? 'combinations' : 'all', cases: env.cases.map((c) => ({ name: c.name, kind: c.kind })),
        ...Object.fromEntries(SERIES.map((k) => {
          const e = env.envelope[k.key], f = displayFactor(m.units, k.quantity, system)
          const at = (k2: number) => (e.maxCase[k2] < 0 ? null : { max: e.max[k2] * f, maxCase: env.cases[e.maxCase[k2]].name, min: e.min[k2] * f, minCase: env.cases[e.minCase[k2]].name })
          return [k.key, Array.from(s.offsets, (_, k2) => at(k2))]
        })),
      },
    } : {}),
  }, null, 2)
}
