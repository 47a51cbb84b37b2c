/**
 * A small pool of workers that the engine worker splits element- and node-parallel kernels across
 * (today: the element balance audit and the nodal invariants, the jobs of a load that need no
 * boundary faces). The
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
import { meshSlice, splitRanges } from '../src/model/meshRange.ts'
import type { ElementChunks } from '../src/mechanics/elementChunks.ts'
import type { ElementBlock, Mesh, Vec3 } from '../src/model/model.ts'
import { nodalStressField, stressFieldSlice } from '../src/model/stressField.ts'
import type { StressField } from '../src/model/stressField.ts'
import { allocateElementBalance, computeElementBalance } from '../src/mechanics/balanceAudit.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../src/mechanics/invariants.ts'
import type { ElementBalance, NodalInvariants } from '../src/mechanics/types.ts'
import { indicatorSpread } from '../src/mechanics/balanceVerdict.ts'
import type { IndicatorSpread } from '../src/mechanics/balanceVerdict.ts'
import type { BalanceOut, BalancePart } from './kernelPoolTask.ts'
import type { PieceJob, PieceLane, PieceOutcome } from '../src/io/csvPieces.ts'
import type { StreamLane, StreamResult, StreamSetup } from '../src/io/csvPieceStream.ts'

export type Sharing = 'shared' | 'copy'

/** One pool worker as the pool sees it (a comlink proxy in the browser, a direct call in tests). */
export interface PoolEndpoint {
  /** Resolves once the worker runs (its script loaded): answers a call. */
  ping(): Promise<boolean>
  balance(part: BalancePart, out?: BalanceOut): Promise<ElementBalance | null>
  invariants(stress: Float64Array, out?: NodalInvariants): Promise<NodalInvariants | null>
  /** The spread of the element indicator (balanceVerdict.ts), read in place from shared memory. */
  spread?(indicator: Float32Array | Float64Array, count: number): Promise<IndicatorSpread>
  /** Reads pieces of CSV tables (src/io/csvPieces.ts); the jobs' bytes move by transfer. */
  csvPieces?(jobs: readonly PieceJob[]): Promise<readonly PieceOutcome[]>
  /** The element chunks of a mesh in shared memory (src/mechanics/elementChunks.ts); the chunks' arrays move by transfer. */
  chunks?(mesh: Mesh): Promise<ElementChunks>
  /** Reads pieces of CSV tables streamed to it through shared memory (src/io/csvPieceStream.ts); blocks the worker while it reads. */
  csvStream?(setup: StreamSetup): Promise<StreamResult>
  terminate(): void
}

/** How the last kernel ran: on how many pool workers (0: in the calling thread), and how the model was handed over. */
export interface PoolRun {
  readonly workers: number
  readonly sharing: Sharing | 'none'
  /** Why the pool stood down, when it did. */
  readonly fallback?: string
}

/** Below this many elements (nodes) one thread is faster than handing the work out. */
export const POOL_MIN_ELEMENTS = 50_000
export const POOL_MIN_NODES = 10_000

export class KernelPool {
  private endpoints: PoolEndpoint[]
  private broken: string | null = null
  /** Shared copies of the model's arrays, by the array they copy (weakly: a dropped model frees them). */
  private sharedCopies = new WeakMap<object, Float64Array | Int32Array>()
  readonly sharing: Sharing

  /**
   * Settles when every worker answers. A nested worker loads its script through its parent's event
   * loop, which a long synchronous stage blocks: a job sent to a worker that is not up yet would
   * wait for the engine's next pause, so callers wait for this first.
   */
  readonly ready: Promise<void>

  constructor(size: number, spawn: () => PoolEndpoint, sharing: Sharing) {
    this.endpoints = Array.from({ length: Math.max(0, Math.floor(size)) }, spawn)
    this.sharing = sharing
    this.ready = Promise.all(this.endpoints.map((ep) => ep.ping())).then(
      () => undefined,
      (e: unknown) => this.standDown(`a pool worker did not start (${e instanceof Error ? e.message : String(e)})`),
    )
  }

  get size(): number { return this.broken ? 0 : this.endpoints.length }

  /** True when the pool is up within `ms` milliseconds (a worker that hangs must not hang a load). */
  async upWithin(ms: number): Promise<boolean> {
    let timer: ReturnType<typeof setTimeout> | undefined
    const late = new Promise<false>((r) => { timer = setTimeout(() => r(false), ms) })
    const up = await Promise.race([this.ready.then(() => true), late])
    clearTimeout(timer)
    return up && this.size > 0
  }

  /** Element balance of the whole mesh in single precision, split over the pool where that pays. */
  async elementBalance(mesh: Mesh, stress: StressField, bodyForce: Vec3): Promise<{ value: ElementBalance; run: PoolRun }> {
    const serial = (): ElementBalance => computeElementBalance(allocateElementBalance(mesh.elementCount, 'single'), mesh, stress, bodyForce)
    if (mesh.elementCount < POOL_MIN_ELEMENTS) return this.runSerial(serial)
    return this.runSplit(serial, () => (this.sharing === 'shared' ? this.balanceShared(mesh, stress, bodyForce) : this.balanceCopied(mesh, stress, bodyForce)))
  }

  /** Principal stresses and the other invariants of every node, split by node range. */
  async nodalInvariants(stress: Float64Array): Promise<{ value: NodalInvariants; run: PoolRun }> {
    const N = stress.length / 6
    const serial = (): NodalInvariants => computeNodalInvariants(allocateNodalInvariants(N), stress)
    if (N < POOL_MIN_NODES) return this.runSerial(serial)
    return this.runSplit(serial, () => (this.sharing === 'shared' ? this.invariantsShared(stress) : this.invariantsCopied(stress)))
  }

  /**
   * The spread of an element indicator (median, 95th percentile, largest, the least balanced),
   * on a pool worker when the indicator is in shared memory (the pool's balance), so the caller
   * goes on meanwhile; else, or on any failure, here. Same function, same values.
   */
  async indicatorSpread(indicator: Float32Array | Float64Array, count: number): Promise<IndicatorSpread> {
    const ep = this.endpoints[0]
    if (this.size < 1 || !ep?.spread || !(indicator.buffer instanceof SharedArrayBuffer)) return indicatorSpread(indicator, count)
    try {
      return await ep.spread(indicator, count)
    } catch (e) {
      this.standDown(`a pool worker failed (${e instanceof Error ? e.message : String(e)})`)
      return indicatorSpread(indicator, count)
    }
  }

  /**
   * The element chunks of a mesh whose arrays are shared (sharedMesh), built on a pool worker
   * while the engine goes on; null without shared memory or a worker that can, or on a failure
   * (the engine then builds them itself when it needs them).
   */
  async elementChunks(mesh: Mesh): Promise<ElementChunks | null> {
    const ep = this.endpoints[0]
    if (this.size < 1 || this.sharing !== 'shared' || !ep?.chunks || !(mesh.coords.buffer instanceof SharedArrayBuffer)) return null
    try {
      const blocks = mesh.blocks.map((b) => ({ ...b, part: null }))
      return await ep.chunks({ ...mesh, blocks })
    } catch {
      return null
    }
  }

  /**
   * One lane per pool worker for reading a CSV bundle in pieces (readCsvBundleInPieces); none
   * when the pool stood down. With shared memory the lanes take the pieces streamed
   * (csvPieceStream.ts: no model-size copy). A worker that fails there makes the pool stand
   * down, and the read runs on one thread.
   */
  csvLanes(): PieceLane[] {
    if (this.size < 1) return []
    const failed = (e: unknown) => this.standDown(`a pool worker failed reading CSV (${e instanceof Error ? e.message : String(e)})`)
    return this.endpoints.filter((ep) => ep.csvPieces).map((ep) => {
      const lane = async (jobs: readonly PieceJob[]) => {
        try {
          return await ep.csvPieces!(jobs)
        } catch (e) {
          failed(e)
          throw e
        }
      }
      if (this.sharing !== 'shared' || !ep.csvStream) return lane
      const stream: StreamLane = async (setup) => {
        try {
          return await ep.csvStream!(setup)
        } catch (e) {
          failed(e)
          throw e
        }
      }
      return Object.assign(lane, { stream })
    })
  }

  private runSerial<T>(serial: () => T): { value: T; run: PoolRun } {
    return { value: serial(), run: { workers: 0, sharing: 'none', ...(this.broken ? { fallback: this.broken } : {}) } }
  }

  /** The split run, or on any failure of a pool worker the serial one (and the pool stands down). */
  private async runSplit<T>(serial: () => T, split: () => Promise<T>): Promise<{ value: T; run: PoolRun }> {
    if (this.size < 1) return this.runSerial(serial)
    try {
      const value = await split()
      return { value, run: { workers: this.endpoints.length, sharing: this.sharing } }
    } catch (e) {
      this.standDown(`a pool worker failed (${e instanceof Error ? e.message : String(e)})`)
      return this.runSerial(serial)
    }
  }

  private async invariantsShared(stress: Float64Array): Promise<NodalInvariants> {
    const N = stress.length / 6
    const shared = this.shared(stress)
    const out: NodalInvariants = {
      principal: sharedF64(3 * N), directions: sharedF64(9 * N), vonMises: sharedF64(N), tresca: sharedF64(N), mean: sharedF64(N),
    }
    const ranges = splitRanges(N, this.endpoints.length)
    await Promise.all(ranges.map(([a, b], i) => this.endpoints[i].invariants(shared.subarray(6 * a, 6 * b), nodeRangeOf(out, a, b))))
    return out
  }

  private async invariantsCopied(stress: Float64Array): Promise<NodalInvariants> {
    const N = stress.length / 6
    const ranges = splitRanges(N, this.endpoints.length)
    const parts = await Promise.all(ranges.map(([a, b], i) => this.endpoints[i].invariants(stress.slice(6 * a, 6 * b))))
    const out = allocateNodalInvariants(N)
    ranges.forEach(([a], i) => {
      const p = parts[i]
      if (!p) throw new Error('a pool worker returned no result')
      out.principal.set(p.principal, 3 * a); out.directions.set(p.directions, 9 * a)
      out.vonMises.set(p.vonMises, a); out.tresca.set(p.tresca, a); out.mean.set(p.mean, a)
    })
    return out
  }

  /**
   * The mesh with its node and element arrays replaced by their shared copies (those the load's
   * balance made; made now where missing); the parts stay. The engine keeps this mesh in place of
   * its own arrays, which then free: no second copy is held, and a later job on the mesh (the
   * balance of another load case) shares it as it is, copying only the case's stress. Without
   * shared memory the mesh itself.
   */
  sharedMesh(mesh: Mesh): Mesh {
    if (this.sharing !== 'shared') return mesh
    return {
      ...mesh, coords: this.shared(mesh.coords), nodeIds: this.shared(mesh.nodeIds),
      blocks: mesh.blocks.map((b) => ({ ...b, conn: this.shared(b.conn), ids: this.shared(b.ids) })),
    }
  }

  /** Drops the shared copies (the jobs of a load are done; they would double the model's memory). */
  forget(): void {
    this.sharedCopies = new WeakMap()
  }

  /** A shared copy of an array, made once per array (the balance and the invariants share the stress). */
  private shared<T extends Float64Array | Int32Array>(a: T): T {
    if (a.buffer instanceof SharedArrayBuffer) return a
    let s = this.sharedCopies.get(a) as T | undefined
    if (!s) {
      const Ctor = a.constructor as { new (b: SharedArrayBuffer): T }
      s = new Ctor(new SharedArrayBuffer(a.byteLength))
      s.set(a)
      this.sharedCopies.set(a, s)
    }
    return s
  }

  private async balanceShared(mesh: Mesh, stress: StressField, bodyForce: Vec3): Promise<ElementBalance> {
    const E = mesh.elementCount
    const shared: Mesh = {
      coords: this.shared(mesh.coords), nodeIds: this.shared(mesh.nodeIds),
      blocks: mesh.blocks.map((b) => ({ ...b, conn: this.shared(b.conn), ids: this.shared(b.ids), part: null })),
      nodeCount: mesh.nodeCount, elementCount: E,
    }
    // Nodal rows are the connectivity: the copy made for it above serves them too.
    const sStress: StressField = { values: this.shared(stress.values), rows: stress.rows.map((r) => this.shared(r)), layout: stress.layout }
    const out: ElementBalance = {
      residual: new Float32Array(new SharedArrayBuffer(12 * E)),
      gross: new Float32Array(new SharedArrayBuffer(4 * E)),
      indicator: new Float32Array(new SharedArrayBuffer(4 * E)),
    }
    const ranges = splitRanges(E, this.endpoints.length)
    await Promise.all(ranges.map(([from, to], i) => this.endpoints[i].balance(
      partOf(shared, from, to, sStress, bodyForce),
      { residual: out.residual.subarray(3 * from, 3 * to), gross: out.gross.subarray(from, to), indicator: out.indicator.subarray(from, to) },
    )))
    return out
  }

  private async balanceCopied(mesh: Mesh, stress: StressField, bodyForce: Vec3): Promise<ElementBalance> {
    const E = mesh.elementCount
    const ranges = splitRanges(E, this.endpoints.length)
    const parts = await Promise.all(ranges.map(([from, to], i) => {
      // Own copies of the range's connectivity and stress rows (structured clone copies the node
      // arrays and the stress values). Nodal rows are the copied connectivity itself, which
      // structured clone sends once.
      const slice = meshSlice(mesh, from, to)
      const blocks: ElementBlock[] = slice.blocks.map((b) => ({ ...b, conn: b.conn.slice(), ids: b.ids.slice(), part: null }))
      const own: Mesh = { ...slice, blocks }
      const field: StressField = stress.layout === 'nodal'
        ? nodalStressField(own, stress.values)
        : { ...stress, rows: stressFieldSlice(stress, mesh, slice, from).rows.map((r) => r.slice()) }
      return this.endpoints[i].balance(partAs(own, field, bodyForce))
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

/** The part of elements [from, to) of `mesh` with its stress rows. */
function partOf(mesh: Mesh, from: number, to: number, stress: StressField, bodyForce: Vec3): BalancePart {
  const slice = meshSlice(mesh, from, to)
  return partAs(slice, stressFieldSlice(stress, mesh, slice, from), bodyForce)
}

function partAs(slice: Mesh, stress: StressField, bodyForce: Vec3): BalancePart {
  return { coords: slice.coords, nodeIds: slice.nodeIds, stress, blocks: slice.blocks, elementCount: slice.elementCount, bodyForce }
}

const sharedF64 = (n: number): Float64Array => new Float64Array(new SharedArrayBuffer(8 * n))

function nodeRangeOf(r: NodalInvariants, a: number, b: number): NodalInvariants {
  return {
    principal: r.principal.subarray(3 * a, 3 * b), directions: r.directions.subarray(9 * a, 9 * b),
    vonMises: r.vonMises.subarray(a, b), tresca: r.tresca.subarray(a, b), mean: r.mean.subarray(a, b),
  }
}
