/**
 * A pool worker: computes element- or node-parallel kernels for one range at a time and keeps
 * nothing between calls. With shared memory the result is written in place and nothing comes
 * back; otherwise the arrays are moved back by transfer.
 */
import * as Comlink from 'comlink'
import { allocateNodalInvariants, computeNodalInvariants } from '../src/mechanics/invariants.ts'
import { balancePart } from './kernelPoolTask.ts'
import type { BalanceOut, BalancePart } from './kernelPoolTask.ts'
import type { ElementBalance, NodalInvariants } from '../src/mechanics/types.ts'
import { pieceBuffers, readPiece } from '../src/io/csvPieces.ts'
import { indicatorSpread } from '../src/mechanics/balanceVerdict.ts'
import { buildElementChunks } from '../src/mechanics/elementChunks.ts'
import type { ElementChunks } from '../src/mechanics/elementChunks.ts'
import type { Mesh } from '../src/model/model.ts'
import type { IndicatorSpread } from '../src/mechanics/balanceVerdict.ts'
import type { PieceJob, PieceOutcome } from '../src/io/csvPieces.ts'
import { readStreamedPieces, streamBuffers } from '../src/io/csvPieceStream.ts'
import type { StreamResult, StreamSetup } from '../src/io/csvPieceStream.ts'

const buffersOf = (r: object): ArrayBuffer[] => Object.values(r).map((a: Float64Array | Float32Array) => a.buffer as ArrayBuffer)

const api = {
  ping: (): boolean => true,
  balance(part: BalancePart, out?: BalanceOut): ElementBalance | null {
    const r = balancePart(part, out)
    return out ? null : Comlink.transfer(r, buffersOf(r))
  },
  invariants(stress: Float64Array, out?: NodalInvariants): NodalInvariants | null {
    const r = computeNodalInvariants(out ?? allocateNodalInvariants(stress.length / 6), stress)
    return out ? null : Comlink.transfer(r, buffersOf(r))
  },
  spread(indicator: Float32Array | Float64Array, count: number): IndicatorSpread {
    return indicatorSpread(indicator, count)
  },
  chunks(mesh: Mesh): ElementChunks {
    const c = buildElementChunks(mesh)
    return Comlink.transfer(c, [c.block, c.first, c.count, c.centre, c.half, c.runs].map((a) => a.buffer as ArrayBuffer))
  },
  csvPieces(jobs: readonly PieceJob[]): PieceOutcome[] {
    const out = jobs.map(readPiece)
    return Comlink.transfer(out, out.flatMap(pieceBuffers))
  },
  csvStream(setup: StreamSetup): StreamResult {
    const r = readStreamedPieces(setup)
    return Comlink.transfer(r, streamBuffers(r))
  },
}

export type PoolWorkerApi = typeof api

Comlink.expose(api)
