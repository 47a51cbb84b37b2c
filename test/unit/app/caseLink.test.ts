/**
 * The view link carries the load case shown and the app's own combinations (src/app/urlHash.ts):
 * a round trip gives them back; malformed parts are left out, never trusted.
 */
import { describe, expect, it } from 'vitest'
import { buildViewLink, parseViewLink } from '../../../src/app/urlHash.ts'
import type { ViewLink } from '../../../src/app/urlHash.ts'

describe('view link: load cases', () => {
  it('round trip of the case and the combinations', () => {
    const v: ViewLink = { loadCase: 'ULS-3', combinations: [{ name: 'ULS-3', factors: { dead: 1.35, wind: -0.75 } }, { name: 'k2', factors: { dead: 1e-3 } }] }
    const hash = buildViewLink(v)
    expect(hash).toContain('lc=ULS-3')
    expect(parseViewLink(hash)).toEqual(v)
  })
  it('leaves out what does not parse', () => {
    const p = parseViewLink('#lc=a%20b&combo=ok~dead:1|bad~dead:x|~dead:1|no%20good~dead:1|empty~')
    expect(p.loadCase).toBeUndefined()
    expect(p.combinations).toEqual([{ name: 'ok', factors: { dead: 1 } }])
  })
})
