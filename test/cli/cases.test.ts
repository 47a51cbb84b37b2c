/**
 * The command line with load cases (test/fixtures/cases, made by makeCaseBundle.ts): --case on
 * every command, `cut --case all` with its envelope, `sweep --case all`, `info`'s list. The bar's
 * figures are statics (common practice): at height z the dead case carries N = ρg A z, the pull
 * case N = σA, the bend case M = σ_max I / c about y (I = 1/12 m⁴, c = 0.5 m).
 */
import { describe, expect, it } from 'vitest'
import { join } from 'node:path'
import { cli, cliJson } from './cliHarness.ts'

const bar = join(import.meta.dirname, '..', 'fixtures', 'cases')
const plane = ['--point', '0.5,0.5,2', '--normal', '0,0,1']

describe('tractus with load cases', () => {
  it('info lists the cases and combinations; --case chooses the stress shown', async () => {
    const j = await cliJson('info', bar)
    expect(j.case).toBe('dead')
    expect(j.cases.map((c: { name: string }) => c.name)).toEqual(['dead', 'pull', 'bend'])
    expect(j.cases[0]).toMatchObject({ description: 'own weight', bodyForce: [0, 0, -77000], displacement: true })
    expect(j.combinations).toEqual([{ name: 'ULS-1', factors: { dead: 1.35, pull: 1.5 } }, { name: 'ULS-2', factors: { dead: 1, bend: 1.5, pull: -0.5 } }])
    const pull = await cliJson('info', bar, '--case', 'PULL')
    expect(pull.case).toBe('pull')
    expect(pull.stress.zz).toEqual([1e6, 1e6])
    expect((await cli('info', bar)).stdout).toMatch(/Combinations\n\s+ULS-1\s+1\.35 × dead \+ 1\.5 × pull/)
  })

  it('every command takes --case; an unknown name is an error listing the known ones', async () => {
    for (const cmd of [['info'], ['audit'], ['parts'], ['cut', ...plane], ['sweep', '--normal', '0,0,1', '--from', '1', '--to', '3', '--count', '3'], ['line', '--from', '0.5,0.5,0.5', '--to', '0.5,0.5,3.5']]) {
      const out = await cli(cmd[0], bar, ...cmd.slice(1), '--case', 'snow')
      expect(out.code, cmd[0]).toBe(2)
      expect(out.stderr).toContain('no load case or combination "snow"; this model has cases dead, pull, bend; combinations ULS-1, ULS-2')
      const ok = await cli(cmd[0], bar, ...cmd.slice(1), '--case', 'ULS-2')
      expect(ok.code, `${cmd[0]}: ${ok.stderr}`).toBe(0)
    }
    const all = await cli('audit', bar, '--case', 'all')
    expect(all.stderr).toMatch(/--case all is for cut and sweep/)
  })

  it('cut --case NAME: the combination is the factored sum (statics of the bar)', async () => {
    const uls = await cliJson('cut', bar, ...plane, '--case', 'uls-1')
    // 1.35 · ρg A z + 1.5 · σ A at z = 2
    expect(uls.axial).toBeCloseTo(1.35 * 77000 * 2 + 1.5 * 1e6, 4)
    // ρb of a combination is the factored sum: the free body of the lower half balances
    expect(uls.bodyForce).toEqual([0, 0, -1.35 * 77000])
    expect(uls.freeBody.relative).toBeLessThan(1e-9)
    const bend = await cliJson('cut', bar, ...plane, '--case', 'bend')
    // M = σ_max I / c = 3e6 · (1/12) / 0.5
    expect(Math.hypot(...bend.bending)).toBeCloseTo(3e6 / 12 / 0.5, 3)
  })

  it('cut --case all --json prints every case and the envelope in the documented shape', async () => {
    const j = await cliJson('cut', bar, ...plane, '--case', 'all')
    expect(j.cases.map((c: { case: string }) => c.case)).toEqual(['dead', 'pull', 'bend', 'ULS-1', 'ULS-2'])
    expect(Object.keys(j.envelope).sort()).toEqual(['axial', 'bending', 'regions', 'shear', 'torque'])
    expect(Object.keys(j.envelope.axial).sort()).toEqual(['max', 'maxCase', 'min', 'minCase'])
    expect(j.envelope.shear.length).toBe(2)
    expect(j.envelope.bending.length).toBe(2)
    const axial = j.cases.map((c: { axial: number }) => c.axial)
    expect(j.envelope.axial.max).toBeCloseTo(Math.max(...axial), 6)
    expect(j.envelope.axial.maxCase).toBe('ULS-1')
    // ULS-2 = dead + 1.5 bend − 0.5 pull: N = 154 000 − 500 000
    expect(j.envelope.axial.min).toBeCloseTo(77000 * 2 - 0.5e6, 4)
    expect(j.envelope.axial.minCase).toBe('ULS-2')
    // the envelope (one stencil) agrees with the full cut of each case
    j.cases.forEach((c: { bending: number[] }, k: number) => {
      if (j.cases[k].case === j.envelope.bending[1].minCase) expect(j.envelope.bending[1].min).toBeCloseTo(c.bending[1], 4)
    })
    expect(j.envelope.regions.length).toBe(1)
    expect(j.envelope.regions[0].axial.maxCase).toBe('ULS-1')
    const only = await cliJson('cut', bar, ...plane, '--case', 'all', '--combinations-only')
    expect(only.combinationsOnly).toBe(true)
    expect(only.envelope.axial.maxCase).toBe('ULS-1')
    expect(only.cases.length).toBe(5)
  })

  it('cut --case all prints a table naming the governing cases; sweep --case all per section', async () => {
    const t = await cli('cut', bar, ...plane, '--case', 'all')
    expect(t.stdout).toMatch(/Envelope over 5 cases and combinations/)
    expect(t.stdout).toMatch(/axial N \[N\]\s+1\.708e\+6\s+ULS-1\s+-346000\s+ULS-2/)
    const s = await cliJson('sweep', bar, '--normal', '0,0,1', '--from', '1', '--to', '3', '--count', '3', '--case', 'all')
    expect(s.sections.length).toBe(3)
    s.sections.forEach((x: { offset: number; envelope: { axial: { max: number; maxCase: string } } }) => {
      expect(x.envelope.axial.maxCase).toBe('ULS-1')
      expect(x.envelope.axial.max).toBeCloseTo(1.35 * 77000 * x.offset + 1.5e6, 4)
    })
    const csv = await cli('sweep', bar, '--normal', '0,0,1', '--from', '1', '--to', '3', '--count', '3', '--case', 'all')
    expect(csv.stdout.split('\n')[0]).toMatch(/^offset \[m\],axial_max \[N\],axial_max_case,axial_min \[N\],axial_min_case,/)
    expect((await cli('cut', bar, ...plane, '--combinations-only')).stderr).toMatch(/goes with --case all/)
  })
})
