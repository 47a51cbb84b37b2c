/**
 * The load-entry patches of the shipped demos (the checks of the patch rule, loadPatches.ts):
 * the tunnel block splits into its loaded faces — top, both sides, base and the two slice faces —
 * while the free tunnel wall stays free surface; the lug's base patch is the welded base, 200 mm
 * by 20 mm, and carries the pin's 50 kN pull at 30° (the demo's own statics).
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { readNative } from '../../src/io/nativeContainer.ts'
import { analysisInputOf, runAnalysis } from '../../src/mechanics/analysisPipeline.ts'
import { cliJson } from '../cli/cliHarness.ts'

function patchesOf(file: string) {
  const model = readNative(readFileSync(join('public', 'demo', file)), file)
  return runAnalysis(analysisInputOf(model), { balancePrecision: 'single' }).loadPatches
}

describe('demo load-entry patches', () => {
  it('tunnel block: top, two sides, base and the two slice faces; the tunnel wall is free', () => {
    const lp = patchesOf('tunnel-block/tunnel-block.tractus')
    // The block spans x ∈ [−30, 30], y ∈ [0, 60] (y up), z ∈ [0, 3]; each patch is one flat face.
    const named = lp.patches.map((p) => {
      const [nx, ny, nz] = p.normal
      expect(Math.hypot(nx, ny, nz)).toBeCloseTo(1, 9)
      return ny > 0.99 ? 'top' : ny < -0.99 ? 'base' : nx > 0.99 ? 'right side' : nx < -0.99 ? 'left side' : nz > 0.99 ? 'back slice' : 'front slice'
    })
    expect(named.sort()).toEqual(['back slice', 'base', 'front slice', 'left side', 'right side', 'top'])
    expect(lp.patches.find((p) => p.normal[1] > 0.99)!.area).toBeCloseTo(60 * 3, 9)
    expect(lp.patches.find((p) => p.normal[1] < -0.99)!.area).toBeCloseTo(60 * 3, 9)
    // What is left free is the tunnel wall: 2π · 4 m · 3 m (as the polygon the mesh draws).
    expect(lp.freeSurface.area).toBeGreaterThan(0.99 * 2 * Math.PI * 4 * 3)
    expect(lp.freeSurface.area).toBeLessThan(2 * Math.PI * 4 * 3)
  })

  it('lifting lug: the base patch is the base, and carries the pin load', () => {
    const lp = patchesOf('lifting-lug/lifting-lug.tractus')
    const base = lp.patches.find((p) => p.normal[1] < -0.99)!
    expect(base.area).toBeCloseTo(200 * 20, 6)
    expect(Math.abs(base.centroid[1])).toBeLessThan(1e-9)
    // The pin pulls with 50 kN at 30° from the lug's axis (the demo's description); the base holds
    // it back, less what the weld toes' own small patches carry.
    expect(Math.hypot(...base.force) / 50e3).toBeGreaterThan(0.99)
    expect(Math.hypot(...base.force) / 50e3).toBeLessThan(1.01)
  })
})

describe('demo load-entry patches through `tractus audit --json`', () => {
  it('tunnel: six patches, each with its force and its moment; the lug: the base patch', async () => {
    const tunnel = await cliJson('audit', join('public', 'demo', 'tunnel-block', 'tunnel-block.tractus'))
    expect(tunnel.patches).toHaveLength(6)
    expect(tunnel).toMatchObject({ thresholdFraction: 0.05, lowerThresholdFraction: 0.005, featureAngle: 40 })
    for (const p of tunnel.patches) {
      expect(p.force).toHaveLength(3)
      expect(p.moment).toHaveLength(3)
    }
    const lug = await cliJson('audit', join('public', 'demo', 'lifting-lug', 'lifting-lug.tractus'))
    const base = lug.patches.find((p: { centroid: number[] }) => Math.abs(p.centroid[1]) < 1e-9)
    expect(base.area).toBeCloseTo(4000, 6) // mm², the model's own units
    expect(Math.hypot(...base.force) / 50e3).toBeCloseTo(1, 1)
  })
})
