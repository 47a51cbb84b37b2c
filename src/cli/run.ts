/**
 * The command line in-process: `run(argv, io)` picks the command, parses its arguments and turns
 * every failure into a message and an exit code, so tests call it directly and main.ts only wires
 * it to the process.
 *
 * Exit codes: 0 success, 1 usage error (with the usage line), 2 input error (message names the
 * file, line and column or element), 3 unexpected failure.
 */
import type { CliIO, Command } from './command.ts'
import { UsageError, checkRequired, parseArgs } from './args.ts'
import { isInputError } from '../model/errors.ts'
import { infoCommand } from './info.ts'
import { auditCommand } from './audit.ts'
import { partsCommand } from './parts.ts'
import { cutCommand } from './cut.ts'
import { sweepCommand } from './sweep.ts'
import { convertCommand } from './convert.ts'
import { lineCommand } from './line.ts'

export type { CliIO } from './command.ts'

export const COMMANDS: readonly Command[] = [infoCommand, auditCommand, cutCommand, sweepCommand, lineCommand, convertCommand, partsCommand]

export const EXIT = { ok: 0, usage: 1, input: 2, internal: 3 } as const

function overview(): string {
  const w = Math.max(...COMMANDS.map((c) => c.name.length))
  return [
    'Usage: tractus <command> [arguments] [options]',
    '',
    'Tractions, section resultants and equilibrium checks for a finite-element stress result.',
    '',
    'Commands:',
    ...COMMANDS.map((c) => `  ${c.name.padEnd(w)}  ${c.summary}`),
    '',
    '<model> is a CSV bundle folder, a native .tractus file, or a folder that holds one .tractus file and no CSV.',
    'Run "tractus <command> --help" for the options of a command.',
    '',
  ].join('\n')
}

export function helpText(c: Command): string {
  const label = (o: Command['options'][number]) => `--${o.name}${o.value ? ' ' + o.value : ''}`
  const w = Math.max(...c.options.map((o) => label(o).length))
  return [
    `Usage: ${c.usage}`,
    '',
    `${c.summary[0].toUpperCase()}${c.summary.slice(1)}.`,
    '',
    'Options:',
    ...c.options.map((o) => `  ${label(o).padEnd(w)}  ${o.help}${o.required ? ' (required)' : ''}`),
    '',
    c.details,
    '',
  ].join('\n')
}

export async function run(argv: readonly string[], io: CliIO): Promise<number> {
  const [name, ...rest] = argv
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    const topic = name === 'help' ? COMMANDS.find((c) => c.name === rest[0]) : undefined
    if (topic) { io.stdout(helpText(topic)); return EXIT.ok }
    if (name === undefined) { io.stderr(overview()); return EXIT.usage }
    io.stdout(overview())
    return EXIT.ok
  }
  const command = COMMANDS.find((c) => c.name === name)
  if (!command) {
    io.stderr(`tractus: unknown command "${name}"\n\n${overview()}`)
    return EXIT.usage
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    io.stdout(helpText(command))
    return EXIT.ok
  }
  try {
    const args = parseArgs(rest, command.options, command.positionals)
    checkRequired(args, command.options, command.positionals)
    return await command.run(args, io)
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr(`tractus ${command.name}: ${e.message}\nUsage: ${command.usage}\nRun "tractus ${command.name} --help" for details.\n`)
      return EXIT.usage
    }
    if (isInputError(e)) {
      io.stderr(`tractus ${command.name}: ${e.message}\n`)
      return EXIT.input
    }
    const err = e instanceof Error ? e : new Error(String(e))
    io.stderr(`tractus ${command.name}: unexpected failure: ${err.message}\n`)
    if (process.env.TRACTUS_DEBUG) io.stderr(`${err.stack ?? ''}\n`)
    return EXIT.internal
  }
}
