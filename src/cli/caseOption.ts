/**
 * `--case NAME`, which every command takes: the load case or combination the command works on
 * (default the first case; names match without regard to letter case; an unknown name is an
 * error that lists the known ones). `cut` and `sweep` also take `all`: every case and
 * combination at once, with their envelope.
 */
import type { OptionSpec, ParsedArgs } from './args.ts'
import type { ReadModel } from '../io/index.ts'
import { InputError } from '../model/errors.ts'
import { ALL_CASES, combinationsOf, describeNames, findCase, firstCaseName, modelForCase, sameCaseName } from '../model/loadCases.ts'

export const CASE_OPTION: OptionSpec = { name: 'case', kind: 'string', value: 'NAME', help: 'the load case or combination to work on (the first case by default; `tractus info` lists them)' }
export const CASE_ALL_OPTION: OptionSpec = { ...CASE_OPTION, help: 'the load case or combination to work on (the first case by default), or "all": every case and combination with their envelope' }
export const COMBINATIONS_ONLY_OPTION: OptionSpec = { name: 'combinations-only', kind: 'flag', help: 'with --case all: the envelope over the combinations only (every case is still listed)' }

/** True when --case all was given. */
export function allCases(args: ParsedArgs): boolean {
  const c = args.options.case
  return typeof c === 'string' && sameCaseName(c, ALL_CASES)
}

/**
 * The model of the case or combination that --case names (the model as read when none is
 * named) and the name shown. `all` is refused here: only cut and sweep take it.
 */
export function caseModel(model: ReadModel, args: ParsedArgs, command: string): { model: ReadModel; name: string } {
  const c = args.options.case
  if (args.options['combinations-only']) throw new InputError('bad-argument', '--combinations-only goes with --case all')
  if (typeof c !== 'string') return { model, name: firstCaseName(model) }
  if (sameCaseName(c, ALL_CASES)) throw new InputError('bad-argument', `--case all is for cut and sweep; ${command} works on one case: name one of the ${describeNames(model)}`)
  const ref = findCase(model, c)
  const name = ref.kind === 'case' ? ref.case.name : ref.combination.name
  return { model: { ...model, ...modelForCase(model, name) } as ReadModel, name }
}

/** --combinations-only needs --case all and a model with combinations. */
export function combinationsOnly(model: ReadModel, args: ParsedArgs): boolean {
  if (!args.options['combinations-only']) return false
  if (!allCases(args)) throw new InputError('bad-argument', '--combinations-only goes with --case all')
  if (combinationsOf(model).length === 0) throw new InputError('bad-argument', `--combinations-only: this model has no combinations (${describeNames(model)}); define them in model.json "combinations"`)
  return true
}
