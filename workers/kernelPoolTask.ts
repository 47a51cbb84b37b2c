/**
 * What one pool worker computes: the element balance of one contiguous range of elements (the
 * part carries the whole node arrays and stress values, shared views or copies, and the range's
 * blocks with their stress rows; element 0 of the part is global element `from` of the model).
 * Node-parallel kernels need no part: their input is a subarray of the nodal stress.
 */
import type { ElementBlock, Mesh, Vec3 } from '../src/model/model.ts'
import type { StressField } from '../src/model/stressField.ts'
import { allocateElementBalance, computeElementBalance } from '../src/mechanics/balanceAudit.ts'
import type { ElementBalance } from '../src/mechanics/types.ts'

export interface BalancePart {
  readonly coords: Float64Array
  readonly nodeIds: Int32Array
  /** The stress field on the part: `rows[b]` beside `blocks[b]` (for nodal stress, its `conn`). */
  readonly stress: StressField
  readonly blocks: readonly ElementBlock[]
  readonly elementCount: number
  readonly bodyForce: Vec3
}

/** Single-precision output views of one part: written in place when they live in shared memory. */
export type BalanceOut = ElementBalance

export function partMesh(part: BalancePart): Mesh {
  return { coords: part.coords, nodeIds: part.nodeIds, blocks: part.blocks, nodeCount: part.coords.length / 3, elementCount: part.elementCount }
}

/** Runs the audit on the part; writes into `out` when given, else returns fresh single-precision arrays. */
export function balancePart(part: BalancePart, out?: BalanceOut): ElementBalance {
  const target = out ?? allocateElementBalance(part.elementCount, 'single')
  return computeElementBalance(target, partMesh(part), part.stress, part.bodyForce)
}

