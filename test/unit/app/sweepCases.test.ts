/**
 * Several load cases along the part in the app: the cases the chart draws, the sweep's CSV and
 * JSON carrying every drawn case and the envelope, and the review report's envelope along the
 * part. The bar of test/helpers/caseBar.ts has closed forms (elementary beam theory; Timoshenko &
 * Goodier, common practice): N = 5 (pull), −2 (press), 7.5 (K = 1.5 pull + bend), −4 (U = 2 press).
 */
import { describe, expect, it } from 'vitest'
import { buildReportContent } from '../../../src/app/reportContent.ts'
import type { ReportInput, ReportTable } from '../../../src/app/reportContent.ts'
import { sweepCsv, sweepJson } from '../../../src/app/sweepExport.ts'
import { envelopeAlong, envelopeAlongExtremes } from '../../../src/app/sweepSeries.ts'
import { CAUTION } from '../../../src/app/caution.ts'
import { drawnSweepCases } from '../../../src/state/sweepSlice.ts'
import { createTractusStore } from '../../../src/state/store.ts'
import type { ModelSummary } from '../../../workers/protocol.ts'
import { caseBar, sweepOf } from '../../helpers/caseBar.ts'

const U = { name: 'U', factors: { press: 2 } }
const summary: ModelSummary = {
  name: 'bar', description: '', units: { length: 'm', stress: 'Pa' }, nodeCount: 0, elementCount: 32, boundaryFaceCount: 0,
  elementTypes: { hex8: 32 }, bounds: { min: [0, 0, 0], max: [4, 1, 0.5] }, bodyForce: [0, 0, 0], warnings: [], source: 'test', shownCase: 'pull',
}

describe('the sweep over several load cases in the app', () => {
  it('draws the picked cases the sweep holds, in its order', () => {
    const s = sweepOf(caseBar, 5, [U])
    const store = createTractusStore()
    store.getState().showSweepCase('u', true)
    store.getState().showSweepCase('press', true)
    store.getState().showSweepCase('gone', true)
    expect(drawnSweepCases(s, store.getState().sweepCases)).toEqual(['press', 'U'])
    store.getState().showSweepCase('PRESS', false)
    expect(drawnSweepCases(s, store.getState().sweepCases)).toEqual(['U'])
    expect(drawnSweepCases({ ...s, cases: undefined }, ['U'])).toEqual([])
  })

  it('exports every drawn case and the envelope per section (CSV and JSON), in the display units', () => {
    const s = sweepOf(caseBar, 5, [U])
    const csv = sweepCsv(summary, s, 'SI', ['press', 'U'], 'pull').trim().split('\n')
    const head = csv.find((l) => l.startsWith('position'))!.split(',')
    expect(head).toContain('press axial [kN]')
    expect(head).toContain('U bending1 [kN·m]')
    expect(head).not.toContain('pull axial [kN]')
    expect(head).toContain('axial_max_case')
    const row = csv[csv.length - 1].split(',')
    expect(Number(row[head.indexOf('press axial [kN]')])).toBeCloseTo(-2e-3, 12)
    expect(Number(row[head.indexOf('U axial [kN]')])).toBeCloseTo(-4e-3, 12)
    expect(Number(row[head.indexOf('axial_max [kN]')])).toBeCloseTo(7.5e-3, 12)
    expect(row[head.indexOf('axial_max_case')]).toBe('K')
    expect(row[head.indexOf('axial_min_case')]).toBe('U')
    // US units: 1 lbf = 4.4482216152605 N (NIST SP 811)
    const us = JSON.parse(sweepJson(summary, s, 'US', ['press', 'U'], 'pull'))
    const lbf = us.units.force === 'kip' ? 4448.2216152605 : 4.4482216152605
    // (to 1e-6: the app's own conversion factor is written to fewer digits)
    expect(us.cases.map((c: { case: string }) => c.case)).toEqual(['press', 'U'])
    expect(us.cases[1].axial[2] / (-4 / lbf)).toBeCloseTo(1, 6)
    expect(us.envelope.axial[2]).toMatchObject({ maxCase: 'K', minCase: 'U' })
    expect(us.freeBody.case).toBe('pull')
    // none drawn: the case shown
    const one = JSON.parse(sweepJson(summary, s, 'SI', [], 'pull'))
    expect(one.cases.map((c: { case: string }) => c.case)).toEqual(['pull'])
    expect(one.cases[0].axial[0]).toBeCloseTo(5e-3, 12)
  })

  it('marks a plane that misses the body with no envelope', () => {
    const s = sweepOf(caseBar, 3, [], [1, 6])
    const rows = envelopeAlong(s, summary.units, 'SI')!
    expect(rows[2].cells.every((c) => c === null)).toBe(true)
    expect(rows[0].cells[0]).toMatchObject({ maxCase: 'K', minCase: 'press' })
    const csv = sweepCsv(summary, s, 'SI', [], 'pull').trim().split('\n')
    expect(csv[csv.length - 1].split(',').slice(1).every((v) => v === '')).toBe(true)
  })

  it('puts the envelope along the part in the review report: extremes with position and governing case, diagrams, tables', () => {
    const s = sweepOf(caseBar, 5, [U])
    const input: ReportInput = {
      model: summary, system: 'SI', date: new Date('2026-12-02T00:00:00Z'), caution: CAUTION, audit: null, section: null, sweep: s,
      shown: { axial: true, shear1: false, shear2: false, torque: false, bending1: true, bending2: false }, snapshot: null,
    }
    const c = buildReportContent(input)
    const ids = c.blocks.map((b) => b.id)
    expect(ids).toEqual(expect.arrayContaining(['sweep', 'envelope-along-extremes', 'diagram-envelope-axial', 'diagram-envelope-bending1', 'envelope-along-forces', 'envelope-along-moments']))
    expect(ids).not.toContain('diagram-envelope-torque')
    const ext = c.blocks.find((b) => b.id === 'envelope-along-extremes') as ReportTable
    // (the minus sign is U+2212; ties up to round-off go to the first section)
    expect(ext.rows[0]).toEqual(['Axial force N [kN]', '0.0075', '4e−6 m', 'K', '−0.004', '4e−6 m', 'U'])
    expect(ext.rows[1]).toEqual(['Shear force 1 V₁ [kN]', '0', '—', '—', '0', '—', '—'])
    const forces = c.blocks.find((b) => b.id === 'envelope-along-forces') as ReportTable
    expect(forces.rows.length).toBe(5)
    expect(forces.rows[0][1]).toBe('0.0075 (K)')
    expect(forces.rows[0][2]).toBe('−0.004 (U)')
    // a component that is rounding noise in every case names no governing case
    expect(forces.rows[0][3]).not.toMatch(/\(/)
    const extremes = envelopeAlongExtremes(envelopeAlong(s, summary.units, 'SI')!)
    // |M| = 6 I = 0.0625 N·m in bend and in K (equal up to round-off), in whichever bending axis the principal axes give
    const m = extremes.slice(4).map((e) => (Math.abs(e.max) > Math.abs(e.min) ? { v: e.max, g: e.maxCase } : { v: e.min, g: e.minCase }))
    const big = m.find((x) => Math.abs(x.v) > 1e-6)!
    expect(Math.abs(big.v)).toBeCloseTo(6.25e-5, 12)
    expect(['bend', 'K']).toContain(big.g)
    // a sweep of one case has no envelope blocks
    const plain = buildReportContent({ ...input, sweep: { ...s, cases: undefined } })
    expect(plain.blocks.some((b) => b.id.startsWith('envelope-along'))).toBe(false)
  })
})
