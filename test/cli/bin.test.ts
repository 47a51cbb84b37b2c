/**
 * The real launcher: src/cli/tractus.mjs starts the TypeScript CLI through tsx from any working
 * directory and forwards output and exit codes.
 */
import { spawnSync } from 'node:child_process'
import { rmSync } from 'node:fs'
import os from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { tempDir, writeBundle } from './cliHarness.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'

const BIN = fileURLToPath(new URL('../../src/cli/tractus.mjs', import.meta.url))
let root = ''
let bundle = ''

beforeAll(() => {
  root = tempDir()
  bundle = writeBundle(join(root, 'block'), syntheticModel('tet4', 48, 5))
})
afterAll(() => { rmSync(root, { recursive: true, force: true }) })

const spawnBin = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: os.tmpdir(), encoding: 'utf8', timeout: 50_000 })

describe('src/cli/tractus.mjs', () => {
  it('runs a command from another working directory and prints JSON', () => {
    const r = spawnBin('info', bundle, '--json')
    expect(r.stderr).toBe('')
    expect(r.status).toBe(0)
    expect(JSON.parse(r.stdout).elements).toBe(48)
  })

  it('forwards the exit code and the message of an input error', () => {
    const r = spawnBin('audit', join(root, 'missing'))
    expect(r.status).toBe(2)
    expect(r.stderr).toContain(join(root, 'missing'))
    expect(r.stdout).toBe('')
  })
})
