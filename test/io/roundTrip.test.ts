/**
 * Round trips: Model → CSV bundle → Model → native container → Model must give back the same
 * numbers bit for bit (the CSV writer uses the shortest round-trip decimal form of ECMA-262
 * Number::toString, which reads back to the same double). Also the accepted variations of the
 * CSV text: BOM, CRLF, comments, blank lines, reordered columns, sparse ids, mixed types.
 */
import { describe, expect, it } from 'vitest'
import { ELEMENT_TYPES, ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import type { Model } from '../../src/model/model.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import type { WrittenCsvFile } from '../../src/io/writeCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { readLittleEndian, writeLittleEndian } from '../../src/io/littleEndianArrays.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { boxModel, mixedModel } from './testModels.ts'
import { expectSameModel, sameNumbers } from './sameModel.ts'

const TYPES = ELEMENT_TYPE_NAMES

function file(files: WrittenCsvFile[], name: string): WrittenCsvFile {
  return files.find((f) => f.name === name)!
}

describe('CSV → Model → native → Model', () => {
  it.each(TYPES)('%s box with displacement', (type) => {
    const m = boxModel(type, undefined, true)
    const fromCsv = readCsvBundle(writeCsvBundle(m))
    expectSameModel(m, fromCsv)
    validateModel(fromCsv)
    const fromNative = readNative(writeNative(fromCsv))
    expectSameModel(fromCsv, fromNative)
    validateModel(fromNative)
  })

  it('mixed element types in one file make one block per type, with the user ids and parts kept', () => {
    const m = mixedModel(['hex8', 'tet10', 'wedge6', 'hex20', 'tet4'])
    const files = writeCsvBundle(m)
    const el = file(files, 'elements.csv').text
    expect(el.split('\n')[0]).toBe('id,type,part,' + Array.from({ length: 20 }, (_, i) => `n${i + 1}`).join(','))
    const r = readCsvBundle(files)
    expect(r.mesh.blocks.map((b) => b.type)).toEqual(['hex8', 'tet10', 'wedge6', 'hex20', 'tet4'])
    expect(r.mesh.blocks[1].ids[0]).toBe(1001)
    expect(Array.from(r.mesh.blocks[3].part!)).toEqual([4, 4, 4, 4])
    expectSameModel(m, r)
    expectSameModel(r, readNative(writeNative(r)))
  })

  it('rows of different types may interleave: blocks follow the order of first appearance', () => {
    const text = [
      'id,type,n1,n2,n3,n4,n5,n6,n7,n8',
      '10,tet4,1,2,3,5',
      '11,hex8,1,2,3,4,5,6,7,8',
      '12,tet4,2,4,3,8',
    ].join('\n')
    const nodes = 'id,x,y,z\n1,0,0,0\n2,1,0,0\n3,1,1,0\n4,0,1,0\n5,0,0,1\n6,1,0,1\n7,1,1,1\n8,0,1,1\n'
    const stress = 'id,sxx,syy,szz,sxy,syz,sxz\n' + [1, 2, 3, 4, 5, 6, 7, 8].map((i) => `${i},${i},0,0,0,0,0`).join('\n')
    const r = readCsvBundle([{ name: 'nodes.csv', text: nodes }, { name: 'elements.csv', text }, { name: 'stress.csv', text: stress }])
    expect(r.mesh.blocks.map((b) => [b.type, Array.from(b.ids)])).toEqual([['tet4', [10, 12]], ['hex8', [11]]])
    expect(r.mesh.blocks[1].offset).toBe(2)
    // Element 12 lists its corners clockwise: mirrored by swapping local nodes 2 and 3 (1-based).
    expect(r.warnings.join(' ')).toContain('reoriented 1 inverted element (negative volume, local nodes mirrored): 12')
    expect(Array.from(r.mesh.blocks[0].conn.subarray(4, 8)).map((i) => r.mesh.nodeIds[i])).toEqual([2, 3, 4, 8])
  })

  it('every registered type in one file: one block per type, read back bit for bit through CSV and the container', () => {
    const m = mixedModel(ELEMENT_TYPE_NAMES)
    const files = writeCsvBundle(m)
    const widest = Math.max(...ELEMENT_TYPE_NAMES.map((t) => ELEMENT_TYPES[t].nodeCount))
    expect(file(files, 'elements.csv').text.split('\n')[0]).toBe('id,type,part,' + Array.from({ length: widest }, (_, i) => `n${i + 1}`).join(','))
    const r = readCsvBundle(files)
    expect(r.mesh.blocks.map((b) => b.type)).toEqual(ELEMENT_TYPE_NAMES)
    expect(r.warnings).toEqual([])
    expectSameModel(m, r)
    const back = readNative(writeNative(r))
    expectSameModel(r, back)
    validateModel(back)
  })

  it.each(TYPES)('%s: inverted elements are mirrored back on reading, with a warning naming them', (type) => {
    const m = boxModel(type)
    const b = m.mesh.blocks[0]
    const perm = ELEMENT_TYPES[type].mirror, nn = perm.length
    // Mirror the 1st and 3rd element: the reader must find them inverted and restore them.
    const conn = b.conn.slice()
    for (const e of [0, 2]) for (let a = 0; a < nn; a++) conn[e * nn + a] = b.conn[e * nn + perm[a]]
    const inverted: Model = { ...m, mesh: { ...m.mesh, blocks: [{ ...b, conn }] } }
    for (const r of [readCsvBundle(writeCsvBundle(inverted)), readNative(writeNative(inverted))]) {
      expect(r.warnings.join(' ')).toContain(`reoriented 2 inverted elements (negative volume, local nodes mirrored): ${b.ids[0]}, ${b.ids[2]}`)
      expect(Array.from(r.mesh.blocks[0].conn)).toEqual(Array.from(b.conn))
    }
  })

  it('the copying reader (big-endian path) gives the same model as the zero-copy views', () => {
    const m = mixedModel(['hex20', 'tet4'])
    const bytes = writeNative(m)
    expectSameModel(readNative(bytes), readNative(bytes, 'x.tractus', { copy: true }))
    // A buffer that starts at an odd byte offset cannot be viewed as Float64Array: it is copied.
    const shifted = new Uint8Array(bytes.length + 3)
    shifted.set(bytes, 3)
    expectSameModel(m, readNative(shifted.subarray(3)))
  })

  it('little-endian writer and reader agree on both paths', () => {
    const a = new Float64Array([1.5, -0, 1e-310, -2.5e300])
    const i = new Int32Array([1, -1, 2147483647, -2147483648])
    const out = new Uint8Array(64)
    writeLittleEndian(out, 0, a, false)
    writeLittleEndian(out, 32, i, false)
    // IEEE 754 binary64 of 1.5 is 0x3FF8000000000000; little-endian puts 0x3F last.
    expect(Array.from(out.subarray(0, 8))).toEqual([0, 0, 0, 0, 0, 0, 0xf8, 0x3f])
    expect(sameNumbers(readLittleEndian(out, 0, 4, 'f64', false) as Float64Array, a)).toBe(true)
    expect(Array.from(readLittleEndian(out, 32, 4, 'i32', false))).toEqual(Array.from(i))
    expect(Array.from(readLittleEndian(out, 32, 4, 'i32', true))).toEqual(Array.from(i))
  })

  it('the native reader never writes into the given buffer, not even to reorient', () => {
    const m = boxModel('tet4')
    const conn = m.mesh.blocks[0].conn
    const t = conn[1]; conn[1] = conn[2]; conn[2] = t // invert element 1
    const bytes = writeNative(m)
    const copy = bytes.slice()
    const r = readNative(bytes)
    expect(r.warnings.join(' ')).toContain('reoriented 1 inverted element')
    expect(bytes).toEqual(copy)
  })
})

describe('accepted CSV variations', () => {
  const base = boxModel('hex8', undefined, true)
  const files = writeCsvBundle(base)

  it('UTF-8 BOM and CRLF line ends', () => {
    const crlf = files.map((f) => ({ name: f.name, text: '\uFEFF' + f.text.replace(/\n/g, '\r\n') }))
    expectSameModel(base, readCsvBundle(crlf))
  })

  it('comment lines, blank lines, spaces around fields, upper-case headers and types', () => {
    const noisy = files.map((f) => {
      if (!f.name.endsWith('.csv')) return f
      const lines = f.text.trimEnd().split('\n')
      const out = ['# written by a test', '', lines[0].toUpperCase().replace(/,/g, ' , ')]
      for (const l of lines.slice(1)) out.push('   ', l.replace('hex8', 'HEX8').replace(/,/g, ', '), '  # comment')
      return { name: f.name.toUpperCase(), text: out.join('\n') }
    })
    expectSameModel(base, readCsvBundle(noisy))
  })

  it('columns of nodes, stress and displacement in any order', () => {
    const reorder = (text: string, perm: number[]) => text.trimEnd().split('\n').map((l) => { const f = l.split(','); return perm.map((p) => f[p]).join(',') }).join('\n')
    const shuffled = files.map((f) => {
      if (f.name === 'nodes.csv') return { ...f, text: reorder(f.text, [3, 1, 0, 2]) }
      if (f.name === 'stress.csv') return { ...f, text: reorder(f.text, [6, 5, 4, 3, 2, 1, 0]) }
      if (f.name === 'displacement.csv') return { ...f, text: reorder(f.text, [2, 0, 3, 1]) }
      return f
    })
    expectSameModel(base, readCsvBundle(shuffled))
  })

  it('rows in any order: nodes keep the file order, lookups follow ids', () => {
    const rev = (text: string) => { const l = text.trimEnd().split('\n'); return [l[0], ...l.slice(1).reverse()].join('\n') }
    const r = readCsvBundle(files.map((f) => (f.name.endsWith('.csv') ? { ...f, text: rev(f.text) } : f)))
    expect(r.mesh.nodeIds[0]).toBe(base.mesh.nodeCount)
    // Node with id k sits at index N - k; its coordinates and stress came along.
    const N = base.mesh.nodeCount
    for (let k = 1; k <= N; k++) {
      const i = N - k, j = k - 1
      expect(r.mesh.coords[3 * i + 2]).toBe(base.mesh.coords[3 * j + 2])
      expect(r.stress[6 * i + 3]).toBe(base.stress[6 * j + 3])
    }
    validateModel(r)
  })

  it('sparse ids near 2^31-1 use the sorted index and give the same model', () => {
    const m = mixedModel(['hex8', 'tet4'], 100000000)
    const r = readCsvBundle(writeCsvBundle(m))
    expectSameModel(m, r)
    const big = writeCsvBundle(boxModel('tet4')).map((f) => ({ ...f, text: f.text.replace(/^(\d+),/gm, (_, id) => `${2147483647 - Number(id)},`) }))
    const el = big.find((f) => f.name === 'elements.csv')!
    // Node columns: every number after a comma (the leading element id was mapped above).
    el.text = el.text.replace(/,(\d+)(?=,|$)/gm, (_, id) => `,${2147483647 - Number(id)}`)
    const rb = readCsvBundle(big)
    expect(rb.mesh.nodeIds[0]).toBe(2147483646)
    validateModel(rb)
  })

  it('model.json: name, description, units and body force; defaults without it', () => {
    const r = readCsvBundle(files)
    expect(r.units).toEqual({ length: 'mm', stress: 'MPa' })
    expect(r.bodyForce).toEqual([0, 0, -7.7e-5])
    const noJson = readCsvBundle(files.filter((f) => f.name !== 'model.json'), { name: 'bracket' })
    expect(noJson.name).toBe('bracket')
    expect(noJson.units).toEqual({ length: 'm', stress: 'Pa' })
    expect(noJson.bodyForce).toEqual([0, 0, 0])
  })

  it('unknown files are ignored with a warning, folders in names are fine', () => {
    const r = readCsvBundle([...files.map((f) => ({ ...f, name: `run3/${f.name}` })), { name: 'run3/notes.txt', text: 'hello' }])
    expect(r.warnings).toContain('ignored run3/notes.txt: not part of a CSV bundle')
  })
})
