/**
 * Element-nodal (unaveraged) stress from a stress file with an element column
 * (`element,node,sxx,syy,szz,sxy,syz,sxz`): one row per element and node, in any order. The
 * values stay as read (Float64Array(6·R), R rows, model stress units); what is built here is the
 * index beside the connectivity, rows[b][e·nodeCount + a] = the row of element e's local node a
 * (src/model/stressField.ts), so every element-based kernel reads each element's own values.
 *
 * Rows are matched by the user's ids after the connectivity is resolved, reordered by
 * model.json "nodeOrder" and reoriented, so the index follows the nodes wherever they went.
 * Every refusal names the stress file, the line and the column (element or node) and says how
 * to fix it: an element that is not in the elements file, a node that is not one of that
 * element's nodes, two rows for one element-node, or an element-node without a row.
 */
import { elementType } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { ElementBlock } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { NumericTable } from './csvTable.ts'
import { buildIdIndex, isDuplicate, rowOfId } from './idIndex.ts'
import type { IdIndex } from './idIndex.ts'

/** What the index is built from: the element blocks (connectivity as node indices, the user's ids) and the node index. */
export interface ElementNodalSources {
  readonly blocks: readonly Pick<ElementBlock, 'type' | 'conn' | 'ids'>[]
  readonly nodeIds: Int32Array
  readonly nodeIndex: IdIndex
  readonly stressFile: string
  readonly elementsFile: string
  readonly nodesFile: string
  /** Column labels of the element and node columns, as messages name them. */
  readonly elementColumn: string
  readonly nodeColumn: string
}

/** The element-nodal field of `table` (read with two id columns: ids = elements, ids2 = nodes). */
export function elementNodalField(table: NumericTable, src: ElementNodalSources): StressField {
  const { blocks, nodeIndex } = src
  const elems = table.ids, nodes = table.ids2!, lines = table.lines
  const where = (r: number, column: string, elementId?: number) => ({ file: src.stressFile, line: lines[r], column, elementId })

  // Element id → global element index (blocks in order); ids are unique (checked by the reader).
  let E = 0
  for (const b of blocks) E += b.ids.length
  const allIds = new Int32Array(E)
  const blockStart = new Int32Array(blocks.length + 1)
  blocks.forEach((b, k) => { allIds.set(b.ids, blockStart[k]); blockStart[k + 1] = blockStart[k] + b.ids.length })
  const elementIndex = buildIdIndex(allIds)
  if (isDuplicate(elementIndex)) throw new RangeError('element ids must be unique before element-nodal rows are matched')

  const rows = blocks.map((b) => new Int32Array(b.conn.length).fill(-1))
  const nnOf = blocks.map((b) => elementType(b.type).nodeCount)
  let lastId = -1, lastBlock = 0, lastElement = 0
  for (let r = 0; r < table.rows; r++) {
    const id = elems[r]
    // Rows of one element usually follow each other: look its index up once.
    if (id !== lastId) {
      const g = rowOfId(elementIndex, id)
      if (g < 0) throw new InputError('missing-element', `element ${id} is not in ${src.elementsFile}; remove the row, or add the element there (the element column of an element-nodal stress file holds element ids)`, where(r, src.elementColumn))
      let b = 0
      while (g >= blockStart[b + 1]) b++
      lastId = id; lastBlock = b; lastElement = g - blockStart[b]
    }
    const nn = nnOf[lastBlock]
    const conn = blocks[lastBlock].conn
    const node = rowOfId(nodeIndex, nodes[r])
    if (node < 0) throw new InputError('missing-node', `node ${nodes[r]} is not in ${src.nodesFile}; correct the node id, or add the node there`, where(r, src.nodeColumn, id))
    const base = lastElement * nn
    let a = 0
    while (a < nn && conn[base + a] !== node) a++
    if (a === nn) {
      const list = Array.from(conn.subarray(base, base + nn), (n) => src.nodeIds[n]).join(', ')
      throw new InputError('element-node', `node ${nodes[r]} is not a node of element ${id} (its nodes are ${list}); each row gives the stress of one element at one of its own nodes: correct the element or the node id`, where(r, src.nodeColumn, id))
    }
    const slot = rows[lastBlock]
    if (slot[base + a] >= 0) {
      throw new InputError('duplicate-id', `element ${id} at node ${nodes[r]} has two rows (lines ${lines[slot[base + a]]} and ${lines[r]}); keep one row per element and node`, where(r, src.nodeColumn, id))
    }
    slot[base + a] = r
  }
  blocks.forEach((b, k) => {
    const at = rows[k].indexOf(-1)
    if (at < 0) return
    const nn = nnOf[k]
    const e = (at / nn) | 0
    const missing = src.nodeIds[b.conn[at]]
    throw new InputError('missing-stress', `no row for element ${b.ids[e]} at its node ${missing}; an element-nodal stress file needs one row per element and node (${nn} rows for each ${b.type}): add it`, { file: src.stressFile, column: src.nodeColumn, elementId: b.ids[e] })
  })
  return { values: table.values, rows, layout: 'element-nodal' }
}
