/**
 * How numbers are shown: in the model's own units (default) or converted to SI or US customary
 * display units (src/model/units.ts holds the factors). Every quantity gets a factor from model
 * units and a label, so tables and JSON convert the same way.
 */
import type { ModelUnits, Quantity, UnitSystem } from '../model/units.ts'
import { displayFactor, displayUnitLabel } from '../model/units.ts'

export type UnitChoice = 'model' | 'si' | 'us'

export interface UnitView {
  readonly choice: UnitChoice
  /** Multiply a model-unit value of `q` by this to get the shown value. */
  factor(q: Quantity): number
  label(q: Quantity): string
}

/** Force unit named by stress × length² for the usual pairs; otherwise spelled as the product. */
const FORCE_NAMES: Readonly<Record<string, string>> = {
  'Pa·m': 'N', 'kPa·m': 'kN', 'MPa·m': 'MN', 'GPa·m': 'GN',
  'MPa·mm': 'N', 'GPa·mm': 'kN', 'kPa·mm': 'mN',
  'psi·in': 'lbf', 'ksi·in': 'kip', 'psf·ft': 'lbf',
}

export function modelUnitLabel(units: ModelUnits, q: Quantity): string {
  const L = units.length
  const force = FORCE_NAMES[`${units.stress}·${L}`] ?? `${units.stress}·${L}²`
  switch (q) {
    case 'length': return L
    case 'area': return `${L}²`
    case 'volume': return `${L}³`
    case 'secondMoment': return `${L}⁴`
    case 'stress': return units.stress
    case 'force': return force
    case 'moment': return `${force}·${L}`
    case 'forcePerVolume': return `${force}/${L}³`
  }
}

export function createUnitView(units: ModelUnits, choice: UnitChoice): UnitView {
  if (choice === 'model') {
    return { choice, factor: () => 1, label: (q) => modelUnitLabel(units, q) }
  }
  const system: UnitSystem = choice === 'si' ? 'SI' : 'US'
  return {
    choice,
    factor: (q) => displayFactor(units, q, system),
    label: (q) => displayUnitLabel(q, system),
  }
}

/** The unit labels written into every JSON answer so a reader knows what the numbers are in. */
export function unitLabels(view: UnitView): Record<string, string> {
  return {
    length: view.label('length'), area: view.label('area'), volume: view.label('volume'),
    stress: view.label('stress'), force: view.label('force'), moment: view.label('moment'),
    forcePerVolume: view.label('forcePerVolume'), secondMoment: view.label('secondMoment'),
  }
}
