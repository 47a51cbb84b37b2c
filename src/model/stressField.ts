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
import type { Mesh, Model } from './model.ts'

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
 * The stress field every element-based kernel reads for `model`: its element-nodal field when the
 * input gave one, else its nodal stress seen through the connectivity.
 */
export function modelStressField(model: Model): StressField {
  return model.stressField ?? nodalStressField(model.mesh, model.stress)
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
 * stress the values themselves; for element-nodal stress the average within each part
 * (partAveragedStress).
 */
export function nodalDisplayStress(field: StressField, mesh?: Mesh): Float64Array {
  if (field.layout === 'nodal') return field.values
  if (!mesh) throw new Error('element-nodal stress needs its mesh to be averaged to nodes')
  return partAveragedStress(mesh, field)
}

/**
 * The part of each node for display: the lowest part number among the elements that use it
 * (Int32Array(N), -1 for a node no element uses). Where parts meet, a node has one value per
 * part; the display shows one of them, the lowest part's, rather than a blend that is the
 * stress of neither material. Element-based kernels never use it: they read each element's own.
 */
export function displayPartOfNodes(mesh: Mesh): Int32Array {
  const out = new Int32Array(mesh.nodeCount).fill(-1)
  for (const b of mesh.blocks) {
    const conn = b.conn, part = b.part
    const nn = conn.length / Math.max(1, b.ids.length)
    for (let i = 0; i < conn.length; i++) {
      const p = part ? part[(i / nn) | 0] : 0
      const n = conn[i]
      if (out[n] < 0 || p < out[n]) out[n] = p
    }
  }
  return out
}

/**
 * Display stress of an element-nodal field: Float64Array(6·N), at each node the mean of the
 * element-node values of the elements of the node's display part (displayPartOfNodes) that use
 * it; zero at nodes no element uses. Two passes over the element-nodes, no other allocation.
 */
export function partAveragedStress(mesh: Mesh, field: StressField, out: Float64Array = new Float64Array(6 * mesh.nodeCount)): Float64Array {
  const N = mesh.nodeCount
  const nodePart = displayPartOfNodes(mesh)
  const count = new Int32Array(N)
  out.fill(0)
  const v = field.values
  mesh.blocks.forEach((b, k) => {
    const conn = b.conn, part = b.part, rows = field.rows[k]
    const nn = conn.length / Math.max(1, b.ids.length)
    for (let i = 0; i < conn.length; i++) {
      const n = conn[i]
      // Only the elements of the node's display part contribute.
      if ((part ? part[(i / nn) | 0] : 0) !== nodePart[n]) continue
      const r = 6 * rows[i], o = 6 * n
      out[o] += v[r]; out[o + 1] += v[r + 1]; out[o + 2] += v[r + 2]
      out[o + 3] += v[r + 3]; out[o + 4] += v[r + 4]; out[o + 5] += v[r + 5]
      count[n]++
    }
  })
  for (let n = 0; n < N; n++) {
    const c = count[n]
    if (c > 1) {
      const o = 6 * n, w = 1 / c
      out[o] *= w; out[o + 1] *= w; out[o + 2] *= w; out[o + 3] *= w; out[o + 4] *= w; out[o + 5] *= w
    }
  }
  return out
}
