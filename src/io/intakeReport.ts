/**
 * What a reader found out about the files it read, for the model card, the top bar and
 * `tractus info`: per CSV file its role and dialect (detected or declared), the columns it left
 * out, and where the units came from. A model whose units nobody declared loads, with a warning
 * (also in `model.warnings`) and `unitsDeclared: false`, never silently in metres and pascals.
 */
import type { Model } from '../model/model.ts'
import type { LengthUnit, StressUnit } from '../model/units.ts'
import type { CsvDialect, DecimalMark, DialectKey, Separator } from './csvDialect.ts'
import { describeDialect } from './csvDialect.ts'

/**
 * Where a unit came from; 'default' = nothing declared it and m or Pa was assumed; 'chosen' =
 * nothing in the files declared it and the user chose it when opening them (the browser's intake).
 */
export type UnitSource = 'model.json' | 'header' | 'container' | 'default' | 'chosen'

export interface FileIntake {
  /** The file's name as given. */
  readonly file: string
  /** nodes, elements, stress, displacement (or stress.NAME / displacement.NAME). */
  readonly role: string
  readonly separator: Separator
  readonly decimal: DecimalMark
  /** Lines skipped before the header or the first row. */
  readonly skipLines: number
  /** 1-based line of the header, 0 when the file has none. */
  readonly headerLine: number
  /** The settings model.json declared; the others were detected. */
  readonly declared: readonly DialectKey[]
  /** Columns of the file that no field uses, as written in its header ("column 5" without one). */
  readonly ignoredColumns: readonly string[]
  /** One line for people, e.g. "semicolon-separated, decimal comma, header on line 1". */
  readonly description: string
}

export interface IntakeReport {
  readonly format: 'csv' | 'native'
  /** One entry per CSV file read, in the order nodes, elements, stress, displacement; empty for a container. */
  readonly files: readonly FileIntake[]
  readonly unitSources: { readonly length: UnitSource; readonly stress: UnitSource }
  /** True when both the length and the stress unit were declared. */
  readonly unitsDeclared: boolean
  /** The warning about undeclared units (also in model.warnings), or null. */
  readonly unitsWarning: string | null
}

/** A model as a reader returns it: the model and what the reader found out about its files. */
export interface ReadModel extends Model {
  readonly intake: IntakeReport
}

export function fileIntake(file: string, role: string, d: CsvDialect, ignoredColumns: readonly string[]): FileIntake {
  return {
    file, role, separator: d.separator, decimal: d.decimal, skipLines: d.skipLines, headerLine: d.headerLine,
    declared: d.declared, ignoredColumns, description: describeDialect(d),
  }
}

/**
 * The warning for units nobody declared, or null when both were declared. `where` says how to
 * declare them for this kind of input.
 */
export function unitsWarning(units: { readonly length: LengthUnit; readonly stress: StressUnit }, sources: IntakeReport['unitSources'], where: 'csv' | 'native'): string | null {
  const undeclared = (s: UnitSource) => s === 'default' || s === 'chosen'
  const noLength = undeclared(sources.length), noStress = undeclared(sources.stress)
  if (!noLength && !noStress) return null
  const which = noLength && noStress
    ? `no units declared: lengths are read as ${units.length} and stresses as ${units.stress}`
    : noLength ? `no length unit declared: lengths are read as ${units.length}` : `no stress unit declared: stresses are read as ${units.stress}`
  const how = where === 'csv'
    ? 'declare them in model.json, e.g. "units": {"length": "mm", "stress": "MPa"}, or in the headers, e.g. "x [mm]", "sxx (MPa)"'
    : 'write the container again from a bundle whose model.json declares "units"'
  const chosen = (noLength && sources.length === 'chosen') || (noStress && sources.stress === 'chosen')
  return `${which} (${chosen ? 'as chosen when the files were opened, not stated in them' : 'the defaults, which may be wrong'}); ${how}`
}

/** True for a warning made by unitsWarning (of a bundle or of a container). */
export function isUnitsWarning(w: string): boolean {
  return /^no (units|length unit|stress unit) declared:/.test(w)
}
