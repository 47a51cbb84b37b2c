/**
 * The three read paths of little-endian arrays give the same values: the zero-copy view, the bulk
 * copy (unaligned bytes, or a copy asked for) and the value-by-value DataView read a big-endian
 * platform takes. Reference: IEEE 754 binary64 and two's-complement int32 bytes written
 * little-endian by hand (common practice).
 */
import { describe, expect, it } from 'vitest'
import { readLittleEndian, readLittleEndianByValue } from '../../src/io/littleEndianArrays.ts'

describe('readLittleEndian', () => {
  // 1.5 = 0x3FF8000000000000 and -2 = 0xC000000000000000 as binary64; 1 and -2 as int32.
  const f64 = [0, 0, 0, 0, 0, 0, 0xf8, 0x3f, 0, 0, 0, 0, 0, 0, 0, 0xc0]
  const i32 = [1, 0, 0, 0, 0xfe, 0xff, 0xff, 0xff]
  for (const shift of [0, 3, 8]) {
    it(`view, bulk copy and value-by-value agree (data at byte ${shift} of its buffer)`, () => {
      const buf = new Uint8Array(shift + 24)
      buf.set(f64, shift)
      buf.set(i32, shift + 16)
      const bytes = buf.subarray(shift)
      for (const allowView of [true, false]) {
        expect(Array.from(readLittleEndian(bytes, 0, 2, 'f64', allowView))).toEqual([1.5, -2])
        expect(Array.from(readLittleEndian(bytes, 16, 2, 'i32', allowView))).toEqual([1, -2])
      }
      expect(Array.from(readLittleEndianByValue(bytes, 0, 2, 'f64'))).toEqual([1.5, -2])
      expect(Array.from(readLittleEndianByValue(bytes, 16, 2, 'i32'))).toEqual([1, -2])
      // A copy shares no memory with the bytes: changing them leaves it as it was.
      const copy = readLittleEndian(bytes, 0, 2, 'f64', false)
      bytes[7] = 0
      expect(copy[0]).toBe(1.5)
    })
  }
})
