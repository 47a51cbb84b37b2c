/**
 * Number formatting for display: model units → the chosen unit system, four significant figures,
 * a real minus sign, and the unit on every value. The raw model-unit value stays available to
 * tests and exports through `data-model` attributes (see Num in ui/Num.tsx).
 */
import { displayFactor, displayUnitLabel } from '../model/units.ts'
import type { ModelUnits, Quantity, UnitSystem } from '../model/units.ts'
import type { QuantityName } from '../state/store.ts'
import type { ComponentAxes } from '../../workers/protocol.ts'

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

// The display rule for rounding noise lives in src/model/roundingNoise.ts (the command line's
// tables use it too); the cards, snapshot and report take it from here.
export { denoise, noiseFloor, NOISE_FRACTION } from '../model/roundingNoise.ts'

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
  stressJump: 'Stress jump between elements',
  // Components in global axes (quantityLabel names them in cylindrical axes).
  sxx: 'Stress σxx', syy: 'Stress σyy', szz: 'Stress σzz', sxy: 'Shear stress τxy', syz: 'Shear stress τyz', sxz: 'Shear stress τxz',
  displacement: 'Displacement |u|', ux: 'Displacement ux', uy: 'Displacement uy', uz: 'Displacement uz',
}

/** The components' names in cylindrical axes about a line (r radial, θ hoop, z along the axis). */
const CYLINDRICAL_LABEL: Readonly<Partial<Record<QuantityName, string>>> = {
  sxx: 'Radial stress σrr', syy: 'Hoop stress σθθ', szz: 'Axial stress σzz',
  sxy: 'Shear stress τrθ', syz: 'Shear stress τθz', sxz: 'Shear stress τrz',
  ux: 'Radial displacement ur', uy: 'Hoop displacement uθ', uz: 'Axial displacement uz',
}

/** The label of a colour quantity in the axes its components are shown in. */
export function quantityLabel(q: QuantityName, axes: ComponentAxes): string {
  return (axes.kind === 'cylindrical' ? CYLINDRICAL_LABEL[q] : undefined) ?? QUANTITY_LABEL[q]
}

/** Short symbols of the six stress components ([xx, yy, zz, xy, yz, xz] order) in the axes. */
export function componentSymbols(axes: ComponentAxes): readonly string[] {
  return axes.kind === 'cylindrical' ? ['σrr', 'σθθ', 'σzz', 'τrθ', 'τθz', 'τrz'] : ['σxx', 'σyy', 'σzz', 'τxy', 'τyz', 'τxz']
}

/** Short symbols of the displacement components in the axes. */
export function displacementSymbols(axes: ComponentAxes): readonly string[] {
  return axes.kind === 'cylindrical' ? ['ur', 'uθ', 'uz'] : ['ux', 'uy', 'uz']
}

/** Physical kind of a colour quantity: a stress, a length (displacement), or dimensionless. */
export function quantityKind(q: QuantityName): Quantity | null {
  if (q === 'balanceIndicator' || q === 'stressJump') return null
  return q === 'displacement' || q === 'ux' || q === 'uy' || q === 'uz' ? 'length' : 'stress'
}

/** Display factor and label for a colour quantity. */
export function quantityDisplay(q: QuantityName, units: ModelUnits | undefined, system: UnitSystem): { factor: number; unit: string } {
  const kind = quantityKind(q)
  if (!kind || !units) return { factor: 1, unit: kind ? unitLabel(kind, system) : '–' }
  return { factor: displayFactor(units, kind, system), unit: unitLabel(kind, system) }
}
