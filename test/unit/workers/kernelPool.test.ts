/**
 * The kernel pool's split and hand-over, with in-process endpoints standing in for the browser's
 * workers (the browser path is measured end to end in test/e2e/large.e2e.test.ts). Reference: the
 * single-threaded kernel in the same storage precision, bit for bit.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { allocateElementBalance, computeElementBalance } from '../../../src/mechanics/balanceAudit.ts'
import { KernelPool, POOL_MIN_ELEMENTS } from '../../../workers/kernelPool.ts'
import type { PoolEndpoint, Sharing } from '../../../workers/kernelPool.ts'
import { balancePart } from '../../../workers/kernelPoolTask.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../../src/mechanics/invariants.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'
import { indicatorSpread, LEAST_BALANCED_COUNT } from '../../../src/mechanics/balanceVerdict.ts'
import { elementNodalCopy } from '../../helpers/elementNodal.ts'
import { buildElementChunks } from '../../../src/mechanics/elementChunks.ts'

/** An endpoint that runs the pool worker's task in this thread; structuredClone mimics postMessage. */
function localEndpoint(log: { shared: number; calls: number; rowCopies?: number }): PoolEndpoint {
  return {
    ping: async () => true,
    async balance(part, out) {
      log.calls++
      if (part.coords.buffer instanceof SharedArrayBuffer) log.shared++
      const copy = structuredClone(part)
      // Nodal rows are the connectivity itself: one array, sent once.
      if (copy.stress.layout === 'nodal') copy.stress.rows.forEach((r, i) => { if (r !== copy.blocks[i].conn) log.rowCopies = (log.rowCopies ?? 0) + 1 })
      const r = balancePart(copy, out)
      return out ? null : r
    },
    async invariants(stress, out) {
      log.calls++
      if (stress.buffer instanceof SharedArrayBuffer) log.shared++
      const copy = structuredClone(stress)
      const r = computeNodalInvariants(out ?? allocateNodalInvariants(copy.length / 6), copy)
      return out ? null : r
    },
    async spread(indicator, count) {
      log.calls++
      if (indicator.buffer instanceof SharedArrayBuffer) log.shared++
      return indicatorSpread(structuredClone(indicator), count)
    },
    terminate() { /* nothing to stop */ },
  }
}

/** Same bytes? (A byte comparison: deep equality over 10^5 numbers is slow.) */
function sameBits(a: ArrayBufferView, b: ArrayBufferView): boolean {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(Buffer.from(b.buffer, b.byteOffset, b.byteLength))
}

const mesh = boxMesh({ nx: 30, ny: 20, nz: 15, lx: 3, ly: 2, lz: 1.5 }, 'tet4') // 54 000 tet4
const stress = stressField(mesh, (x, y, z) => [x * y, z * z, x, y * z, -x * z, 2 * y])
const field = nodalStressField(mesh, stress)
const b: [number, number, number] = [0, 0, -9.81]
const reference = computeElementBalance(allocateElementBalance(mesh.elementCount, 'single'), mesh, field, b)

describe('kernel pool: element balance', () => {
  it('the test mesh is above the size where the pool takes over', () => {
    expect(mesh.elementCount).toBeGreaterThanOrEqual(POOL_MIN_ELEMENTS)
  })

  for (const sharing of ['shared', 'copy'] as Sharing[]) {
    for (const size of [1, 2, 3, 4]) {
      it(`${sharing} hand-over over ${size} workers equals one thread bit for bit`, async () => {
        const log = { shared: 0, calls: 0, rowCopies: 0 }
        const pool = new KernelPool(size, () => localEndpoint(log), sharing)
        const { value: balance, run } = await pool.elementBalance(mesh, field, b)
        expect(run).toEqual({ workers: size, sharing })
        expect(log.calls).toBe(size)
        expect(log.rowCopies).toBe(0)
        expect(log.shared).toBe(sharing === 'shared' ? size : 0)
        expect(balance.indicator).toBeInstanceOf(Float32Array)
        expect(sameBits(balance.residual, reference.residual)).toBe(true)
        expect(sameBits(balance.gross, reference.gross)).toBe(true)
        expect(sameBits(balance.indicator, reference.indicator)).toBe(true)
        // After a load the engine drops the shared copies; the next model is copied afresh.
        pool.forget()
        expect(sameBits((await pool.elementBalance(mesh, field, b)).value.residual, reference.residual)).toBe(true)
        pool.dispose()
      })
    }
  }

  it('keeps the mesh shared after a load: the engine holds the shared copies, and another case\'s balance on them copies only its stress', async () => {
    const log = { shared: 0, calls: 0 }
    const pool = new KernelPool(2, () => localEndpoint(log), 'shared')
    await pool.elementBalance(mesh, field, b)
    const kept = pool.sharedMesh(mesh)
    pool.forget()
    // the same values, in shared memory, the parts and the counts as they were
    expect(kept.coords.buffer).toBeInstanceOf(SharedArrayBuffer)
    expect(sameBits(kept.coords, mesh.coords)).toBe(true)
    kept.blocks.forEach((k, i) => {
      expect(k.conn.buffer).toBeInstanceOf(SharedArrayBuffer)
      expect(sameBits(k.conn, mesh.blocks[i].conn)).toBe(true)
      expect(k.part).toBe(mesh.blocks[i].part)
      expect(k.offset).toBe(mesh.blocks[i].offset)
    })
    // another case (twice the stress): the pool's balance on the kept mesh against one thread on the model's own
    const twice = stress.map((v) => 2 * v)
    const plain = computeElementBalance(allocateElementBalance(mesh.elementCount, 'single'), mesh, nodalStressField(mesh, twice), b)
    const { value } = await pool.elementBalance(kept, nodalStressField(kept, twice), b)
    expect(sameBits(value.residual, plain.residual)).toBe(true)
    expect(sameBits(value.indicator, plain.indicator)).toBe(true)
    // the indicator's spread read on a pool worker from the shared balance: the verdict's own figures
    const before = log.calls
    expect(await pool.indicatorSpread(value.indicator as Float32Array, LEAST_BALANCED_COUNT)).toEqual(indicatorSpread(plain.indicator, LEAST_BALANCED_COUNT))
    expect(log.calls).toBe(before + 1)
    // an indicator not in shared memory is read here
    expect(await pool.indicatorSpread(plain.indicator as Float32Array, 3)).toEqual(indicatorSpread(plain.indicator, 3))
    expect(log.calls).toBe(before + 1)
    // the mesh arrays are shared as they are: asking again gives the very arrays
    expect(pool.sharedMesh(kept).coords).toBe(kept.coords)
    expect(new KernelPool(1, () => localEndpoint(log), 'copy').sharedMesh(mesh)).toBe(mesh)
    pool.dispose()
  })

  for (const sharing of ['shared', 'copy'] as Sharing[]) {
    it(`${sharing} hand-over of element-nodal stress (a shuffled copy of the nodal rows) equals the nodal one thread bit for bit`, async () => {
      const log = { shared: 0, calls: 0 }
      const pool = new KernelPool(3, () => localEndpoint(log), sharing)
      const { value, run } = await pool.elementBalance(mesh, elementNodalCopy(mesh, stress), b)
      expect(run).toEqual({ workers: 3, sharing })
      expect(sameBits(value.residual, reference.residual)).toBe(true)
      expect(sameBits(value.gross, reference.gross)).toBe(true)
      expect(sameBits(value.indicator, reference.indicator)).toBe(true)
      pool.dispose()
    })
  }

  for (const sharing of ['shared', 'copy'] as Sharing[]) {
    it(`${sharing} hand-over of the nodal invariants over 3 workers equals one thread bit for bit`, async () => {
      const log = { shared: 0, calls: 0 }
      const pool = new KernelPool(3, () => localEndpoint(log), sharing)
      const { value, run } = await pool.nodalInvariants(stress)
      expect(run).toEqual({ workers: 3, sharing })
      expect(log.shared).toBe(sharing === 'shared' ? 3 : 0)
      const one = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), stress)
      for (const k of ['principal', 'directions', 'vonMises', 'tresca', 'mean'] as const) expect(sameBits(value[k], one[k]), k).toBe(true)
      pool.dispose()
    })
  }

  it('a worker that never starts makes the pool stand down before any job', async () => {
    const pool = new KernelPool(2, () => ({ ping: () => Promise.reject(new Error('script blocked')), balance: async () => null, invariants: async () => null, terminate() { /* none */ } }), 'shared')
    await pool.ready
    expect(pool.size).toBe(0)
    const { run } = await pool.elementBalance(mesh, field, b)
    expect(run.workers).toBe(0)
    expect(run.fallback).toMatch(/did not start \(script blocked\)/)
  })

  it('a worker that never answers is waited for a bounded time only', async () => {
    const pool = new KernelPool(1, () => ({ ping: () => new Promise<boolean>(() => undefined), balance: async () => null, invariants: async () => null, terminate() { /* none */ } }), 'copy')
    expect(await pool.upWithin(20)).toBe(false)
  })

  it('a small model runs on one thread without calling the pool', async () => {
    const log = { shared: 0, calls: 0 }
    const small = boxMesh({ nx: 4, ny: 3, nz: 2, lx: 1, ly: 1, lz: 1 }, 'hex8')
    const pool = new KernelPool(2, () => localEndpoint(log), 'shared')
    const { run } = await pool.elementBalance(small, nodalStressField(small, stressField(small, () => [1, 0, 0, 0, 0, 0])), [0, 0, 0])
    expect(run).toEqual({ workers: 0, sharing: 'none' })
    expect(log.calls).toBe(0)
  })

  it('a failing worker makes the pool stand down; the result still comes, from one thread', async () => {
    let terminated = 0
    const fail = (): Promise<never> => Promise.reject(new Error('worker script did not load'))
    const failing: PoolEndpoint = { ping: async () => true, balance: fail, invariants: fail, terminate: () => { terminated++ } }
    const pool = new KernelPool(2, () => failing, 'copy')
    const first = await pool.elementBalance(mesh, field, b)
    expect(first.run.workers).toBe(0)
    expect(first.run.fallback).toMatch(/worker script did not load/)
    expect(sameBits(first.value.indicator, reference.indicator)).toBe(true)
    expect(terminated).toBe(2)
    expect(pool.size).toBe(0)
    const again = await pool.elementBalance(mesh, field, b)
    expect(again.run.fallback).toMatch(/worker script did not load/)
  })
})

describe('kernel pool: element chunks', () => {
  const chunksEndpoint = (): PoolEndpoint => ({
    ...localEndpoint({ shared: 0, calls: 0 }),
    chunks: async (m) => buildElementChunks(structuredClone(m)),
  })

  it('a pool worker builds the chunks of a shared mesh, the same as here', async () => {
    const pool = new KernelPool(1, chunksEndpoint, 'shared')
    const shared = pool.sharedMesh(mesh)
    const got = await pool.elementChunks(shared)
    const want = buildElementChunks(mesh)
    expect(got).not.toBeNull()
    for (const k of ['block', 'first', 'count', 'centre', 'half'] as const) expect(sameBits(got![k], want[k])).toBe(true)
  })

  it('none without shared memory or on a failure: the engine builds them itself', async () => {
    expect(await new KernelPool(1, chunksEndpoint, 'copy').elementChunks(mesh)).toBeNull()
    const failing = new KernelPool(1, () => ({ ...chunksEndpoint(), chunks: async () => { throw new Error('gone') } }), 'shared')
    expect(await failing.elementChunks(failing.sharedMesh(mesh))).toBeNull()
  })
})
