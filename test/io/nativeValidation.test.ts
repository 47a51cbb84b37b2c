/**
 * The native container reader trusts nothing in the file: each broken field gives an InputError
 * of the right kind whose message names the header field (and the element id where there is one).
 */
import { describe, expect, it } from 'vitest'
import { InputError } from '../../src/model/errors.ts'
import type { InputErrorKind } from '../../src/model/errors.ts'
import { NATIVE_VERSION, readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { patchArrayValue, patchNative, readHeader } from './nativePatch.ts'
import { tinyBundle, toFiles } from './tinyBundle.ts'

const model = readCsvBundle(toFiles(tinyBundle()))
const good = writeNative(model)

function expectError(bytes: Uint8Array, kind: InputErrorKind, fragments: string[]): void {
  let err: unknown = null
  try { readNative(bytes, 'tiny.tractus') } catch (e) { err = e }
  expect(err).toBeInstanceOf(InputError)
  const ie = err as InputError
  expect(ie.kind, ie.message).toBe(kind)
  expect(ie.message).toContain('tiny.tractus')
  for (const f of fragments) expect(ie.message).toContain(f)
}

describe('layout', () => {
  it('magic, version, header length, then JSON, then 8-byte aligned arrays', () => {
    expect(new TextDecoder().decode(good.subarray(0, 8))).toBe('TRACTUS\0')
    const dv = new DataView(good.buffer)
    expect(dv.getUint32(8, true)).toBe(NATIVE_VERSION)
    const h = readHeader(good)
    expect(h.format).toBe('tractus-model')
    expect(h.arrays.map((a) => a.name)).toEqual(['coords', 'nodeIds', 'stress', 'displacement', 'block0.conn', 'block0.ids', 'block1.conn', 'block1.ids'])
    for (const a of h.arrays) expect(a.offset % 8).toBe(0)
    expect(good.length % 8).toBe(0)
    const m = readNative(good)
    validateModel(m)
    // Zero-copy: the coordinates are a view on the given buffer.
    expect(m.mesh.coords.buffer).toBe(good.buffer)
  })
  it('an untouched patch round-trips (the helper itself)', () => {
    validateModel(readNative(patchNative(good, () => {})))
  })
})

describe('broken containers', () => {
  it('empty and too short', () => {
    expectError(new Uint8Array(0), 'empty-file', ['empty'])
    expectError(good.subarray(0, 10), 'container', ['field "magic"', 'too short'])
  })
  it('wrong magic', () => {
    const b = good.slice(); b[0] = 0x58
    expectError(b, 'container', ['field "magic"'])
  })
  it('unknown version names the field', () => {
    const b = good.slice(); new DataView(b.buffer).setUint32(8, 3, true)
    expectError(b, 'version', ['field "version"', 'format version 3', 'reads versions 1 and 2', 'write the container again'])
  })
  it('header length past the end', () => {
    const b = good.slice(); new DataView(b.buffer).setUint32(12, 1e6, true)
    expectError(b, 'container', ['field "headerLength"'])
  })
  it('header not JSON / not UTF-8 / not an object', () => {
    const b = good.slice(); b[16] = 0x7a // 'z' instead of '{'
    expectError(b, 'bad-json', ['field "header"'])
    const c = good.slice(); c[20] = 0xff
    expectError(c, 'container', ['field "header"', 'UTF-8'])
    expectError(patchNative(good, (h) => { for (const k of Object.keys(h)) delete h[k]; (h as Record<string, unknown>).arrays = [] }), 'container', ['field "format"'])
  })
  it('truncated file: arrays run past the end', () => {
    expectError(good.subarray(0, good.length - 8), 'container', ['runs past the end', 'block1.ids'])
  })
  it('misaligned, out of range and overlapping offsets', () => {
    expectError(patchNative(good, (h) => { h.arrays[0].offset += 4 }), 'container', ['field "arrays[0].offset"', 'not a multiple of 8'])
    expectError(patchNative(good, (h) => { h.arrays[1].offset = 16 }), 'container', ['field "arrays[1].offset"', 'inside the header'])
    expectError(patchNative(good, (h) => { h.arrays[2].length = 1e9 }), 'container', ['field "arrays[2].length"', 'runs past the end'])
    expectError(patchNative(good, (h) => { h.arrays[1].offset = h.arrays[0].offset }), 'container', ['overlap'])
    expectError(patchNative(good, (h) => { h.arrays[1].offset = -8 }), 'container', ['field "arrays[1].offset"'])
    expectError(patchNative(good, (h) => { (h.arrays[1] as Record<string, unknown>).length = 2.5 }), 'container', ['field "arrays[1].length"'])
  })
  it('unknown dtype, wrong dtype, duplicate or missing arrays', () => {
    expectError(patchNative(good, (h) => { h.arrays[0].dtype = 'f16' }), 'container', ['field "arrays[0].dtype"', '"f16"'])
    expectError(patchNative(good, (h) => { h.arrays[1].dtype = 'f64'; h.arrays[1].length = 4 }), 'container', ['field "nodeIds"', 'dtype f64, expected i32'])
    expectError(patchNative(good, (h) => { h.arrays[1].name = 'coords' }), 'container', ['field "arrays[1].name"', 'listed twice'])
    expectError(patchNative(good, (h) => { h.arrays = h.arrays.filter((a) => a.name !== 'coords') }), 'container', ['field "arrays"', '"coords" is missing'])
    // Version 2 reaches the stress through the field table.
    expectError(patchNative(good, (h) => { h.arrays = h.arrays.filter((a) => a.name !== 'stress') }), 'container', ['field "fields[0].offset"', 'not the start of an array'])
  })
  it('lengths inconsistent with the counts', () => {
    expectError(patchNative(good, (h) => { h.nodeCount = 8 }), 'container', ['field "coords"', 'expected 24'])
    expectError(patchNative(good, (h) => { h.elementCount = 3 }), 'container', ['field "elementCount"', 'the blocks hold 2'])
    expectError(patchNative(good, (h) => { (h.blocks as { count: number }[])[0].count = 0 }), 'container', ['field "blocks[0].count"'])
    expectError(patchNative(good, (h) => { (h.blocks as { type: string }[])[1].type = 'hex27' }), 'unknown-type', ['field "blocks[1].type"'])
    expectError(patchNative(good, (h) => { h.nodeCount = '9' }), 'container', ['field "nodeCount"'])
  })
  it('metadata fields', () => {
    expectError(patchNative(good, (h) => { h.units = { length: 'parsec', stress: 'Pa' } }), 'bad-unit', ['field "units.length"'])
    expectError(patchNative(good, (h) => { h.bodyForce = [0, 0] }), 'bad-json', ['field "bodyForce"'])
    expectError(patchNative(good, (h) => { h.warnings = [1] }), 'container', ['field "warnings"'])
    expectError(patchNative(good, (h) => { h.name = 7 }), 'bad-json', ['field "name"'])
  })
  it('node index out of range in conn names the element', () => {
    expectError(patchArrayValue(good, 'block1.conn', 3, 9), 'missing-node', ['field "block1.conn"', 'element 2', 'node index 9'])
    expectError(patchArrayValue(good, 'block0.conn', 0, -1), 'missing-node', ['field "block0.conn"', 'element 1'])
  })
  it('non-finite coordinates, stress and displacement', () => {
    expectError(patchArrayValue(good, 'coords', 4, NaN), 'not-finite', ['field "coords"', 'node 2'])
    expectError(patchArrayValue(good, 'stress', 13, Infinity), 'not-finite', ['field "stress"', 'node 3'])
    expectError(patchArrayValue(good, 'displacement', 0, -Infinity), 'not-finite', ['field "displacement"', 'node 1'])
  })
  it('bad and duplicate ids, negative part', () => {
    expectError(patchArrayValue(good, 'nodeIds', 2, 0), 'bad-id', ['field "nodeIds"'])
    expectError(patchArrayValue(good, 'nodeIds', 2, 1), 'duplicate-id', ['field "nodeIds"', 'node id 1 appears twice'])
    expectError(patchArrayValue(good, 'block1.ids', 0, 1), 'duplicate-id', ['element id 1 appears twice'])
    const parted = writeNative({ ...model, mesh: { ...model.mesh, blocks: model.mesh.blocks.map((b) => ({ ...b, part: new Int32Array(b.ids.length) })) } })
    expectError(patchArrayValue(parted, 'block0.part', 0, -4), 'bad-id', ['field "block0.part"', 'element 1'])
  })
  it('degenerate element names the element; inverted ones are reoriented', () => {
    // Node 9 (index 8) moved into the top face of the cube: the tet is flat.
    expectError(patchArrayValue(good, 'coords', 26, 1), 'zero-volume', ['field "block1.conn"', 'element 2'])
    const inv = patchArrayValue(patchArrayValue(good, 'block1.conn', 1, 7), 'block1.conn', 2, 5)
    const m = readNative(inv, 'tiny.tractus')
    expect(m.warnings).toEqual(['tiny.tractus: reoriented 1 inverted element (negative volume, local nodes mirrored): 2'])
    validateModel(m)
  })
})

describe('counts far beyond the file', () => {
  it('huge counts are refused before anything is allocated from them', () => {
    const big = 2 ** 40
    expectError(patchNative(good, (h) => { h.elementCount = big; (h.blocks as { count: number }[])[0].count = big - 1 }), 'container', ['field "block0.conn"'])
    expectError(patchNative(good, (h) => { h.nodeCount = 2 ** 52 }), 'container', ['field "coords"'])
  })
})
