/**
 * Test helper: two models are the same when names, units, body force and every array element
 * agree (Object.is, so -0 ≠ 0): bit for bit.
 */
import { expect } from 'vitest'
import type { Model } from '../../src/model/model.ts'
import type { ReadModel } from '../../src/io/index.ts'

/** Same model: names, units, body force, every array element (Object.is, so -0 ≠ 0). */
export function expectSameModel(a: Model, b: Model): void {
  expect(b.name).toBe(a.name)
  expect(b.description).toBe(a.description)
  expect(b.units).toEqual(a.units)
  expect(b.bodyForce).toEqual(a.bodyForce)
  expect(b.mesh.nodeCount).toBe(a.mesh.nodeCount)
  expect(b.mesh.elementCount).toBe(a.mesh.elementCount)
  expect(Array.from(b.mesh.nodeIds)).toEqual(Array.from(a.mesh.nodeIds))
  expect(sameNumbers(a.mesh.coords, b.mesh.coords)).toBe(true)
  expect(sameNumbers(a.stress, b.stress)).toBe(true)
  expect(a.displacement === null).toBe(b.displacement === null)
  if (a.displacement && b.displacement) expect(sameNumbers(a.displacement, b.displacement)).toBe(true)
  expect(b.mesh.blocks.length).toBe(a.mesh.blocks.length)
  a.mesh.blocks.forEach((ba, k) => {
    const bb = b.mesh.blocks[k]
    expect(bb.type).toBe(ba.type)
    expect(bb.offset).toBe(ba.offset)
    expect(Array.from(bb.conn)).toEqual(Array.from(ba.conn))
    expect(Array.from(bb.ids)).toEqual(Array.from(ba.ids))
    expect(bb.part === null ? null : Array.from(bb.part)).toEqual(ba.part === null ? null : Array.from(ba.part))
  })
}

export function sameNumbers(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false
  return true
}


/** Same read: the same model, warnings and intake report, and the element-nodal field row for row. */
export function expectSameRead(a: ReadModel, b: ReadModel): void {
  expectSameModel(a, b)
  expect(b.warnings).toEqual(a.warnings)
  expect(b.intake).toEqual(a.intake)
  if (a.stressField) {
    expect(sameNumbers(a.stressField.values, b.stressField!.values)).toBe(true)
    expect(b.stressField!.rows.map((r) => Array.from(r))).toEqual(a.stressField.rows.map((r) => Array.from(r)))
  }
}
