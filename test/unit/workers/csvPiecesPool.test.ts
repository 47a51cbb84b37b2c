/**
 * The engine's pool as lanes for reading a CSV bundle in pieces (workers/kernelPool.ts
 * `csvLanes`): endpoints in this thread whose messages pass through structuredClone with the
 * jobs' bytes transferred, as comlink sends them. Same model as one thread; a worker that fails
 * makes the pool stand down and the bundle read on one thread.
 */
import { afterAll, describe, expect, it } from 'vitest'
import { KernelPool } from '../../../workers/kernelPool.ts'
import type { PoolEndpoint } from '../../../workers/kernelPool.ts'
import { jobBuffers, readPiece } from '../../../src/io/csvPieces.ts'
import { readModelFiles, readModelFilesInPieces, writeCsvBundle } from '../../../src/io/index.ts'
import { expectSameModel } from '../../io/sameModel.ts'
import { mixedModel } from '../../io/testModels.ts'
import { streamCounts } from '../../../src/io/csvPieceStream.ts'
import { startCsvLanes } from '../../../src/cli/csvLanes.ts'

const none = async () => null
function endpoint(fail = false): PoolEndpoint {
  return {
    ping: async () => true, balance: none, invariants: none, terminate() { /* nothing to end */ },
    csvPieces: async (jobs) => {
      if (fail) throw new Error('the pool worker stopped')
      return structuredClone(structuredClone(jobs, { transfer: jobBuffers(jobs) }).map(readPiece))
    },
  }
}

describe('the pool reads a CSV bundle in pieces', () => {
  const files = writeCsvBundle(mixedModel(['hex8', 'tet10', 'wedge6'], 1000, true, { nx: 3, ny: 3, nz: 2, lx: 2, ly: 1, lz: 1 }))
    .map((f) => ({ name: f.name, data: new TextEncoder().encode(f.text).buffer }))

  it('with one and with three workers: the one-thread model', async () => {
    const one = readModelFiles(files)
    for (const n of [1, 3]) {
      const pool = new KernelPool(n, () => endpoint(), 'copy')
      await pool.ready
      expect(pool.csvLanes()).toHaveLength(n)
      expectSameModel(one, await readModelFilesInPieces(files, {}, pool.csvLanes()))
    }
  })

  it('a worker that fails: the pool stands down and the bundle is read on one thread', async () => {
    const pool = new KernelPool(1, () => endpoint(true), 'copy')
    await pool.ready
    expectSameModel(readModelFiles(files), await readModelFilesInPieces(files, {}, pool.csvLanes()))
    expect(pool.size).toBe(0)
    expect(pool.csvLanes()).toEqual([])
  })
})

describe('with shared memory the pool streams the pieces (csvPieceStream.ts)', () => {
  const files = writeCsvBundle(mixedModel(['hex8', 'tet10', 'wedge6'], 1000, true, { nx: 3, ny: 3, nz: 2, lx: 2, ly: 1, lz: 1 }))
    .map((f) => ({ name: f.name, data: new TextEncoder().encode(f.text).buffer }))
  // Worker threads stand in for the pool's Web Workers: a streamed lane blocks its thread while it reads.
  const threads = startCsvLanes(2)
  afterAll(() => threads.close())
  const streaming = (k: number, fail = false): PoolEndpoint => ({
    ...endpoint(),
    csvStream: async (setup) => {
      if (fail) throw new Error('the pool worker stopped')
      return threads.lanes[k].stream!(setup)
    },
  })

  it('the one-thread model, the pieces streamed; copying pools keep sending pieces', async () => {
    const one = readModelFiles(files)
    const pool = new KernelPool(2, (() => { let k = 0; return () => streaming(k++) })(), 'shared')
    await pool.ready
    expect(pool.csvLanes().every((l) => l.stream)).toBe(true)
    const before = streamCounts.read
    expectSameModel(one, await readModelFilesInPieces(files, {}, pool.csvLanes()))
    expect(streamCounts.read).toBe(before + 1)
    const copying = new KernelPool(1, () => streaming(0), 'copy')
    await copying.ready
    expect(copying.csvLanes().some((l) => l.stream)).toBe(false)
  }, 60_000)

  it('a streamed lane that fails: the pool stands down and the bundle is read on one thread', async () => {
    const pool = new KernelPool(1, () => streaming(0, true), 'shared')
    await pool.ready
    expectSameModel(readModelFiles(files), await readModelFilesInPieces(files, {}, pool.csvLanes()))
    expect(pool.size).toBe(0)
  }, 60_000)
})
