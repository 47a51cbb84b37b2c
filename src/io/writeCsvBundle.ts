/**
 * Writes a Model as a CSV bundle that readCsvBundle reads back to the same numbers: numbers are
 * written in the shortest form that round-trips (ECMAScript Number::toString), -0 as "-0".
 * Element-nodal stress (model.stressField) is written as element,node,sxx,... rows in the order
 * of the connectivity.
 */
import { elementType } from '../model/elementTypes.ts'
import type { Model } from '../model/model.ts'
import { DEFAULT_CASE, sameCaseName } from '../model/loadCases.ts'
import { partsJson } from './nativeContainer.ts'

/** A number as the bundle writes it: the shortest form that round-trips, -0 as "-0". */
export function csvNumber(v: number): string {
  return v === 0 && 1 / v < 0 ? '-0' : String(v)
}

function table(header: string, rows: number, width: number, ids: Int32Array, values: Float64Array): string {
  const out: string[] = [header]
  for (let r = 0; r < rows; r++) {
    let line = String(ids[r])
    for (let k = 0; k < width; k++) line += ',' + csvNumber(values[r * width + k])
    out.push(line)
  }
  return out.join('\n') + '\n'
}

/** A file of a written bundle: its name and text (a CsvFile the readers take as it is). */
export interface WrittenCsvFile {
  readonly name: string
  readonly text: string
}

/** Element-nodal stress: a row per element and node, in the order of the connectivity. */
function elementNodalTable(model: Model): string {
  const { mesh } = model
  const field = model.stressField!
  const v = field.values
  const out: string[] = ['element,node,sxx,syy,szz,sxy,syz,sxz']
  mesh.blocks.forEach((b, k) => {
    const nn = elementType(b.type).nodeCount
    const rows = field.rows[k]
    for (let i = 0; i < b.conn.length; i++) {
      let line = `${b.ids[(i / nn) | 0]},${mesh.nodeIds[b.conn[i]]}`
      for (let c = 0; c < 6; c++) line += ',' + csvNumber(v[6 * rows[i] + c])
      out.push(line)
    }
  })
  return out.join('\n') + '\n'
}

export function writeCsvBundle(model: Model): WrittenCsvFile[] {
  const { mesh } = model
  const N = mesh.nodeCount
  const files: WrittenCsvFile[] = []
  files.push({ name: 'nodes.csv', text: table('id,x,y,z', N, 3, mesh.nodeIds, mesh.coords) })
  const hasPart = mesh.blocks.some((b) => b.part !== null)
  let maxNodes = 1
  for (const b of mesh.blocks) maxNodes = Math.max(maxNodes, elementType(b.type).nodeCount)
  const head = ['id', 'type', ...(hasPart ? ['part'] : [])]
  for (let k = 1; k <= maxNodes; k++) head.push(`n${k}`)
  const el: string[] = [head.join(',')]
  for (const b of mesh.blocks) {
    const nn = elementType(b.type).nodeCount
    const count = b.ids.length
    for (let e = 0; e < count; e++) {
      let line = `${b.ids[e]},${b.type}`
      if (hasPart) line += ',' + (b.part ? b.part[e] : 0)
      for (let a = 0; a < nn; a++) line += ',' + mesh.nodeIds[b.conn[e * nn + a]]
      el.push(line)
    }
  }
  files.push({ name: 'elements.csv', text: el.join('\n') + '\n' })
  // --- load cases: stress.csv is the case "default", stress.NAME.csv every other; model.json lists them in order ---
  // Each case keeps its form: element-nodal fields are written as element-nodal tables.
  const cases = model.cases && model.cases.length ? model.cases : [{ name: DEFAULT_CASE, description: '', bodyForce: null, stress: model.stress, stressField: model.stressField, displacement: model.displacement }]
  for (const c of cases) {
    const stem = sameCaseName(c.name, DEFAULT_CASE) ? '' : `.${c.name}`
    const text = c.stressField ? elementNodalTable({ ...model, stress: c.stress, stressField: c.stressField }) : table('id,sxx,syy,szz,sxy,syz,sxz', N, 6, mesh.nodeIds, c.stress)
    files.push({ name: `stress${stem}.csv`, text })
    if (c.displacement) files.push({ name: `displacement${stem}.csv`, text: table('id,ux,uy,uz', N, 3, mesh.nodeIds, c.displacement) })
  }
  const parts = model.parts && model.parts.length > 0 ? { parts: partsJson(model.parts) } : {}
  const meta = {
    name: model.name, description: model.description, units: model.units, bodyForce: model.bodyForce, ...parts,
    ...(model.cases && model.cases.length ? { cases: casesJson(model), combinations: (model.combinations ?? []).map((c) => ({ name: c.name, factors: { ...c.factors } })) } : {}),
  }
  files.push({ name: 'model.json', text: JSON.stringify(meta, null, 2) + '\n' })
  return files
}

/** model.json's "cases" of a model: name, description and ρb of each case, in order. */
export function casesJson(model: Model): { name: string; description: string; bodyForce: readonly number[] }[] {
  return (model.cases ?? []).map((c) => ({ name: c.name, description: c.description, bodyForce: c.bodyForce ?? model.bodyForce }))
}
