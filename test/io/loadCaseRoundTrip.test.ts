/**
 * Load cases through the writers and readers: CSV bundle with cases → container (version 2, one
 * field per case in the field table, cases and combinations in the header) → CSV bundle, file for
 * file identical; element-nodal cases keep their values; a container without cases reads as before.
 */
import { readFileSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { Model } from '../../src/model/model.ts'
import { modelForCase } from '../../src/model/loadCases.ts'
import { InputError } from '../../src/model/errors.ts'
import { elementNodalCopy } from '../helpers/elementNodal.ts'
import { nodalStress } from '../helpers/sectionMeshes.ts'

const dir = join(import.meta.dirname, '..', 'fixtures', 'cases')
const bundle = () => readdirSync(dir).map((name) => ({ name, text: readFileSync(join(dir, name), 'utf8') }))
const byName = (files: { name: string; text: string }[]) => Object.fromEntries(files.map((f) => [f.name, f.text]))

describe('load cases: round trips', () => {
  it('CSV bundle with cases → container → CSV bundle, identical', () => {
    const model = readCsvBundle(bundle())
    const first = byName(writeCsvBundle(model))
    expect(Object.keys(first).sort()).toEqual(['displacement.dead.csv', 'elements.csv', 'model.json', 'nodes.csv', 'stress.bend.csv', 'stress.dead.csv', 'stress.pull.csv'])
    const back = readNative(writeNative(model))
    expect(back.cases!.map((c) => c.name)).toEqual(['dead', 'pull', 'bend'])
    expect(back.combinations).toEqual(model.combinations)
    expect(byName(writeCsvBundle(back))).toEqual(first)
    // and the bundle written reads back to the same files again
    expect(byName(writeCsvBundle(readCsvBundle(writeCsvBundle(model))))).toEqual(first)
    // a combination of the container's model is that of the bundle's
    expect(modelForCase(back, 'ULS-2').stress).toEqual(modelForCase(model, 'ULS-2').stress)
  })

  it('element-nodal cases keep their values through the container', () => {
    const mesh = boxMesh({ nx: 2, ny: 1, nz: 2, lx: 2, ly: 1, lz: 2 }, 'hex8')
    const f = [1, 2].map((k) => elementNodalCopy(mesh, nodalStress(mesh, (x, y, z) => [k * x, y, z, 0, 0, k]), 7))
    const model: Model = {
      name: 'en', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress: nodalStress(mesh, () => [0, 0, 0, 0, 0, 0]), stressField: f[0],
      displacement: null, bodyForce: [0, 0, 0], warnings: [],
      cases: [{ name: 'a', description: '', bodyForce: null, stress: new Float64Array(6 * mesh.nodeCount), stressField: f[0], displacement: null },
        { name: 'b', description: 'second', bodyForce: [0, 0, -1], stress: new Float64Array(6 * mesh.nodeCount), stressField: f[1], displacement: null }],
      combinations: [{ name: 'k', factors: { a: 2, b: -1 } }],
    }
    const back = readNative(writeNative(model))
    const c = back.cases!
    expect(c[1].description).toBe('second')
    expect(c[1].bodyForce).toEqual([0, 0, -1])
    for (let k = 0; k < 2; k++) {
      const got = c[k].stressField!, want = f[k]
      // connectivity order on both sides: element-node i of the mesh
      for (let b = 0; b < mesh.blocks.length; b++) for (let i = 0; i < want.rows[b].length; i++) {
        for (let j = 0; j < 6; j++) expect(got.values[6 * got.rows[b][i] + j]).toBe(want.values[6 * want.rows[b][i] + j])
      }
    }
  })

  it('element-nodal cases in a CSV bundle: each case file read in the first case\'s form, round trip identical; a nodal file beside them is refused', () => {
    const mesh = boxMesh({ nx: 2, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1 }, 'hex8')
    const f = [1, 2].map((k) => elementNodalCopy(mesh, nodalStress(mesh, (x, y, z) => [k * x, y, z, 0, 0, k]), 7))
    const model: Model = {
      name: 'en', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress: new Float64Array(6 * mesh.nodeCount), stressField: f[0],
      displacement: null, bodyForce: [0, 0, 0], warnings: [],
      cases: [{ name: 'a', description: '', bodyForce: null, stress: new Float64Array(6 * mesh.nodeCount), stressField: f[0], displacement: null },
        { name: 'b', description: '', bodyForce: null, stress: new Float64Array(6 * mesh.nodeCount), stressField: f[1], displacement: null }],
    }
    const files = writeCsvBundle(model)
    expect(files.find((x) => x.name === 'stress.b.csv')!.text.split('\n')[0]).toMatch(/^element,node,/)
    const read = readCsvBundle(files)
    expect(read.cases!.map((c) => c.name)).toEqual(['a', 'b'])
    for (let k = 0; k < 2; k++) {
      const got = read.cases![k].stressField!, want = f[k]
      for (let b = 0; b < mesh.blocks.length; b++) for (let i = 0; i < want.rows[b].length; i++) {
        for (let j = 0; j < 6; j++) expect(got.values[6 * got.rows[b][i] + j]).toBe(want.values[6 * want.rows[b][i] + j])
      }
    }
    expect(byName(writeCsvBundle(read))).toEqual(byName(files))
    // a case given per node beside element-nodal cases: one form for all cases
    const nodal = writeCsvBundle({ ...model, stressField: undefined, cases: undefined }).find((x) => x.name === 'stress.csv')!.text
    const mixed = files.map((x) => (x.name === 'stress.b.csv' ? { name: x.name, text: nodal } : x))
    expect(() => readCsvBundle(mixed)).toThrow(/stress\.b\.csv, line 1: one row per node, while stress\.a\.csv holds one row per element and node/)
  })

  it('a container whose header lists other cases than its field table is refused, naming the key', () => {
    const model = readCsvBundle(bundle())
    const bytes = writeNative(model)
    const text = new TextDecoder().decode(bytes)
    const i = text.indexOf('"name":"pull"')
    const patched = bytes.slice()
    patched.set(new TextEncoder().encode('"name":"snow"'), i)
    expect(() => readNative(patched)).toThrow(InputError)
    expect(() => readNative(patched)).toThrow(/cases\[1\]/)
  })
})
