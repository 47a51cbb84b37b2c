/**
 * Command-line failures: input errors name the file and line and exit with 2, usage errors print
 * the usage line and exit with 1, never a stack trace; every command answers --help.
 */
import { copyFileSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { cli, cliJson, tempDir, writeBundle } from './cliHarness.ts'
import { writeNative } from '../../src/io/index.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'
import { COMMANDS } from '../../src/cli/run.ts'

let root = ''
let bundle = ''

beforeAll(() => {
  root = tempDir()
  bundle = writeBundle(join(root, 'block'), syntheticModel('hex8', 27, 3))
})
afterAll(() => { rmSync(root, { recursive: true, force: true }) })

const noStack = (s: string) => expect(s).not.toMatch(/\n\s+at /)

describe('--help', () => {
  it.each(COMMANDS.map((c) => c.name))('tractus %s --help prints the usage and every option', async (name) => {
    const out = await cli(name, '--help')
    expect(out.code).toBe(0)
    expect(out.stdout.startsWith(`Usage: tractus ${name} `)).toBe(true)
    for (const o of COMMANDS.find((c) => c.name === name)!.options) expect(out.stdout).toContain(`--${o.name}`)
  })

  it('tractus --help lists the commands', async () => {
    const out = await cli('--help')
    expect(out.code).toBe(0)
    for (const c of COMMANDS) expect(out.stdout).toContain(`  ${c.name}`)
  })
})

describe('input errors', () => {
  it('names a missing model and exits with 2', async () => {
    const missing = join(root, 'nowhere')
    const out = await cli('info', missing)
    expect(out.code).toBe(2)
    expect(out.stderr).toContain(missing)
    expect(out.stdout).toBe('')
    noStack(out.stderr)
  })

  it('names the file and line of a bad number', async () => {
    const bad = join(root, 'bad')
    mkdirSync(bad)
    for (const f of ['elements.csv', 'stress.csv', 'model.json']) copyFileSync(join(bundle, f), join(bad, f))
    const lines = readFileSync(join(bundle, 'nodes.csv'), 'utf8').split('\n')
    lines[2] = lines[2].replace(/,[^,]*$/, ',zero point five') // line 3 of the file
    writeFileSync(join(bad, 'nodes.csv'), lines.join('\n'))
    for (const cmd of [['info'], ['audit'], ['cut', '--point', '0,0,0.5', '--normal', '0,0,1']]) {
      const out = await cli(cmd[0], bad, ...cmd.slice(1))
      expect(out.code).toBe(2)
      expect(out.stderr).toContain(join(bad, 'nodes.csv'))
      expect(out.stderr).toContain('line 3')
      noStack(out.stderr)
    }
  })

  it('names a missing bundle file', async () => {
    const partial = join(root, 'partial')
    mkdirSync(partial)
    copyFileSync(join(bundle, 'nodes.csv'), join(partial, 'nodes.csv'))
    const out = await cli('info', partial)
    expect(out.code).toBe(2)
    expect(out.stderr).toContain('elements.csv')
  })

  it('a folder with one container and no CSV file is that container; with two, says which to choose', async () => {
    const dir = tempDir()
    writeFileSync(join(dir, 'a.tractus'), writeNative(syntheticModel('tet4', 500, 1)))
    writeFileSync(join(dir, 'model.json'), '{"name": "a card beside the container"}')
    const one = await cliJson('info', dir)
    expect(one.elements).toBeGreaterThan(0)
    writeFileSync(join(dir, 'b.tractus'), writeNative(syntheticModel('tet4', 500, 2)))
    const two = await cli('info', dir)
    expect(two.code).toBe(2)
    expect(two.stderr).toMatch(/2 \.tractus files \(a\.tractus, b\.tractus\) and no CSV bundle: give the path of one of them/)
  })

  it('refuses a single CSV file with a hint to give its folder', async () => {
    const out = await cli('info', join(bundle, 'nodes.csv'))
    expect(out.code).toBe(2)
    expect(out.stderr).toContain('give the folder')
  })
})

describe('a zero or non-finite normal', () => {
  // One rule for every plane (src/mechanics/plane.ts): the same message as in the app and the kernels.
  it.each([
    ['cut', ['cut', 'x', '--point', '0,0,0', '--normal', '0,0,0'], /the section normal \(0, 0, 0\) has no direction/],
    ['sweep', ['sweep', 'x', '--normal', '0,0,0', '--from', '0', '--to', '1', '--count', '2'], /the sweep direction \(0, 0, 0\) has no direction/],
  ])('%s refuses it as an input error (exit 2) before reading the model', async (_label, argv, message) => {
    const out = await cli(...argv)
    expect(out.code).toBe(2)
    expect(out.stderr).toMatch(message)
    noStack(out.stderr)
  })
})

describe('usage errors', () => {
  const cases: [string, string[], RegExp][] = [
    ['a missing required option', ['cut', 'x', '--point', '0,0,0'], /missing option --normal/],
    ['a vector with two numbers', ['cut', 'x', '--point', '0,0', '--normal', '0,0,1'], /three numbers/],
    ['an unknown option', ['info', 'x', '--colour'], /unknown option "--colour"/],
    ['a bad unit system', ['info', 'x', '--units', 'cgs'], /si, us/],
    ['a missing model', ['audit'], /missing <model>/],
    ['a count that is not whole', ['sweep', 'x', '--normal', '0,0,1', '--from', '0', '--to', '1', '--count', '2.5'], /whole number/],
    ['convert without --out', ['convert', 'x'], /missing option --out/],
  ]
  it.each(cases)('%s exits with 1 and the usage line', async (_label, argv, message) => {
    const out = await cli(...argv)
    expect(out.code).toBe(1)
    expect(out.stderr).toMatch(message)
    expect(out.stderr).toContain(`Usage: tractus ${argv[0]} `)
    noStack(out.stderr)
  })

  it('an unknown command exits with 1 and the overview', async () => {
    const out = await cli('slice', 'x')
    expect(out.code).toBe(1)
    expect(out.stderr).toContain('unknown command "slice"')
  })

  it('negative numbers are values, not options', async () => {
    const out = await cli('cut', bundle, '--point', '-1,-1,0.5', '--normal', '0,0,-2', '--json')
    expect(out.code).toBe(0)
    expect(JSON.parse(out.stdout).axes.e3).toEqual([0, 0, -1])
  })
})
