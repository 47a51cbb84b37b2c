/**
 * Reports a reviewer can file, in Chromium: the reviewer's fields on the snapshot and in the
 * report; traceability in the report (input file name, size and SHA-256, the tool's version, the
 * load case, nodal or element-nodal stress, units); all six internal-force diagrams by default;
 * and a print stylesheet, so the browser's print gives a clean PDF.
 */
import { describe, expect, it } from 'vitest'
import { createHash } from 'node:crypto'
import { readFileSync, statSync, writeFileSync } from 'node:fs'
import type { Page } from 'playwright-core'
import { newPage, OUT_DIR, useBrowserSession, waitForCut, waitForModel } from './browser.ts'

const s = useBrowserSession()
const LUG_FILE = 'public/demo/lifting-lug/lifting-lug.tractus'

/** Height (px) of the snapshot's title panel: rows from the top whose pixel at x = 4 is the panel's near-white. */
async function titlePanelHeight(page: Page, png: Buffer): Promise<number> {
  return page.evaluate(async (b64) => {
    const bytes = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0))
    const bmp = await createImageBitmap(new Blob([bytes], { type: 'image/png' }))
    const c = new OffscreenCanvas(bmp.width, bmp.height)
    const g = c.getContext('2d')!
    g.drawImage(bmp, 0, 0)
    const d = g.getImageData(4, 0, 1, bmp.height).data
    let y = 0
    while (y < bmp.height && d[4 * y] > 245 && d[4 * y + 1] > 245 && d[4 * y + 2] > 245) y++
    return y
  }, png.toString('base64'))
}

async function snapshot1x(page: Page, name: string): Promise<Buffer> {
  await page.click('[data-testid="snap-1x"]')
  const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="snapshot"]')])
  await dl.saveAs(`${OUT_DIR}/${name}`)
  return readFileSync(`${OUT_DIR}/${name}`)
}

const REVIEW = { title: 'Lug LL-20 neck check', project: 'P-4711 deck fittings', author: 'A. Engineer', checker: 'C. Checker', revision: 'B', loadCase: 'LC2 pin pull 50 kN at 30°', notes: 'first review; weld not assessed here' }

describe('review reports', () => {
  it('carries the reviewer\'s fields, traceability and all six diagrams, and prints to a clean PDF', async () => {
    const page = await newPage(s, '#model=demo:lifting-lug')
    await waitForModel(page)
    await page.keyboard.press('c')
    await waitForCut(page)
    await page.waitForTimeout(1200)
    const plain = await titlePanelHeight(page, await snapshot1x(page, 'report-snapshot-plain.png'))

    await page.click('[data-testid="review-fields"] summary')
    for (const [k, v] of Object.entries(REVIEW)) await page.fill(`[data-testid="review-${k}"]`, v)
    await page.locator('[data-card="snapshot"]').screenshot({ path: `${OUT_DIR}/review-fields.png` })
    // The snapshot's title block grows by the reviewer's lines (title, model, two lines of details, notes).
    const withFields = await titlePanelHeight(page, await snapshot1x(page, 'report-snapshot-review.png'))
    expect(withFields - plain).toBeGreaterThan(4 * 16)

    // A sweep along the lug: the report then carries the six diagrams by default.
    await page.selectOption('[data-testid="sweep-direction"]', 'y')
    await page.fill('[data-testid="sweep-count"]', '40')
    await page.press('[data-testid="sweep-count"]', 'Enter')
    await page.click('[data-testid="sweep-run"]')
    await page.locator('[data-testid="sweep-chart"] .u-over').waitFor({ timeout: 60_000 })
    const [dl] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.click('[data-testid="review-report"]')])
    const html = readFileSync((await dl.path())!, 'utf8')
    writeFileSync(`${OUT_DIR}/review-report-lug.html`, html)
    await page.close()

    const ctx = await s.browser.newContext({ viewport: { width: 1100, height: 900 }, offline: true })
    await ctx.route('**/*', (route) => route.abort())
    const view = await ctx.newPage()
    await view.setContent(html, { waitUntil: 'load' })
    const facts = await view.$$eval('dl.facts dt', (dts) => dts.map((dt) => [dt.textContent ?? '', dt.nextElementSibling?.textContent ?? '']))
    const fact = (k: string): string => facts.find(([a]) => a === k)?.[1] ?? ''
    expect(fact('Title')).toBe(REVIEW.title)
    expect(fact('Project')).toBe(REVIEW.project)
    expect(fact('Author')).toBe(REVIEW.author)
    expect(fact('Checker')).toBe(REVIEW.checker)
    expect(fact('Revision')).toBe(REVIEW.revision)
    expect(fact('Load case')).toBe(REVIEW.loadCase)
    expect(fact('Notes')).toBe(REVIEW.notes)
    // Traceability: the file, its size and its SHA-256 (FIPS 180-4, computed here by Node).
    const bytes = readFileSync(LUG_FILE)
    const sha = createHash('sha256').update(bytes).digest('hex')
    expect(fact('Input file')).toBe(`lifting-lug.tractus: ${statSync(LUG_FILE).size.toLocaleString('en-US').replace(/,/g, ' ')} bytes, SHA-256 ${sha}`)
    expect(fact('Made with')).toMatch(/^Tractus \d+\.\d+\.\d+$/)
    expect(fact('Stress')).toBe('nodal (one value per node)')
    expect(fact('Model units')).toBe('length mm, stress MPa')
    // The section table names its axes.
    const section = await view.$$eval('table[data-table="section"] tbody tr', (trs) => trs.map((tr) => Array.from(tr.children, (c) => c.textContent ?? '')))
    expect(section[0]).toEqual(['Axis e₁', '(0, 0, 1)', '–'])
    // Six internal-force diagrams, one each, plus the free-body residual; the lug has load cases,
    // so the envelope along the part follows with one diagram per component.
    const diagrams = await view.$$eval('figure[data-diagram]', (f) => f.map((x) => x.getAttribute('data-diagram')))
    const kinds = ['axial', 'shear1', 'shear2', 'torque', 'bending1', 'bending2']
    expect(diagrams).toEqual([...kinds.map((k) => `diagram-${k}`), 'diagram-residual', ...kinds.map((k) => `diagram-envelope-${k}`)])
    await view.screenshot({ path: `${OUT_DIR}/review-report-lug.png`, fullPage: true })
    // The print stylesheet: A4 pages, no figure split across a page; the PDF comes out.
    await view.emulateMedia({ media: 'print' })
    expect(await view.evaluate(() => getComputedStyle(document.querySelector('figure')!).breakInside)).toBe('avoid')
    const pdf = await view.pdf({ format: 'A4', printBackground: true })
    writeFileSync(`${OUT_DIR}/review-report-lug.pdf`, pdf)
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(pdf.length).toBeGreaterThan(50_000)
    await ctx.close()
  })
})
