/**
 * What every command of the command line provides, and the options they share.
 */
import type { OptionSpec, ParsedArgs } from './args.ts'
import type { Model, Vec3 } from '../model/model.ts'
import type { UnitChoice } from './unitView.ts'

/** Where a command writes: plain text sinks, so tests can capture them. */
export interface CliIO {
  stdout(text: string): void
  stderr(text: string): void
}

export interface Command {
  readonly name: string
  /** One line for the overview. */
  readonly summary: string
  /** The usage line, e.g. "tractus info <model> [options]". */
  readonly usage: string
  readonly positionals: readonly string[]
  readonly options: readonly OptionSpec[]
  /** Paragraphs after the option list in --help. */
  readonly details: string
  /** Returns the exit code. */
  run(args: ParsedArgs, io: CliIO): number | Promise<number>
}

export const JSON_OPTION: OptionSpec = { name: 'json', kind: 'flag', help: 'print one JSON object instead of the table (model units unless --units is given)' }
export const UNITS_OPTION: OptionSpec = { name: 'units', kind: 'string', value: 'si|us', choices: ['si', 'us'], help: 'show values in SI (m, kN, kN·m, MPa) or US customary (in, kip, kip·in, ksi) units; model units by default' }
export const BODY_FORCE_OPTION: OptionSpec = { name: 'body-force', kind: 'vec3', value: 'bx,by,bz', help: 'body force per unit volume ρb in model units (stress/length); overrides model.json' }
export const HELP_OPTION: OptionSpec = { name: 'help', kind: 'flag', help: 'show this help' }

export function unitChoice(args: ParsedArgs): UnitChoice {
  const u = args.options.units
  return u === 'si' || u === 'us' ? u : 'model'
}

export function bodyForceOf(args: ParsedArgs, model: Model): Vec3 {
  const b = args.options['body-force']
  return Array.isArray(b) ? [b[0], b[1], b[2]] : [model.bodyForce[0], model.bodyForce[1], model.bodyForce[2]]
}

export function vecOption(args: ParsedArgs, name: string): Vec3 | undefined {
  const v = args.options[name]
  return Array.isArray(v) ? [v[0], v[1], v[2]] : undefined
}

/** JSON with a trailing newline; non-finite numbers become null so the output always parses. */
export function printJson(io: CliIO, value: unknown): void {
  const text = JSON.stringify(value, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2)
  // Short arrays of numbers (vectors, percentiles) on one line, so the output reads like the table.
  io.stdout(text.replace(/\[\s+(-?[\d.eE+-]+|null)((?:,\s+(?:-?[\d.eE+-]+|null)){0,5})\s+\]/g, (_m, a: string, rest: string) => `[${a}${rest.replace(/,\s+/g, ', ')}]`) + '\n')
}
