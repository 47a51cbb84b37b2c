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

/**
 * Checks that `field` fits `mesh`: one rows array per block, as long as the block's connectivity.
 * A mismatch is a programming error (the readers build both together), so a RangeError.
 */
export function checkStressField(mesh: Mesh, field: StressField): void {
  const blocks = mesh.blocks
  if (field.rows.length !== blocks.length) {
    throw new RangeError(`the stress field has rows for ${field.rows.length} element blocks, the mesh has ${blocks.length}`)
  }
  for (let b = 0; b < blocks.length; b++) {
    if (field.rows[b].length !== blocks[b].conn.length) {
      throw new RangeError(`block ${b} (${blocks[b].type}): the stress field has ${field.rows[b].length} element-node rows, the connectivity ${blocks[b].conn.length}`)
    }
  }
}

/**
 * The field on the elements [from, to) of `mesh`, matching meshSlice(mesh, from, to) block for
 * block: the values are shared, the rows are views cut like the connectivity. For nodal stress
 * the rows are the slice's own connectivity views, so a slice stays nodal.
 */
export function stressFieldSlice(field: StressField, mesh: Mesh, slice: Mesh, from: number): StressField {
  if (field.layout === 'nodal') return nodalStressField(slice, field.values)
  // meshSlice keeps the blocks in order and drops those outside the range; block offsets of the
  // slice are relative to `from`.
  const rows: Int32Array[] = []
  let b = 0
  for (const s of slice.blocks) {
    const first = from + s.offset
    while (!(first >= mesh.blocks[b].offset && first < mesh.blocks[b].offset + mesh.blocks[b].ids.length)) b++
    const nn = mesh.blocks[b].conn.length / mesh.blocks[b].ids.length
    const a = first - mesh.blocks[b].offset
    rows.push(field.rows[b].subarray(a * nn, (a + s.ids.length) * nn))
  }
  return { values: field.values, rows, layout: field.layout }
}

/**
 * The stress at nodes for display (invariants, colours, the load-patch reference): for nodal
 * stress the values themselves. Element-nodal stress is averaged to nodes within each part; that
 * averaging arrives with the element-nodal readers, and until then such a field is refused here
 * rather than shown wrong.
 */
export function nodalDisplayStress(field: StressField): Float64Array {
  if (field.layout === 'nodal') return field.values
  throw new Error('element-nodal stress has no nodal display values yet (the part-wise nodal average is not written)')
}
