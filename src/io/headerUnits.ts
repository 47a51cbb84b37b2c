/**
 * Units written in CSV headers, as solvers and spreadsheets write them: `x [mm]`, `sxx (MPa)`.
 * A trailing bracketed unit is split from the column name when it is one of the units this tool
 * knows (src/model/units.ts), matched case-insensitively (no two of them differ only in case), or
 * one of the few spellings of the same units below. Anything else in brackets stays part of the
 * name (`S11 (avg)` is a name), so an unknown unit is never silently taken for a known one.
 */
import { LENGTH_TO_M, STRESS_TO_PA } from '../model/units.ts'
import type { LengthUnit, StressUnit } from '../model/units.ts'

export type HeaderUnit = { readonly kind: 'length'; readonly unit: LengthUnit } | { readonly kind: 'stress'; readonly unit: StressUnit }

/** Other spellings of known units (lower-case): SI writes the pascal also as N/m². */
const ALIASES: Readonly<Record<string, HeaderUnit>> = {
  'n/mm2': { kind: 'stress', unit: 'MPa' }, 'n/mm^2': { kind: 'stress', unit: 'MPa' }, 'n/mm²': { kind: 'stress', unit: 'MPa' },
  'n/m2': { kind: 'stress', unit: 'Pa' }, 'n/m^2': { kind: 'stress', unit: 'Pa' }, 'n/m²': { kind: 'stress', unit: 'Pa' },
  'inch': { kind: 'length', unit: 'in' },
}

const BY_LOWER: ReadonlyMap<string, HeaderUnit> = (() => {
  const m = new Map<string, HeaderUnit>()
  for (const u of Object.keys(LENGTH_TO_M) as LengthUnit[]) m.set(u.toLowerCase(), { kind: 'length', unit: u })
  for (const u of Object.keys(STRESS_TO_PA) as StressUnit[]) m.set(u.toLowerCase(), { kind: 'stress', unit: u })
  for (const [k, v] of Object.entries(ALIASES)) m.set(k, v)
  return m
})()

/** The unit a text names, or null. */
export function unitOfText(s: string): HeaderUnit | null {
  return BY_LOWER.get(s.trim().toLowerCase()) ?? null
}

const SUFFIX = /^(.*?)\s*(?:\[\s*([^\]]*?)\s*\]|\(\s*([^)]*?)\s*\))\s*$/

/** Splits `x [mm]` into the bare name `x` and its unit; a name without a known unit comes back whole. */
export function splitHeaderUnit(name: string): { readonly bare: string; readonly unit: HeaderUnit | null } {
  const m = SUFFIX.exec(name)
  if (m && m[1] !== '') {
    const unit = unitOfText(m[2] ?? m[3] ?? '')
    if (unit) return { bare: m[1], unit }
  }
  return { bare: name, unit: null }
}

/** The known unit names of a kind, for messages. */
export function knownUnits(kind: 'length' | 'stress'): string {
  return Object.keys(kind === 'length' ? LENGTH_TO_M : STRESS_TO_PA).join(', ')
}
