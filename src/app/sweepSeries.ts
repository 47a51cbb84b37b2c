/**
 * The six section quantities of a sweep, as series for the chart and rows for the report:
 * display-unit conversion, the nearest section to a position, and the mapping between a
 * position along the sweep direction and the app's section offset. Pure (no DOM, no store).
 */
import type { ModelUnits, UnitSystem } from '../model/units.ts'
import { displayFactor, displayUnitLabel } from '../model/units.ts'
import type { Vec3 } from '../model/model.ts'
import type { SeriesKey, SweepReply } from '../../workers/protocol.ts'
import { denoise, formatNumber, noiseFloor } from './format.ts'

export type { SeriesKey }

export interface SeriesInfo {
  readonly key: SeriesKey
  /** Words for the legend and the tables. */
  readonly label: string
  /** Symbol used where space is short. */
  readonly symbol: string
  readonly quantity: 'force' | 'moment'
  /** Line colour (Okabe–Ito palette, readable by most colour-blind viewers). */
  readonly colour: string
}

export const SERIES: readonly SeriesInfo[] = [
  { key: 'axial', label: 'Axial force', symbol: 'N', quantity: 'force', colour: '#0072b2' },
  { key: 'shear1', label: 'Shear force 1', symbol: 'V₁', quantity: 'force', colour: '#d55e00' },
  { key: 'shear2', label: 'Shear force 2', symbol: 'V₂', quantity: 'force', colour: '#009e73' },
  { key: 'torque', label: 'Torque', symbol: 'T', quantity: 'moment', colour: '#cc79a7' },
  { key: 'bending1', label: 'Bending moment 1', symbol: 'M₁', quantity: 'moment', colour: '#e69f00' },
  { key: 'bending2', label: 'Bending moment 2', symbol: 'M₂', quantity: 'moment', colour: '#56b4e9' },
]

/** Values of one series in the display system (a new array; the reply stays in model units). */
export function seriesInDisplay(r: SweepReply, key: SeriesKey, units: ModelUnits, system: UnitSystem): Float64Array {
  const info = SERIES.find((s) => s.key === key)!
  const f = displayFactor(units, info.quantity, system)
  const src = r[key]
  const out = new Float64Array(src.length)
  for (let i = 0; i < src.length; i++) out[i] = src[i] * f
  return out
}

/** Offsets in display length units. */
export function offsetsInDisplay(r: SweepReply, units: ModelUnits, system: UnitSystem): Float64Array {
  const f = displayFactor(units, 'length', system)
  return r.offsets.map((v) => v * f)
}

/** Index of the section nearest to `x` (same units as `offsets`); -1 for no sections. */
export function nearestIndex(offsets: ArrayLike<number>, x: number): number {
  let best = -1, bestD = Infinity
  for (let i = 0; i < offsets.length; i++) {
    const d = Math.abs(offsets[i] - x)
    if (d < bestD) { bestD = d; best = i }
  }
  return best
}

const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2]

/**
 * Where the live section plane sits along the sweep direction m (unit), as x·m of its point
 * (length units), or null when the planes are not parallel (then no marker is drawn).
 */
export function positionAlong(planePoint: Vec3, planeNormal: Vec3, m: Vec3): number | null {
  const c = Math.abs(dot(planeNormal, m)) / (Math.hypot(...planeNormal) * Math.hypot(...m) || 1)
  if (!(c > 1 - 1e-9)) return null
  return dot(planePoint, m)
}

/**
 * The section offset (along unit m, from `point`) that puts the plane at x·m = `position`: the
 * app's plane is point + offset·m, so offset = position - point·m.
 */
export function offsetForPosition(position: number, point: Vec3, m: Vec3): number {
  return position - dot(point, m)
}

/** A table of the sweep in the display system: header with units, one row per section. */
export function sweepTable(r: SweepReply, units: ModelUnits, system: UnitSystem): { head: string[]; rows: string[][] } {
  const L = displayUnitLabel('length', system)
  const head = [`Position [${L}]`, ...SERIES.map((s) => `${s.symbol} [${displayUnitLabel(s.quantity, system)}]`), 'Free-body force residual / gross', 'Free-body moment residual / (gross · L)']
  const x = offsetsInDisplay(r, units, system)
  const cols = SERIES.map((s) => seriesInDisplay(r, s.key, units, system))
  const rows: string[][] = []
  for (let k = 0; k < x.length; k++) {
    if (r.empty[k]) { rows.push([formatNumber(x[k]), ...SERIES.map(() => '—'), 'misses the body', '—']); continue }
    // Each row is one section: its forces judged against its forces, its moments against its moments.
    const floor = { force: noiseFloor(SERIES.filter((s) => s.quantity === 'force').map((s) => cols[SERIES.indexOf(s)][k])), moment: noiseFloor(SERIES.filter((s) => s.quantity === 'moment').map((s) => cols[SERIES.indexOf(s)][k])) }
    rows.push([formatNumber(x[k]), ...cols.map((c, i) => formatNumber(denoise(c[k], floor[SERIES[i].quantity]))), formatNumber(r.freeBodyRelative[k], 2), formatNumber(r.freeBodyMomentRelative[k], 2)])
  }
  return { head, rows }
}

/**
 * Largest free-body residual over the sections that cut the body (0 when none): the force residual
 * over the gross load, or the moment residual over gross load × L, whichever is larger.
 */
export function worstResidual(r: SweepReply): number {
  let w = 0
  for (let k = 0; k < r.freeBodyRelative.length; k++) {
    if (r.empty[k]) continue
    w = Math.max(w, r.freeBodyRelative[k], r.freeBodyMomentRelative[k])
  }
  return w
}

/**
 * Ranges for two or more y axes drawn over one plot, widened so that zero sits at the same
 * height on each (a force axis and a moment axis then share their zero line), with 5 % room.
 * Each input is the [min, max] of that axis's data; the output always contains zero.
 */
export function zeroAlignedRanges(ranges: readonly (readonly [number, number])[]): [number, number][] {
  const parts = ranges.map(([lo, hi]) => {
    const n = Math.max(0, -(Number.isFinite(lo) ? lo : 0)), p = Math.max(0, Number.isFinite(hi) ? hi : 0)
    return n + p > 0 ? [n, p] : [1, 1]
  })
  // share of the height below zero: the mean of the axes' own shares, kept off the edges
  const r = Math.min(0.9, Math.max(0.1, parts.reduce((a, [n, p]) => a + n / (n + p), 0) / parts.length))
  return parts.map(([n, p]) => {
    const below = Math.max(n, (p * r) / (1 - r)), above = Math.max(p, (n * (1 - r)) / r)
    return [-below * 1.05, above * 1.05]
  })
}

// ---- Several load cases on one chart ----

/** Line colours of the cases when one component is drawn (Okabe–Ito, after the component palette's neutral). */
const CASE_COLOURS = ['#1d2329', '#0072b2', '#d55e00', '#009e73', '#cc79a7', '#e69f00', '#56b4e9', '#9a6a2a'] as const
/** Dash patterns (px, on/off) of the cases: solid first, then ever sparser. */
const CASE_DASHES: readonly (readonly number[])[] = [[], [7, 3], [2, 2], [9, 3, 2, 3], [4, 4], [12, 4], [2, 5], [6, 2, 2, 2, 2, 2]]

/** How case `i` of the drawn ones is drawn: one component, a colour per case (and a dash); several, the component's colour and a dash per case. */
export function caseLineStyle(i: number, oneComponent: boolean, componentColour: string): { readonly colour: string; readonly dash: readonly number[] } {
  const dash = CASE_DASHES[i % CASE_DASHES.length]
  return { colour: oneComponent ? CASE_COLOURS[i % CASE_COLOURS.length] : componentColour, dash }
}

/** The legend's colour of case `i`: its own when one component is drawn, a neutral ink otherwise (the dash tells it). */
export function caseLegendColour(i: number, oneComponent: boolean): string {
  return oneComponent ? CASE_COLOURS[i % CASE_COLOURS.length] : '#4a545e'
}

/** One case's values of one component along the sweep, in the display system (model units in the reply). */
export function caseSeriesInDisplay(r: SweepReply, name: string, key: SeriesKey, units: ModelUnits, system: UnitSystem): Float64Array {
  const c = r.cases?.cases.find((x) => x.name === name)
  if (!c) throw new RangeError(`the sweep holds no case "${name}"`)
  const f = displayFactor(units, SERIES.find((s) => s.key === key)!.quantity, system)
  return c[key].map((v) => v * f)
}

/**
 * The envelope along the part in the display system: per section its position and, per component,
 * the largest and smallest value with the governing case (null where the plane misses the body).
 * Values every digit (`value`) and after the rounding-noise rule (`shown`, for the report), each
 * family judged over the whole part, as one table.
 */
export interface EnvelopeAlongRow {
  readonly position: number
  readonly cells: readonly ({ readonly key: SeriesKey; readonly max: number; readonly maxShown: number; readonly maxCase: string | null; readonly min: number; readonly minShown: number; readonly minCase: string | null } | null)[]
}

export function envelopeAlong(r: SweepReply, units: ModelUnits, system: UnitSystem): EnvelopeAlongRow[] | null {
  const c = r.cases
  if (!c) return null
  const x = offsetsInDisplay(r, units, system)
  // One table: forces judged against the forces anywhere along the part, moments against moments
  // (a tiny end section's round-off is not a governing value).
  const floorOf = (q: 'force' | 'moment'): number => noiseFloor(SERIES.filter((s) => s.quantity === q).flatMap((s) => {
    const e = c.envelope[s.key]
    return Array.from(e.max, (v, k) => (e.maxCase[k] < 0 ? 0 : Math.max(Math.abs(v), Math.abs(e.min[k]))))
  }))
  const floor = { force: floorOf('force'), moment: floorOf('moment') }
  const rows: EnvelopeAlongRow[] = []
  for (let k = 0; k < x.length; k++) {
    if (r.empty[k] || c.envelope.axial.maxCase[k] < 0) { rows.push({ position: x[k], cells: SERIES.map(() => null) }); continue }
    rows.push({
      position: x[k],
      cells: SERIES.map((s) => {
        const e = c.envelope[s.key], f = displayFactor(units, s.quantity, system), fl = floor[s.quantity]
        const hi = denoise(e.max[k], fl), lo = denoise(e.min[k], fl)
        // a component that is rounding noise in every case has no governing case
        const noise = hi === 0 && lo === 0
        return {
          key: s.key, max: e.max[k] * f, maxShown: hi * f, maxCase: noise ? null : c.cases[e.maxCase[k]].name,
          min: e.min[k] * f, minShown: lo * f, minCase: noise ? null : c.cases[e.minCase[k]].name,
        }
      }),
    })
  }
  return rows
}

/** Per component, the extremes over the whole part (largest of the maxima, smallest of the minima) with position and governing case. */
export function envelopeAlongExtremes(rows: readonly EnvelopeAlongRow[]): { key: SeriesKey; max: number; maxAt: number; maxCase: string | null; min: number; minAt: number; minCase: string | null }[] {
  return SERIES.map((s, i) => {
    let max = -Infinity, maxAt = NaN, maxCase: string | null = null, min = Infinity, minAt = NaN, minCase: string | null = null
    for (const r of rows) {
      const c = r.cells[i]
      if (!c) continue
      // ties up to round-off go to the first section (a constant force along a bar is at its start)
      const tol = 1e-9 * Math.max(Math.abs(c.maxShown), Math.abs(c.minShown))
      if (c.maxShown > max + tol) { max = c.maxShown; maxAt = r.position; maxCase = c.maxCase }
      if (c.minShown < min - tol) { min = c.minShown; minAt = r.position; minCase = c.minCase }
    }
    return { key: s.key, max, maxAt, maxCase, min, minAt, minCase }
  })
}
