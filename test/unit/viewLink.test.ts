/**
 * The view link (URL hash): what is written reads back exactly, and crafted text cannot produce
 * anything outside the fixed lists or a non-finite number. Round-trip of shortest number text is
 * ECMAScript Number::toString behaviour (common practice); fast-check generates the inputs.
 */
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { buildViewLink, parseViewLink } from '../../src/app/urlHash.ts'
import type { ViewLink } from '../../src/app/urlHash.ts'

// -0 is written as 0 (same plane), so the generator normalises it.
const finite = fc.double({ min: -1e9, max: 1e9, noNaN: true, noDefaultInfinity: true }).map((v) => v + 0)
const vec = fc.tuple(finite, finite, finite)

describe('view link', () => {
  it('reads back what it wrote', () => {
    fc.assert(fc.property(vec, vec, finite, vec, vec, (p, n, off, cp, ct) => {
      fc.pre(Math.hypot(...n) > 0 && Math.hypot(cp[0] - ct[0], cp[1] - ct[1], cp[2] - ct[2]) > 0)
      const v: ViewLink = {
        model: { kind: 'demo', id: 'lifting-lug' }, quantity: 'vonMises', range: [-2.5, 7.25], colourMap: 'cividis', units: 'US',
        section: { enabled: true, point: p, normal: n, offset: off, hide: 'negative' },
        camera: { position: cp, target: ct, up: [0, 0, 1], fov: 35 },
      }
      const back = parseViewLink(buildViewLink(v))
      expect(back).toEqual(v)
    }), { seed: 20261201, numRuns: 200 })
  })

  it('ignores crafted values', () => {
    const bad = [
      '#q=<script>alert(1)</script>&r=1e999,NaN&cut=1,2,3,0,0,0,x&cam=1,1,1,1,1,1,0,0,0,500&model=demo:../../etc&u=<img>',
      '#%E0%A4%A&model=block&elements=-5&map=constructor',
      '#q=__proto__&r=5,1&hide=<b>&cut=' + '9'.repeat(5000),
      '#cut=1,1,1,0,0,0,0&cam=0,0,0,0,0,0,0,0,1,35',
    ]
    for (const h of bad) {
      const v = parseViewLink(h)
      expect(v.quantity).toBeUndefined()
      expect(v.range).toBeUndefined()
      expect(v.section).toBeUndefined()
      expect(v.camera).toBeUndefined()
      expect(v.units).toBeUndefined()
      expect(v.colourMap).toBeUndefined()
      if (v.model?.kind === 'demo') expect(v.model.id).toMatch(/^[A-Za-z0-9_-]+$/)
      if (v.model?.kind === 'block') expect(v.model.elements).toBeGreaterThanOrEqual(6)
    }
  })

  it('names the user\'s own files (with the start of each SHA-256) and the display units', () => {
    const v: ViewLink = {
      model: { kind: 'files', names: ['nodes.csv', 'elements.csv', 'stress.csv', 'model (2).json'], sha: ['0123456789ab', 'ffffffffffff', '000000000000', 'abcdefabcdef'] },
      units: { length: 'mm', force: 'N', stress: 'MPa' },
      section: { enabled: true, point: [0, 60, 10], normal: [0, 1, 0], offset: 0, hide: 'auto' },
    }
    const hash = buildViewLink(v)
    expect(hash).toContain('model=files:nodes.csv/elements.csv/stress.csv/model')
    expect(parseViewLink(hash)).toEqual(v)
    expect(parseViewLink('#u=model').units).toBe('model')
    // Folders, control characters and unknown units are refused.
    expect(parseViewLink('#model=files:..%2Fetc').model).toBeUndefined()
    expect(parseViewLink('#model=files:a%00b').model).toBeUndefined()
    expect(parseViewLink('#model=files:a.csv&fsha=xyz').model).toEqual({ kind: 'files', names: ['a.csv'] })
    expect(parseViewLink('#u=mm,N,lbs').units).toBeUndefined()
  })

  it('never throws on random text', () => {
    fc.assert(fc.property(fc.string({ maxLength: 300 }), (s) => { parseViewLink('#' + s) }), { seed: 7, numRuns: 500 })
  })
})
