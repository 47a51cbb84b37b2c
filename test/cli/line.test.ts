/**
 * `tractus line` in-process: the documented JSON shape, gaps as null, usage errors (exit 1), a
 * line wholly outside (exit 0, empty), and the linearisation of a field linear through the wall,
 * which the method reproduces exactly (ASME BPVC VIII-2 Part 5 Annex 5-A: membrane = the mean,
 * bending = the half difference of the in-plane normal stresses, peak = 0 for those).
 */
import { join } from 'node:path'
import { rmSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { cli, cliJson, tempDir, writeBundle } from './cliHarness.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { Model } from '../../src/model/model.ts'
import { stressField } from '../helpers/mappedMeshes.ts'

let root = '', wall = ''

/** σxx and σzz linear across the wall (y), the rest uniform; u = 10⁻³·(y, 0, 0) (m). */
const field = (_x: number, y: number): number[] => [100 + 60 * (y - 0.5), -20, 40 - 30 * (y - 0.5), 5, 0, 0]

beforeAll(() => {
  root = tempDir()
  const mesh = boxMesh({ nx: 3, ny: 2, nz: 2, lx: 3, ly: 1, lz: 1 }, 'hex8')
  const displacement = new Float64Array(3 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) displacement[3 * i] = 1e-3 * mesh.coords[3 * i + 1]
  const model: Model = {
    name: 'wall', description: '', units: { length: 'mm', stress: 'MPa' }, mesh, stress: stressField(mesh, field),
    displacement, bodyForce: [0, 0, 0], warnings: [],
  }
  wall = writeBundle(join(root, 'wall'), model)
})
afterAll(() => { rmSync(root, { recursive: true, force: true }) })

describe('tractus line', () => {
  it('samples the line and linearises it (exact for a linear field)', async () => {
    const j = await cliJson('line', wall, '--from', '1.2,0,0.5', '--to', '1.2,1,0.5', '--points', '5')
    expect(j.length).toBe(1)
    expect(j.points).toHaveLength(5)
    expect(j.distance).toEqual([0, 0.25, 0.5, 0.75, 1])
    expect(j.stress[2][0]).toBeCloseTo(100, 10)
    expect(j.stress[0][0]).toBeCloseTo(70, 10)
    expect(j.vonMises).toHaveLength(5)
    expect(j.principal[0]).toHaveLength(3)
    expect(j.displacement[4][0]).toBeCloseTo(1e-3, 12)
    expect(j.units.stress).toBe('MPa')
    const l = j.linearised
    expect(l.criterion).toBe('vonMises')
    expect(l.method).toMatch(/Annex 5-A/)
    expect(l.frame.e1).toEqual([0, 1, 0])
    expect(l.thickness).toBeCloseTo(1, 10)
    // Membrane = mean = the field at mid-wall.
    for (let k = 0; k < 6; k++) expect(l.membrane[k]).toBeCloseTo(field(0, 0.5)[k], 9)
    // Bending at --from (y = 0): σ(0) − mean = −30 (xx), +15 (zz); nothing else.
    const want = [-30, 0, 15, 0, 0, 0]
    for (let k = 0; k < 6; k++) expect(l.bending[k]).toBeCloseTo(want[k], 9)
    expect(l.peakEquivalent.from).toBeLessThan(1e-8)
    expect(l.peakEquivalent.to).toBeLessThan(1e-8)
    expect(l.membranePlusBendingEquivalent.from).toBeGreaterThan(0)
    expect(j.warnings).toEqual([])
    expect(j.outside).toBe(false)
  })

  it('points outside the body are null in every per-point array', async () => {
    const j = await cliJson('line', wall, '--from', '-1,0.5,0.5', '--to', '1,0.5,0.5', '--points', '3')
    expect(j.stress[0]).toBeNull()
    expect(j.vonMises[0]).toBeNull()
    expect(j.principal[0]).toBeNull()
    expect(j.displacement[0]).toBeNull()
    expect(j.stress[2]).not.toBeNull()
    expect(j.linearised).toBeNull()
    expect(j.linearisationRefused).toMatch(/start of the line lies outside the body/)
  })

  it('Tresca on request, components and frame about an axis, SI units', async () => {
    const j = await cliJson('line', wall, '--from', '1.2,0,0.5', '--to', '1.2,1,0.5', '--criterion', 'tresca', '--axis', '0,0,1', '--axis-point', '1.2,-5,0', '--units', 'si')
    expect(j.linearised.criterion).toBe('tresca')
    expect(j.linearised.frame.rule).toBe('axis')
    expect(j.units.length).toBe('m')
    expect(j.length).toBeCloseTo(1e-3, 15)
    expect(j.points).toHaveLength(51)
    // Radial line along +y about an axis along z: σrr = σyy, σθθ = σxx.
    expect(j.components.stress[0][0]).toBeCloseTo(-20, 9)
    expect(j.components.stress[0][1]).toBeCloseTo(70, 9)
    expect(j.components.displacement[50][1]).toBeCloseTo(-1e-6, 12)
  })

  it('stretches the line to the wall surfaces with --through-wall', async () => {
    const j = await cliJson('line', wall, '--from', '1.2,0.4,0.5', '--to', '1.2,0.6,0.5', '--through-wall')
    expect(j.from[1]).toBeCloseTo(0, 9)
    expect(j.to[1]).toBeCloseTo(1, 9)
    expect(j.warnings[0]).toMatch(/moved to the wall's surfaces/)
  })

  it('a line wholly outside says so, exit 0, empty', async () => {
    const out = await cli('line', wall, '--from', '0,5,0', '--to', '3,5,1')
    expect(out.code).toBe(0)
    expect(out.stdout).toMatch(/wholly outside the body/)
    const j = await cliJson('line', wall, '--from', '0,5,0', '--to', '3,5,1')
    expect(j.outside).toBe(true)
    expect(j.points).toEqual([])
    expect(j.stress).toEqual([])
    expect(j.linearised).toBeNull()
  })

  it('prints a table of points and the linearisation with the caution', async () => {
    const out = await cli('line', wall, '--from', '1.2,0,0.5', '--to', '1.2,1,0.5', '--points', '3')
    expect(out.code).toBe(0)
    expect(out.stdout).toMatch(/von Mises \[MPa\]/)
    expect(out.stdout).toMatch(/Annex 5-A/)
    expect(out.stdout).toMatch(/engineer's task under the applicable code/)
  })

  it('usage errors exit 1: fewer than 2 points, --from equal to --to, a missing end', async () => {
    for (const argv of [
      ['line', wall, '--from', '0,0,0', '--to', '1,1,1', '--points', '1'],
      ['line', wall, '--from', '1,1,1', '--to', '1,1,1'],
      ['line', wall, '--from', '0,0,0'],
      ['line', wall, '--from', '0,0', '--to', '1,1,1'],
      ['line', wall, '--from', '0,0,0', '--to', '1,1,1', '--axis-point', '0,0,0'],
    ]) {
      const out = await cli(...argv)
      expect(out.code, argv.join(' ')).toBe(1)
      expect(out.stderr).toMatch(/Usage: tractus line/)
    }
  })

  it('an unknown load case is an input error (exit 2) naming it', async () => {
    const out = await cli('line', wall, '--from', '1.2,0,0.5', '--to', '1.2,1,0.5', '--case', 'wind')
    expect(out.code).toBe(2)
    expect(out.stderr).toMatch(/no load case or combination "wind"; this model has case default/)
  })
})
