/**
 * The invariants every loaded Model satisfies, checked on an assembled model (for the fuzz tests,
 * and for any code that builds a Model by hand). Throws the first violation as an InputError
 * naming `source` and the field.
 */
import { elementType, isElementTypeName } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { Model } from '../model/model.ts'
import { isLengthUnit, isStressUnit } from '../model/units.ts'
import { checkBlockOrientation } from './elementOrientation.ts'
import { buildIdIndex, isDuplicate } from './idIndex.ts'

export function validateModel(model: Model, source = 'model'): void {
  const bad = (field: string, message: string, kind: 'container' | 'not-finite' | 'bad-id' | 'duplicate-id' | 'bad-unit' | 'zero-volume' | 'unknown-type' = 'container', elementId?: number): never => {
    throw new InputError(kind, message, { file: source, field, elementId })
  }
  if (typeof model.name !== 'string') bad('name', 'name is not a string')
  if (typeof model.description !== 'string') bad('description', 'description is not a string')
  if (!isLengthUnit(model.units.length)) bad('units.length', 'unknown length unit', 'bad-unit')
  if (!isStressUnit(model.units.stress)) bad('units.stress', 'unknown stress unit', 'bad-unit')
  if (model.bodyForce.length !== 3 || !model.bodyForce.every(Number.isFinite)) bad('bodyForce', 'bodyForce is not three finite numbers', 'not-finite')
  const { mesh } = model
  const N = mesh.nodeCount
  if (!Number.isInteger(N) || N < 1) bad('nodeCount', `node count ${N} is not a positive integer`)
  if (mesh.coords.length !== 3 * N) bad('coords', `coords has ${mesh.coords.length} numbers, expected 3 × ${N}`)
  if (mesh.nodeIds.length !== N) bad('nodeIds', `nodeIds has ${mesh.nodeIds.length} entries, expected ${N}`)
  if (model.stress.length !== 6 * N) bad('stress', `stress has ${model.stress.length} numbers, expected 6 × ${N}`)
  if (model.displacement && model.displacement.length !== 3 * N) bad('displacement', `displacement has ${model.displacement.length} numbers, expected 3 × ${N}`)
  const firstNonFinite = (a: Float64Array): number => { for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i])) return i; return -1 }
  let i = firstNonFinite(mesh.coords)
  if (i >= 0) bad('coords', `node ${mesh.nodeIds[(i / 3) | 0]} has a non-finite coordinate`, 'not-finite')
  i = firstNonFinite(model.stress)
  if (i >= 0) bad('stress', `node ${mesh.nodeIds[(i / 6) | 0]} has a non-finite stress`, 'not-finite')
  if (model.displacement) {
    i = firstNonFinite(model.displacement)
    if (i >= 0) bad('displacement', `node ${mesh.nodeIds[(i / 3) | 0]} has a non-finite displacement`, 'not-finite')
  }
  checkIds(mesh.nodeIds, 'nodeIds', 'node', source)
  // --- element-nodal: one row index per element-node, every row in range and finite ---
  const field = model.stressField
  if (field) {
    const R = field.values.length / 6
    if (!Number.isInteger(R) || field.rows.length !== mesh.blocks.length) bad('stressField', `the element-nodal field has ${field.values.length} numbers and rows for ${field.rows.length} of ${mesh.blocks.length} blocks`)
    i = firstNonFinite(field.values)
    if (i >= 0) bad('stressField', `element-node row ${(i / 6) | 0} has a non-finite stress`, 'not-finite')
    field.rows.forEach((rows, k) => {
      if (rows.length !== mesh.blocks[k].conn.length) bad(`stressField.rows[${k}]`, `${rows.length} rows for ${mesh.blocks[k].conn.length} element-nodes`)
      for (let j = 0; j < rows.length; j++) if (!(rows[j] >= 0 && rows[j] < R)) bad(`stressField.rows[${k}]`, `row ${rows[j]} is outside 0..${R - 1}`)
    })
  }
  let offset = 0
  const allIds: Int32Array[] = []
  mesh.blocks.forEach((b, k) => {
    const f = `blocks[${k}]`
    if (!isElementTypeName(b.type)) bad(`${f}.type`, `unknown element type ${JSON.stringify(b.type)}`, 'unknown-type')
    const nn = elementType(b.type).nodeCount
    const count = b.ids.length
    if (b.conn.length !== count * nn) bad(`${f}.conn`, `conn has ${b.conn.length} entries, expected ${count} × ${nn}`)
    if (b.part && b.part.length !== count) bad(`${f}.part`, `part has ${b.part.length} entries, expected ${count}`)
    if (b.offset !== offset) bad(`${f}.offset`, `offset is ${b.offset}, expected ${offset}`)
    for (let j = 0; j < b.conn.length; j++) {
      const n = b.conn[j]
      if (!(n >= 0 && n < N)) bad(`${f}.conn`, `node index ${n} is outside 0..${N - 1}`, 'container', b.ids[(j / nn) | 0])
    }
    if (b.part) for (let j = 0; j < count; j++) if (b.part[j] < 0) bad(`${f}.part`, `part ${b.part[j]} is negative`, 'bad-id', b.ids[j])
    const o = checkBlockOrientation(mesh.coords, b.type, b.conn)
    if (o.degenerate >= 0) bad(`${f}.conn`, 'degenerate element (about zero volume)', 'zero-volume', b.ids[o.degenerate])
    if (o.inverted.length) bad(`${f}.conn`, 'inverted element (negative volume)', 'container', b.ids[o.inverted[0]])
    offset += count
    allIds.push(b.ids)
  })
  if (offset !== mesh.elementCount) bad('elementCount', `elementCount is ${mesh.elementCount}, the blocks hold ${offset}`)
  if (offset === 0) throw new InputError('no-elements', 'the model has no elements', { file: source })
  const ids = new Int32Array(offset)
  let k = 0
  for (const a of allIds) { ids.set(a, k); k += a.length }
  checkIds(ids, 'blocks[].ids', 'element', source)
}

function checkIds(ids: Int32Array, field: string, what: string, source: string): void {
  for (let i = 0; i < ids.length; i++) {
    if (ids[i] < 1) throw new InputError('bad-id', `${what} id ${ids[i]} is not positive`, { file: source, field })
  }
  const ix = buildIdIndex(ids)
  if (isDuplicate(ix)) throw new InputError('duplicate-id', `${what} id ${ix.id} appears twice`, { file: source, field })
}
