/**
 * Element-nodal stress fields for the tests: every element-node gets its own row of stress, so the
 * kernels' element-node index (StressField.rows) is exercised the way unaveraged solver output
 * will use it.
 */
import type { Mesh } from '../../src/model/model.ts'
import type { StressField } from '../../src/model/stressField.ts'
import { mulberry32 } from '../../src/mechanics/seededRandom.ts'

/**
 * The element-nodal field whose row for element-node (e, a) is a copy of node conn[e·n + a]'s row
 * of the nodal `values`. The rows are stored in a seeded random order, so a kernel that read the
 * stress through the connectivity instead of the index would read other nodes' values.
 */
export function elementNodalCopy(mesh: Mesh, values: Float64Array, seed = 20261202): StressField {
  const R = mesh.blocks.reduce((n, b) => n + b.conn.length, 0)
  const order = Int32Array.from({ length: R }, (_, i) => i)
  const rand = mulberry32(seed)
  for (let i = R - 1; i > 0; i--) { // Fisher–Yates shuffle (Knuth, TAOCP vol. 2, Algorithm P)
    const j = Math.floor(rand() * (i + 1))
    const t = order[i]; order[i] = order[j]; order[j] = t
  }
  const out = new Float64Array(6 * R)
  let k = 0
  const rows = mesh.blocks.map((b) => {
    const r = new Int32Array(b.conn.length)
    for (let i = 0; i < b.conn.length; i++, k++) {
      r[i] = order[k]
      out.set(values.subarray(6 * b.conn[i], 6 * b.conn[i] + 6), 6 * order[k])
    }
    return r
  })
  return { values: out, rows, layout: 'element-nodal' }
}
