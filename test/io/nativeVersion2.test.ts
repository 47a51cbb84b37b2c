/**
 * The .tractus container, version 2: a field table (kind, case, layout, count, offset) and the
 * part names of model.json in the header; version 1 still reads. Round trips CSV → container →
 * CSV give the same text, character for character (the CSV writer's numbers are the shortest
 * round-trip form of ECMA-262 Number::toString, so equal doubles write equal text).
 */
import { describe, expect, it } from 'vitest'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { NATIVE_VERSION, readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { InputError } from '../../src/model/errors.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { mixedModel } from './testModels.ts'
import { expectSameModel } from './sameModel.ts'
import { patchNative, readHeader } from './nativePatch.ts'
import { tinyBundle, toFiles } from './tinyBundle.ts'

const withParts = (): ReturnType<typeof readCsvBundle> => {
  const b = tinyBundle()
  b['elements.csv'] = 'id,type,part,n1,n2,n3,n4,n5,n6,n7,n8\n1,hex8,1,1,2,3,4,5,6,7,8\n2,tet4,2,5,6,8,9\n'
  b['model.json'] = JSON.stringify({ name: 'tiny', units: { length: 'mm', stress: 'MPa' }, parts: { 1: 'block', 2: { name: 'cap', bodyForce: [0, 0, -1] } } })
  return readCsvBundle(toFiles(b))
}

function refusal(bytes: Uint8Array): InputError {
  try { readNative(bytes, 'v.tractus') } catch (e) { if (e instanceof InputError) return e; throw e }
  throw new Error('expected a refusal')
}

describe('container version 2', () => {
  it('writes version 2 with a field table pointing at the stress and displacement arrays', () => {
    const bytes = writeNative(readCsvBundle(toFiles(tinyBundle())))
    expect(new DataView(bytes.buffer).getUint32(8, true)).toBe(2)
    expect(NATIVE_VERSION).toBe(2)
    const h = readHeader(bytes)
    const byName = new Map(h.arrays.map((a) => [a.name, a]))
    expect(h.fields).toEqual([
      { kind: 'stress', case: 'default', layout: 'nodal', count: 9, offset: byName.get('stress')!.offset },
      { kind: 'displacement', case: 'default', layout: 'nodal', count: 9, offset: byName.get('displacement')!.offset },
    ])
  })

  it('keeps the part names of model.json in the header, as model.json writes them', () => {
    const m = withParts()
    const bytes = writeNative(m)
    expect(readHeader(bytes).parts).toEqual({ 1: 'block', 2: { name: 'cap', bodyForce: [0, 0, -1] } })
    expect(readNative(bytes).parts).toEqual(m.parts)
  })

  it('CSV → container → CSV gives the same text, file for file', () => {
    for (const m of [withParts(), mixedModel(['hex8', 'tet10', 'wedge15', 'pyramid13'])]) {
      const first = writeCsvBundle(readCsvBundle(writeCsvBundle(m)))
      const back = readNative(writeNative(readCsvBundle(first)))
      validateModel(back)
      expect(writeCsvBundle(back)).toEqual(first)
    }
  })

  it('version 1 still reads, to the same model', () => {
    const m = readCsvBundle(toFiles(tinyBundle()))
    const v1 = writeNative(m, { version: 1 })
    expect(new DataView(v1.buffer).getUint32(8, true)).toBe(1)
    expect(readHeader(v1).fields).toBeUndefined()
    expectSameModel(readNative(writeNative(m)), readNative(v1))
  })

  it('a broken field table names its field and says what it needs', () => {
    const good = writeNative(readCsvBundle(toFiles(tinyBundle())))
    type F = { kind: string; case: string; layout: string; count: number; offset: number }
    const fieldsOf = (h: Record<string, unknown>) => h.fields as F[]
    expect(refusal(patchNative(good, (h) => { delete h.fields })).message).toContain('field "fields"')
    expect(refusal(patchNative(good, (h) => { fieldsOf(h)[0].kind = 'strain' })).message).toContain('fields[0].kind')
    expect(refusal(patchNative(good, (h) => { fieldsOf(h)[0].layout = 'gauss' })).message).toContain('fields[0].layout')
    expect(refusal(patchNative(good, (h) => { fieldsOf(h)[0].count = 8 })).message).toMatch(/fields\[0\]\.count.*9 rows \(one per node\)/)
    expect(refusal(patchNative(good, (h) => { fieldsOf(h)[0].offset += 8 })).message).toContain('is not the start of an array')
    expect(refusal(patchNative(good, (h) => { fieldsOf(h)[1].offset = fieldsOf(h)[0].offset })).message).toMatch(/fields\[1\]\.offset.*needs 27 × f64/)
    expect(refusal(patchNative(good, (h) => { fieldsOf(h).splice(0, 1) })).message).toContain('no stress field')
  })
})
