import { describe, expect, it } from 'vitest'
import { buildReportContent } from '../../../src/app/reportContent.ts'
import type { ReportInput, ReportTable } from '../../../src/app/reportContent.ts'
import { CAUTION } from '../../../src/app/caution.ts'
import type { SweepReply } from '../../../workers/protocol.ts'

const f = (...v: number[]): Float64Array => Float64Array.from(v)
const sweep: SweepReply = {
  normal: [1, 0, 0], extent: [0, 4], offsets: f(0.5, 2, 3.5), axial: f(5, 5, 5), shear1: f(0, 0, 0), shear2: f(1, 1, 1),
  torque: f(0, 0, 0), bending1: f(3, 2, 1), bending2: f(0, 0, 0), freeBodyRelative: f(1e-12, 2e-12, 3e-12), freeBodyMomentRelative: f(1e-12, 1e-12, 1e-12), empty: new Uint8Array(3),
  axes: { kind: 'principal', reference: [0, 1, 0] },
}

function input(over: Partial<ReportInput> = {}): ReportInput {
  return {
    model: {
      name: '<img src=x onerror=alert(1)> bar', description: 'a test bar', units: { length: 'm', stress: 'Pa' },
      nodeCount: 10, elementCount: 4, boundaryFaceCount: 12, elementTypes: { hex8: 4 }, bounds: { min: [0, 0, 0], max: [4, 1, 1] },
      bodyForce: [0, 0, 0], warnings: ['node 7 repeated'], source: 'files:a.csv',
      inputs: [{ name: 'a.csv', bytes: 1234567, sha256: 'ab'.repeat(32) }], stressLayout: 'nodal',
    },
    system: 'SI', date: new Date('2026-12-01T19:00:00.000Z'), caution: CAUTION,
    audit: {
      body: { force: [1, 3e-12, 0], moment: [0, 0, 0], gross: 2000, relative: 5e-4, bodyForceTotal: [0, 0, 0], volume: 4, about: [2, 0.5, 0.5] } as never,
      indicator: { p50: 1e-6, p95: 1e-5, max: 1e-4 },
      patches: [{ id: 0, faceCount: 3, part: 0, area: 1, centroid: [0, 0.5, 0.5], force: [-5000, 0, 0], moment: [0, 2e-9, 30], peak: 5000, mean: 5000 } as never],
      threshold: 50, lowerThreshold: 25, fractions: { threshold: 0.01, lowerThreshold: 0.005 }, featureAngle: 40,
      referenceStress: 5000, freeSurface: { area: 14, mean: 0, relative: 0, peak: 0 },
      freeSurfaceForce: [0, 0, 0], verdict: { kind: 'mesh', reason: 'in balance: the residual force is 0.05 % of the gross load' },
      leastBalanced: [{ id: 17, indicator: 1e-4, centre: [1, 0.5, 0.5], radius: 0.8 }],
    },
    review: { title: 'Bar check', project: 'P-12', author: 'A. Author', checker: '', revision: 'B', loadCase: '', notes: 'first look' },
    version: '0.1.0',
    section: null, sweep, shown: { axial: true, shear1: false, shear2: true, torque: false, bending1: true, bending2: false },
    snapshot: 'data:image/png;base64,iVBORw0KGgo=',
    ...over,
  }
}

const table = (c: ReturnType<typeof buildReportContent>, id: string): ReportTable => c.blocks.find((b) => b.id === id) as ReportTable

describe('review report content', () => {
  it('carries the facts, the caution, the tables and the diagrams', () => {
    const c = buildReportContent(input())
    // The name is passed through as text; the HTML writer puts it in a text node (never markup).
    expect(c.title).toBe('Review report: <img src=x onerror=alert(1)> bar')
    expect(c.caution).toBe(CAUTION)
    expect(c.facts).toContainEqual(['Made', '2026-12-01T19:00:00Z'])
    expect(c.facts).toContainEqual(['Model units', 'length m, stress Pa'])
    expect(c.facts).toContainEqual(['Reader note', 'node 7 repeated'])
    // The reviewer's fields (empty ones left out) and the traceability of the inputs.
    expect(c.facts).toContainEqual(['Title', 'Bar check'])
    expect(c.facts).toContainEqual(['Revision', 'B'])
    expect(c.facts.some(([k]) => k === 'Checker')).toBe(false)
    expect(c.facts).toContainEqual(['Load case', 'the model\'s one stress field (no load case named)'])
    expect(c.facts).toContainEqual(['Input file', `a.csv: 1 234 567 bytes, SHA-256 ${'ab'.repeat(32)}`])
    // a digest still being computed (it starts after the first picture) says so, not that there is none
    const base = input()
    const pending = buildReportContent(input({ model: { ...base.model, inputs: [{ name: 'a.csv', bytes: 12 }], digestsPending: true } }))
    expect(pending.facts).toContainEqual(['Input file', 'a.csv: 12 bytes, SHA-256 still being computed (make the report again in a moment)'])
    expect(c.facts).toContainEqual(['Stress', 'nodal (one value per node)'])
    expect(c.facts).toContainEqual(['Made with', 'Tractus 0.1.0'])
    expect(c.facts).toContainEqual(['Notes', 'first look'])
    expect(c.blocks.map((b) => b.id)).toEqual(['snapshot', 'equilibrium', 'patches', 'patch-vectors', 'diagram-axial', 'diagram-shear2', 'diagram-bending1', 'diagram-residual', 'sweep'])
    // 1 N residual of 2000 N gross; N in kN (SI display, common practice); 3e-12 N is rounding noise next to it, shown as 0.
    expect(table(c, 'equilibrium').rows[0]).toEqual(['Residual force', '(0.001, 0, 0)', 'kN'])
    expect(table(c, 'equilibrium').rows[2]).toEqual(['Residual moment taken about (volume centroid)', '(2, 0.5, 0.5)', 'm'])
    expect(table(c, 'equilibrium').rows).toContainEqual(['Least balanced elements (id: indicator)', '17: 1e−4', '–'])
    // Moments: 2e-9 of 30 N·m is noise and reads 0; force and moment per patch.
    expect(table(c, 'patches').rows[0]).toEqual(['0', '3', '1', '5', '0.03', '0.005', '0.005'])
    expect(table(c, 'patch-vectors').rows[0]).toEqual(['0', '(0, 0.5, 0.5)', '(−5, 0, 0)', '(0, 0, 0.03)'])
    expect(table(c, 'patches').note).toMatch(/faces above 1 % of the reference stress start a patch, faces above 0.5 % join one/)
    expect(table(c, 'sweep').rows).toHaveLength(3)
    const bending = c.blocks.find((b) => b.id === 'diagram-bending1')!
    expect(bending.kind === 'diagram' && bending.geometry.lines.map((l) => l.label)).toEqual(['M₁ Bending moment 1'])
  })

  it('shows all six internal-force diagrams by default (the store\'s default choice)', async () => {
    const { createTractusStore } = await import('../../../src/state/store.ts')
    const c = buildReportContent(input({ shown: createTractusStore().getState().sweepShown }))
    expect(c.blocks.filter((b) => b.kind === 'diagram' && b.id !== 'diagram-residual').map((b) => b.id))
      .toEqual(['diagram-axial', 'diagram-shear1', 'diagram-shear2', 'diagram-torque', 'diagram-bending1', 'diagram-bending2'])
    // Moments share one scale: the zero torque is drawn on the bending moment's axis .
    const torque = c.blocks.find((b) => b.id === 'diagram-torque')!
    const bending = c.blocks.find((b) => b.id === 'diagram-bending1')!
    if (torque.kind !== 'diagram' || bending.kind !== 'diagram') throw new Error('not diagrams')
    expect(torque.geometry.yTicks.map((t) => t.label)).toEqual(bending.geometry.yTicks.map((t) => t.label))
  })

  it('takes only PNG data URLs as the snapshot', () => {
    for (const bad of ['javascript:alert(1)', 'data:text/html;base64,PHA+', 'http://example.org/x.png', 'data:image/png;base64,"><x']) {
      expect(buildReportContent(input({ snapshot: bad })).blocks.some((b) => b.kind === 'image')).toBe(false)
    }
  })

  it('leaves out what is not there and says so for an empty section', () => {
    const c = buildReportContent(input({ audit: null, sweep: null, snapshot: null, section: { empty: true } as never }))
    expect(c.blocks.map((b) => b.id)).toEqual(['section'])
    expect((c.blocks[0] as ReportTable).note).toBe('The plane misses the body.')
  })
})

describe('review report: a line through the model', () => {
  const n = 5
  const line = {
    from: [0, 0, 0], to: [0, 1, 0], length: 1, axes: { kind: 'global' }, criterion: 'vonMises',
    points: Float64Array.from({ length: 3 * n }, (_, i) => (i % 3 === 1 ? Math.floor(i / 3) / (n - 1) : 0)),
    distance: Float64Array.from({ length: n }, (_, i) => i / (n - 1)),
    stress: new Float64Array(6 * n).fill(2e6), components: new Float64Array(6 * n).fill(2e6),
    vonMises: new Float64Array(n).fill(1e6), principal: new Float64Array(3 * n).fill(2e6),
    displacement: null, displacementComponents: null, held: Uint8Array.from([1, 1, 1, 1, 0]),
    linearisation: null, refused: 'the line leaves the body 0.75 after its start', warnings: [], outside: false,
  } as never
  it('adds the diagram, the refusal and the points with the gap marked', () => {
    const c = buildReportContent(input({ line, lineShown: { s0: true, s1: false, s2: false, s3: false, s4: false, s5: false, vonMises: true, principal1: false, principal3: false, displacement: false } }))
    expect(c.blocks.slice(-3).map((b) => b.id)).toEqual(['diagram-line', 'linearisation', 'line'])
    expect(table(c, 'linearisation').note).toBe('Not linearised: the line leaves the body 0.75 after its start.')
    const points = table(c, 'line')
    expect(points.rows).toHaveLength(5)
    // 2e6 Pa = 2 MPa (SI display), the last point outside the body.
    expect(points.rows[0][1]).toBe('2')
    expect(points.rows[4][1]).toBe('outside the body')
  })
})

describe('review report: the section envelope over load cases', () => {
  const z = { axial: 0, shear: [0, 0] as const, torque: 0, bending: [0, 0] as const }
  const cases = [
    { name: 'dead', kind: 'case' as const, ...z, axial: 1000, bending: [0, -2000] as const },
    { name: 'wind', kind: 'case' as const, ...z, axial: -500, bending: [0, 3000] as const },
  ]
  const e = (max: number, maxCase: string, min: number, minCase: string) => ({ max, maxCase, min, minCase })
  const envelope = {
    plane: { point: [0, 0, 1] as [number, number, number], normal: [0, 0, 1] as [number, number, number] }, combinationsOnly: false, cases,
    envelope: { axial: e(1000, 'dead', -500, 'wind'), torque: e(0, 'dead', 0, 'dead'), shear: [e(0, 'dead', 0, 'dead'), e(0, 'dead', 0, 'dead')] as const, bending: [e(0, 'dead', 0, 'dead'), e(3000, 'wind', -2000, 'dead')] as const },
    regions: [], axes: { e1: [1, 0, 0] as [number, number, number], e2: [0, 1, 0] as [number, number, number], e3: [0, 0, 1] as [number, number, number], kind: 'principal' as const }, computeMs: 1,
  }
  it('lists each extreme with its governing case (none for a component that is zero in every case) and the concurrent values', () => {
    const c = buildReportContent(input({ envelope }))
    const t = table(c, 'envelope')
    expect(t.rows.find((r) => r[0] === 'Axial force N' && r[1] === 'largest')).toEqual(['Axial force N', 'largest', '1', 'kN', 'dead'])
    expect(t.rows.find((r) => r[0] === 'Bending moment M₂' && r[1] === 'smallest')).toEqual(['Bending moment M₂', 'smallest', '−2', 'kN·m', 'dead'])
    expect(t.rows.find((r) => r[0] === 'Torque T')![4]).toBe('—')
    const k = table(c, 'envelope-concurrent')
    expect(k.rows.map((r) => r[0])).toEqual(['dead', 'wind'])
    expect(k.rows[1]).toEqual(['wind', '−0.5', '0', '0', '0', '0', '3'])
  })
})
