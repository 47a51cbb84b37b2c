/**
 * validateModel: the invariants of a loaded Model, checked on hand-broken copies of a valid one.
 */
import { describe, expect, it } from 'vitest'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import { InputError } from '../../src/model/errors.ts'
import type { Model } from '../../src/model/model.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { boxModel } from './testModels.ts'

function broken(change: (m: Model) => Model): InputError {
  try { validateModel(change(boxModel('hex8')), 'test model') } catch (e) { return e as InputError }
  throw new Error('expected an InputError')
}

describe('validateModel', () => {
  it('accepts the box models', () => {
    for (const t of ELEMENT_TYPE_NAMES) validateModel(boxModel(t, undefined, true))
  })
  it('names the field and element of each broken invariant', () => {
    const withConn = (m: Model, conn: Int32Array): Model => ({ ...m, mesh: { ...m.mesh, blocks: [{ ...m.mesh.blocks[0], conn }] } })
    let e = broken((m) => { const c = m.mesh.blocks[0].conn.slice(); c[9] = 999; return withConn(m, c) })
    expect(e.message).toBe('test model, field "blocks[0].conn", element 2: node index 999 is outside 0..17')
    e = broken((m) => { const c = m.mesh.blocks[0].conn.slice(); c.copyWithin(0, 4, 8); c.set(m.mesh.blocks[0].conn.subarray(0, 4), 4); return withConn(m, c) })
    expect(e.message).toContain('element 1: inverted element')
    e = broken((m) => { const s = m.stress.slice(); s[7] = NaN; return { ...m, stress: s } })
    expect(e.kind).toBe('not-finite')
    expect(e.message).toContain('field "stress"')
    e = broken((m) => { const ids = m.mesh.nodeIds.slice(); ids[3] = ids[4]; return { ...m, mesh: { ...m.mesh, nodeIds: ids } } })
    expect(e.kind).toBe('duplicate-id')
    e = broken((m) => ({ ...m, units: { length: 'mm', stress: 'bar' as 'Pa' } }))
    expect(e.kind).toBe('bad-unit')
    e = broken((m) => ({ ...m, mesh: { ...m.mesh, elementCount: 5 } }))
    expect(e.message).toContain('field "elementCount"')
  })
})
