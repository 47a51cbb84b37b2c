import { elementType } from './elementTypes.ts'
import type { ElementTypeName } from './elementTypes.ts'
import type { ElementBlock, Mesh } from './model.ts'

export interface BlockInput {
  readonly type: ElementTypeName
  readonly conn: Int32Array
  readonly ids?: Int32Array
  readonly part?: Int32Array | null
}

/**
 * Assembles a Mesh from coordinates and element blocks, assigning block offsets. Element ids
 * default to 1..E in block order; node ids default to 1..N. Does not validate: readers do.
 */
export function createMesh(coords: Float64Array, blocks: readonly BlockInput[], nodeIds?: Int32Array): Mesh {
  const nodeCount = coords.length / 3
  let offset = 0
  const out: ElementBlock[] = []
  for (const b of blocks) {
    const nn = elementType(b.type).nodeCount
    const count = b.conn.length / nn
    if (!Number.isInteger(count)) throw new RangeError(`a ${b.type} block needs ${nn} nodes per element; its connectivity has ${b.conn.length} entries`)
    let ids = b.ids
    if (!ids) {
      ids = new Int32Array(count)
      for (let i = 0; i < count; i++) ids[i] = offset + i + 1
    }
    out.push({ type: b.type, conn: b.conn, ids, part: b.part ?? null, offset })
    offset += count
  }
  let nid = nodeIds
  if (!nid) {
    nid = new Int32Array(nodeCount)
    for (let i = 0; i < nodeCount; i++) nid[i] = i + 1
  }
  return { coords, nodeIds: nid, blocks: out, nodeCount, elementCount: offset }
}
