import { describe, expect, it } from 'vitest'
import { displayFactor, displayUnitLabel, modelDisplayUnits } from '../../../src/model/units.ts'

// NIST SP 811 (2008), Appendix B: 1 in = 0.0254 m, 1 lbf = 4.448 222 N, 1 psi = 6 894.757 Pa.
describe('display units', () => {
  it('the model\'s own units name the force of their pair', () => {
    expect(modelDisplayUnits({ length: 'mm', stress: 'MPa' })).toEqual({ length: 'mm', force: 'N', stress: 'MPa' })
    expect(modelDisplayUnits({ length: 'in', stress: 'ksi' })).toEqual({ length: 'in', force: 'kip', stress: 'ksi' })
    expect(modelDisplayUnits({ length: 'cm', stress: 'kPa' })).toEqual({ length: 'cm', force: 'N', stress: 'kPa' })
  })

  it('a chosen set converts every quantity with the same factors as SI and US', () => {
    const mm = { length: 'mm', stress: 'MPa' } as const
    const own = { length: 'mm', force: 'N', stress: 'MPa' } as const
    // In its own units a mm/MPa model shows its numbers unchanged.
    for (const q of ['length', 'area', 'stress', 'force', 'moment', 'secondMoment', 'volume', 'forcePerVolume'] as const) expect(displayFactor(mm, q, own)).toBeCloseTo(1, 12)
    expect(displayUnitLabel('moment', own)).toBe('N·mm')
    expect(displayUnitLabel('secondMoment', own)).toBe('mm⁴')
    // SI keeps its labels and factors: 3600 mm² = 0.0036 m²; 1 N·mm = 1e-6 kN·m.
    expect(displayFactor(mm, 'area', 'SI')).toBeCloseTo(1e-6, 18)
    expect(displayFactor(mm, 'moment', 'SI')).toBeCloseTo(1e-6, 18)
    expect(displayUnitLabel('moment', 'US')).toBe('kip·in')
    // A mixed choice: kN and cm on a m/Pa model.
    expect(displayFactor({ length: 'm', stress: 'Pa' }, 'moment', { length: 'cm', force: 'kN', stress: 'kPa' })).toBeCloseTo(0.1, 12)
    expect(displayFactor({ length: 'm', stress: 'Pa' }, 'force', { length: 'in', force: 'lbf', stress: 'psi' })).toBeCloseTo(1 / 4.448222, 12)
  })
})
