/**
 * Assemblies in Chromium on the bolted-bracket demo (parts 1 base, 2 bracket, 3–6 bolts A–D): a
 * plane at mid-gap lists one region per bolt, largest force first, and a click marks a region in
 * the scene; a bounded section refuses a bad input with the field marked and the previous cut
 * kept; the Parts card hides and isolates a part; the Interfaces card lists the bolt/plate
 * interfaces with Newton's third law as the mismatch; a snapshot carries the region table.
 * Screenshots go to test-output/e2e/assemblies-*.png.
 */
import { describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import type { Page } from 'playwright-core'
import { colourBox, newPage, OUT_DIR, useBrowserSession, waitForCut, waitForModel } from './browser.ts'
import { BACKGROUND, INTERFACE, REGION } from '../../src/scene/sceneLook.ts'

const s = useBrowserSession()
// the plane at mid-gap (z = 13 mm) through the four bolts, the upper side hidden
const BRACKET = '#model=demo:bolted-bracket&cut=0,0,13,0,0,1,0&hide=positive'
const settle = (page: Page): Promise<void> => page.waitForTimeout(1500)
const rows = (page: Page, sel: string): Promise<string[]> => page.$$eval(sel, (els) => els.map((e) => (e.textContent ?? '').trim()))

describe('assemblies', () => {
  it('lists the regions of a cut through the bolts and marks the one clicked', async () => {
    const page = await newPage(s, BRACKET)
    await waitForModel(page)
    await waitForCut(page)
    await page.waitForSelector('[data-testid="cut-regions"]')
    await settle(page)
    const regions = await page.$$('[data-testid="cut-regions"] tbody tr')
    expect(regions.length).toBe(4)
    // largest force first: bolts A and B (parts 3 and 4) nearer the load carry more
    const parts = await rows(page, '[data-testid="cut-regions"] tbody tr td:nth-child(2)')
    expect(parts.slice(0, 2).map((p) => p.split(' ')[0]).sort()).toEqual(['3', '4'])
    const before = await page.screenshot({ path: `${OUT_DIR}/assemblies-regions.png` })
    expect((await colourBox(page, before, REGION, 8)).n).toBe(0)
    await page.click('[data-testid="cut-regions"] tbody tr[data-region="1"]')
    await settle(page)
    const shot = await page.screenshot({ path: `${OUT_DIR}/assemblies-region-marked.png` })
    expect(await page.getAttribute('[data-testid="cut-regions"] tbody tr[data-region="1"]', 'class')).toBe('sel')
    await page.waitForSelector('[data-testid="cut-region-selected"]')
    // the marked region is drawn over the section fill in its colour (blended over the fill)
    expect((await colourBox(page, shot, REGION, 60)).n).toBeGreaterThan(30)
    await page.close()
  })

  it('limits the cut to a part, refuses a bad disc with the field marked and keeps the cut', async () => {
    const page = await newPage(s, BRACKET)
    await waitForModel(page)
    await waitForCut(page)
    await page.fill('[data-testid="cut-limit-parts"]', '5')
    await page.click('[data-testid="cut-limit-apply"]')
    await page.waitForSelector('[data-testid="cut-limit-note"]')
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="cut-regions"] tbody tr').length === 1)
    await settle(page)
    const fz = Number(await page.getAttribute('[data-testid="cut-result"] tr[data-row="Fz"] .num', 'data-model'))
    // bolt C carries about 5 kN by the elastic bolt-group method (the model card says the tool's figure)
    expect(fz).toBeGreaterThan(3000)
    expect(fz).toBeLessThan(7000)
    // whole parts bound a piece: the free body is reported
    expect(await page.$('[data-testid="cut-free-body-undefined"]')).toBeNull()
    // a radius of 0 is refused, the field marked, the previous limit and cut kept
    await page.check('[data-testid="cut-limit-disc"]')
    await page.fill('[data-testid="cut-limit-centre"]', '-50, -35, 0')
    await page.fill('[data-testid="cut-limit-radius"]', '0')
    await page.click('[data-testid="cut-limit-apply"]')
    await page.waitForSelector('[data-testid="cut-limit-error"]')
    expect(await page.getAttribute('[data-testid="cut-limit-radius"]', 'aria-invalid')).toBe('true')
    expect(await page.textContent('[data-testid="cut-limit-error"]')).toMatch(/radius: a number greater than 0.*previous cut is kept/)
    expect(Number(await page.getAttribute('[data-testid="cut-result"] tr[data-row="Fz"] .num', 'data-model'))).toBe(fz)
    // an unknown part is refused by name
    await page.fill('[data-testid="cut-limit-parts"]', '9')
    await page.click('[data-testid="cut-limit-apply"]')
    await page.waitForFunction(() => /no element has part 9/.test(document.querySelector('[data-testid="cut-limit-error"]')?.textContent ?? ''))
    expect(await page.getAttribute('[data-testid="cut-limit-parts"]', 'aria-invalid')).toBe('true')
    // a disc round bolt C, typed in the shown length unit: the free body is not defined
    const mm = /\[mm\]/.test(await page.textContent('[data-testid="cut-limit"]') ?? '')
    await page.fill('[data-testid="cut-limit-parts"]', '')
    await page.fill('[data-testid="cut-limit-centre"]', mm ? '-50, -35, 0' : '-0.05, -0.035, 0')
    await page.fill('[data-testid="cut-limit-radius"]', mm ? '8' : '0.008')
    await page.click('[data-testid="cut-limit-apply"]')
    await page.waitForSelector('[data-testid="cut-free-body-undefined"]')
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="cut-regions"] tbody tr').length === 1)
    expect(await rows(page, '[data-testid="cut-regions"] tbody tr td:nth-child(2)')).toEqual([expect.stringMatching(/^5\b/)])
    await page.screenshot({ path: `${OUT_DIR}/assemblies-limit.png` })
    await page.close()
  })

  it('hides and isolates a part, colours by part, and shows the interfaces', async () => {
    const page = await newPage(s, '#model=demo:bolted-bracket')
    await waitForModel(page)
    await settle(page)
    expect(await rows(page, '[data-testid="parts-table"] tbody tr td:nth-child(2)')).toEqual(['1', '2', '3', '4', '5', '6'])
    // The names come from the demo's model.json, carried by the container (format version 2).
    const names = await rows(page, '[data-testid="parts-table"] tbody td.name')
    const named = ['base plate', 'bracket plate', 'bolt A (+50, +35)', 'bolt B (+50, −35)', 'bolt C (−50, −35)', 'bolt D (−50, +35)']
    expect(names).toEqual(named)
    const canvas = (await page.locator('[data-testid="scene"] canvas').boundingBox())!
    // the open part of the view: left of the cards, between the view buttons and the colour bar
    const cardsLeft = (await page.locator('aside.cards').boundingBox())!.x
    const area = { x: Math.round(canvas.x), y: Math.round(canvas.y) + 40, w: Math.round(cardsLeft - canvas.x) - 10, h: Math.round(canvas.height) - 60 }
    // the share of the view that is not the scene's background
    const drawn = async (png: Buffer): Promise<number> => 1 - (await colourBox(page, png, BACKGROUND, 8, area)).n / (area.w * area.h)
    const all = await drawn(await page.screenshot())
    await page.uncheck('[data-testid="part-shown-2"]')
    await settle(page)
    await page.screenshot({ path: `${OUT_DIR}/assemblies-bracket-hidden.png` })
    await page.click('[data-testid="part-isolate-3"]')
    await settle(page)
    const alone = await drawn(await page.screenshot({ path: `${OUT_DIR}/assemblies-bolt-alone.png` }))
    // one bolt alone (its faces against the plates closing it) covers far less of the view than the whole assembly
    expect(all - alone).toBeGreaterThan(0.1)
    expect(alone).toBeGreaterThan(0.001)
    await page.click('[data-testid="parts-show-all"]')
    await page.check('[data-testid="parts-colour"]')
    await settle(page)
    await page.screenshot({ path: `${OUT_DIR}/assemblies-colour-by-part.png` })
    expect(await page.$('[data-testid="colour-bar-parts"]')).not.toBeNull()
    // interfaces: each bolt against each plate (8), shared nodes: Newton's third law by construction
    const pairs = await rows(page, '[data-testid="interfaces-table"] tbody td:first-child')
    expect(pairs.sort()).toEqual(['1 → 3', '1 → 4', '1 → 5', '1 → 6', '2 → 3', '2 → 4', '2 → 5', '2 → 6'])
    const mismatch = await page.$$eval('[data-testid="interfaces-table"] tbody td:last-child .num', (els) => els.map((e) => Number(e.getAttribute('data-model'))))
    for (const m of mismatch) expect(m).toBeLessThan(1e-9)
    await page.uncheck('[data-testid="parts-colour"]')
    await page.click('[data-testid="interfaces-table"] tbody tr[data-interface="2-3"]')
    await settle(page)
    const shot = await page.screenshot({ path: `${OUT_DIR}/assemblies-interfaces.png` })
    expect((await colourBox(page, shot, INTERFACE, 20)).n).toBeGreaterThan(20)
    await page.waitForSelector('[data-testid="interface-selected"]')
    await page.close()
  })

  it('takes a snapshot with the region table', async () => {
    const page = await newPage(s, BRACKET)
    await waitForModel(page)
    await waitForCut(page)
    await page.waitForSelector('[data-testid="cut-regions"]')
    await settle(page)
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="snapshot"]')])
    const png = readFileSync((await dl.path())!)
    const { writeFileSync } = await import('node:fs')
    writeFileSync(`${OUT_DIR}/assemblies-snapshot.png`, png)
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG')
    // the section CSV carries the regions
    const [csv] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="export-section-csv"]')])
    const text = readFileSync((await csv.path())!, 'utf8')
    expect(text).toMatch(/^region,parts,area/m)
    expect(text.split('\n').filter((l) => /^[1-4],[3-6],/.test(l)).length).toBe(4)
    await page.close()
  })
})
