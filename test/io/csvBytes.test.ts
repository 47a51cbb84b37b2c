/**
 * The CSV readers parse a file's UTF-8 bytes (src/io/csvBytes.ts): the model is the one read from
 * its text, bit for bit; text that is kept or shown (header names, comments, messages) is still
 * decoded as UTF-8 (RFC 3629) and a file in another encoding is refused with its line, wherever
 * the bad byte lies; the record-count estimate that sizes the buffers stays close to the true
 * count (a line count is the reference).
 */
import { describe, expect, it } from 'vitest'
import { readCsvBundle, writeCsvBundle } from '../../src/io/index.ts'
import { estimateRecordCount } from '../../src/io/csvCursor.ts'
import { HEAD_BYTES, detectDialect, detectDialectOfBytes } from '../../src/io/csvDialect.ts'
import { InputError } from '../../src/model/errors.ts'
import { boxModel } from './testModels.ts'
import { expectSameModel } from './sameModel.ts'

const enc = (s: string) => new TextEncoder().encode(s)
const model = boxModel('tet4', { nx: 6, ny: 5, nz: 4, lx: 2, ly: 1, lz: 0.5, y0: -0.5 }, true)
const texts = writeCsvBundle(model)
const large = boxModel('tet10', { nx: 14, ny: 12, nz: 10, lx: 2, ly: 1, lz: 0.5, y0: -0.5 }, true)
const asBytes = (files: readonly { name: string; text: string }[]) => files.map((f) => ({ name: f.name, bytes: enc(f.text) }))

function refusal(read: () => unknown): InputError {
  try {
    read()
  } catch (e) {
    if (e instanceof InputError) return e
    throw e
  }
  throw new Error('read without an error')
}

describe('reading a CSV bundle from its bytes', () => {
  it('gives the model its text gives, also with a BOM, CRLF line ends and characters of several bytes in comments and the header', () => {
    expectSameModel(readCsvBundle(texts), readCsvBundle(asBytes(texts)))
    const varied = texts.map((f) => (f.name.endsWith('.csv')
      ? { ...f, text: '\uFEFF# Spannung σ, Länge in mm — 測試\n' + f.text.replace(/\n/g, '\r\n').replace(/^([^\r]*)\r\n/, '$1\r\n# Kommentar: ü\r\n') }
      : f))
    expectSameModel(readCsvBundle(varied), readCsvBundle(asBytes(varied)))
    expectSameModel(readCsvBundle(texts), readCsvBundle(asBytes(varied)))
  })

  it('refuses bytes that are not UTF-8 with the file and line: in the header, and in a comment far past the first lines', () => {
    const latin1 = (s: string) => Uint8Array.from(s, (c) => c.charCodeAt(0))
    const files = asBytes(texts)
    const header = files.map((f) => (f.name === 'nodes.csv' ? { ...f, bytes: latin1('# Länge\n' + texts.find((t) => t.name === f.name)!.text) } : f))
    const e1 = refusal(() => readCsvBundle(header))
    expect(e1.kind).toBe('encoding')
    expect(e1.message).toMatch(/^nodes\.csv, line 1: the file is not UTF-8 text/)
    // A file longer than the bytes sampled for its dialect, the bad byte in a comment near its end.
    const big = writeCsvBundle(large)
    const lines = big.find((t) => t.name === 'nodes.csv')!.text.split('\n')
    const at = lines.length - 3
    const far = latin1(lines.slice(0, at).join('\n') + '\n# Länge\n' + lines.slice(at).join('\n'))
    expect(far.indexOf(0xe4), 'the bad byte lies past the bytes sampled').toBeGreaterThan(4 * HEAD_BYTES)
    const deep = asBytes(big).map((f) => (f.name === 'nodes.csv' ? { ...f, bytes: far } : f))
    const e2 = refusal(() => readCsvBundle(deep))
    expect(e2.kind).toBe('encoding')
    expect(e2.message).toContain(`nodes.csv, line ${at + 1}:`)
  })

  it('samples the dialect past HEAD_BYTES when the first lines are long, with byte offsets after characters of several bytes', () => {
    const nodes = texts.find((t) => t.name === 'nodes.csv')!.text
    const text = `# ${'ä'.repeat(HEAD_BYTES)}\n# σ\n` + nodes.replace(/,/g, ';')
    const bytes = enc(text)
    const d = detectDialectOfBytes('nodes.csv', bytes, {}, 'numeric', 'nodes')
    const t = detectDialect('nodes.csv', text, {}, 'numeric', 'nodes')
    expect({ ...d, start: 0 }).toEqual({ ...t, start: 0 })
    expect(d.separator).toBe(';')
    expect(d.start).toBe(enc(text.slice(0, t.start)).length)
    expect(bytes[d.start]).toBe('i'.charCodeAt(0))
  })

  it('sizes the buffers from an estimate of the rows: exact for a short file, within 0 to +15 % for a long one', () => {
    const short = enc('a\n1\n2\r\n3\n')
    expect(estimateRecordCount(short)).toBe(5)
    expect(estimateRecordCount(enc('a\r1\r2\r'))).toBe(4)
    let checked = 0
    for (const f of asBytes(writeCsvBundle(large))) {
      if (!f.name.endsWith('.csv') || f.bytes.length < 512 * 1024) continue
      checked++
      let lines = 0
      for (const b of f.bytes) if (b === 10) lines++
      const e = estimateRecordCount(f.bytes)
      expect(e, f.name).toBeGreaterThanOrEqual(lines)
      expect(e, f.name).toBeLessThanOrEqual(1.15 * lines + 16)
    }
    expect(checked, 'files long enough to be sampled').toBeGreaterThanOrEqual(2)
  })
})
