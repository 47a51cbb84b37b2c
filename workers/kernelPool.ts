/**
 * A small pool of workers that the engine worker splits element-parallel kernels across (today:
 * the element balance audit, the largest O(elements) job of a load that needs no faces). The
 * engine starts one worker per core but its own, so the audit runs beside the engine's own
 * stages (boundary faces, tractions, invariants) and every core has one thread to run.
 *
 * Two ways to hand over the model:
 * - `shared`: where the page is cross-origin isolated, the node and element arrays are copied
 *   once into SharedArrayBuffers; every worker reads them in place and writes its slice of one
 *   shared output. Nothing else is copied.
 * - `copy`: elsewhere (a page opened from a file, a server without the isolation headers) each
 *   worker receives copies of the node arrays and its own range of the connectivity, and moves
 *   its results back by transfer.
 * Both give the same bits as the single-threaded kernel (tested). Any failure of a pool worker
 * makes the pool stand down and the kernel run in the engine worker instead: a pool is a speed-up,
 * never a new way to fail.
 */
import { meshSlice, splitElementRanges } from '../src/model/meshRange.ts'
import type { ElementBlock, Mesh, Vec3 } from '../src/model/model.ts'
import { allocateElementBalance, computeElementBalance } from '../src/mechanics/balanceAudit.ts'
import type { ElementBalance } from '../src/mechanics/types.ts'
import type { BalanceOut, BalancePart } from './kernelPoolTask.ts'

export type Sharing = 'shared' | 'copy'

/** One pool worker as the pool sees it (a comlink proxy in the browser, a direct call in tests). */
export interface PoolEndpoint {
  balance(part: BalancePart, out?: BalanceOut): Promise<ElementBalance | null>
  terminate(): void
}

/** How the last kernel ran: on how many pool workers (0: in the calling thread), and how the model was handed over. */
export interface PoolRun {
  readonly workers: number
  readonly sharing: Sharing | 'none'
  /** Why the pool stood down, when it did. */
  readonly fallback?: string
}

/** Below this many elements one thread is faster than handing the work out. */
export const POOL_MIN_ELEMENTS = 50_000

export class KernelPool {
  private endpoints: PoolEndpoint[]
  private broken: string | null = null
  readonly sharing: Sharing

  constructor(size: number, spawn: () => PoolEndpoint, sharing: Sharing) {
    this.endpoints = Array.from({ length: Math.max(0, Math.floor(size)) }, spawn)
    this.sharing = sharing
  }

  get size(): number { return this.broken ? 0 : this.endpoints.length }

  /** Element balance of the whole mesh in single precision, split over the pool where that pays. */
  async elementBalance(mesh: Mesh, stress: Float64Array, bodyForce: Vec3): Promise<{ balance: ElementBalance; run: PoolRun }> {
    const E = mesh.elementCount
    if (this.size < 1 || E < POOL_MIN_ELEMENTS) {
      const balance = computeElementBalance(mesh, stress, bodyForce, allocateElementBalance(E, 'single'))
      return { balance, run: { workers: 0, sharing: 'none', ...(this.broken ? { fallback: this.broken } : {}) } }
    }
    try {
      const balance = this.sharing === 'shared' ? await this.balanceShared(mesh, stress, bodyForce) : await this.balanceCopied(mesh, stress, bodyForce)
      return { balance, run: { workers: this.endpoints.length, sharing: this.sharing } }
    } catch (e) {
      this.standDown(`a pool worker failed (${e instanceof Error ? e.message : String(e)})`)
      const balance = computeElementBalance(mesh, stress, bodyForce, allocateElementBalance(E, 'single'))
      return { balance, run: { workers: 0, sharing: 'none', fallback: this.broken! } }
    }
  }

  private async balanceShared(mesh: Mesh, stress: Float64Array, bodyForce: Vec3): Promise<ElementBalance> {
    const E = mesh.elementCount
    const shared: Mesh = {
      coords: toShared(mesh.coords), nodeIds: toShared(mesh.nodeIds),
      blocks: mesh.blocks.map((b) => ({ ...b, conn: toShared(b.conn), ids: toShared(b.ids), part: null })),
      nodeCount: mesh.nodeCount, elementCount: E,
    }
    const sStress = toShared(stress)
    const out: ElementBalance = {
      residual: new Float32Array(new SharedArrayBuffer(12 * E)),
      gross: new Float32Array(new SharedArrayBuffer(4 * E)),
      indicator: new Float32Array(new SharedArrayBuffer(4 * E)),
    }
    const ranges = splitElementRanges(E, this.endpoints.length)
    await Promise.all(ranges.map(([from, to], i) => this.endpoints[i].balance(
      partOf(meshSlice(shared, from, to), sStress, bodyForce),
      { residual: out.residual.subarray(3 * from, 3 * to), gross: out.gross.subarray(from, to), indicator: out.indicator.subarray(from, to) },
    )))
    return out
  }

  private async balanceCopied(mesh: Mesh, stress: Float64Array, bodyForce: Vec3): Promise<ElementBalance> {
    const E = mesh.elementCount
    const ranges = splitElementRanges(E, this.endpoints.length)
    const parts = await Promise.all(ranges.map(([from, to], i) => {
      // Own copies of the range's connectivity (structured clone copies the node arrays).
      const slice = meshSlice(mesh, from, to)
      const blocks: ElementBlock[] = slice.blocks.map((b) => ({ ...b, conn: b.conn.slice(), ids: b.ids.slice(), part: null }))
      return this.endpoints[i].balance(partOf({ ...slice, blocks }, stress, bodyForce))
    }))
    const out = allocateElementBalance(E, 'single')
    ranges.forEach(([from], i) => {
      const p = parts[i]
      if (!p) throw new Error('a pool worker returned no result')
      out.residual.set(p.residual, 3 * from); out.gross.set(p.gross, from); out.indicator.set(p.indicator, from)
    })
    return out
  }

  private standDown(why: string): void {
    this.broken = why
    this.dispose()
  }

  dispose(): void {
    for (const ep of this.endpoints) { try { ep.terminate() } catch { /* already gone */ } }
    this.endpoints = []
  }
}

function partOf(slice: Mesh, stress: Float64Array, bodyForce: Vec3): BalancePart {
  return { coords: slice.coords, nodeIds: slice.nodeIds, stress, blocks: slice.blocks, elementCount: slice.elementCount, bodyForce }
}

function toShared<T extends Float64Array | Int32Array>(a: T): T {
  if (a.buffer instanceof SharedArrayBuffer) return a
  const Ctor = a.constructor as { new (b: SharedArrayBuffer): T }
  const s = new Ctor(new SharedArrayBuffer(a.byteLength))
  s.set(a)
  return s
}
