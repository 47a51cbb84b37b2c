/**
 * The browser's file-size limits (src/io/sizeGuard.ts): a CSV or JSON file up to the longest
 * string V8 makes, 2^29 - 24 units (measured in Node 20 and Chromium: 'x'.repeat(2 ** 29 - 24)
 * works, one more throws "Invalid string length"); a .tractus container up to 2 GiB. A refused
 * file's hint sends it to the command line, which reads any size.
 */
import { describe, expect, it } from 'vitest'
import { MAX_CONTAINER_BYTES, MAX_TEXT_BYTES, checkModelSize, limitFor, tooLargeHint } from '../../src/io/sizeGuard.ts'
import { readModelFiles } from '../../src/io/detect.ts'
import { writeNative } from '../../src/io/index.ts'
import { InputError } from '../../src/model/errors.ts'
import { boxModel } from './testModels.ts'

describe('file-size limits', () => {
  it('the text limit is exactly the longest string this engine makes', () => {
    expect('x'.repeat(MAX_TEXT_BYTES).length).toBe(MAX_TEXT_BYTES)
    expect(() => 'x'.repeat(MAX_TEXT_BYTES + 1)).toThrow(RangeError)
  })

  it('a container may be larger than a text file; each kind is refused just past its own limit', () => {
    expect(limitFor('Model.TRACTUS')).toBe(MAX_CONTAINER_BYTES)
    expect(limitFor('elements.csv')).toBe(MAX_TEXT_BYTES)
    expect(() => checkModelSize([{ name: 'm.tractus', size: MAX_CONTAINER_BYTES }, { name: 'stress.csv', size: MAX_TEXT_BYTES }])).not.toThrow()
    expect(() => checkModelSize([{ name: 'm.tractus', size: MAX_CONTAINER_BYTES + 1 }])).toThrow(/m\.tractus: the file is 2\.00 GiB/)
    expect(() => checkModelSize([{ name: 'stress.csv', size: MAX_TEXT_BYTES + 1 }])).toThrow(InputError)
  })

  it('the reader takes a container by the container limit, whatever its name', () => {
    const bytes = writeNative(boxModel('tet4'))
    expect(() => readModelFiles([{ name: 'model.bin', data: bytes }], { maxBytes: bytes.byteLength - 1 })).toThrow(/more than the limit/)
    expect(readModelFiles([{ name: 'model.bin', data: bytes }]).mesh.elementCount).toBeGreaterThan(0)
  })

  it('the hint says what to do: the command line for a container, converting for a CSV bundle', () => {
    expect(tooLargeHint('big.tractus')).toMatch(/up to 2\.00 GiB\. The command line reads it whatever its size: npx tractus audit big\.tractus/)
    expect(tooLargeHint('elements.csv')).toMatch(/npx tractus convert <bundle folder> --out model\.tractus/)
  })
})
