/**
 * Units. A model declares the length and stress units its numbers are in; derived units follow:
 * force = stress · length², moment = force · length, body force per volume = stress / length.
 * Factors convert a value in the unit to SI (m, Pa, N, N·m). Sources: NIST SP 811 (2008),
 * Appendix B: 1 in = 0.0254 m exactly, 1 ft = 0.3048 m exactly, 1 lbf = 4.448 222 N,
 * 1 psi = 6 894.757 Pa.
 */

export type LengthUnit = 'm' | 'mm' | 'cm' | 'km' | 'in' | 'ft'
export type StressUnit = 'Pa' | 'kPa' | 'MPa' | 'GPa' | 'psi' | 'ksi' | 'psf'

export interface ModelUnits {
  readonly length: LengthUnit
  readonly stress: StressUnit
}

export const DEFAULT_UNITS: ModelUnits = { length: 'm', stress: 'Pa' }

export const LENGTH_TO_M: Readonly<Record<LengthUnit, number>> = {
  m: 1, mm: 1e-3, cm: 1e-2, km: 1e3, in: 0.0254, ft: 0.3048,
}

/** NIST SP 811 B.8: 1 lbf/in² = 6.894 757 E+03 Pa; 1 kip/in² = 6.894 757 E+06 Pa; 1 lbf/ft² = 4.788 026 E+01 Pa. */
export const STRESS_TO_PA: Readonly<Record<StressUnit, number>> = {
  Pa: 1, kPa: 1e3, MPa: 1e6, GPa: 1e9, psi: 6894.757, ksi: 6894.757e3, psf: 47.88026,
}

/** NIST SP 811 B.8: 1 lbf = 4.448 222 N. */
export const LBF_TO_N = 4.448222

export function isLengthUnit(s: string): s is LengthUnit {
  return Object.prototype.hasOwnProperty.call(LENGTH_TO_M, s)
}
export function isStressUnit(s: string): s is StressUnit {
  return Object.prototype.hasOwnProperty.call(STRESS_TO_PA, s)
}

/** Display systems: SI shows m, kN, kN·m, MPa; US customary shows in, kip, kip·in, ksi. */
export type UnitSystem = 'SI' | 'US'

export type Quantity = 'length' | 'area' | 'stress' | 'force' | 'moment' | 'forcePerVolume' | 'secondMoment' | 'volume'

interface DisplayUnit { readonly label: string; readonly toSI: number }

const DISPLAY: Readonly<Record<UnitSystem, Readonly<Record<Quantity, DisplayUnit>>>> = {
  SI: {
    length: { label: 'm', toSI: 1 },
    area: { label: 'm²', toSI: 1 },
    volume: { label: 'm³', toSI: 1 },
    secondMoment: { label: 'm⁴', toSI: 1 },
    stress: { label: 'MPa', toSI: 1e6 },
    force: { label: 'kN', toSI: 1e3 },
    moment: { label: 'kN·m', toSI: 1e3 },
    forcePerVolume: { label: 'kN/m³', toSI: 1e3 },
  },
  US: {
    length: { label: 'in', toSI: 0.0254 },
    area: { label: 'in²', toSI: 0.0254 ** 2 },
    volume: { label: 'in³', toSI: 0.0254 ** 3 },
    secondMoment: { label: 'in⁴', toSI: 0.0254 ** 4 },
    stress: { label: 'ksi', toSI: 6894.757e3 },
    force: { label: 'kip', toSI: LBF_TO_N * 1e3 },
    moment: { label: 'kip·in', toSI: LBF_TO_N * 1e3 * 0.0254 },
    forcePerVolume: { label: 'kip/in³', toSI: (LBF_TO_N * 1e3) / 0.0254 ** 3 },
  },
}

/** Factor that turns a value of `q` in model units into SI. */
export function modelToSI(units: ModelUnits, q: Quantity): number {
  const L = LENGTH_TO_M[units.length]
  const S = STRESS_TO_PA[units.stress]
  switch (q) {
    case 'length': return L
    case 'area': return L * L
    case 'volume': return L * L * L
    case 'secondMoment': return L ** 4
    case 'stress': return S
    case 'force': return S * L * L
    case 'moment': return S * L * L * L
    case 'forcePerVolume': return S / L
  }
}

/** Converts a value of quantity `q` from model units to the display system; returns value and label. */
export function toDisplay(value: number, units: ModelUnits, q: Quantity, system: UnitSystem): { value: number; unit: string } {
  const d = DISPLAY[system][q]
  return { value: (value * modelToSI(units, q)) / d.toSI, unit: d.label }
}

export function displayUnitLabel(q: Quantity, system: UnitSystem): string {
  return DISPLAY[system][q].label
}

/** Factor from model units of `q` to the display unit of `system` (multiply). */
export function displayFactor(units: ModelUnits, q: Quantity, system: UnitSystem): number {
  return modelToSI(units, q) / DISPLAY[system][q].toSI
}
