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
