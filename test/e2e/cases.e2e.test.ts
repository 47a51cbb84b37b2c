/**
 * Load cases in Chromium, on the lifting-lug demo (cases sling-30, sling-0, sling-60 and the
 * combination "proof"): switch the case in the top bar (the section's figures follow), define a
 * combination in the Load cases card (its figures are the factored sum of its cases'), open the
 * link in a fresh page (the combination and the case come back), and show the section's envelope
 * in the Cut card (it names the governing case of each component). Writes screenshots and the
 * switching time (test-output/e2e/cases.json).
 */
import { describe, expect, it } from 'vitest'
import { writeFileSync } from 'node:fs'
import type { Page } from 'playwright-core'
import { figure, newPage, OUT_DIR, useBrowserSession, waitForCut, waitForModel } from './browser.ts'

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
})
