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

/**
 * Display units: what a number is shown in. A length, a force and a stress unit; the others
 * follow (area L², volume L³, second moment L⁴, moment F·L, force per volume F/L³). `SI` and `US`
 * name the usual sets; a record sets each unit itself (the model's own units, or the user's
 * choice).
 */
export type ForceUnit = 'N' | 'kN' | 'MN' | 'lbf' | 'kip'

/** NIST SP 811 B.8: 1 lbf = 4.448 222 N; 1 kip = 1000 lbf. */
export const FORCE_TO_N: Readonly<Record<ForceUnit, number>> = { N: 1, kN: 1e3, MN: 1e6, lbf: LBF_TO_N, kip: LBF_TO_N * 1e3 }

export const LENGTH_UNITS = Object.keys(LENGTH_TO_M) as LengthUnit[]
export const STRESS_UNITS = Object.keys(STRESS_TO_PA) as StressUnit[]
export const FORCE_UNITS = Object.keys(FORCE_TO_N) as ForceUnit[]

export interface DisplayUnits {
  readonly length: LengthUnit
  readonly force: ForceUnit
  readonly stress: StressUnit
}

/** Display systems: SI shows m, kN, kN·m, MPa; US customary shows in, kip, kip·in, ksi; a record shows its own units. */
export type UnitSystem = 'SI' | 'US' | DisplayUnits

export type Quantity = 'length' | 'area' | 'stress' | 'force' | 'moment' | 'forcePerVolume' | 'secondMoment' | 'volume'

export const SI_UNITS: DisplayUnits = { length: 'm', force: 'kN', stress: 'MPa' }
export const US_UNITS: DisplayUnits = { length: 'in', force: 'kip', stress: 'ksi' }

export function isForceUnit(s: string): s is ForceUnit {
  return Object.prototype.hasOwnProperty.call(FORCE_TO_N, s)
}

/** The units of a system as a record. */
export function displayUnitsOf(system: UnitSystem): DisplayUnits {
  return system === 'SI' ? SI_UNITS : system === 'US' ? US_UNITS : system
}

/** Force unit named by stress × length² for the usual pairs (MPa·mm² = N, ksi·in² = kip). */
const FORCE_OF_PAIR: Readonly<Record<string, ForceUnit>> = {
  'Pa·m': 'N', 'kPa·m': 'kN', 'MPa·m': 'MN', 'MPa·mm': 'N', 'GPa·mm': 'kN',
  'psi·in': 'lbf', 'ksi·in': 'kip', 'psf·ft': 'lbf',
}

/**
 * The model's own units as display units: its length and stress, and the force unit their
 * product names (MPa·mm² = N, kPa·m² = kN, ksi·in² = kip); for a pair without a name, N for SI
 * lengths and lbf for inches and feet.
 */
export function modelDisplayUnits(units: ModelUnits): DisplayUnits {
  const force = FORCE_OF_PAIR[`${units.stress}·${units.length}`] ?? (units.length === 'in' || units.length === 'ft' ? 'lbf' : 'N')
  return { length: units.length, force, stress: units.stress }
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

/** SI value of one display unit of `q` (m, m², N, N·m, Pa ...). */
function displayToSI(q: Quantity, d: DisplayUnits): number {
  const L = LENGTH_TO_M[d.length], F = FORCE_TO_N[d.force]
  switch (q) {
    case 'length': return L
    case 'area': return L * L
    case 'volume': return L * L * L
    case 'secondMoment': return L ** 4
    case 'stress': return STRESS_TO_PA[d.stress]
    case 'force': return F
    case 'moment': return F * L
    case 'forcePerVolume': return F / (L * L * L)
  }
}

/** Converts a value of quantity `q` from model units to the display system; returns value and label. */
export function toDisplay(value: number, units: ModelUnits, q: Quantity, system: UnitSystem): { value: number; unit: string } {
  return { value: value * displayFactor(units, q, system), unit: displayUnitLabel(q, system) }
}

export function displayUnitLabel(q: Quantity, system: UnitSystem): string {
  const d = displayUnitsOf(system)
  switch (q) {
    case 'length': return d.length
    case 'area': return `${d.length}²`
    case 'volume': return `${d.length}³`
    case 'secondMoment': return `${d.length}⁴`
    case 'stress': return d.stress
    case 'force': return d.force
    case 'moment': return `${d.force}·${d.length}`
    case 'forcePerVolume': return `${d.force}/${d.length}³`
  }
}

/** Factor from model units of `q` to the display unit of `system` (multiply). */
export function displayFactor(units: ModelUnits, q: Quantity, system: UnitSystem): number {
  return modelToSI(units, q) / displayToSI(q, displayUnitsOf(system))
}
