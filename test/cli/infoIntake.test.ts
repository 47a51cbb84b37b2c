/**
 * `tractus info` on bundles written the ways solvers and spreadsheets write them
 * (test/fixtures/variants): the same model as the plain bundle, each file's dialect stated, files
 * named in model.json read whatever their extension, and a model whose units nobody declared
 * said to be so in the text and the JSON.
 */
import { copyFileSync, readdirSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { cli, cliJson, tempDir } from './cliHarness.ts'

const root = join(import.meta.dirname, '..', 'fixtures', 'variants')
const variants = readdirSync(root).filter((n) => n !== 'plain').sort()
const dirs: string[] = []
afterAll(() => { for (const d of dirs) rmSync(d, { recursive: true, force: true }) })

describe('tractus info on the accepted variants', () => {
  it.each(variants)('%s: the same counts, types, bounds and stress range as the plain bundle', async (v) => {
    const plain = await cliJson('info', join(root, 'plain'))
    const j = await cliJson('info', join(root, v))
    for (const k of ['nodes', 'elements', 'types', 'parts', 'bounds', 'stress', 'bodyForce', 'modelUnits']) expect(j[k], k).toEqual(plain[k])
    expect(j.unitsDeclared).toBe(true)
    expect(j.files.map((f: { role: string }) => f.role)).toEqual(['nodes', 'elements', 'stress', 'displacement'])
  })

  it('states each file\'s dialect in the text and the JSON', async () => {
    const dir = join(root, 'semicolon-decimal-comma')
    const j = await cliJson('info', dir)
    expect(j.files[0]).toMatchObject({ file: 'nodes.csv', role: 'nodes', separator: ';', decimal: ',', skipLines: 0, headerLine: 1, declared: [], ignoredColumns: [] })
    const out = await cli('info', dir)
    expect(out.stdout).toMatch(/Files read\n\s+nodes\s+nodes\.csv\s+semicolon-separated, decimal comma, header on line 1\n/)
    expect((await cli('info', join(root, 'mapped-names'))).stdout).toMatch(/stress\s+nodal_stress\.txt\s+comma-separated/)
    expect((await cli('info', join(root, 'extra-columns'))).stdout).toMatch(/stress\s+stress\.csv\s+comma-separated, .*; columns left out: seqv\n/)
  })

  it('a model without declared units: a warning, unitsDeclared false, the units marked as assumed', async () => {
    const dir = tempDir()
    dirs.push(dir)
    for (const f of ['nodes.csv', 'elements.csv', 'stress.csv']) copyFileSync(join(root, 'tab', f), join(dir, f))
    const j = await cliJson('info', dir)
    expect(j.unitsDeclared).toBe(false)
    expect(j.unitSources).toEqual({ length: 'default', stress: 'default' })
    expect(j.warnings.some((w: string) => w.startsWith('no units declared: lengths are read as m and stresses as Pa'))).toBe(true)
    const out = await cli('info', dir)
    expect(out.stdout).toContain('model units    length m (NOT DECLARED, assumed), stress Pa (NOT DECLARED, assumed)')
    expect(out.stdout).toContain('  - no units declared: lengths are read as m and stresses as Pa')
  })

  it('units from the headers are named as such', async () => {
    const j = await cliJson('info', join(root, 'units-in-headers'))
    expect(j.unitSources).toEqual({ length: 'header', stress: 'header' })
    expect((await cli('info', join(root, 'units-in-headers'))).stdout).toContain('length mm (the headers), stress MPa (the headers)')
  })
})
