import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { LUG_DEFAULTS } from '../../src/demo/liftingLug.ts'
import { TUNNEL_DEFAULTS } from '../../src/demo/tunnelBlock.ts'
import { readNative } from '../../src/io/nativeContainer.ts'
import { analysisInputOf, runAnalysis } from '../../src/mechanics/analysisPipeline.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { nodalStressField } from '../../src/model/stressField.ts'

// The committed full-size demo files, checked with the project's own pipeline and kernels (what a user sees).
const load = (id: string) => readNative(readFileSync(join('public', 'demo', id, `${id}.tractus`)), `${id}.tractus`)

describe('committed demo: lifting lug through the mechanics kernels', () => {
  const model = load('lifting-lug')
  const { mesh, stress, bodyForce } = model
  const analysis = runAnalysis(analysisInputOf(model))
  const spec = LUG_DEFAULTS
  const th = (spec.angleDeg * Math.PI) / 180
  const P = [spec.load * Math.sin(th), spec.load * Math.cos(th), 0]

  it('whole-body balance residual is under 1 % of the gross load', () => {
    // Cauchy's equation integrated over the body (Malvern 1969, ch. 3).
    const bal = analysis.bodyBalance
    console.log(`lug (full size): balance ${(100 * bal.relative).toFixed(3)} % of ${(bal.gross / 1000).toFixed(2)} kN`)
    expect(bal.relative).toBeLessThan(0.01)
  })

  it('a cut through the shank carries the pin load within 2 % (force and moment about its centroid)', () => {
    // Free body above the cut (statics, common practice). The cut at y = 60 mm runs through elements.
    // The pressure on the hole is radial, so the pin load's line of action passes through the hole centre.
    const { result } = cutSection(mesh, nodalStressField(mesh, stress), bodyForce, { point: [0, 60, spec.thickness / 2], normal: [0, 1, 0] })
    const dF = Math.hypot(result.force[0] - P[0], result.force[1] - P[1], result.force[2] - P[2]) / spec.load
    const c = result.centroid
    const rx = 0 - c[0], ry = spec.holeHeight - c[1]
    const mz = rx * P[1] - ry * P[0]
    const dM = Math.abs(result.moment[2] - mz) / Math.abs(mz)
    console.log(`lug (full size): cut at y = 60 mm: force error ${(100 * dF).toFixed(3)} %, moment ${(result.moment[2] / 1e6).toFixed(4)} vs ${(mz / 1e6).toFixed(4)} kN·m (${(100 * dM).toFixed(3)} %)`)
    expect(dF).toBeLessThan(0.02)
    expect(dM).toBeLessThan(0.02)
  })

  it('load enters at the hole and leaves at the base', () => {
    const lp = analysis.loadPatches
    const big = [...lp.patches].sort((a, b) => Math.hypot(...b.force) - Math.hypot(...a.force)).slice(0, 2)
    console.log(`lug (full size): ${lp.patches.length} load patches; largest ${big.map((p) => `${(Math.hypot(...p.force) / 1000).toFixed(1)} kN at y = ${p.centroid[1].toFixed(0)} mm`).join(', ')}; free surface mean |t| ${(100 * lp.freeSurface.relative).toFixed(2)} % of reference`)
    const atHole = big.find((p) => Math.abs(p.centroid[1] - spec.holeHeight) < spec.headRadius)
    const atBase = big.find((p) => p.centroid[1] < 10)
    expect(atHole).toBeDefined()
    expect(atBase).toBeDefined()
    expect(Math.hypot(atHole!.force[0] - P[0], atHole!.force[1] - P[1]) / spec.load).toBeLessThan(0.05)
    expect(Math.hypot(atBase!.force[0] + P[0], atBase!.force[1] + P[1]) / spec.load).toBeLessThan(0.05)
  })
})

describe('committed demo: tunnel block through the mechanics kernels', () => {
  const model = load('tunnel-block')
  const { mesh, stress, bodyForce } = model
  const { faces, tractions: tr, bodyBalance: bal } = runAnalysis(analysisInputOf(model))
  const s = TUNNEL_DEFAULTS

  it('balance under 1 %; the base carries weight + overburden within 1 %', () => {
    // Free-body diagram of the block (statics, common practice); gravity per Cauchy's equation.
    let fy = 0
    for (let f = 0; f < faces.count; f++) if (Math.abs(faces.centroid[3 * f + 1]) < 1e-9 && faces.normal[3 * f + 1] < -0.999) fy += tr.force[3 * f + 1]
    const gamma = (s.density * s.gravity) / 1000
    const expected = gamma * bal.volume + gamma * s.topDepth * s.width * s.slice
    console.log(`tunnel (full size): base ${fy.toFixed(0)} kN vs ${expected.toFixed(0)} kN (${(100 * (fy / expected - 1)).toFixed(3)} %), balance ${(100 * bal.relative).toFixed(4)} %`)
    expect(Math.abs(fy / expected - 1)).toBeLessThan(0.01)
    expect(bal.relative).toBeLessThan(0.01)
  })

  it('a horizontal cut through the tunnel axis carries the overburden and the rock above', () => {
    const yc = s.height / 2
    const { result } = cutSection(mesh, nodalStressField(mesh, stress), bodyForce, { point: [0, yc + 1e-3, s.slice / 2], normal: [0, 1, 0] })
    const gamma = (s.density * s.gravity) / 1000
    // Rock above the cut: the block above y_c + 1 mm less the upper half of the tunnel above it (nearly πa²/2).
    const above = (s.width * (s.height - yc - 1e-3) - (Math.PI * s.radius ** 2) / 2) * s.slice
    const expected = -(gamma * s.topDepth * s.width * s.slice + gamma * above)
    expect(Math.abs(result.force[1] / expected - 1)).toBeLessThan(0.01)
  })
})
