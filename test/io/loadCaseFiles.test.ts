/**
 * Reading load cases from a CSV bundle (src/io/caseFiles.ts): file names, model.json "cases" and
 * "combinations", the first case, and one broken input per message the issue asks for.
 */
import { describe, expect, it } from 'vitest'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { InputError } from '../../src/model/errors.ts'
import { caseNames, modelForCase } from '../../src/model/loadCases.ts'
import { setLine, tinyBundle, toFiles } from './tinyBundle.ts'
import type { Bundle } from './tinyBundle.ts'

const ids = [1, 2, 3, 4, 5, 6, 7, 8, 9]
const stressOf = (sxx: number, order = ids) => ['id,sxx,syy,szz,sxy,syz,sxz', ...order.map((i) => `${i},${sxx},0,0,0,0,${i}`)].join('\n') + '\n'

function withCases(json: Record<string, unknown> = {}): Bundle {
  const b = tinyBundle()
  b['stress.Wind.csv'] = stressOf(3, [9, 8, 7, 6, 5, 4, 3, 2, 1])
  b['stress.dead.csv'] = stressOf(2)
  b['displacement.dead.csv'] = ['id,ux,uy,uz', ...ids.map((i) => `${i},0,0,${-i}`)].join('\n') + '\n'
  b['model.json'] = JSON.stringify({ name: 'tiny', units: { length: 'm', stress: 'MPa' }, bodyForce: [0, 0, -1], ...json })
  return b
}

function errorOf(b: Bundle): InputError {
  try { readCsvBundle(toFiles(b)) } catch (e) { if (e instanceof InputError) return e; throw e }
  throw new Error('no error')
}

describe('load case files', () => {
  it('reads stress.csv as "default", stress.NAME.csv as NAME; order: listed, default, the rest by name', () => {
    const m = readCsvBundle(toFiles(withCases({ cases: [{ name: 'dead', description: 'self weight', bodyForce: [0, 0, -77000] }] })))
    expect(m.cases!.map((c) => c.name)).toEqual(['dead', 'default', 'Wind'])
    // the model's own fields are those of the first case
    expect(m.stress[0]).toBe(2)
    expect(m.bodyForce).toEqual([0, 0, -77000])
    expect(m.displacement![2]).toBe(-1)
    expect(m.cases![0].description).toBe('self weight')
    // a case naming no ρb takes the model's
    expect(m.cases![1].bodyForce).toEqual([0, 0, -1])
    // rows in another order go to their nodes
    const wind = m.cases![2]
    for (let n = 0; n < 9; n++) expect([wind.stress[6 * n], wind.stress[6 * n + 5]]).toEqual([3, m.mesh.nodeIds[n]])
    expect(wind.displacement).toBeNull()
    expect(m.intake.files.map((f) => f.role)).toContain('stress.wind')
  })

  it('without model.json cases the first is default; a bundle of case files only starts with the first by name', () => {
    expect(readCsvBundle(toFiles(withCases())).cases!.map((c) => c.name)).toEqual(['default', 'dead', 'Wind'])
    const b = withCases()
    delete b['stress.csv']; delete b['displacement.csv']
    const m = readCsvBundle(toFiles(b))
    expect(m.cases!.map((c) => c.name)).toEqual(['dead', 'Wind'])
    expect(m.stress[0]).toBe(2)
  })

  it('a bundle without case files has no cases list (one field, as before)', () => {
    const m = readCsvBundle(toFiles(tinyBundle()))
    expect(m.cases).toBeUndefined()
    expect(caseNames(m)).toEqual(['default'])
  })

  it('reads combinations; a combination is the factored sum of its cases, ρb included', () => {
    const m = readCsvBundle(toFiles(withCases({ combinations: [{ name: 'ULS-1', factors: { DEAD: 1.35, wind: 1.5 } }] })))
    expect(m.combinations).toEqual([{ name: 'ULS-1', factors: { dead: 1.35, Wind: 1.5 } }])
    const c = modelForCase(m, 'uls-1')
    expect(c.stress[0]).toBeCloseTo(1.35 * 2 + 1.5 * 3, 14)
    expect(c.bodyForce).toEqual([0, 0, -1.35 - 1.5])
    // Wind has no displacement, so neither has the combination
    expect(c.displacement).toBeNull()
  })

  const defects: [string, (b: Bundle) => Bundle, string, string[]][] = [
    ['a case file with an extra node', (b) => { b['stress.dead.csv'] += '10,1,0,0,0,0,0\n'; return b }, 'missing-node', ['stress.dead.csv', 'line 11', 'node 10', 'stress.csv']],
    ['a case file without a node', (b) => { b['stress.dead.csv'] = setLine(b['stress.dead.csv'], 5, null); return b }, 'missing-stress', ['stress.dead.csv', 'node 4']],
    ['two files for one case', (b) => { b['stress.DEAD.csv'] = b['stress.dead.csv']; return b }, 'bad-argument', ['two files for load case "dead"', 'stress.DEAD.csv']],
    ['stress.csv and stress.default.csv', (b) => { b['stress.default.csv'] = b['stress.csv']; return b }, 'bad-argument', ['two files for load case "default"', 'stress.default.csv']],
    ['a combination of an unknown case', (b) => withJson(b, { combinations: [{ name: 'C1', factors: { dead: 1, snow: 1.5 } }] }), 'bad-json', ['model.json', 'combinations[0].factors.snow', '"snow"', 'dead']],
    ['a factor that is not finite', (b) => { b['model.json'] = '{"combinations": [{"name": "C1", "factors": {"dead": 1e999}}]}'; return b }, 'bad-json', ['model.json', 'combinations[0].factors.dead', 'finite']],
    ['a factor that is text', (b) => withJson(b, { combinations: [{ name: 'C1', factors: { dead: '1.35' } }] }), 'bad-json', ['combinations[0].factors.dead', 'finite']],
    ['a combination of a combination', (b) => withJson(b, { combinations: [{ name: 'C1', factors: { dead: 1 } }, { name: 'C2', factors: { C1: 1 } }] }), 'bad-json', ['combinations[1].factors.C1', 'not of other combinations']],
    ['a listed case without a file', (b) => withJson(b, { cases: [{ name: 'snow' }] }), 'missing-file', ['model.json', 'cases[0].name', 'stress.snow.csv']],
    ['the reserved name all', (b) => { b['stress.all.csv'] = b['stress.dead.csv']; return b }, 'bad-argument', ['stress.all.csv', 'reserved']],
    ['a name with a space', (b) => { b['stress.wind load.csv'] = b['stress.dead.csv']; return b }, 'bad-argument', ['stress.wind load.csv', 'letters, digits']],
    ['a displacement without its stress', (b) => { b['displacement.snow.csv'] = b['displacement.dead.csv']; return b }, 'missing-file', ['displacement.snow.csv', 'stress.snow.csv']],
    ['a combination named like a case', (b) => withJson(b, { combinations: [{ name: 'Dead', factors: { dead: 1 } }] }), 'bad-json', ['combinations[0].name', 'already the name of a load case']],
  ]
  it.each(defects)('%s', (_, make, kind, fragments) => {
    const e = errorOf(make(withCases()))
    expect(e.kind, e.message).toBe(kind)
    for (const f of fragments) expect(e.message).toContain(f)
  })
})

function withJson(b: Bundle, extra: Record<string, unknown>): Bundle {
  b['model.json'] = JSON.stringify({ ...JSON.parse(b['model.json']), ...extra })
  return b
}

describe('load cases: memory', () => {
  it('refuses plainly, before reading, where the fields would not fit', async () => {
    const { checkCaseMemory, MAX_CASE_FIELD_BYTES } = await import('../../src/io/caseFiles.ts')
    // 50 nodal cases of about 1.8·10^5 nodes (a 10^6-element tet4 block): 0.4 GiB, accepted
    expect(() => checkCaseMemory(50, 6 * 175_616, 0, 'stress.csv')).not.toThrow()
    // 50 element-nodal cases of 10^6 tet4 (4·10^6 element-node rows): about 9 GiB, refused with the figure
    expect(() => checkCaseMemory(50, 6 * 4_000_000, 0, 'stress.csv')).toThrow(/50 load cases need 8\.9 GiB .* split the cases/)
    expect(MAX_CASE_FIELD_BYTES).toBe(4 * 2 ** 30)
  })
})
