import { elementType } from './elementTypes.ts'
import type { ElementBlock, Mesh } from './model.ts'

/** [from, to) index ranges (elements or nodes). */
export type IndexRange = readonly [number, number]

/**
 * Splits 0..count (elements or nodes) into at most `parts` contiguous ranges of near-equal size
 * (none empty), so parallel kernels can run one range per worker and write straight into their
 * slice of the output.
 */
export function splitRanges(count: number, parts: number): IndexRange[] {
  const n = Math.max(1, Math.min(Math.floor(parts) || 1, count))
  const out: IndexRange[] = []
  for (let i = 0; i < n; i++) {
    const from = Math.floor((i * count) / n), to = Math.floor(((i + 1) * count) / n)
    if (to > from) out.push([from, to])
  }
  return out
}

/**
 * The elements [from, to) of a mesh as a mesh of their own: the same nodes (coords and node ids
 * are shared, not copied), blocks cut to the range with views into their arrays, and element
 * index 0 of the result = global element `from` of the input. A per-element kernel run on the
 * slice fills exactly its part of the whole mesh's output.
 */
export function meshSlice(mesh: Mesh, from: number, to: number): Mesh {
  const lo = Math.max(0, Math.min(from, mesh.elementCount)), hi = Math.max(lo, Math.min(to, mesh.elementCount))
  const blocks: ElementBlock[] = []
  for (const b of mesh.blocks) {
    const nn = elementType(b.type).nodeCount
    const count = b.ids.length
    const a = Math.max(lo, b.offset) - b.offset, z = Math.min(hi, b.offset + count) - b.offset
    if (z <= a) continue
    blocks.push({
      type: b.type,
      conn: b.conn.subarray(a * nn, z * nn),
      ids: b.ids.subarray(a, z),
      part: b.part ? b.part.subarray(a, z) : null,
      offset: b.offset + a - lo,
    })
  }
  return { coords: mesh.coords, nodeIds: mesh.nodeIds, blocks, nodeCount: mesh.nodeCount, elementCount: hi - lo }
}
