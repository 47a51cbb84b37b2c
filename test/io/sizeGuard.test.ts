/**
 * The file-size limits (src/io/sizeGuard.ts): a JSON file up to the longest string V8 makes,
 * 2^29 - 24 units (measured in Node 20 and Chromium: 'x'.repeat(2 ** 29 - 24) works, one more
 * throws "Invalid string length"); a CSV file, parsed from its bytes, and a .tractus container up
 * to 2 GiB. A refused file's hint says what to do instead.
 */
import { describe, expect, it } from 'vitest'
import { MAX_CONTAINER_BYTES, MAX_CSV_BYTES, MAX_TEXT_BYTES, checkModelSize, limitFor, tooLargeHint } from '../../src/io/sizeGuard.ts'
import { readModelFiles } from '../../src/io/detect.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle, writeNative } from '../../src/io/index.ts'
import { InputError } from '../../src/model/errors.ts'
import { boxModel } from './testModels.ts'

describe('file-size limits', () => {
  it('the JSON limit is exactly the longest string this engine makes', () => {
    expect('x'.repeat(MAX_TEXT_BYTES).length).toBe(MAX_TEXT_BYTES)
    expect(() => 'x'.repeat(MAX_TEXT_BYTES + 1)).toThrow(RangeError)
  })

  it('a CSV file and a container may be larger than a JSON file; each kind is refused just past its own limit', () => {
    expect(limitFor('Model.TRACTUS')).toBe(MAX_CONTAINER_BYTES)
    expect(limitFor('elements.csv')).toBe(MAX_CSV_BYTES)
    expect(limitFor('results/stress.txt')).toBe(MAX_CSV_BYTES)
    expect(limitFor('bundle/Model.JSON')).toBe(MAX_TEXT_BYTES)
    expect(MAX_CSV_BYTES).toBeGreaterThan(MAX_TEXT_BYTES)
    expect(() => checkModelSize([{ name: 'm.tractus', size: MAX_CONTAINER_BYTES }, { name: 'stress.csv', size: MAX_CSV_BYTES }, { name: 'model.json', size: MAX_TEXT_BYTES }])).not.toThrow()
    expect(() => checkModelSize([{ name: 'm.tractus', size: MAX_CONTAINER_BYTES + 1 }])).toThrow(/m\.tractus: the file is 2\.00 GiB/)
    expect(() => checkModelSize([{ name: 'stress.csv', size: MAX_CSV_BYTES + 1 }])).toThrow(InputError)
    expect(() => checkModelSize([{ name: 'model.json', size: MAX_TEXT_BYTES + 1 }])).toThrow(/model\.json: the file is 512\.0 MiB/)
  })

  it('the bundle reader takes each file by its own limit: a CSV file past the JSON limit is read, a model.json past it is refused', () => {
    const files = writeCsvBundle(boxModel('tet4')).map((f) => ({ ...f, size: f.name === 'elements.csv' ? MAX_TEXT_BYTES + 1 : f.text.length }))
    expect(readCsvBundle(files).mesh.elementCount).toBeGreaterThan(0)
    const json = { name: 'model.json', text: '{"units":{"length":"m","stress":"Pa"}}', size: MAX_TEXT_BYTES + 1 }
    expect(() => readCsvBundle([...files, json])).toThrow(/model\.json: the file is 512\.0 MiB/)
    const past = files.map((f) => (f.name === 'stress.csv' ? { ...f, size: MAX_CSV_BYTES + 1 } : f))
    expect(() => readCsvBundle(past)).toThrow(/stress\.csv: the file is 2\.00 GiB/)
  })

  it('the reader takes a container by the container limit, whatever its name', () => {
    const bytes = writeNative(boxModel('tet4'))
    expect(() => readModelFiles([{ name: 'model.bin', data: bytes }], { maxBytes: bytes.byteLength - 1 })).toThrow(/more than the limit/)
    expect(readModelFiles([{ name: 'model.bin', data: bytes }]).mesh.elementCount).toBeGreaterThan(0)
  })

  it('the hint says what to do: the command line for a container, smaller tables or a container for a CSV file, CSV beside a JSON file', () => {
    expect(tooLargeHint('big.tractus')).toMatch(/up to 2\.00 GiB\. The command line reads larger ones \(up to the largest buffer of Node\.js, 4 GiB in Node\.js 20\): npx tractus audit big\.tractus/)
    expect(tooLargeHint('elements.csv')).toMatch(/^The browser and the command line read a CSV file of up to 2\.00 GiB\./)
    expect(tooLargeHint('elements.csv')).toMatch(/stress\.NAME\.csv.*\.tractus container/)
    expect(tooLargeHint('model.json')).toMatch(/^The browser reads a JSON file of up to 512\.0 MiB/)
  })
})
