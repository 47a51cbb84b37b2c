/**
 * readModelFiles: decides between a CSV bundle and a native container by content (magic bytes),
 * not only by name, and says clearly what is missing.
 */
import { describe, expect, it } from 'vitest'
import { InputError } from '../../src/model/errors.ts'
import { readModelFiles } from '../../src/io/detect.ts'
import { writeNative } from '../../src/io/nativeContainer.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { MAX_CSV_BYTES, checkModelSize } from '../../src/io/sizeGuard.ts'
import { tinyBundle, toFiles } from './tinyBundle.ts'

const enc = new TextEncoder()
const csv = toFiles(tinyBundle())
const asBytes = csv.map((f) => ({ name: f.name, data: enc.encode(f.text).buffer as ArrayBuffer }))
const model = readCsvBundle(csv)
const native = writeNative(model)

function errorOf(f: () => unknown): InputError {
  try { f() } catch (e) { expect(e).toBeInstanceOf(InputError); return e as InputError }
  throw new Error('expected an InputError')
}

describe('readModelFiles', () => {
  it('reads a CSV bundle given as bytes or as text', () => {
    expect(readModelFiles(asBytes).mesh.elementCount).toBe(2)
    expect(readModelFiles(csv.map((f) => ({ name: f.name, data: f.text }))).mesh.elementCount).toBe(2)
  })
  it('reads a native container by its magic, whatever its name', () => {
    expect(readModelFiles([{ name: 'tiny.tractus', data: native }]).mesh.elementCount).toBe(2)
    expect(readModelFiles([{ name: 'download.bin', data: native.buffer as ArrayBuffer }]).mesh.elementCount).toBe(2)
  })
  it('a file named .tractus without the magic is a container error', () => {
    const e = errorOf(() => readModelFiles([{ name: 'model.tractus', data: enc.encode('id,x,y,z\n') }]))
    expect(e.kind).toBe('container')
    expect(e.message).toContain('model.tractus')
    expect(e.message).toContain('field "magic"')
  })
  it('an incomplete set names what is missing and what was given', () => {
    const e = errorOf(() => readModelFiles([{ name: 'a.csv', data: 'x' }, { name: 'b.csv', data: 'y' }]))
    expect(e.kind).toBe('missing-file')
    expect(e.message).toContain('missing nodes.csv, elements.csv, stress.csv; got: a.csv, b.csv')
    const e2 = errorOf(() => readModelFiles(asBytes.filter((f) => f.name !== 'nodes.csv')))
    expect(e2.message).toContain('missing nodes.csv; got: elements.csv, stress.csv, displacement.csv, model.json')
    expect(errorOf(() => readModelFiles([])).kind).toBe('missing-file')
  })
  it('a container mixed with CSV files is refused', () => {
    const e = errorOf(() => readModelFiles([...asBytes, { name: 'm.tractus', data: native }]))
    expect(e.kind).toBe('bad-argument')
    expect(e.message).toContain('m.tractus')
  })
  it('a file that is not UTF-8 names the file and line', () => {
    const bytes = enc.encode(tinyBundle()['nodes.csv'])
    const bad = new Uint8Array([...bytes.subarray(0, 20), 0xe9, ...bytes.subarray(20)]) // Latin-1 'é'
    const e = errorOf(() => readModelFiles(asBytes.map((f) => (f.name === 'nodes.csv' ? { name: f.name, data: bad } : f))))
    expect(e.kind).toBe('encoding')
    expect(e.message).toMatch(/^nodes\.csv, line 3: the file is not UTF-8 text \(first bad byte at offset 20\)/)
  })
  it('a UTF-8 BOM in bytes is dropped', () => {
    const withBom = asBytes.map((f) => ({ name: f.name, data: new Uint8Array([0xef, 0xbb, 0xbf, ...new Uint8Array(f.data)]) }))
    expect(readModelFiles(withBom).mesh.nodeCount).toBe(9)
  })
  it('size guard: too-large names file, size and limit', () => {
    const e = errorOf(() => readModelFiles([{ name: 'huge.tractus', data: native }], { maxBytes: 64 }))
    expect(e.kind).toBe('too-large')
    expect(e.message).toBe(`huge.tractus: the file is ${native.length > 1023 ? `${(native.length / 1024).toFixed(1)} KiB (${native.length} bytes)` : `${native.length} bytes`}, more than the limit of 64 bytes`)
    const e2 = errorOf(() => checkModelSize([{ name: 'a.csv', size: 10 }, { name: 'b.csv', size: MAX_CSV_BYTES + 1 }]))
    expect(e2.message).toBe(`b.csv: the file is 2.00 GiB (${MAX_CSV_BYTES + 1} bytes), more than the limit of 2.00 GiB (${MAX_CSV_BYTES} bytes)`)
  })
})
