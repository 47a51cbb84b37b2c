/**
 * Test helper: one CSV bundle rewritten the ways solvers, scripts and spreadsheets write it
 * (separators, decimal commas, quotes, D exponents, preambles, no header, other file and column
 * names, units in headers, other type names and node orders, extra columns, padded rows). Each
 * variant must read back to the very model of the plain bundle: bit for bit, since every number
 * keeps its digits. Used by the variant tests, the fixture writer (test/fixtures/makeVariants.ts),
 * the fuzz bases and the dialect benchmark.
 */
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import type { Model } from '../../src/model/model.ts'
import { mixedModel } from './testModels.ts'

export type Bundle = Record<string, string>

export interface Variant {
  readonly name: string
  readonly what: string
  readonly make: (plain: Bundle) => Bundle
}

/** The plain bundle the variants start from: one cell of every type, parts, displacement, mm and MPa. */
export function variantModel(): Model {
  return mixedModel(['hex8', 'tet10', 'wedge6', 'hex20', 'tet4'], 100, true, { nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 })
}

export function bundleOf(model: Model): Bundle {
  return Object.fromEntries(writeCsvBundle(model).map((f) => [f.name, f.text]))
}

type Rows = string[][]
const rowsOf = (text: string): Rows => text.replace(/\n$/, '').split('\n').map((l) => l.split(','))
const textOf = (rows: Rows, sep = ','): string => rows.map((r) => r.join(sep)).join('\n') + '\n'
const meta = (b: Bundle): Record<string, unknown> => JSON.parse(b['model.json']) as Record<string, unknown>
const isCsv = (name: string) => name.endsWith('.csv')
const NUMERIC = ['nodes.csv', 'stress.csv', 'displacement.csv']

/** Every CSV file's rows through `f` (name, rows) and written with `sep`. */
function eachTable(b: Bundle, f: (name: string, rows: Rows) => Rows, sep = ','): Bundle {
  const out: Bundle = {}
  for (const [name, text] of Object.entries(b)) out[name] = isCsv(name) ? textOf(f(name, rowsOf(text)), sep) : text
  return out
}

/** The element table's rows with their types renamed or their nodes reordered. */
function eachElement(b: Bundle, f: (type: ElementTypeName, nodes: string[]) => { type: string; nodes: string[] }): Bundle {
  const rows = rowsOf(b['elements.csv'])
  const head = rows[0]
  const first = head.indexOf('n1')
  const out = [head, ...rows.slice(1).map((r) => { const x = f(r[1] as ElementTypeName, r.slice(first)); return [r[0], x.type, ...r.slice(2, first), ...x.nodes] })]
  return { ...b, 'elements.csv': textOf(out) }
}

const withJson = (b: Bundle, change: (m: Record<string, unknown>) => void): Bundle => { const m = meta(b); change(m); return { ...b, 'model.json': JSON.stringify(m, null, 2) + '\n' } }

/** Header-less column numbers of our own layout. */
const NUMBERED = {
  nodes: { id: 1, x: 2, y: 3, z: 4 },
  elements: { id: 1, type: 2, part: 3, nodes: 4 },
  stress: { id: 1, sxx: 2, syy: 3, szz: 4, sxy: 5, syz: 6, sxz: 7 },
  displacement: { id: 1, ux: 2, uy: 3, uz: 4 },
}

/** Our type names as a made-up exporter spells them. */
export const TYPE_NAMES: Readonly<Record<ElementTypeName, string>> = { tet4: 'tetra4', tet10: 'TETRA-10', hex8: 'brick8', hex20: 'brick20', wedge6: 'prism6', wedge15: 'prism15', pyramid5: 'pyra5', pyramid13: 'PYRA-13' }

/**
 * Another node order per type, as model.json "nodeOrder" states it (entry k = the user's node
 * column holding our node k): tet10 with its last two mid-edge nodes swapped; hex20 with the
 * mid-edge nodes of the vertical edges before those of the top face.
 */
export const NODE_ORDERS: Readonly<Partial<Record<ElementTypeName, readonly number[]>>> = {
  tet10: [0, 1, 2, 3, 4, 5, 6, 7, 9, 8],
  hex20: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 16, 17, 18, 19, 12, 13, 14, 15],
}

/** Rewrites our node order into the user's: user column perm[k] holds our node k. */
export function toUserOrder<T>(nodes: readonly T[], perm: readonly number[]): T[] {
  const out = new Array<T>(nodes.length)
  perm.forEach((p, k) => { out[p] = nodes[k] })
  return out
}

export const VARIANTS: readonly Variant[] = [
  { name: 'semicolon-decimal-comma', what: 'semicolons between fields, decimal commas', make: (b) => eachTable(b, (_, rows) => rows.map((r) => r.map((x) => x.replace('.', ','))), ';') },
  { name: 'tab', what: 'tab-separated', make: (b) => eachTable(b, (_, rows) => rows, '\t') },
  { name: 'spaces', what: 'fixed-width columns: runs of spaces, leading blanks', make: (b) => eachTable(b, (_, rows) => rows.map((r) => r.map((x) => x.padStart(24))), ' ') },
  {
    name: 'quoted', what: 'every field quoted (RFC 4180), an extra column whose quoted name holds the separator',
    make: (b) => eachTable(b, (name, rows) => rows.map((r, i) => {
      const q = r.map((x) => `"${x}"`)
      return name === 'stress.csv' ? [...q, i === 0 ? '"von Mises, nodal ""avg"""' : '"0"'] : q
    })),
  },
  {
    name: 'd-exponents', what: 'numbers in exponent form with D and d exponents',
    make: (b) => eachTable(b, (name, rows) => !NUMERIC.includes(name) ? rows : rows.map((r, i) => i === 0 ? r : r.map((x, j) => (j === 0 || x === '-0' ? x : Number(x).toExponential().replace('e', j % 2 ? 'D' : 'd'))))),
  },
  {
    name: 'preamble', what: 'three lines of text and a blank line above each header',
    make: (b) => Object.fromEntries(Object.entries(b).map(([n, t]) => [n, isCsv(n) ? `Exported by the result script\nModel: mixed blocks, ${n}\nDate: 2026-12-01\n\n${t}` : t])),
  },
  {
    name: 'no-header', what: 'no header rows; model.json names the columns by number',
    make: (b) => withJson(eachTable(b, (_, rows) => rows.slice(1)), (m) => { m.columns = NUMBERED }),
  },
  {
    name: 'mapped-names', what: 'other file names and headers, mapped in model.json',
    make: (b) => {
      const x = eachTable(b, (name, rows) => {
        const h = rows[0]
        if (name === 'nodes.csv') rows[0] = ['Node', 'X', 'Y', 'Z']
        if (name === 'elements.csv') rows[0] = ['Elem', 'Kind', 'Mat', ...h.slice(3).map((n) => n.toUpperCase())]
        if (name === 'stress.csv') rows[0] = ['NodeID', 'S_XX', 'S_YY', 'S_ZZ', 'S_XY', 'S_YZ', 'S_XZ']
        if (name === 'displacement.csv') rows[0] = ['NodeID', 'UX', 'UY', 'UZ']
        return rows
      })
      const renamed: Bundle = { 'mesh_nodes.txt': x['nodes.csv'], 'conn.txt': x['elements.csv'], 'nodal_stress.txt': x['stress.csv'], 'nodal_disp.txt': x['displacement.csv'], 'model.json': x['model.json'] }
      return withJson(renamed, (m) => {
        m.files = { nodes: 'mesh_nodes.txt', elements: 'conn.txt', stress: 'nodal_stress.txt', displacement: 'nodal_disp.txt' }
        m.columns = {
          nodes: { id: 'node' },
          elements: { id: 'Elem', type: 'Kind', part: 'Mat', nodes: 'N1' },
          stress: { id: 'NodeID', sxx: 'S_XX', syy: 'S_YY', szz: 'S_ZZ', sxy: 'S_XY', syz: 'S_YZ', sxz: 'S_XZ' },
          displacement: { id: 'NodeID' },
        }
      })
    },
  },
  {
    name: 'units-in-headers', what: 'units in the headers ("x [mm]", "sxx (MPa)"), none in model.json',
    make: (b) => withJson(eachTable(b, (name, rows) => {
      if (name === 'nodes.csv' || name === 'displacement.csv') rows[0] = rows[0].map((n, j) => (j === 0 ? n : `${n} [mm]`))
      if (name === 'stress.csv') rows[0] = rows[0].map((n, j) => (j === 0 ? n : `${n} (MPa)`))
      return rows
    }), (m) => { delete m.units }),
  },
  {
    name: 'type-names', what: 'the exporter\'s own element type names, mapped in model.json "types"',
    make: (b) => withJson(eachElement(b, (t, nodes) => ({ type: TYPE_NAMES[t], nodes })), (m) => { m.types = Object.fromEntries(Object.entries(TYPE_NAMES).map(([ours, theirs]) => [theirs, ours])) }),
  },
  {
    name: 'node-order', what: 'tet10 and hex20 nodes in another order, mapped in model.json "nodeOrder"',
    make: (b) => withJson(eachElement(b, (t, nodes) => ({ type: t, nodes: NODE_ORDERS[t] ? toUserOrder(nodes, NODE_ORDERS[t]!) : nodes })), (m) => { m.nodeOrder = NODE_ORDERS }),
  },
  {
    name: 'extra-columns', what: 'columns in another order, columns this tool does not use, the part column after the nodes',
    make: (b) => eachTable(b, (name, rows) => rows.map((r, i) => {
      if (name === 'nodes.csv') return [r[3], r[0], i === 0 ? 'csys' : '0', r[1], r[2]]
      if (name === 'stress.csv') return [...r, i === 0 ? 'seqv' : '1.5']
      if (name === 'elements.csv') {
        const width = rows[0].length
        const padded = [...r, ...new Array<string>(width - r.length).fill('')]
        return [padded[0], padded[1], ...padded.slice(3), padded[2], i === 0 ? 'comment' : 'none']
      }
      return r
    })),
  },
  {
    name: 'padded-rows', what: 'element rows padded with empty fields to the header, as a spreadsheet saves them',
    make: (b) => eachTable(b, (name, rows) => name !== 'elements.csv' ? rows : rows.map((r) => [...r, ...new Array<string>(rows[0].length - r.length).fill('')])),
  },
  {
    name: 'first-node-column', what: 'one "Nodes" column heading the node fields, mapped as the first node column',
    make: (b) => withJson(eachTable(b, (name, rows) => { if (name === 'elements.csv') rows[0] = ['id', 'type', 'part', 'Nodes']; return rows }), (m) => { m.columns = { elements: { nodes: 'Nodes' } } }),
  },
]
