/**
 * Sections along the part in Chromium: run a sweep on the demo, hover the chart (the read-out
 * shows the values), click it (the section moves there and the Cut card's resultant changes),
 * then export the review report and open it with every request refused: it carries the tables,
 * the diagrams and the caution, and asks for nothing.
 */
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { readFileSync, writeFileSync } from 'node:fs'
import { figure, newPage, openBrowser, OUT_DIR, waitForCut, waitForModel } from './browser.ts'
import type { Session } from './browser.ts'
import { CAUTION } from '../../src/app/caution.ts'

let s: Session

beforeAll(async () => { s = await openBrowser() })
afterAll(async () => { await s?.close() })
afterEach(() => {
  expect(s.outside, 'requests that left 127.0.0.1').toEqual([])
  expect(s.pageErrors, 'uncaught page errors').toEqual([])
})

describe('Along the part', () => {
  it('charts a sweep, reads it on hover, moves the section on click and exports the review report', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    // Cut across y (the lug's long axis when the lug demo is shipped; any axis serves the test).
    await page.keyboard.press('y')
    await waitForCut(page)
    await page.fill('[data-testid="sweep-count"]', '60')
    await page.press('[data-testid="sweep-count"]', 'Enter')
    await page.check('[data-testid="sweep-show-bending1"]')
    await page.click('[data-testid="sweep-run"]')
    const over = page.locator('[data-testid="sweep-chart"] .u-over')
    await over.waitFor({ timeout: 60_000 })
    const card = page.locator('[data-card="sweep"]')
    await card.scrollIntoViewIfNeeded()
    await page.waitForTimeout(300)
    await card.screenshot({ path: `${OUT_DIR}/sweep-card.png` })

    // Hover: the read-out names the position and the plotted quantities with their units.
    const box = (await over.boundingBox())!
    await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.5)
    await page.waitForSelector('[data-testid="sweep-readout"] [data-readout="axial"]')
    const text = await page.textContent('[data-testid="sweep-readout"]')
    expect(text).toMatch(/x·m = .+ (m|in)/)
    expect(text).toMatch(/N = .+ (kN|kip)/)
    expect(text).toMatch(/M₁ = .+ (kN·m|kip·in)/)

    // Click: the plane moves to the picked position, the Cut card cuts there.
    const planeBefore = await page.$$eval('[data-testid="cut-plane"] .num', (e) => e.map((x) => x.getAttribute('data-model')))
    const bendingBefore = await figure(page, 'bending1')
    const axialBefore = await figure(page, 'axial')
    await page.mouse.click(box.x + box.width * 0.2, box.y + box.height * 0.5)
    await page.waitForFunction((b) => {
      const v = document.querySelector('[data-testid="cut-result"] tr[data-row="bending1"] .num')?.getAttribute('data-model')
      return v !== undefined && v !== null && v !== b
    }, String(bendingBefore), { timeout: 30_000 })
    const planeAfter = await page.$$eval('[data-testid="cut-plane"] .num', (e) => e.map((x) => x.getAttribute('data-model')))
    expect(planeAfter).not.toEqual(planeBefore)
    expect([await figure(page, 'bending1'), await figure(page, 'axial')]).not.toEqual([bendingBefore, axialBefore])
    await page.waitForTimeout(600)
    await card.screenshot({ path: `${OUT_DIR}/sweep-card-picked.png` })

    // The review report: one HTML file.
    const [dl] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.click('[data-testid="review-report"]')])
    expect(dl.suggestedFilename()).toMatch(/-review-.*\.html$/)
    const html = readFileSync((await dl.path())!, 'utf8')
    writeFileSync(`${OUT_DIR}/review-report.html`, html)
    expect(html.startsWith('<!doctype html>')).toBe(true)
    expect(html).not.toMatch(/<script/i)
    expect(html).not.toMatch(/(src|href)="(https?:|\/\/)/i)
    await page.close()

    // Open it in a context of its own where every request is refused and recorded.
    const ctx = await s.browser.newContext({ viewport: { width: 1100, height: 900 }, offline: true })
    const asked: string[] = []
    await ctx.route('**/*', (route) => { asked.push(route.request().url()); return route.abort() })
    ctx.on('request', (r) => { if (!r.url().startsWith('data:')) asked.push(r.url()) })
    const view = await ctx.newPage()
    const errors: string[] = []
    view.on('pageerror', (e) => errors.push(String(e)))
    await view.setContent(html, { waitUntil: 'load' })
    expect(await view.getAttribute('meta[http-equiv="Content-Security-Policy"]', 'content')).toContain("default-src 'none'")
    expect(await view.textContent('[data-testid="report-caution"]')).toBe(CAUTION)
    for (const id of ['equilibrium', 'section', 'sweep']) {
      expect(await view.locator(`table[data-table="${id}"] tbody tr`).count(), id).toBeGreaterThan(2)
    }
    expect(await view.locator('table[data-table="sweep"] tbody tr').count()).toBe(60)
    expect(await view.locator('section[data-block="patches"] h2').count()).toBe(1)
    expect(await view.locator('figure[data-diagram] svg polyline').count()).toBeGreaterThan(2)
    const img = view.locator('section[data-block="snapshot"] img')
    if (await img.count()) {
      expect(await img.getAttribute('src')).toMatch(/^data:image\/png;base64,/)
      expect(await img.evaluate((e) => (e as HTMLImageElement).naturalWidth)).toBeGreaterThan(100)
    }
    await view.screenshot({ path: `${OUT_DIR}/review-report.png`, fullPage: true })
    expect(asked, 'requests made by the report').toEqual([])
    expect(errors).toEqual([])
    await ctx.close()
  })
})
