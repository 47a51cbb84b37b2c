/**
 * The intake's preview and column mapping (src/io/bundlePreview.ts): files named and headed in
 * the user's own way are recognised from their first bytes, the suggested mapping completes by
 * name similarity, and the model.json it writes loads the same model as the bundle mapped by
 * hand (test/fixtures/variants/mapped-names), bit for bit. Units nobody states are asked, never
 * guessed, and loaded as chosen with the warning kept.
 */
import { readFileSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { PREVIEW_BYTES, mappingModelJson, mappingProblems, previewBundle, roleByName, suggestMapping } from '../../src/io/bundlePreview.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import type { WrittenCsvFile } from '../../src/io/writeCsvBundle.ts'
import { expectSameModel } from './sameModel.ts'
import { tinyBundle, toFiles } from './tinyBundle.ts'

const dir = join(import.meta.dirname, '..', 'fixtures', 'variants', 'mapped-names')
const fixture = (): WrittenCsvFile[] => readdirSync(dir).sort().map((name) => ({ name, text: readFileSync(join(dir, name), 'utf8') }))
/** The fixture with its model.json stripped of the mapping keys (what a user drops the first time). */
const unmapped = (): WrittenCsvFile[] => fixture().map((f) => {
  if (f.name !== 'model.json') return f
  const j = JSON.parse(f.text) as Record<string, unknown>
  delete j.files; delete j.columns
  return { name: f.name, text: JSON.stringify(j) }
})

describe('intake preview and mapping', () => {
  it('a bundle that reads as it is and declares its units needs no step', () => {
    const p = previewBundle(toFiles(tinyBundle()))
    expect(p.problem).toBeNull()
    expect(p.unitsDeclared).toEqual({ length: true, stress: true })
  })

  it('names and headers of the user\'s own: the suggested mapping is complete and loads the same model', () => {
    const p = previewBundle(unmapped())
    expect(p.problem).toMatch(/missing nodes\.csv, elements\.csv, stress\.csv/)
    const m = suggestMapping(p, { length: null, stress: null })
    expect(m.roles).toEqual({ 'conn.txt': 'elements', 'mesh_nodes.txt': 'nodes', 'nodal_disp.txt': 'displacement', 'nodal_stress.txt': 'stress' })
    expect(mappingProblems(p, m)).toEqual([])
    const json = mappingModelJson(p, m, false)
    expect(json.columns).toMatchObject({ elements: { id: 'Elem', type: 'Kind', part: 'Mat', nodes: 'N1' }, stress: { id: 'NodeID', sxx: 'S_XX' } })
    const files = [...unmapped().filter((f) => f.name !== 'model.json'), { name: 'model.json', text: JSON.stringify(json) }]
    expectSameModel(readCsvBundle(fixture()), readCsvBundle(files))
  })

  it('the preview reads only the first bytes: a file cut at PREVIEW_BYTES still previews', () => {
    const b = tinyBundle()
    const rows = Array.from({ length: 20000 }, (_, i) => `${i + 10},1,2,3`).join('\n')
    const big = { name: 'points.csv', text: 'id,x,y,z\n' + rows }
    const cut = big.text.slice(0, PREVIEW_BYTES)
    const p = previewBundle([{ name: big.name, text: cut.slice(0, cut.lastIndexOf('\n') + 1) }, { name: 'elements.csv', text: b['elements.csv'] }, { name: 'stress.csv', text: b['stress.csv'] }])
    expect(p.problem).toMatch(/missing nodes\.csv/)
    expect(p.files[0].rows).toHaveLength(5)
    expect(roleByName('points.csv')).toBe('nodes')
  })

  it('units nobody states are asked; loaded as chosen, the model still says they were not declared', () => {
    const files = toFiles(tinyBundle()).filter((f) => f.name !== 'model.json')
    const p = previewBundle(files)
    expect(p.problem).toBeNull()
    expect(p.unitsDeclared).toEqual({ length: false, stress: false })
    const m = suggestMapping(p, { length: null, stress: null })
    expect(mappingProblems(p, m)).toEqual(['Choose the length unit (the files do not state it).', 'Choose the stress unit (the files do not state it).'])
    const chosen = readCsvBundle(files, { units: { length: 'mm', stress: 'MPa' } })
    expect(chosen.units).toEqual({ length: 'mm', stress: 'MPa' })
    expect(chosen.intake.unitsDeclared).toBe(false)
    expect(chosen.intake.unitSources).toEqual({ length: 'chosen', stress: 'chosen' })
    expect(chosen.warnings.join(' ')).toContain('no units declared: lengths are read as mm and stresses as MPa (as chosen when the files were opened, not stated in them)')
    // Saved with its units, the model.json declares them.
    const saved = mappingModelJson(p, { ...m, units: { length: 'mm', stress: 'MPa' } }, true)
    expect(saved.units).toEqual({ length: 'mm', stress: 'MPa' })
  })

  it('element-nodal stress with headers of its own: element and node columns are suggested', () => {
    const b = tinyBundle()
    const rows = [...[1, 2, 3, 4, 5, 6, 7, 8].map((n) => `1;${n};10;0;0;0;0;0`), ...[5, 6, 8, 9].map((n) => `2;${n};12;0;0;0;0;0`)]
    const files = [
      { name: 'nodes.csv', text: b['nodes.csv'] }, { name: 'elements.csv', text: b['elements.csv'] }, { name: 'model.json', text: b['model.json'] },
      { name: 'unaveraged.txt', text: ['Elem;Node;S11;S22;S33;S12;S23;S13', ...rows].join('\n') + '\n' },
    ]
    const p = previewBundle(files)
    const m = suggestMapping(p, { length: null, stress: null })
    // The name says nothing; the S11 column says stress.
    expect(m.roles['unaveraged.txt']).toBe('stress')
    expect(m.columns.stress).toEqual({ element: 0, id: 1, sxx: 2, syy: 3, szz: 4, sxy: 5, syz: 6, sxz: 7 })
    expect(mappingProblems(p, m)).toEqual([])
    const json = mappingModelJson(p, m, false)
    expect(json.columns).toMatchObject({ stress: { element: 'Elem', node: 'Node', sxx: 'S11' } })
    const model = readCsvBundle([...files.filter((f) => f.name !== 'model.json'), { name: 'model.json', text: JSON.stringify(json) }])
    expect(model.stressField?.layout).toBe('element-nodal')
  })
})
