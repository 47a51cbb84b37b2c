import { describe, expect, it } from 'vitest'
import { buildReportContent } from '../../../src/app/reportContent.ts'
import type { ReportInput, ReportTable } from '../../../src/app/reportContent.ts'
import { CAUTION } from '../../../src/app/caution.ts'
import type { SweepReply } from '../../../workers/protocol.ts'

const f = (...v: number[]): Float64Array => Float64Array.from(v)
const sweep: SweepReply = {
  normal: [1, 0, 0], extent: [0, 4], offsets: f(0.5, 2, 3.5), axial: f(5, 5, 5), shear1: f(0, 0, 0), shear2: f(1, 1, 1),
  torque: f(0, 0, 0), bending1: f(3, 2, 1), bending2: f(0, 0, 0), freeBodyRelative: f(1e-12, 2e-12, 3e-12), freeBodyMomentRelative: f(1e-12, 1e-12, 1e-12), empty: new Uint8Array(3),
}

function input(over: Partial<ReportInput> = {}): ReportInput {
  return {
    model: {
      name: '<img src=x onerror=alert(1)> bar', description: 'a test bar', units: { length: 'm', stress: 'Pa' },
      nodeCount: 10, elementCount: 4, boundaryFaceCount: 12, elementTypes: { hex8: 4 }, bounds: { min: [0, 0, 0], max: [4, 1, 1] },
      bodyForce: [0, 0, 0], warnings: ['node 7 repeated'], source: 'files:a.csv',
    },
    system: 'SI', date: new Date('2026-12-01T19:00:00.000Z'), caution: CAUTION,
    audit: {
      body: { force: [1, 0, 0], moment: [0, 0, 0], gross: 2000, relative: 5e-4, bodyForceTotal: [0, 0, 0], volume: 4 } as never,
      indicator: { p50: 1e-6, p95: 1e-5, max: 1e-4 },
      patches: [{ id: 0, faceCount: 3, area: 1, centroid: [0, 0.5, 0.5], force: [-5000, 0, 0], peak: 5000, mean: 5000 } as never],
      threshold: 50, referenceStress: 5000, freeSurface: { area: 14, mean: 0, relative: 0, peak: 0 },
      freeSurfaceForce: [0, 0, 0], verdict: { kind: 'mesh', reason: 'in balance: the residual force is 0.05 % of the gross load' },
    },
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
    expect(c.blocks.map((b) => b.id)).toEqual(['snapshot', 'equilibrium', 'patches', 'diagram-force', 'diagram-moment', 'diagram-residual', 'sweep'])
    // 1 N residual of 2000 N gross; N in kN (SI display, common practice)
    expect(table(c, 'equilibrium').rows[0]).toEqual(['Residual force', '(0.001, 0, 0)', 'kN'])
    expect(table(c, 'patches').rows[0]).toEqual(['0', '3', '1', '(0, 0.5, 0.5)', '(−5, 0, 0)', '5', '0.005', '0.005'])
    expect(table(c, 'sweep').rows).toHaveLength(3)
    const force = c.blocks.find((b) => b.id === 'diagram-force')!
    expect(force.kind === 'diagram' && force.geometry.lines.map((l) => l.label)).toEqual(['N Axial force', 'V₂ Shear force 2'])
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
