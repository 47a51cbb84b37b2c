/**
 * Reading a bundle in pieces (src/io/recordSplit.ts, src/io/csvPieces.ts): the cut never falls
 * inside a quoted field (RFC 4180, which allows line breaks, separators and doubled quotes inside
 * quotes), and the model read in pieces is the one-thread model bit for bit, with the same
 * messages (file, line, field). The lanes here run in this thread, with every job and result
 * passed through structuredClone as a worker's message would be. Seeded; the seed is printed.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { readCsvBundle, readCsvBundleInPieces, writeCsvBundle } from '../../src/io/index.ts'
import { jobBuffers, readPiece } from '../../src/io/csvPieces.ts'
import type { PieceLane } from '../../src/io/csvPieces.ts'
import { LineEndCounter, lineEndsIn, splitAtRecords } from '../../src/io/recordSplit.ts'
import { elementType } from '../../src/model/elementTypes.ts'
import type { Model } from '../../src/model/model.ts'
import { BAD_ROWS, editLine, latin1Comment, refusal } from './badRows.ts'
import { expectSameModel, expectSameRead } from './sameModel.ts'

/** The splitter works on UTF-8 bytes, as files arrive (these texts are ASCII: positions agree). */
const enc = (s: string) => new TextEncoder().encode(s)
import { boxModel, elementNodalTwin, mixedModel } from './testModels.ts'

const SEED = 20261203
console.log(`csvPieces property tests: fast-check seed ${SEED}`)

/** A lane in this thread; jobs and results cross a structured clone as they would cross a worker. */
const cloneLane: PieceLane = async (jobs) => structuredClone(structuredClone(jobs, { transfer: jobBuffers(jobs) }).map(readPiece))
const lanes = (n: number): PieceLane[] => Array.from({ length: n }, () => cloneLane)

/** Record starts of an RFC 4180 text (line ends outside quotes), by a plain character walk. */
function recordStarts(text: string, from: number): Set<number> {
  const out = new Set<number>([from])
  let inside = false
  for (let i = from; i < text.length; i++) {
    const c = text[i]
    if (c === '"') inside = !inside
    else if (c === '\n' && !inside) out.add(i + 1)
  }
  return out
}

describe('the cut falls between records', () => {
  it('never inside a quoted field (line breaks, separators and doubled quotes inside quotes)', () => {
    const plain = fc.stringMatching(/^[0-9a-z.]{0,6}$/)
    const quoted = fc.array(fc.constantFrom('a', '1', ',', ';', '\n', '\r\n', '""', ' '), { maxLength: 12 }).map((p) => `"${p.join('')}"`)
    const record = fc.array(fc.oneof(plain, quoted), { minLength: 1, maxLength: 5 }).map((f) => f.join(','))
    fc.assert(fc.property(fc.array(record, { minLength: 1, maxLength: 60 }), fc.integer({ min: 2, max: 6 }), fc.boolean(), (records, pieces, crlf) => {
      const text = 'id,x\n' + records.join(crlf ? '\r\n' : '\n') + '\n'
      const from = 5
      const starts = recordStarts(text, from)
      const split = splitAtRecords(enc(text), from, 2, pieces)
      expect(split[0].start).toBe(from)
      expect(split[split.length - 1].end).toBe(text.length)
      split.forEach((p, k) => {
        if (k > 0) expect(p.start).toBe(split[k - 1].end)
        expect(starts.has(p.start), `piece ${k} starts inside a quoted field`).toBe(true)
        expect(p.line).toBe(2 + lineEndsIn(enc(text), from, p.start))
      })
      expect(split.length).toBeLessThanOrEqual(pieces)
    }), { seed: SEED, numRuns: 400 })
  })

  it('counts line ends four bytes at a time as one byte at a time does, over consecutive ranges of an unaligned view', () => {
    const naive = (b: Uint8Array, x: number, y: number) => {
      let n = 0
      for (let i = x; i < y; i++) if (b[i] === 10 || (b[i] === 13 && b[i + 1] !== 10)) n++
      return n
    }
    fc.assert(fc.property(fc.array(fc.constantFrom(10, 13, 97, 44, 0x8a, 0x0a0a), { maxLength: 200 }), fc.integer({ min: 0, max: 3 }), fc.array(fc.nat(60), { maxLength: 6 }), (codes, shift, steps) => {
      const buf = new Uint8Array(codes.length + shift)
      codes.forEach((c, i) => { buf[shift + i] = c & 0xff })
      const bytes = buf.subarray(shift)
      const counter = new LineEndCounter(bytes)
      let a = 0
      for (const s of [...steps, bytes.length]) {
        const b = Math.min(bytes.length, a + s)
        expect(counter.count(a, b)).toBe(naive(bytes, a, b))
        a = b
      }
      expect(lineEndsIn(bytes, 0, bytes.length)).toBe(naive(bytes, 0, bytes.length))
    }), { seed: SEED, numRuns: 500 })
  })

  it('counts lines as the reader does (LF, CR LF, a lone CR) and keeps a text without line ends whole', () => {
    const text = 'h\n1\r\n2\r3\n4\n5\n6\n'
    const split = splitAtRecords(enc(text), 2, 2, 3)
    for (const p of split) expect(p.line).toBe(2 + lineEndsIn(enc(text), 2, p.start))
    expect(lineEndsIn(enc(text), 0, text.length)).toBe(7)
    expect(splitAtRecords(enc('h\n1,2,3'), 2, 2, 4)).toEqual([{ start: 2, end: 7, line: 2 }])
    // An opening quote never closed: no cut after it.
    const open = 'h\n1\n"2\n3\n4\n5\n'
    for (const p of splitAtRecords(enc(open), 2, 2, 4).slice(1)) expect(p.start).toBeLessThanOrEqual(4)
  })
})

/** The cantilever boxes of several types (ids with gaps, parts) and their element-nodal twin. */
function fixtures(): [string, Model][] {
  const nodal = mixedModel(['hex8', 'tet10', 'tet4', 'wedge6'], 1000, true, { nx: 4, ny: 3, nz: 3, lx: 2, ly: 1, lz: 1 })
  return [['nodal', nodal], ['element-nodal', elementNodalTwin(nodal)]]
}

describe('a bundle read in pieces is the one-thread model', () => {
  it.each(fixtures())('%s stress: nodes, elements, stress and displacement bit for bit, 1 to 3 lanes', async (_, model) => {
    const files = writeCsvBundle(model)
    const one = readCsvBundle(files)
    for (const n of [1, 2, 3]) {
      const split = await readCsvBundleInPieces(files, {}, lanes(n))
      expectSameRead(one, split)
      for (const b of one.mesh.blocks) expect(elementType(b.type).nodeCount).toBeGreaterThan(0)
    }
  })

  it('in another dialect (semicolons, decimal commas, CR LF, comment lines, a quoted header)', async () => {
    const files = writeCsvBundle(fixtures()[0][1]).map((f) => {
      if (!f.name.endsWith('.csv')) return f
      const lines = f.text.trimEnd().split('\n').map((l, i) => (i === 0 ? l.split(',').map((h) => `"${h}"`).join(';') : l.replace(/,/g, ';').replace(/\./g, ',')))
      lines.splice(Math.floor(lines.length / 2), 0, '# a comment with a "quote" pair')
      return { name: f.name, text: lines.join('\r\n') + '\r\n' }
    })
    const one = readCsvBundle(files)
    expectSameModel(one, await readCsvBundleInPieces(files, {}, lanes(2)))
  })
})

describe('messages from a later piece name the right line', () => {
  const base = writeCsvBundle(fixtures()[0][1])
  const lineCount = (name: string) => base.find((f) => f.name === name)!.text.trimEnd().split('\n').length

  it.each([
    ...BAD_ROWS,
    ['displacement.csv', 'a quote left open', (l: string) => l.replace(/,([^,]*)$/, ',"1.5')],
  ])('%s: %s, near the end of the file', async (name, _, change) => {
    const at = lineCount(name) - 2
    const files = editLine(base, name, at, change)
    const one = await refusal(() => readCsvBundle(files))
    for (const n of [1, 2]) {
      const split = await refusal(() => readCsvBundleInPieces(files, {}, lanes(n)))
      expect(split.message).toBe(one.message)
      expect(split.where).toEqual(one.where)
      expect(split.kind).toBe(one.kind)
    }
    expect(one.where.line).toBe(at)
    expect(one.where.file).toBe(name)
  })

  it('a comment that is not UTF-8 in a copied piece: the byte offset in the file, not in the copy', async () => {
    // Past the first 64 KiB, which the dialect's detection decodes whole on this thread.
    const big = writeCsvBundle(boxModel('tet4', { nx: 14, ny: 14, nz: 14, lx: 1, ly: 1, lz: 1 }, true))
    const n = big.find((f) => f.name === 'stress.csv')!.text.trimEnd().split('\n').length
    for (const at of [Math.floor(n / 2), n - 2]) {
      const files = latin1Comment(big, 'stress.csv', at)
      const one = await refusal(() => readCsvBundle(files))
      expect(one.kind).toBe('encoding')
      for (const k of [1, 2]) {
        const split = await refusal(() => readCsvBundleInPieces(files, {}, lanes(k)))
        expect(split.message).toBe(one.message)
        expect(split.where).toEqual(one.where)
      }
    }
  })

  it('the first error in file order wins, whichever piece meets it', async () => {
    const twice = editLine(base, 'stress.csv', 3, (l) => l.replace(/,[^,]*$/, ',x')).map((f) => (f.name === 'stress.csv'
      ? { ...f, text: f.text.replace(/\n([^\n]*)\n$/, '\n$1,extra\n') } : f))
    const one = await refusal(() => readCsvBundle(twice))
    const split = await refusal(() => readCsvBundleInPieces(twice, {}, lanes(2)))
    expect(split.message).toBe(one.message)
    expect(one.where.line).toBe(3)
  })

  it('a lane that fails reads the bundle on one thread instead', async () => {
    const dead: PieceLane = async () => { throw new Error('the worker stopped') }
    expectSameModel(readCsvBundle(base), await readCsvBundleInPieces(base, {}, [dead]))
  })
})
