/**
 * A stress field on a mesh, read through an element-node index so that nodal and element-nodal
 * (unaveraged) stress share one code path in every element-based kernel.
 *
 * - `values`: Float64Array(6·R), rows of Cauchy stress xx, yy, zz, xy, yz, xz, tension positive,
 *   model stress units. For nodal stress R = node count and row i is node i.
 * - `rows[b]`: Int32Array(count·nodeCount) beside block b's connectivity: the row of `values` that
 *   holds the stress of element-node (e, a) is rows[b][e·nodeCount + a]. For nodal stress it is the
 *   block's `conn` itself (no copy), so a kernel written against `rows` reads nodal data unchanged.
 * - `layout`: 'nodal' when rows are nodes (rows[b] === conn), 'element-nodal' when every
 *   element-node has its own row.
 */
import type { Mesh } from './model.ts'

export type StressLayout = 'nodal' | 'element-nodal'

export interface StressField {
  readonly values: Float64Array
  readonly rows: readonly Int32Array[]
  readonly layout: StressLayout
}

/** The field of nodal stress `values` (6·N) on `mesh`: rows are the blocks' connectivities. */
export function nodalStressField(mesh: Mesh, values: Float64Array): StressField {
  return { values, rows: mesh.blocks.map((b) => b.conn), layout: 'nodal' }
}
