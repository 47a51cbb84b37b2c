/**
 * The section envelope in the snapshot: one line per component with the largest and smallest
 * value and their governing cases, shown only when the envelope belongs to the plane on screen.
 * Figures from the engine worker's own envelope of the bar of test/helpers/caseBar.ts (elementary
 * beam theory, common practice: N = 7.5 N for K = 1.5 pull + bend, −2 N for press).
 */
import { describe, expect, it } from 'vitest'
import { envelopeLines, envelopeOnPlane } from '../../../src/app/envelopeExport.ts'
import { modelEnvelope } from '../../../src/mechanics/sweepEnvelope.ts'
import type { EnvelopeReply, ModelSummary } from '../../../workers/protocol.ts'
import { caseBar } from '../../helpers/caseBar.ts'

const summary = { name: 'bar', units: { length: 'm', stress: 'Pa' } } as ModelSummary

describe('the section envelope in the snapshot', () => {
  const plane = { point: [2, 0.3, 0.2] as [number, number, number], normal: [1, 0, 0] as [number, number, number] }
  const env = modelEnvelope(caseBar, plane, { regions: false })
  const r = (x: (typeof env.cases)[number]) => ({ name: x.name, kind: x.kind, axial: x.section.axial, shear: x.section.shear, torque: x.section.torque, bending: x.section.bending })
  const reply: EnvelopeReply = {
    plane, combinationsOnly: false, cases: env.cases.map(r), envelope: env.envelope, regions: [],
    axes: { e1: [0, 1, 0], e2: [0, 0, 1], e3: [1, 0, 0], kind: 'principal' }, computeMs: 0,
  }

  it('gives one line per component with the governing cases, in the display units', () => {
    const lines = envelopeLines(reply, summary, 'SI')
    expect(lines.map((l) => l.label)).toEqual(['Axial force N', 'Shear force V₁', 'Shear force V₂', 'Torque T', 'Bending moment M₁', 'Bending moment M₂'])
    expect(lines[0]).toEqual({ label: 'Axial force N', largest: '0.0075 kN', largestCase: 'K', smallest: '−0.002 kN', smallestCase: 'press' })
    // shear is rounding noise in every case: no governing case
    expect(lines[1].largestCase).toBe('—')
  })

  it('belongs to the plane it was computed on only', () => {
    expect(envelopeOnPlane(reply, { point: [2, 0.9, 0.1], normal: [3, 0, 0] }, 4)).toBe(true)
    expect(envelopeOnPlane(reply, { point: [2.1, 0.3, 0.2], normal: [1, 0, 0] }, 4)).toBe(false)
    expect(envelopeOnPlane(reply, { point: [2, 0.3, 0.2], normal: [1, 0.1, 0] }, 4)).toBe(false)
  })
})
