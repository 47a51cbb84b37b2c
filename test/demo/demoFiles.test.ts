import { existsSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { readNative } from '../../src/io/nativeContainer.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { LUG_DEFAULTS, LUG_SLING_ANGLES } from '../../src/demo/liftingLug.ts'
import { sectionEnvelope } from '../../src/mechanics/sectionEnvelope.ts'
import { nodalStressField } from '../../src/model/stressField.ts'

// The committed demo files (written by `npm run demo`): listed, loadable, labelled as invented,
// and small enough to ship.
const root = join('public', 'demo')
interface Entry { id: string; description: string; elements: number; nodes: number; file: string; files: { native: string; csv: string[] | null }; onDemand?: boolean }

describe('bundled demo files', () => {
  const index = JSON.parse(readFileSync(join(root, 'index.json'), 'utf8')) as { scenarios: Entry[] }
  const committed = index.scenarios.filter((e) => !e.onDemand)

  it('lists the four scenarios, each saying it is invented', () => {
    expect(committed.map((e) => e.id).sort()).toEqual(['bolted-bracket', 'lifting-lug', 'pipe-segment', 'tunnel-block'])
    for (const e of committed) {
      expect(e.description).toMatch(/invented/i)
      const meta = JSON.parse(readFileSync(join(root, e.id, 'model.json'), 'utf8')) as { description: string }
      expect(meta.description).toBe(e.description)
    }
  })

  it('the lug carries the caution about lifting devices', () => {
    const lug = committed.find((e) => e.id === 'lifting-lug')!
    expect(lug.description).toMatch(/qualified engineer/)
    expect(lug.description).toMatch(/codes/)
  })

  it('the pipe quotes the Lamé hoop stress to compare with, and carries displacement', () => {
    const pipe = committed.find((e) => e.id === 'pipe-segment')!
    // Lamé (Timoshenko & Goodier §28), a = 100, b = 130, p = 20: mean hoop p·a/(b − a) = 66.7 MPa,
    // at the bore p(b² + a²)/(b² − a²) = 78.0 MPa.
    expect(pipe.description).toMatch(/Lamé/)
    expect(pipe.description).toMatch(/66\.7 MPa/)
    expect(pipe.description).toMatch(/78\.0 MPa/)
    const model = readNative(readFileSync(join(root, pipe.files.native)), pipe.files.native)
    expect(model.displacement).not.toBeNull()
    expect(model.units).toEqual({ length: 'mm', stress: 'MPa' })
  })

  it('the bracket states the elastic bolt-group tensions beside the section forces, and names its parts', () => {
    const b = committed.find((e) => e.id === 'bolted-bracket')!
    // P/n + M·yᵢ/Σyⱼ² with P = 40 kN, n = 4, load 25 mm off the centre, bolts at x = ±50 mm:
    // 10 ± 40·25·50/(4·50²) = 15 and 5 kN (Shigley, Mechanical Engineering Design, bolted joints; from memory)
    expect(b.description).toMatch(/A 15\.0 kN \/ [\d.]+ kN, B 15\.0 kN \/ [\d.]+ kN, C 5\.0 kN \/ [\d.]+ kN, D 5\.0 kN/)
    expect(b.description).toMatch(/not rigid/)
    const model = readNative(readFileSync(join(root, b.files.native)), b.files.native)
    expect(new Set(model.mesh.blocks[0].part)).toEqual(new Set([1, 2, 3, 4, 5, 6]))
    // version 1 of the container carries part numbers only: the names are in model.json
    const meta = JSON.parse(readFileSync(join(root, b.id, 'model.json'), 'utf8')) as { parts: Record<string, string> }
    expect(meta.parts['2']).toBe('bracket plate')
  })

  it('native containers load and match the index; committed files stay under 16 MB', () => {
    let bytes = 0
    for (const e of committed) {
      const files = [e.files.native, ...(e.files.csv ?? []), `${e.id}/model.json`]
      for (const f of new Set(files)) { expect(existsSync(join(root, f)), f).toBe(true); bytes += statSync(join(root, f)).size }
      const model = readNative(readFileSync(join(root, e.files.native)), e.files.native)
      expect(model.mesh.elementCount).toBe(e.elements)
      expect(model.mesh.nodeCount).toBe(e.nodes)
      expect(model.mesh.blocks[0].type).toBe('hex8')
      expect(model.warnings).toEqual([])
    }
    // four scenarios: the bolted bracket added about 0.9 MB to the three's 14.4 MB
    expect(bytes).toBeLessThan(16e6)
  })

  it('the lug container reads back through a CSV bundle to the same stress, every load case', () => {
    // The lug's CSV tables are generated but not committed (size); its bundle is written here from the container.
    const lug = committed.find((e) => e.id === 'lifting-lug')!
    const native = readNative(readFileSync(join(root, lug.files.native)), lug.files.native)
    const csv = readCsvBundle(writeCsvBundle(native))
    expect(csv.mesh.nodeCount).toBe(native.mesh.nodeCount)
    expect(csv.units).toEqual(native.units)
    expect(csv.cases!.map((c) => c.name)).toEqual(native.cases!.map((c) => c.name))
    let worst = 0
    native.cases!.forEach((c, k) => { for (let i = 0; i < c.stress.length; i++) worst = Math.max(worst, Math.abs(csv.cases![k].stress[i] - c.stress[i])) })
    expect(worst).toBe(0)
  })

  it('the lug has its sling angles as load cases; the governing angle it names at the neck is the envelope\'s', () => {
    const lug = committed.find((e) => e.id === 'lifting-lug')!
    const m = readNative(readFileSync(join(root, lug.files.native)), lug.files.native)
    expect(m.cases!.map((c) => c.name)).toEqual(LUG_SLING_ANGLES.map((a) => `sling-${a}`))
    expect(m.combinations).toEqual([{ name: 'proof', factors: { 'sling-30': 2 } }])
    // the neck: the shank's top, y = hole height − head radius (LUG_DEFAULTS)
    const y = LUG_DEFAULTS.holeHeight - LUG_DEFAULTS.headRadius
    const env = sectionEnvelope(m.mesh, m.cases!.map((c) => ({ name: c.name, field: nodalStressField(m.mesh, c.stress) })), [], { point: [0, y, 10], normal: [0, 1, 0] })
    const e = env.envelope!
    const inPlane = Math.abs(env.cases[0].section.axes.e1[2]) > 0.5 ? e.bending[0] : e.bending[1]
    const governing = Math.abs(inPlane.max) >= Math.abs(inPlane.min) ? inPlane.maxCase : inPlane.minCase
    expect(m.description).toContain(`the angle that governs the neck is ${governing.slice(6)}°`)
    // statics (common practice): the in-plane moment at the neck is the sideways pull times its arm, 50 kN · sin θ · (hole height − neck), within the 2 % the shank cut keeps (demoKernels.test.ts)
    const moments = env.cases.map((c) => Math.abs(Math.abs(c.section.axes.e1[2]) > 0.5 ? c.section.bending[0] : c.section.bending[1]))
    const arm = LUG_DEFAULTS.holeHeight - y
    LUG_SLING_ANGLES.forEach((a, k) => expect(Math.abs(moments[k] - LUG_DEFAULTS.load * Math.sin((a * Math.PI) / 180) * arm)).toBeLessThan(0.02 * LUG_DEFAULTS.load * arm))
  })
})
