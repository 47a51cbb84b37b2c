/**
 * Load cases in Chromium, on the lifting-lug demo (cases sling-30, sling-0, sling-60 and the
 * combination "proof"): switch the case in the top bar (the section's figures follow), define a
 * combination in the Load cases card (its figures are the factored sum of its cases'), open the
 * link in a fresh page (the combination and the case come back), and show the section's envelope
 * in the Cut card (it names the governing case of each component). Then the sweep chart with
 * several cases at once (its legend, its CSV), the envelope in a snapshot, the review report with
 * the envelope along the part, and the case switch timed to the new picture: from choosing the
 * case in the top bar to the frame after the new surface's first draw (User Timing mark
 * 'tractus:surface-drawn'), recorded, printed and written to test-output/e2e/cases-switch.json,
 * never asserted. Writes screenshots and the switching time (test-output/e2e/cases.json).
 */
import { describe, expect, it } from 'vitest'
import { readFileSync, writeFileSync } from 'node:fs'
import { loadavg } from 'node:os'
import type { Page } from 'playwright-core'
import { figure, newPage, ORIGIN, OUT_DIR, pixelStats, useBrowserSession, waitForCut, waitForModel } from './browser.ts'
import { DRAWN_OBSERVER, median, switchTimed } from './caseSwitch.ts'
import type { SwitchTime } from './caseSwitch.ts'

const s = useBrowserSession()
// the neck of the lug: the plane y = 120 mm
const NECK = '#model=demo:lifting-lug&cut=0,120,10,0,1,0,0&hide=positive'

/** Chooses a case in the top bar and waits until the engine shows it and the section is cut again; returns the time (ms). */
async function choose(page: Page, name: string): Promise<number> {
  const before = await page.getAttribute('[data-testid="cut-result"] tr[data-row="axial"] .num', 'data-model')
  const t0 = await page.evaluate(() => performance.now())
  await page.selectOption('[data-testid="case-select"]', name)
  await page.waitForFunction((b) => {
    const v = document.querySelector('[data-testid="cut-result"] tr[data-row="axial"] .num')?.getAttribute('data-model')
    return !document.querySelector('[data-testid="case-running"]') && v !== undefined && v !== b
  }, before, { timeout: 60_000 })
  return (await page.evaluate(() => performance.now())) - t0
}

const resultant = async (page: Page) => Object.fromEntries(await Promise.all(['axial', 'shear1', 'shear2', 'torque', 'bending1', 'bending2'].map(async (k) => [k, await figure(page, k)] as const)))

describe('Load cases', () => {
  it('switches the case, defines a combination, restores it from the link and shows the envelope', async () => {
    const page = await newPage(s, NECK)
    await waitForModel(page)
    await waitForCut(page)
    const options = await page.$$eval('[data-testid="case-select"] option', (o) => o.map((x) => (x as HTMLOptionElement).value))
    expect(options).toEqual(['sling-30', 'sling-0', 'sling-60', 'proof'])
    const r30 = await resultant(page)
    await page.locator('header.topbar').screenshot({ path: `${OUT_DIR}/cases-topbar.png` })

    // Switch: the section follows (statics: the sideways pull grows with the angle).
    const switchMs: number[] = []
    switchMs.push(await choose(page, 'sling-60'))
    const r60 = await resultant(page)
    switchMs.push(await choose(page, 'sling-0'))
    const r0 = await resultant(page)
    const inPlane = (r: Record<string, number>) => Math.max(Math.abs(r.bending1), Math.abs(r.bending2))
    expect(inPlane(r60)).toBeGreaterThan(inPlane(r30))
    expect(inPlane(r0)).toBeLessThan(0.05 * inPlane(r30))
    expect(Math.abs(r0.axial)).toBeGreaterThan(Math.abs(r60.axial))
    // the model card says which case is which and which angle governs the neck
    expect(await page.textContent('[data-card="cases"]')).toContain("pin pull 50 kN at 60° from the lug's axis")

    // Define a combination in the app: 1 × sling-0 + 0.5 × sling-60 (superposition: the figures add).
    const card = page.locator('[data-card="cases"]')
    await card.scrollIntoViewIfNeeded()
    await page.fill('[data-testid="combination-name"]', 'mix-1')
    await page.fill('[data-testid="combination-factor-sling-0"]', '1')
    await page.fill('[data-testid="combination-factor-sling-60"]', '0,5')
    const before = await page.getAttribute('[data-testid="cut-result"] tr[data-row="axial"] .num', 'data-model')
    await page.click('[data-testid="combination-save"]')
    await page.waitForFunction((b) => document.querySelector('[data-testid="cut-result"] tr[data-row="axial"] .num')?.getAttribute('data-model') !== b && !document.querySelector('[data-testid="case-running"]'), before, { timeout: 60_000 })
    expect(await page.inputValue('[data-testid="case-select"]')).toBe('mix-1')
    const mix = await resultant(page)
    for (const k of Object.keys(mix)) expect(mix[k]).toBeCloseTo(r0[k] + 0.5 * r60[k], -1)
    await card.screenshot({ path: `${OUT_DIR}/cases-card.png` })
    // a bad factor is refused with words
    await page.fill('[data-testid="combination-name"]', 'bad')
    await page.fill('[data-testid="combination-factor-sling-0"]', 'x')
    await page.click('[data-testid="combination-save"]')
    expect(await page.textContent('[data-testid="combination-error"]')).toMatch(/finite number/)

    // The link carries the combination and the case: a fresh page comes back to them.
    await page.waitForFunction(() => location.hash.includes('lc=mix-1') && location.hash.includes('combo=mix-1'), undefined, { timeout: 10_000 })
    const link = await page.evaluate(() => location.hash)
    const other = await newPage(s, link)
    await waitForModel(other)
    await other.waitForFunction(() => (document.querySelector('[data-testid="case-select"]') as HTMLSelectElement | null)?.value === 'mix-1' && !document.querySelector('[data-testid="case-running"]'), undefined, { timeout: 60_000 })
    await waitForCut(other)
    await other.waitForFunction((v) => Math.abs(Number(document.querySelector('[data-testid="cut-result"] tr[data-row="axial"] .num')?.getAttribute('data-model')) - v) < 1e-6 * Math.abs(v) + 1e-9, mix.axial, { timeout: 60_000 })
    expect(await other.textContent('[data-testid="combination-list"]')).toContain('1 × sling-0 + 0.5 × sling-60')
    await other.close()

    // The envelope in the Cut card: every case and combination; the governing case of each component.
    await page.check('[data-testid="envelope-open"]')
    await page.waitForSelector('[data-testid="envelope-table"]', { timeout: 60_000 })
    const gov = await page.$$eval('[data-testid="envelope-table"] tbody tr', (rows) => rows.map((r) => [r.getAttribute('data-row'), r.querySelector('[data-case]')?.getAttribute('data-case')]))
    const cases = new Set(['sling-30', 'sling-0', 'sling-60', 'proof', 'mix-1'])
    for (const [, c] of gov) expect(c === '' || cases.has(c!)).toBe(true)
    // the pull along the axis: largest under the proof load (twice the design case)
    expect(gov.find(([r]) => r === 'axial-max')![1]).toBe('proof')
    const cut = page.locator('[data-card="cut"]')
    await page.locator('[data-testid="envelope"]').scrollIntoViewIfNeeded()
    await page.waitForTimeout(300)
    await page.screenshot({ path: `${OUT_DIR}/cases-envelope.png` })
    await page.check('[data-testid="envelope-combinations-only"]')
    await page.waitForFunction(() => document.querySelector('[data-testid="envelope"]')?.textContent?.includes('the combinations only'), undefined, { timeout: 60_000 })
    const only = await page.$$eval('[data-testid="envelope-table"] [data-case]', (c) => c.map((x) => x.getAttribute('data-case')))
    for (const c of only) expect(['proof', 'mix-1', '']).toContain(c)
    await cut.screenshot({ path: `${OUT_DIR}/cases-cut-card.png` })
    writeFileSync(`${OUT_DIR}/cases.json`, JSON.stringify({ switchMs, elements: await page.textContent('[data-testid="model-name"]') }, null, 2))
    await page.close()
  })

  it('draws several cases along the part, exports them, puts the envelope in the snapshot and the report, and times the case switch', async () => {
    const page = await s.context.newPage()
    page.on('pageerror', (e) => s.pageErrors.push(String(e)))
    await page.addInitScript(DRAWN_OBSERVER)
    await page.goto(`${ORIGIN}/${NECK}`)
    await waitForModel(page)
    await waitForCut(page)

    // The case switch, to the new picture, three times.
    const switches: SwitchTime[] = []
    for (const name of ['sling-60', 'proof', 'sling-30']) switches.push(await switchTimed(page, name))

    // A sweep along the lug's axis: every case and combination at the same sections.
    await page.fill('[data-testid="sweep-count"]', '40')
    await page.press('[data-testid="sweep-count"]', 'Enter')
    for (const k of ['axial', 'shear1', 'shear2', 'torque', 'bending2']) await page.uncheck(`[data-testid="sweep-show-${k}"]`)
    await page.check('[data-testid="sweep-show-bending1"]')
    await page.click('[data-testid="sweep-run"]')
    await page.waitForSelector('[data-testid="sweep-cases"]', { timeout: 120_000 })
    expect(await page.$$eval('[data-testid="sweep-cases"] input', (e) => e.map((x) => x.getAttribute('data-testid')))).toEqual(
      ['sweep-case-sling-30', 'sweep-case-sling-0', 'sweep-case-sling-60', 'sweep-case-proof'])
    for (const c of ['sling-0', 'sling-30', 'sling-60']) await page.check(`[data-testid="sweep-case-${c}"]`)
    await page.waitForSelector('[data-testid="sweep-legend"] li[data-case="sling-60"]')
    expect(await page.$$eval('[data-testid="sweep-legend"] li[data-case]', (e) => e.map((x) => x.getAttribute('data-case')))).toEqual(['sling-30', 'sling-0', 'sling-60'])
    const card = page.locator('[data-card="sweep"]')
    await card.scrollIntoViewIfNeeded()
    await page.waitForTimeout(400)
    await card.screenshot({ path: `${OUT_DIR}/cases-sweep-card.png` })
    // hover: the read-out gives each drawn case's value
    const over = page.locator('[data-testid="sweep-chart"] .u-over')
    const box = (await over.boundingBox())!
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.5)
    await page.waitForSelector('[data-testid="sweep-readout"] [data-readout-case="sling-60"]')
    await card.screenshot({ path: `${OUT_DIR}/cases-sweep-readout.png` })
    // two components: colour by component, a dash per case
    await page.check('[data-testid="sweep-show-axial"]')
    await page.waitForTimeout(300)
    await card.screenshot({ path: `${OUT_DIR}/cases-sweep-two-components.png` })
    // the CSV carries every drawn case and the envelope per section
    const [csv] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="export-sweep-csv"]')])
    const text = readFileSync((await csv.path())!, 'utf8')
    const head = text.split('\n').find((l) => l.startsWith('position'))!.split(',')
    for (const c of ['sling-30', 'sling-0', 'sling-60']) expect(head.some((h) => h.startsWith(`${c} bending1 [`))).toBe(true)
    expect(head).toContain('bending1_max_case')
    expect(text.trim().split('\n').filter((l) => /^-?\d/.test(l)).length).toBe(40)

    // The envelope of the neck section in a snapshot: shown in the Cut card, then the snapshot.
    await page.check('[data-testid="envelope-open"]')
    await page.waitForSelector('[data-testid="envelope-table"]', { timeout: 60_000 })
    await page.waitForTimeout(500)
    const [dl] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.click('[data-testid="snapshot"]')])
    const png = readFileSync((await dl.path())!)
    writeFileSync(`${OUT_DIR}/cases-snapshot-envelope.png`, png)
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG')
    await page.uncheck('[data-testid="envelope-open"]')
    await page.waitForTimeout(300)
    const [dl2] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.click('[data-testid="snapshot"]')])
    const bare = readFileSync((await dl2.path())!)
    writeFileSync(`${OUT_DIR}/cases-snapshot-bare.png`, bare)
    // the envelope's panel adds ink where the bare snapshot has the scene or nothing
    const a = await pixelStats(page, png), b = await pixelStats(page, bare)
    expect(a.width).toBe(b.width)
    expect(a.nonBackground).not.toBe(b.nonBackground)
    await page.check('[data-testid="envelope-open"]')
    await page.waitForSelector('[data-testid="envelope-table"]', { timeout: 60_000 })

    // The review report: the envelope along the part, with its governing cases.
    const [rep] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.click('[data-testid="review-report"]')])
    const html = readFileSync((await rep.path())!, 'utf8')
    writeFileSync(`${OUT_DIR}/cases-report.html`, html)
    const view = await s.browser.newPage({ viewport: { width: 1100, height: 900 } })
    await view.setContent(html, { waitUntil: 'load' })
    const ext = view.locator('section[data-block="envelope-along-extremes"]')
    await ext.waitFor()
    const extText = (await ext.textContent())!
    expect(extText).toMatch(/Bending moment 1 M₁/)
    expect(extText).toMatch(/sling-60|proof/)
    expect(await view.locator('section[data-block="diagram-envelope-bending1"] svg polyline').count()).toBeGreaterThan(1)
    expect(await view.locator('section[data-block="envelope-along-moments"] tbody tr').count()).toBe(40)
    await ext.screenshot({ path: `${OUT_DIR}/cases-report-envelope-extremes.png` })
    await view.locator('section[data-block="diagram-envelope-bending1"]').screenshot({ path: `${OUT_DIR}/cases-report-envelope-diagram.png` })
    await view.locator('section[data-block="envelope-along-moments"]').screenshot({ path: `${OUT_DIR}/cases-report-envelope-table.png` })
    await view.close()

    const record = { model: 'demo:lifting-lug', switches, medianMs: median(switches.map((x) => x.toPictureMs)), loadAverage: loadavg() }
    console.log('case switch on the lug (choice to new picture):', JSON.stringify(record))
    writeFileSync(`${OUT_DIR}/cases-switch.json`, JSON.stringify(record, null, 2))
    await page.close()
  })

  it('keeps the app\'s combination and the case shown when the engine restarts', async () => {
    const page = await newPage(s, `${NECK}&combo=mix-2~sling-0:1,sling-60:0.5&lc=mix-2`)
    await waitForModel(page)
    const shows = (name: string) => page.waitForFunction((n) => (document.querySelector('[data-testid="case-select"]') as HTMLSelectElement | null)?.value === n && !document.querySelector('[data-testid="case-running"]'), name, { timeout: 60_000 })
    await shows('mix-2')
    await waitForCut(page)
    // the engine fails: the app starts a new one, reloads the model and asks for the combination again
    await page.evaluate(() => window.__tractusTest!.crashEngine().catch(() => undefined))
    await page.waitForSelector('[data-testid="error-card"]', { timeout: 60_000 })
    await waitForModel(page)
    await shows('mix-2')
    await waitForCut(page)
    await page.waitForTimeout(500)
    // the reload puts the section back across the part; there the figures are the combination's (superposition)
    const mix = await resultant(page)
    await choose(page, 'sling-0')
    const r0 = await resultant(page)
    await choose(page, 'sling-60')
    const r60 = await resultant(page)
    for (const k of Object.keys(mix)) expect(mix[k]).toBeCloseTo(r0[k] + 0.5 * r60[k], -1)
    expect(await page.$$eval('[data-testid="case-select"] option', (o) => o.map((x) => (x as HTMLOptionElement).value))).toContain('mix-2')
    await page.close()
  })
})
