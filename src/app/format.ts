/**
 * Number formatting for display: model units → the chosen unit system, four significant figures,
 * a real minus sign, and the unit on every value. The raw model-unit value stays available to
 * tests and exports through `data-model` attributes (see Num in ui/Num.tsx).
 */
import { displayFactor, displayUnitLabel } from '../model/units.ts'
import type { ModelUnits, Quantity, UnitSystem } from '../model/units.ts'
import type { QuantityName } from '../state/store.ts'

export function formatNumber(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return Number.isNaN(v) ? '—' : v > 0 ? '∞' : '−∞'
  if (v === 0) return '0'
  const a = Math.abs(v)
  let s: string
  if (a >= 1e6 || a < 1e-3) s = v.toExponential(digits - 1).replace('e+', 'e')
  else s = v.toPrecision(digits)
  if (s.includes('e')) s = s.replace(/\.?0+e/, 'e')
  else if (s.includes('.')) s = s.replace(/\.?0+$/, '')
  return s.replace(/-/g, '−')
}

/**
 * The display rule for rounding noise, the one place it lives: on screen, in snapshots and in
 * reports (never in JSON or CSV, which carry every digit), a value whose magnitude is below
 * NOISE_FRACTION of the largest value of its family in the same table is shown as 0. Families:
 * forces with forces, moments with moments, second moments with second moments, stresses with
 * stresses; coordinates against the model's size (the diagonal of its bounds). So a centroid x of −1.4e-17 m on a part
 * of 0.3 m, or a torque of −1.9e-6 kN·m beside bending moments of 1.7 kN·m, reads 0.
 */
export const NOISE_FRACTION = 1e-6

/** The magnitude below which values of a family are shown as 0: NOISE_FRACTION × the largest |value| (or `scale`, when larger). */
export function noiseFloor(values: Iterable<number>, scale = 0): number {
  let big = Math.abs(scale)
  for (const v of values) { const a = Math.abs(v); if (a > big && Number.isFinite(a)) big = a }
  return NOISE_FRACTION * big
}

/** `v`, or 0 when its magnitude is below `floor` (see NOISE_FRACTION). */
export function denoise(v: number, floor: number): number {
  return Math.abs(v) < floor ? 0 : v
}

/** Converts a model-unit value of `q` to the display system. */
export function convert(v: number, units: ModelUnits, q: Quantity, system: UnitSystem): number {
  return v * displayFactor(units, q, system)
}

export function unitLabel(q: Quantity, system: UnitSystem): string {
  return displayUnitLabel(q, system)
}

export const QUANTITY_LABEL: Readonly<Record<QuantityName, string>> = {
  normalTraction: 'Normal traction tₙ',
  shearTraction: 'Shear traction |τ|',
  tractionMagnitude: 'Traction |t|',
  vonMises: 'von Mises stress',
  principal1: 'Principal stress σ₁',
  principal3: 'Principal stress σ₃',
  balanceIndicator: 'Element balance indicator',
}

/** Physical kind of a colour quantity: a stress, or dimensionless. */
export function quantityKind(q: QuantityName): Quantity | null {
  return q === 'balanceIndicator' ? null : 'stress'
}

/** Display factor and label for a colour quantity. */
export function quantityDisplay(q: QuantityName, units: ModelUnits | undefined, system: UnitSystem): { factor: number; unit: string } {
  const kind = quantityKind(q)
  if (!kind || !units) return { factor: 1, unit: kind ? unitLabel(kind, system) : '–' }
  return { factor: displayFactor(units, kind, system), unit: unitLabel(kind, system) }
}
