/**
 * A pool worker: computes element-parallel kernels for one range of elements at a time and keeps
 * nothing between calls. With shared memory the result is written in place and nothing comes
 * back; otherwise the arrays are moved back by transfer.
 */
import * as Comlink from 'comlink'
import { balancePart } from './kernelPoolTask.ts'
import type { BalanceOut, BalancePart } from './kernelPoolTask.ts'
import type { ElementBalance } from '../src/mechanics/types.ts'

const api = {
  balance(part: BalancePart, out?: BalanceOut): ElementBalance | null {
    const r = balancePart(part, out)
    if (out) return null
    return Comlink.transfer(r, [r.residual.buffer, r.gross.buffer, r.indicator.buffer] as ArrayBuffer[])
  },
}

export type PoolWorkerApi = typeof api

Comlink.expose(api)
