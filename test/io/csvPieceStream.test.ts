/**
 * The read in pieces streamed to worker threads (src/io/csvPieceStream.ts through the command
 * line's lanes, src/cli/csvLanes.ts): the model is the one-thread model bit for bit and the
 * messages name the same file, line and field, for every element type, nodal and element-nodal
 * stress, whichever thread meets the row. The stream's sizes are made tiny here so that every
 * table is cut into many chunks: cuts next to quoted fields, CR LF and lone CR line ends, comment
 * and blank lines, characters of more than one UTF-8 byte. Seeded; the seed is printed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { readCsvBundle, readCsvBundleInPieces, writeCsvBundle } from '../../src/io/index.ts'
import type { CsvFile } from '../../src/io/index.ts'
import { canBlock, streamCounts, streamSizes } from '../../src/io/csvPieceStream.ts'
import { ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import { BAD_ROWS, editLine, latin1Comment, refusal } from './badRows.ts'
import { startCsvLanes } from '../../src/cli/csvLanes.ts'
import type { CsvLanes } from '../../src/cli/csvLanes.ts'
import { expectSameRead } from './sameModel.ts'
import { boxModel, elementNodalTwin, mixedModel } from './testModels.ts'

const SEED = 20261204
console.log(`csvPieceStream tests: seed ${SEED}`)

const usual = { ...streamSizes }
let one: CsvLanes, two: CsvLanes
beforeAll(async () => {
  Object.assign(streamSizes, { slotBytes: 512, ownSlice: 700 })
  one = startCsvLanes(1)
  two = startCsvLanes(2)
  expect(await one.readyWithin(60_000)).toBe(true)
  expect(await two.readyWithin(60_000)).toBe(true)
}, 70_000)
afterAll(async () => {
  Object.assign(streamSizes, usual)
  await one.close()
  await two.close()
})

/** The read through the stream (or, with `way` "stopped", its fallback to one thread) is the one-thread read, with one and with two lanes. */
async function expectSameStreamed(files: CsvFile[], way: 'read' | 'stopped' = 'read'): Promise<void> {
  const plain = readCsvBundle(files)
  for (const lanes of [one, two]) {
    expect(lanes.lanes.every((l) => l.stream)).toBe(true)
    const before = streamCounts[way]
    const split = await readCsvBundleInPieces(files, {}, lanes.lanes)
    expect(streamCounts[way], `the read ${way === 'read' ? 'went through the stream' : 'stopped and read on one thread'}`).toBe(before + 1)
    expectSameRead(plain, split)
  }
}

const box = { nx: 3, ny: 3, nz: 2, lx: 2, ly: 1, lz: 1 }

describe('streamed pieces give the one-thread model', () => {
  it.each(ELEMENT_TYPE_NAMES.map((t) => [t]))('%s, nodal and element-nodal stress', async (type) => {
    const nodal = boxModel(type, box, true)
    await expectSameStreamed(writeCsvBundle(nodal))
    await expectSameStreamed(writeCsvBundle(elementNodalTwin(nodal)))
  }, 30_000)

  it('several types in one element file (rows of other types than the first kept apart and joined in order)', async () => {
    const mixed = mixedModel(['hex8', 'tet10', 'tet4', 'wedge6'], 1000, true, box)
    await expectSameStreamed(writeCsvBundle(mixed))
    // The types interleaved row by row.
    await expectSameStreamed(writeCsvBundle(mixed).map((f) => {
      if (f.name !== 'elements.csv') return f
      const [head, ...rows] = f.text.trimEnd().split('\n')
      const a = rows.filter((_, i) => i % 2 === 0), b = rows.filter((_, i) => i % 2 === 1).reverse()
      return { name: f.name, text: [head, ...a.flatMap((r, i) => (b[i] ? [r, b[i]] : [r]))].join('\n') + '\n' }
    }))
  }, 30_000)

  it('another dialect: semicolons, decimal commas, CR LF, quoted fields and comment lines at many cuts', async () => {
    // A small linear congruential generator, seeded: where the comment and blank lines go.
    let s = SEED
    const rand = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648)
    const files = writeCsvBundle(mixedModel(['hex8', 'tet10'], 1000, true, box)).map((f) => {
      if (!f.name.endsWith('.csv')) return f
      const lines = f.text.trimEnd().split('\n').flatMap((l, i) => {
        const row = i === 0 ? l.split(',').map((h) => `"${h}"`).join(';') : l.split(',').map((v, j) => (j === 1 && f.name === 'elements.csv' ? `"${v}"` : v.replace('.', ','))).join(';')
        const r = rand()
        return r < 0.05 ? [row, '# a comment with a "quoted, ; part" and µ, é'] : r < 0.08 ? [row, '   '] : [row]
      })
      return { name: f.name, text: lines.join('\r\n') + '\r\n' }
    })
    await expectSameStreamed(files)
  }, 30_000)

  it('lone CR line ends, and a text without a final line end', async () => {
    const files = writeCsvBundle(boxModel('tet4', box, true)).map((f) => (f.name.endsWith('.csv') ? { name: f.name, text: f.text.trimEnd().replace(/\n/g, '\r') } : f))
    await expectSameStreamed(files)
  }, 30_000)

  it('a run of comment lines many slices long, in every piece: the same model, and the lines after it right', async () => {
    // Each slice of this thread's piece once walked the whole run after it (quadratic in its length).
    const block = '# solver banner, kept as a comment\n'.repeat(400)
    const files = writeCsvBundle(boxModel('tet10', box, true)).map((f) => {
      if (!f.name.endsWith('.csv')) return f
      const lines = f.text.trimEnd().split('\n')
      const at = [Math.floor(lines.length / 4), Math.floor(lines.length / 2), lines.length - 1]
      return { name: f.name, text: lines.map((l, i) => (at.includes(i) ? block + l : l)).join('\n') + '\n' }
    })
    await expectSameStreamed(files)
  }, 30_000)

  it('a record longer than a slot: read on one thread instead, the same model', async () => {
    const files = writeCsvBundle(boxModel('hex8', box, true)).map((f) => (f.name === 'stress.csv' ? { name: f.name, text: f.text.replace(/\n(\d+),/, `\n$1${' '.repeat(600)},`) } : f))
    await expectSameStreamed(files, 'stopped')
  }, 30_000)
})

describe('messages name the line a one-thread read names', () => {
  const base = writeCsvBundle(mixedModel(['hex8', 'tet10'], 1000, true, box))
  const lineCount = (name: string) => base.find((f) => f.name === name)!.text.trimEnd().split('\n').length
  // Comment lines early in each file: the lanes' pieces hold lines that are no rows.
  const commented = base.map((f) => (f.name.endsWith('.csv') ? { name: f.name, text: f.text.replace(/\n/, '\n# comment\n\n') } : f))

  it.each([
    ...BAD_ROWS,
    ['displacement.csv', 'a quote left open (a line break inside quotes)', (l: string) => l.replace(/,([^,]*)$/, ',"1.5\n2"')],
  ])('%s: %s, early (a lane\'s piece) and late (this thread\'s)', async (name, _, change) => {
    for (const at of [5, lineCount(name) - 2]) {
      const files = editLine(commented, name, at + 2, change)
      const plain = await refusal(() => readCsvBundle(files))
      expect(plain.where.file).toBe(name)
      for (const lanes of [one, two]) {
        const before = streamCounts.read
        const split = await refusal(() => readCsvBundleInPieces(files, {}, lanes.lanes))
        expect(streamCounts.read).toBe(before + 1)
        expect(split.message).toBe(plain.message)
        expect(split.where).toEqual(plain.where)
        expect(split.kind).toBe(plain.kind)
      }
    }
  }, 30_000)

  it.each([['nodes.csv'], ['elements.csv'], ['stress.csv']])('%s with a header and no rows', async (name) => {
    const files = commented.map((f) => (f.name === name ? { name, text: f.text.slice(0, f.text.indexOf('\n') + 1) } : f))
    const plain = await refusal(() => readCsvBundle(files))
    const split = await refusal(() => readCsvBundleInPieces(files, {}, two.lanes))
    expect(split.message).toBe(plain.message)
    expect(split.where).toEqual(plain.where)
  }, 30_000)

  it('a comment that is not UTF-8, in each piece: the same line and the same byte offset in the file', async () => {
    // Past the first 64 KiB, which the dialect's detection decodes whole on this thread.
    const big = writeCsvBundle(boxModel('tet4', { nx: 14, ny: 14, nz: 14, lx: 1, ly: 1, lz: 1 }, true))
    const n = big.find((f) => f.name === 'stress.csv')!.text.trimEnd().split('\n').length
    for (const at of [Math.floor(n / 4), Math.floor(n / 2), n - 2]) {
      const files = latin1Comment(big, 'stress.csv', at)
      const plain = await refusal(() => readCsvBundle(files))
      expect(plain.kind).toBe('encoding')
      expect(plain.where.line).toBe(at)
      for (const lanes of [one, two]) {
        const split = await refusal(() => readCsvBundleInPieces(files, {}, lanes.lanes))
        expect(split.message).toBe(plain.message)
        expect(split.where).toEqual(plain.where)
      }
    }
  }, 30_000)

  it('a node id twice, once in each piece: the message names both lines', async () => {
    const n = lineCount('nodes.csv')
    const second = base.find((f) => f.name === 'nodes.csv')!.text.split('\n')[n - 2].split(',')[0]
    const files = editLine(commented, 'nodes.csv', 5, (l) => l.replace(/^\d+/, second))
    const plain = await refusal(() => readCsvBundle(files))
    expect(plain.kind).toBe('duplicate-id')
    const split = await refusal(() => readCsvBundleInPieces(files, {}, two.lanes))
    expect(split.message).toBe(plain.message)
    expect(split.where).toEqual(plain.where)
  }, 30_000)
})

describe('the way taken', () => {
  it('a thread that may block (here, a test worker) streams', () => {
    expect(canBlock()).toBe(true)
  })
})
