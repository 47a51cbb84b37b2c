/**
 * `tractus cut` with regions and limits: two separate bars through one plane (statics: F = σA
 * per bar, Cauchy's formula; Malvern 1969, ch. 3), --parts and --within, and their bad input.
 */
import { describe, expect, it } from 'vitest'
import { join } from 'node:path'
import { cli, cliJson, tempDir, writeBundle } from './cliHarness.ts'
import { assembly } from '../helpers/assemblies.ts'
import { modelOf } from '../io/testModels.ts'
import type { Model } from '../../src/model/model.ts'

function twoBars(): string {
  const mesh = assembly([
    { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 2 }, type: 'hex8', part: 1 },
    { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 2, x0: 3 }, type: 'hex8', part: 3 },
  ], false)
  const stress = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) stress[6 * i + 2] = mesh.coords[3 * i] < 2 ? 10 : -5
  return writeBundle(join(tempDir(), 'bars'), { ...modelOf(mesh), stress })
}

describe('tractus cut: regions and limits', () => {
  const bars = twoBars()
  const plane = ['--point', '0,0,0.9', '--normal', '0,0,1']

  it('lists the regions with the documented keys; the whole-plane force beside them', async () => {
    const j = await cliJson('cut', bars, ...plane)
    expect(j.force[2]).toBeCloseTo(5, 9)
    expect(j.regions.length).toBe(2)
    expect(Object.keys(j.regions[0])).toEqual(expect.arrayContaining(['area', 'centroid', 'force', 'moment', 'axial', 'shear', 'torque', 'bending', 'parts']))
    expect(j.regions[0].force[2]).toBeCloseTo(10, 9)
    expect(j.regions[0].parts).toEqual([1])
    expect(j.regions[1].force[2]).toBeCloseTo(-5, 9)
    expect(j.regions[1].centroid[0]).toBeCloseTo(3.5, 12)
    const text = await cli('cut', bars, ...plane)
    expect(text.stdout).toMatch(/region 1 \(part 1\)/)
  })

  it('limits to parts and to a disc; the selection is the top-level figure', async () => {
    const p = await cliJson('cut', bars, ...plane, '--parts', '3')
    expect(p.force[2]).toBeCloseTo(-5, 9)
    expect(p.limited).toBe(true)
    expect(p.freeBodyDefined).toBe(true)
    const w = await cliJson('cut', bars, ...plane, '--within', '0.5,0.5,50,1')
    expect(w.force[2]).toBeCloseTo(10, 9)
    const both = await cliJson('cut', bars, ...plane, '--within', '0.5,0.5,0,1', '--parts', '3')
    expect(both.empty).toBe(true)
    const t = await cli('cut', bars, ...plane, '--within', '0.5,0.5,0,1', '--parts', '3')
    expect(t.code).toBe(0)
    expect(t.stdout).toMatch(/selects no part of the section/)
    expect((await cli('cut', bars, ...plane, '--within', '0.5,0.5,50,1')).stdout).toMatch(/free body\s+not defined for a disc/)
    expect((await cli('cut', bars, ...plane, '--parts', '1')).stdout).toMatch(/free body relative/)
  })

  it('rejects an unknown part (exit 2), a malformed option or a radius ≤ 0 (exit 1)', async () => {
    const u = await cli('cut', bars, ...plane, '--parts', '7')
    expect(u.code).toBe(2)
    expect(u.stderr).toMatch(/no element has part 7.*parts are 1, 3/)
    expect((await cli('cut', bars, ...plane, '--parts', '1,x')).code).toBe(1)
    const r0 = await cli('cut', bars, ...plane, '--within', '0,0,0,0')
    expect(r0.code).toBe(1)
    expect(r0.stderr).toMatch(/radius must be greater than 0/)
    expect((await cli('cut', bars, ...plane, '--within', '0,0,1')).code).toBe(1)
  })
})

/** A two-part column 1 × 1 × 2 under ρb = (0, 0, -w), shared nodes at z = 1, σzz = k·w(z - 2) (Timoshenko & Goodier §97). */
function column(w: number, k: number, name: string, parts?: Model['parts']): string {
  const mesh = assembly([
    { box: { nx: 1, ny: 1, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 },
    { box: { nx: 1, ny: 1, nz: 2, lx: 1, ly: 1, lz: 1, z0: 1 }, type: 'hex8', part: 2 },
  ], true)
  const stress = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) stress[6 * i + 2] = k * w * (mesh.coords[3 * i + 2] - 2)
  return writeBundle(join(tempDir(), name), { ...modelOf(mesh), stress, bodyForce: [0, 0, -w], ...(parts ? { parts } : {}) })
}

describe('tractus parts', () => {
  const w = 7.7e-5
  const dir = column(w, 1, 'column')

  it('gives the documented keys, the interface force equal to the upper part\'s weight', async () => {
    const j = await cliJson('parts', dir)
    expect(j.parts.map((p: { part: number }) => p.part)).toEqual([1, 2])
    expect(Object.keys(j.parts[0])).toEqual(['part', 'name', 'elements', 'volume', 'balance'])
    expect(Object.keys(j.parts[0].balance)).toEqual(expect.arrayContaining(['force', 'moment', 'relative', 'about', 'gross']))
    expect(j.interfaces.length).toBe(1)
    expect(Object.keys(j.interfaces[0])).toEqual(expect.arrayContaining(['parts', 'area', 'centroid', 'force', 'moment', 'mismatch']))
    expect(j.interfaces[0].parts).toEqual([1, 2])
    expect(j.interfaces[0].force[2]).toBeCloseTo(w, 15)
    expect(j.interfaces[0].mismatch).toBeLessThan(1e-12)
    expect((await cli('parts', dir)).stdout).toMatch(/1 → 2/)
  })
})

describe('model.json "parts"', () => {
  it('reads names and a part\'s own body force, round-trips them, and names a bad entry', async () => {
    const { readModelMeta } = await import('../../src/io/modelJson.ts')
    const m = readModelMeta('model.json', { parts: { 2: { name: 'base', bodyForce: [0, 0, -1] }, 1: 'bracket' } })
    expect(m.parts).toEqual([{ part: 1, name: 'bracket', bodyForce: null }, { part: 2, name: 'base', bodyForce: [0, 0, -1] }])
    expect(m.warnings).toEqual([])
    expect(() => readModelMeta('model.json', { parts: { x: 'a' } })).toThrow(/parts\.x.*not a part number/)
    expect(() => readModelMeta('model.json', { parts: { 1: { bodyForce: [0, 0] } } })).toThrow(/parts\.1\.bodyForce/)
  })

  it('gives each part its own weight in tractus parts', async () => {
    // column as above; part 2 has its own ρb, twice the model's: its interface then carries 2w
    const w = 7.7e-5
    const dir = column(w, 2, 'heavy', [{ part: 1, name: 'base', bodyForce: null }, { part: 2, name: 'top', bodyForce: [0, 0, -2 * w] }])
    const j = await cliJson('parts', dir)
    expect(j.parts.map((p: { name: string }) => p.name)).toEqual(['base', 'top'])
    expect(j.parts[1].balance.relative).toBeLessThan(1e-10)
    expect(j.interfaces[0].force[2]).toBeCloseTo(2 * w, 15)
  })
})
