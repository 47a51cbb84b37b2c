/**
 * The command line on element-nodal stress: `info` states the stress form, `parts` reports each
 * part's own balance and the interface force from each part's own values, `convert` keeps the
 * element-nodal field in the container. Model: a two-material bar (parts split at x = 1) whose
 * stress is uniform in each part with the components parallel to the joint different and the
 * traction across it, (σxx, σxy, σxz), the same: equilibrium of the interface (common practice).
 */
import { rmSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { Model } from '../../src/model/model.ts'
import type { StressField } from '../../src/model/stressField.ts'
import { partAveragedStress } from '../../src/model/stressField.ts'
import { cli, cliJson, tempDir, writeBundle } from './cliHarness.ts'

const S1 = [10, 2, 1, 3, 0.5, 4], S2 = [10, 7, -3, 3, 2, 4]
const dirs: string[] = []
afterAll(() => { for (const d of dirs) rmSync(d, { recursive: true, force: true }) })

function bar(): Model {
  const m = boxMesh({ nx: 4, ny: 2, nz: 2, lx: 2, ly: 1, lz: 1 }, 'hex8')
  const b = m.blocks[0], nn = 8
  const part = Int32Array.from(b.ids, (_, e) => (m.coords[3 * b.conn[e * nn + 6]] <= 1 ? 1 : 2))
  const mesh = { ...m, blocks: [{ ...b, part }] }
  const values = new Float64Array(6 * b.conn.length)
  for (let i = 0; i < b.conn.length; i++) values.set(part[(i / nn) | 0] === 1 ? S1 : S2, 6 * i)
  const field: StressField = { values, rows: [Int32Array.from(b.conn, (_, i) => i)], layout: 'element-nodal' }
  return { name: 'bar', description: '', units: { length: 'mm', stress: 'MPa' }, mesh, stress: partAveragedStress(mesh, field), stressField: field, displacement: null, bodyForce: [0, 0, 0], warnings: [] }
}

describe('command line on element-nodal stress', () => {
  it('info states the form; parts uses each part\'s own values; convert keeps them', async () => {
    const dir = tempDir()
    dirs.push(dir)
    writeBundle(dir, bar())
    expect((await cli('info', dir)).stdout).toMatch(/stress form\s+element-nodal \(128 rows, one per element and node; averaged within each part for display\)/)
    expect((await cliJson('info', dir)).stressLayout).toBe('element-nodal')
    const p = await cliJson('parts', dir, '--json')
    for (const part of p.parts) expect(part.balance.relative).toBeLessThan(1e-12)
    expect(p.interfaces[0].force.map((f: number) => Math.round(f * 1e9) / 1e9)).toEqual([-10, -3, -4])
    const out = join(dir, 'bar.tractus')
    await cli('convert', dir, '--out', out)
    expect((await cliJson('info', out)).stressLayout).toBe('element-nodal')
  })
})
