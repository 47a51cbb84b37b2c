/**
 * Helpers for the command-line tests: run the CLI in-process with captured output, and write
 * small generated models into a fresh temporary folder.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import { join } from 'node:path'
import { run } from '../../src/cli/run.ts'
import { writeCsvBundle } from '../../src/io/index.ts'
import type { Model } from '../../src/model/model.ts'

export interface CliOutput {
  code: number
  stdout: string
  stderr: string
}

export async function cli(...argv: string[]): Promise<CliOutput> {
  let stdout = '', stderr = ''
  const code = await run(argv, { stdout: (t) => { stdout += t }, stderr: (t) => { stderr += t } })
  return { code, stdout, stderr }
}

/** Parsed JSON answer; tests read documented fields by name. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type Json = any

/** Runs with --json and parses stdout; fails the test with stderr when the command fails. */
export async function cliJson(...argv: string[]): Promise<Json> {
  const out = await cli(...argv, '--json')
  if (out.code !== 0) throw new Error(`exit ${out.code}: ${out.stderr}`)
  return JSON.parse(out.stdout)
}

export function tempDir(prefix = 'tractus-cli-'): string {
  return mkdtempSync(join(os.tmpdir(), prefix))
}

/** Writes the model as a CSV bundle into `dir` (created when missing) and returns `dir`. */
export function writeBundle(dir: string, model: Model): string {
  mkdirSync(dir, { recursive: true })
  for (const f of writeCsvBundle(model)) writeFileSync(join(dir, f.name), f.text)
  return dir
}
