/**
 * Argument parsing of our own for the command line: `--name value`, `--name=value`, boolean
 * flags and positionals. A value may start with '-' (negative numbers), so an option that takes a
 * value always consumes the next word.
 */
import type { Vec3 } from '../model/model.ts'

/** A mistake in how the command was called: exit code 1 and the usage line. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message)
    this.name = 'UsageError'
  }
}

export type OptionKind = 'flag' | 'string' | 'number' | 'integer' | 'vec3'

export interface OptionSpec {
  readonly name: string
  readonly kind: OptionKind
  /** Placeholder shown in help, e.g. "x,y,z". */
  readonly value?: string
  readonly help: string
  readonly required?: boolean
  /** Allowed values of a string option. */
  readonly choices?: readonly string[]
}

export type OptionValue = boolean | string | number | Vec3

export interface ParsedArgs {
  readonly positionals: string[]
  readonly options: Record<string, OptionValue | undefined>
}

export function parseArgs(argv: readonly string[], specs: readonly OptionSpec[], positionalNames: readonly string[]): ParsedArgs {
  const byName = new Map(specs.map((s) => [s.name, s]))
  const positionals: string[] = []
  const options: Record<string, OptionValue | undefined> = {}
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i]
    if (word === '--') { positionals.push(...argv.slice(i + 1)); break }
    if (!word.startsWith('--') || word === '-') {
      if (word.startsWith('-') && word.length > 1 && !/^-[\d.]/.test(word)) {
        throw new UsageError(`unknown option "${word}" (options are spelled --name)`)
      }
      positionals.push(word)
      continue
    }
    const eq = word.indexOf('=')
    const name = eq < 0 ? word.slice(2) : word.slice(2, eq)
    const spec = byName.get(name)
    if (!spec) throw new UsageError(`unknown option "--${name}"`)
    if (spec.kind === 'flag') {
      if (eq >= 0) throw new UsageError(`option --${name} takes no value`)
      options[name] = true
      continue
    }
    let raw: string
    if (eq >= 0) raw = word.slice(eq + 1)
    else {
      if (i + 1 >= argv.length) throw new UsageError(`option --${name} needs a value${spec.value ? ` (${spec.value})` : ''}`)
      raw = argv[++i]
    }
    options[name] = convert(spec, raw)
  }
  if (positionals.length > positionalNames.length) {
    throw new UsageError(`unexpected argument "${positionals[positionalNames.length]}"`)
  }
  return { positionals, options }
}

/** Throws a UsageError when a required option or positional is missing (checked after --help). */
export function checkRequired(args: ParsedArgs, specs: readonly OptionSpec[], positionalNames: readonly string[]): void {
  if (args.positionals.length < positionalNames.length) {
    throw new UsageError(`missing ${positionalNames[args.positionals.length]}`)
  }
  for (const s of specs) {
    if (s.required && args.options[s.name] === undefined) throw new UsageError(`missing option --${s.name}${s.value ? ` ${s.value}` : ''}`)
  }
}

function convert(spec: OptionSpec, raw: string): OptionValue {
  const name = `--${spec.name}`
  switch (spec.kind) {
    case 'string': {
      if (spec.choices && !spec.choices.includes(raw.toLowerCase())) {
        throw new UsageError(`${name} must be one of ${spec.choices.join(', ')} (got "${raw}")`)
      }
      return spec.choices ? raw.toLowerCase() : raw
    }
    case 'number': return parseNumber(raw, name)
    case 'integer': {
      const v = parseNumber(raw, name)
      if (!Number.isInteger(v)) throw new UsageError(`${name} must be a whole number (got "${raw}")`)
      return v
    }
    case 'vec3': {
      const parts = raw.split(',')
      if (parts.length !== 3) throw new UsageError(`${name} needs three numbers separated by commas, like 0,0,1 (got "${raw}")`)
      return [parseNumber(parts[0], name), parseNumber(parts[1], name), parseNumber(parts[2], name)]
    }
    default: return true
  }
}

function parseNumber(raw: string, name: string): number {
  const s = raw.trim()
  const v = s === '' ? NaN : Number(s)
  if (!Number.isFinite(v)) throw new UsageError(`${name}: "${raw}" is not a finite number`)
  return v
}
