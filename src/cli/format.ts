/**
 * Plain-text tables for the terminal: numbers with four significant figures and a unit on every
 * value, columns padded to line up.
 */
import type { Quantity } from '../model/units.ts'
import type { UnitView } from './unitView.ts'
import { denoise } from '../model/roundingNoise.ts'

/** Four significant figures; exponent form outside 1e-3..1e6 so columns stay short. */
export function num(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return String(v)
  if (v === 0) return '0'
  const a = Math.abs(v)
  if (a >= 1e6 || a < 1e-3) return v.toExponential(digits - 1).replace(/\.?0+e/, 'e')
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(a)))
  const s = v.toFixed(decimals)
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s
}

/**
 * A quantity in the chosen units, e.g. "12.5 kN". `floor` (model units): the rounding-noise floor
 * of the value's family in the table (src/model/roundingNoise.ts); below it the value reads 0.
 */
export function qty(v: number, q: Quantity, u: UnitView, floor = 0): string {
  return `${num(denoise(v, floor) * u.factor(q))} ${u.label(q)}`
}

/** A vector in the chosen units, e.g. "(1, 0, -2.5) kN"; `floor` as for qty. */
export function vecQty(v: ArrayLike<number>, q: Quantity, u: UnitView, floor = 0): string {
  const f = u.factor(q)
  return `(${num(denoise(v[0], floor) * f)}, ${num(denoise(v[1], floor) * f)}, ${num(denoise(v[2], floor) * f)}) ${u.label(q)}`
}

/** A dimensionless vector (directions), e.g. "(0, 0, 1)"; unit vectors read components below 1e-6 as 0 by default. */
export function vecPlain(v: ArrayLike<number>, floor = 1e-6): string {
  return `(${num(denoise(v[0], floor))}, ${num(denoise(v[1], floor))}, ${num(denoise(v[2], floor))})`
}

/** Scales a model-unit vector for JSON: a plain [x, y, z] array. */
export function vecJson(v: ArrayLike<number>, q: Quantity | null, u: UnitView): [number, number, number] {
  const f = q ? u.factor(q) : 1
  return [v[0] * f, v[1] * f, v[2] * f]
}

/** Rows of cells as text with padded columns; `right` marks right-aligned columns. */
export function table(rows: readonly (readonly string[])[], right: readonly boolean[] = []): string {
  const widths: number[] = []
  for (const r of rows) r.forEach((c, i) => { widths[i] = Math.max(widths[i] ?? 0, [...c].length) })
  return rows.map((r) => r.map((c, i) => {
    const pad = ' '.repeat(widths[i] - [...c].length)
    return i === r.length - 1 && !right[i] ? c : right[i] ? pad + c : c + pad
  }).join('  ')).join('\n') + '\n'
}

/** Key/value lines indented under a heading. */
export function block(heading: string, rows: readonly (readonly [string, string])[]): string {
  return `${heading}\n` + table(rows.map(([k, v]) => ['  ' + k, v]))
}
