/**
 * Element-nodal (unaveraged) stress: a stress file with an element column holds one row per
 * element and node. Checked against a two-material bar (a bonded joint between two materials):
 * across the joint plane (normal x) the traction t = σ·x̂ = (σxx, σxy, σxz) is continuous while the
 * components parallel to the joint (σyy, σzz, σyz) may jump, from the equilibrium of the
 * interface (common practice; e.g. Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (1970),
 * §1–§4: the stress vector on a plane, Newton's third law across it). Each part carries a uniform
 * stress here, so each part alone is in equilibrium (zero residual, exact for any element), and
 * the interface force is the joint area times (σxx, σxy, σxz).
 */
import { describe, expect, it } from 'vitest'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import type { WrittenCsvFile } from '../../src/io/writeCsvBundle.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { InputError } from '../../src/model/errors.ts'
import { elementType } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import { modelStressField, nodalStressField } from '../../src/model/stressField.ts'
import { assemblyBalance } from '../../src/mechanics/partBalance.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { allocateStressJump, computeStressJump } from '../../src/mechanics/stressJump.ts'
import { runAnalysis, analysisInputOf } from '../../src/mechanics/analysisPipeline.ts'
import type { Model } from '../../src/model/model.ts'

// Part 1 (x < 1) and part 2 (x > 1): σxx, σxy, σxz shared; σyy, σzz, σyz jump.
const S1 = [10, 2, 1, 3, 0.5, 4]
const S2 = [10, 7, -3, 3, 2, 4]

/** The bar 2 × 1 × 1 as a CSV bundle with element-nodal stress, written in `sep` with `dec` decimals. */
function barBundle(type: ElementTypeName, sep = ',', dec = '.', quote = false): WrittenCsvFile[] {
  const mesh = boxMesh({ nx: 4, ny: 2, nz: 2, lx: 2, ly: 1, lz: 1 }, type)
  const nn = elementType(type).nodeCount
  const b = mesh.blocks[0]
  const num = (v: number) => (dec === ',' ? String(v).replace('.', ',') : String(v))
  const q = (s: string) => (quote ? `"${s}"` : s)
  const nodes = ['id' + sep + 'x' + sep + 'y' + sep + 'z']
  for (let n = 0; n < mesh.nodeCount; n++) nodes.push([n + 1, ...[0, 1, 2].map((k) => num(mesh.coords[3 * n + k]))].join(sep))
  const head = ['id', 'type', 'part', ...Array.from({ length: nn }, (_, a) => `n${a + 1}`)]
  const elements = [head.join(sep)]
  const stress = [['element', 'node', 'sxx [MPa]', 'syy [MPa]', 'szz [MPa]', 'sxy [MPa]', 'syz [MPa]', 'sxz [MPa]'].map(q).join(sep)]
  const partOf: number[] = []
  for (let e = 0; e < b.ids.length; e++) {
    let cx = 0
    for (let a = 0; a < nn; a++) cx += mesh.coords[3 * b.conn[e * nn + a]] / nn
    const part = cx < 1 ? 1 : 2
    partOf.push(part)
    elements.push([e + 1, type, part, ...Array.from(b.conn.subarray(e * nn, (e + 1) * nn), (n) => n + 1)].join(sep))
  }
  // Rows in reverse order, nodes of each element backwards: the reader must not rely on order.
  for (let e = b.ids.length - 1; e >= 0; e--) {
    for (let a = nn - 1; a >= 0; a--) stress.push([e + 1, b.conn[e * nn + a] + 1, ...(partOf[e] === 1 ? S1 : S2).map(num)].join(sep))
  }
  return [
    { name: 'nodes.csv', text: nodes.join('\n') + '\n' },
    { name: 'elements.csv', text: elements.join('\n') + '\n' },
    { name: 'stress.csv', text: stress.join('\n') + '\n' },
    { name: 'model.json', text: JSON.stringify({ name: 'bar', units: { length: 'mm' }, parts: { 1: 'steel', 2: 'aluminium' } }) },
  ]
}

function refusal(files: WrittenCsvFile[]): InputError {
  try { readCsvBundle(files) } catch (e) { if (e instanceof InputError) return e; throw e }
  throw new Error('expected a refusal')
}

const withStress = (files: WrittenCsvFile[], change: (lines: string[]) => void): WrittenCsvFile[] => files.map((f) => {
  if (f.name !== 'stress.csv') return f
  const lines = f.text.trimEnd().split('\n')
  change(lines)
  return { name: f.name, text: lines.join('\n') + '\n' }
})

describe('element-nodal stress: the two-material bar', () => {
  it.each(['hex8', 'tet10', 'wedge6'] as const)('%s: each part keeps its own values at the joint nodes', (type) => {
    const m = readCsvBundle(barBundle(type))
    expect(m.stressField?.layout).toBe('element-nodal')
    const field = modelStressField(m)
    // Every element-node reads its own part's values, also at the joint nodes.
    m.mesh.blocks.forEach((b, k) => {
      const nn = elementType(b.type).nodeCount
      for (let i = 0; i < b.conn.length; i++) {
        const want = b.part![(i / nn) | 0] === 1 ? S1 : S2
        expect(Array.from(field.values.subarray(6 * field.rows[k][i], 6 * field.rows[k][i] + 6))).toEqual(want)
      }
    })
    // The header units are read as the stress unit.
    expect(m.units.stress).toBe('MPa')
  })

  it.each(['hex8', 'tet10', 'hex20'] as const)('%s: the traction across the joint is continuous, per-part balance uses each part\'s own values', (type) => {
    const m = readCsvBundle(barBundle(type))
    const asm = assemblyBalance(m.mesh, modelStressField(m), () => [0, 0, 0])
    for (const p of asm.parts) expect(p.balance.relative, `part ${p.part}`).toBeLessThan(1e-12)
    expect(asm.interfaces).toHaveLength(1)
    const j = asm.interfaces[0]
    expect(j.area).toBeCloseTo(1, 12)
    // What part 1 exerts on part 2, over part 2's faces (outward normal −x): −(σxx, σxy, σxz)·A.
    j.force.forEach((f, k) => expect(f).toBeCloseTo(-[10, 3, 4][k], 10))
    j.reverseForce.forEach((f, k) => expect(f).toBeCloseTo([10, 3, 4][k], 10))
    expect(j.mismatch).toBeLessThan(1e-12)
  })

  it.each(['hex8', 'tet10'] as const)('%s: a section along the bar reads each part\'s own σyy; the display average would not', (type) => {
    const m = readCsvBundle(barBundle(type))
    // Plane y = 0.5 (normal y) through both parts, 1 × 1 of each: F_y = ∫ σyy dA = 2·1 + 7·1.
    const plane = { point: [1, 0.5, 0.5] as [number, number, number], normal: [0, 1, 0] as [number, number, number] }
    const { result } = cutSection(m.mesh, modelStressField(m), [0, 0, 0], plane)
    expect(result.force[1]).toBeCloseTo(S1[1] + S2[1], 10)
    expect(result.force[0]).toBeCloseTo(S1[3] + S2[3], 10)
    // The display average carries part 1's values at the joint nodes into part 2's elements.
    const { result: averaged } = cutSection(m.mesh, nodalStressField(m.mesh, m.stress), [0, 0, 0], plane)
    expect(Math.abs(averaged.force[1] - (S1[1] + S2[1]))).toBeGreaterThan(0.1)
  })

  it('display stress is the average within the part; at a joint node the lowest part\'s', () => {
    const m = readCsvBundle(barBundle('hex8'))
    for (let n = 0; n < m.mesh.nodeCount; n++) {
      const x = m.mesh.coords[3 * n]
      const want = x <= 1 + 1e-12 ? S1 : S2
      expect(Array.from(m.stress.subarray(6 * n, 6 * n + 6)), `node at x = ${x}`).toEqual(want)
    }
  })

  it('the stress jump is zero: uniform within each part, the jump across the joint is left out', () => {
    const m = readCsvBundle(barBundle('tet10'))
    const r = runAnalysis(analysisInputOf(m))
    const j = computeStressJump(allocateStressJump(m.mesh.nodeCount), m.mesh, modelStressField(m), r.loadPatches.referenceStress)
    expect(Math.max(...j)).toBe(0)
    // With the parts merged into one, the joint is a discontinuity inside a part: the jump is
    // largest on the joint plane and zero away from it.
    const one: Model = { ...m, mesh: { ...m.mesh, blocks: m.mesh.blocks.map((b) => ({ ...b, part: null })) } }
    const j1 = computeStressJump(allocateStressJump(m.mesh.nodeCount), one.mesh, modelStressField(one), r.loadPatches.referenceStress)
    let onJoint = 0, off = 0
    for (let n = 0; n < m.mesh.nodeCount; n++) {
      if (Math.abs(m.mesh.coords[3 * n] - 1) < 1e-12) onJoint = Math.max(onJoint, j1[n])
      else off = Math.max(off, j1[n])
    }
    expect(off).toBe(0)
    expect(onJoint).toBeGreaterThan(0.1)
  })

  it('dialects apply: semicolons, decimal commas, quoted header, units in the header', () => {
    const plain = readCsvBundle(barBundle('hex8'))
    const semi = readCsvBundle(barBundle('hex8', ';', ',', true))
    expect(Array.from(semi.stressField!.values)).toEqual(Array.from(plain.stressField!.values))
    expect(semi.stressField!.rows.map((r) => Array.from(r))).toEqual(plain.stressField!.rows.map((r) => Array.from(r)))
    const tab = readCsvBundle(barBundle('hex8', '\t'))
    expect(Array.from(tab.stress)).toEqual(Array.from(plain.stress))
  })

  it('model.json may map the element and node columns', () => {
    const files = withStress(barBundle('hex8'), (l) => { l[0] = l[0].replace('element', 'Elem').replace('node', 'Knoten') })
    const json = { name: 'bar', units: { length: 'mm' }, columns: { stress: { element: 'Elem', node: 'Knoten' } } }
    const m = readCsvBundle(files.map((f) => (f.name === 'model.json' ? { name: f.name, text: JSON.stringify(json) } : f)))
    expect(m.stressField?.layout).toBe('element-nodal')
  })

  it('CSV → container → CSV gives the same text; the container keeps the element-nodal field', () => {
    const m = readCsvBundle(barBundle('tet10'))
    const first = writeCsvBundle(m)
    expect(first.find((f) => f.name === 'stress.csv')!.text.split('\n')[0]).toBe('element,node,sxx,syy,szz,sxy,syz,sxz')
    const back = readNative(writeNative(readCsvBundle(first)))
    expect(back.stressField?.layout).toBe('element-nodal')
    expect(writeCsvBundle(back)).toEqual(first)
    expect(Array.from(back.stress)).toEqual(Array.from(m.stress))
  })

  it('a container with inverted elements moves their element-node rows with their nodes', () => {
    const m = readCsvBundle(barBundle('hex8'))
    // Mirror element 1 in the container (its bottom and top faces swapped, nodes with their rows):
    // the reader reorients it, and the rows must follow the nodes back.
    const b = m.mesh.blocks[0]
    const conn = b.conn.slice()
    const field = m.stressField!
    const rows = field.rows[0].slice()
    for (let a = 0; a < 4; a++) {
      conn[a] = b.conn[a + 4]; conn[a + 4] = b.conn[a]
      rows[a] = field.rows[0][a + 4]; rows[a + 4] = field.rows[0][a]
    }
    const flipped: Model = { ...m, mesh: { ...m.mesh, blocks: [{ ...b, conn }] }, stressField: { ...field, rows: [rows] } }
    const back = readNative(writeNative(flipped))
    expect(back.warnings.join(' ')).toContain('reoriented 1 inverted element')
    const f2 = back.stressField!
    const nn = 8
    for (let i = 0; i < nn; i++) {
      const node = back.mesh.blocks[0].conn[i]
      const a = b.conn.subarray(0, nn).indexOf(node)
      expect(Array.from(f2.values.subarray(6 * f2.rows[0][i], 6 * f2.rows[0][i] + 6))).toEqual(Array.from(field.values.subarray(6 * field.rows[0][a], 6 * field.rows[0][a] + 6)))
    }
  })
})

describe('element-nodal stress: refusals name file, line, column and say how to fix it', () => {
  const files = barBundle('hex8')
  it('an element that is not in the elements file', () => {
    const e = refusal(withStress(files, (l) => { l[1] = l[1].replace(/^\d+,/, '999,') }))
    expect(e.kind).toBe('missing-element')
    expect(e.message).toMatch(/stress\.csv, line 2, column "element".*element 999 is not in elements\.csv; remove the row, or add the element/)
  })
  it('a node that is not one of the element\'s nodes', () => {
    const e = refusal(withStress(files, (l) => { const f = l[1].split(','); f[1] = '1'; l[1] = f.join(',') }))
    expect(e.kind).toBe('element-node')
    expect(e.message).toMatch(/line 2, column "node", element 16: node 1 is not a node of element 16 \(its nodes are [\d, ]+\); .*correct the element or the node id/)
  })
  it('a node that is in no file', () => {
    const e = refusal(withStress(files, (l) => { const f = l[1].split(','); f[1] = '4500'; l[1] = f.join(',') }))
    expect(e.kind).toBe('missing-node')
    expect(e.message).toContain('node 4500 is not in nodes.csv')
  })
  it('two rows for one element-node', () => {
    const e = refusal(withStress(files, (l) => { l.push(l[1]) }))
    expect(e.kind).toBe('duplicate-id')
    expect(e.message).toMatch(/column "node", element 16: element 16 at node \d+ has two rows \(lines 2 and \d+\); keep one row per element and node/)
  })
  it('an element-node without a row', () => {
    const e = refusal(withStress(files, (l) => { l.splice(1, 1) }))
    expect(e.kind).toBe('missing-stress')
    expect(e.message).toMatch(/element 16: no row for element 16 at its node \d+; .*8 rows for each hex8\): add it/)
  })
  it('a node id that is not an integer', () => {
    const e = refusal(withStress(files, (l) => { const f = l[1].split(','); f[1] = '4.5'; l[1] = f.join(',') }))
    expect(e.kind).toBe('bad-id')
    expect(e.message).toMatch(/line 2, column "node"/)
  })
})
