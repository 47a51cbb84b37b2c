/**
 * Bundles written the ways solvers, scripts and spreadsheets write them load to the model of the
 * plain bundle, bit for bit (every number keeps its digits, so ECMAScript's correctly rounded
 * conversion gives the same double: ECMA-262 StringToNumber). The fixtures on disk
 * (test/fixtures/variants, made by test/fixtures/makeVariants.ts) must match their generator
 * (test/io/bundleVariants.ts), and the reader states each file's dialect.
 */
import { readFileSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { readModelFiles } from '../../src/io/detect.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { VARIANTS, bundleOf, variantModel } from './bundleVariants.ts'
import { expectSameModel } from './sameModel.ts'
import { toFiles } from './tinyBundle.ts'

const root = join(import.meta.dirname, '..', 'fixtures', 'variants')
const model = variantModel()
const plain = bundleOf(model)

function fromDisk(name: string) {
  const dir = join(root, name)
  return readdirSync(dir).sort().map((f) => ({ name: f, data: new Uint8Array(readFileSync(join(dir, f))) }))
}

describe('accepted variants of the CSV bundle', () => {
  it('the fixtures on disk are the generator\'s output', () => {
    expect(readdirSync(root).sort()).toEqual(['plain', ...VARIANTS.map((v) => v.name)].sort())
    for (const v of [{ name: 'plain', files: plain }, ...VARIANTS.map((x) => ({ name: x.name, files: x.make(plain) }))]) {
      const disk = Object.fromEntries(fromDisk(v.name).map((f) => [f.name, new TextDecoder().decode(f.data)]))
      expect(disk, v.name).toEqual(v.files)
    }
  })

  it('the plain bundle reads back to its model', () => {
    expectSameModel(model, readModelFiles(fromDisk('plain')))
  })

  it.each(VARIANTS.map((v) => [v.name, v] as const))('%s loads to the same model', (name) => {
    const r = readModelFiles(fromDisk(name))
    expectSameModel(model, r)
    validateModel(r)
  })

  it('each file\'s dialect is stated: separator, decimal mark, preamble, header line', () => {
    const intake = (name: string) => readModelFiles(fromDisk(name)).intake.files
    // The element file and this stress file hold whole numbers only: no decimal mark is stated.
    expect(intake('plain').map((f) => f.description)).toEqual(['comma-separated, decimal point, header on line 1', 'comma-separated, header on line 1', 'comma-separated, header on line 1', 'comma-separated, decimal point, header on line 1'])
    const semi = intake('semicolon-decimal-comma')
    expect(semi.map((f) => f.separator)).toEqual([';', ';', ';', ';'])
    expect(semi.find((f) => f.role === 'nodes')!.decimal).toBe(',')
    expect(intake('tab').every((f) => f.separator === '\t')).toBe(true)
    expect(intake('spaces').every((f) => f.separator === ' ')).toBe(true)
    const pre = intake('preamble')[0]
    // skipLines counts to the last preamble line; the blank line after it is skipped anyway.
    expect(pre).toMatchObject({ skipLines: 3, headerLine: 5, declared: [] })
    expect(pre.description).toBe('comma-separated, decimal point, 3 lines skipped, header on line 5')
    expect(intake('no-header').map((f) => f.headerLine)).toEqual([0, 0, 0, 0])
    expect(intake('mapped-names').map((f) => [f.file, f.role])).toEqual([['mesh_nodes.txt', 'nodes'], ['conn.txt', 'elements'], ['nodal_stress.txt', 'stress'], ['nodal_disp.txt', 'displacement']])
  })

  it('declared settings are taken as given and said to be declared', () => {
    const b = VARIANTS.find((v) => v.name === 'semicolon-decimal-comma')!.make(plain)
    const json = JSON.parse(b['model.json'])
    b['model.json'] = JSON.stringify({ ...json, csv: { separator: ';', decimal: ',', nodes: { skipLines: 0, header: true } } })
    const r = readCsvBundle(toFiles(b))
    expectSameModel(model, r)
    expect(r.intake.files[0].declared).toEqual(['separator', 'decimal', 'skipLines', 'header'])
    expect(r.intake.files[1].declared).toEqual(['separator', 'decimal'])
    expect(r.intake.files[0].description).toBe('semicolon-separated, decimal comma, header on line 1, separator, decimal, skipLines, header from model.json')
  })

  it('columns left out are listed in one warning', () => {
    const r = readModelFiles(fromDisk('extra-columns'))
    const left = r.warnings.filter((w) => w.startsWith('columns left out'))
    expect(left).toEqual(['columns left out (not used by this tool): nodes.csv: "csys"; elements.csv: "comment"; stress.csv: "seqv"'])
    // A quoted name may hold the separator and doubled quotes.
    const quoted = readModelFiles(fromDisk('quoted'))
    expect(quoted.warnings).toContain('columns left out (not used by this tool): stress.csv: "von Mises, nodal "avg""')
  })

  it('units from the headers are the model\'s units, declared', () => {
    const r = readModelFiles(fromDisk('units-in-headers'))
    expect(r.units).toEqual({ length: 'mm', stress: 'MPa' })
    expect(r.intake.unitSources).toEqual({ length: 'header', stress: 'header' })
    expect(r.intake.unitsDeclared).toBe(true)
    expect(r.intake.unitsWarning).toBeNull()
  })
})
