/**
 * Lines, the deformed shape and the linearisation in Chromium, on the thick pipe demo (an
 * invented segment cut from a long pipe under 20 MPa internal pressure, a = 100 mm, b = 130 mm):
 * - the deformed shape turns on and its automatic scale draws the largest displacement as 5 % of
 *   the model's diagonal;
 * - a line is picked by two clicks on the section face at mid-length, its chart and CSV come up,
 *   its ends go to the wall's surfaces, and the linearisation table gives the Lamé membrane hoop
 *   stress p·a/(b − a) = 66.7 MPa (Timoshenko & Goodier §28) within the mesh's error;
 * - the review report carries the line's section.
 * The screenshots go to test-output/e2e (look at them).
 */
import { describe, expect, it } from 'vitest'
import { readFileSync, writeFileSync } from 'node:fs'
import { PerspectiveCamera, Vector3 } from 'three'
import type { Page } from 'playwright-core'
import { newPage, useBrowserSession, OUT_DIR, waitForCut, waitForModel } from './browser.ts'

const s = useBrowserSession()

const a = 100, b = 130, p = 20, Z = 300
// Looking down the axis at the cut face z = 300 (the part above it hidden), from above.
const CAM = { position: [0, -260, 1400], target: [0, 0, Z], up: [0, 1, 0], fov: 35 }
const HASH = `#model=demo:pipe-segment&cut=0,0,${Z},0,0,1,0&hide=positive&cam=${[...CAM.position, ...CAM.target, ...CAM.up, CAM.fov].join(',')}`

/** Screen position (page pixels) of a model point, with the link's camera and the canvas's size. */
async function screenOf(page: Page, point: [number, number, number]): Promise<{ x: number; y: number }> {
  const box = (await page.locator('[data-testid="scene"] canvas').boundingBox())!
  const cam = new PerspectiveCamera(CAM.fov, box.width / box.height, 1, 1e5)
  cam.position.set(...(CAM.position as [number, number, number]))
  cam.up.set(...(CAM.up as [number, number, number]))
  cam.lookAt(new Vector3(...(CAM.target as [number, number, number])))
  cam.updateMatrixWorld()
  const v = new Vector3(...point).project(cam)
  return { x: box.x + ((v.x + 1) / 2) * box.width, y: box.y + ((1 - v.y) / 2) * box.height }
}

const num = (t: string | null): number => Number((t ?? '').replace(/−/g, '-'))

describe('lines and the deformed shape', () => {
  it('deformed shape on, a line by two clicks, its chart and CSV, the linearisation table and the report', async () => {
    const page = await newPage(s, HASH)
    await waitForModel(page)
    await waitForCut(page)
    await page.waitForTimeout(1500)
    await page.screenshot({ path: `${OUT_DIR}/lines-start.png` })

    // Deformed shape: the automatic scale draws the largest displacement as 5 % of the diagonal.
    await page.check('[data-testid="deformation-shown"]')
    const factor = Number(await page.getAttribute('[data-testid="deformation-factor"]', 'data-model'))
    const maxU = Number(await page.getAttribute('[data-testid="deformation-max"]', 'data-model'))
    const diagonal = Math.hypot(2 * b, 2 * b, 600)
    expect(maxU).toBeGreaterThan(0)
    expect(Math.abs(factor * maxU - 0.05 * diagonal)).toBeLessThan(1e-6 * diagonal)
    await page.waitForTimeout(1500)
    await page.screenshot({ path: `${OUT_DIR}/lines-deformed.png` })
    await page.locator('[data-card="deformation"]').screenshot({ path: `${OUT_DIR}/lines-deformation-card.png` })
    // Picking below reads the undeformed view the camera was set for.
    await page.uncheck('[data-testid="deformation-shown"]')
    await page.waitForTimeout(800)

    // Two clicks on the section face, near the bore and near the outside, on the +y side.
    await page.click('[data-testid="line-pick"]')
    expect(await page.textContent('[data-testid="line-pick-hint"]')).toMatch(/start of the line/)
    const p1 = await screenOf(page, [0, a + 4, Z]), p2 = await screenOf(page, [0, b - 4, Z])
    await page.mouse.click(p1.x, p1.y)
    await page.waitForFunction(() => /its end/.test(document.querySelector('[data-testid="line-pick-hint"]')?.textContent ?? ''), undefined, { timeout: 30_000 })
    await page.mouse.click(p2.x, p2.y)
    await page.locator('[data-testid="line-chart"] .u-over').waitFor({ timeout: 60_000 })
    const from = await Promise.all(['x', 'y', 'z'].map((k) => page.inputValue(`[data-testid="line-from-${k}"]`)))
    // SI display: metres. The picked start lies on the section face near the bore.
    expect(Math.abs(num(from[1]) * 1000 - (a + 4))).toBeLessThan(3)
    expect(Math.abs(num(from[2]) * 1000 - Z)).toBeLessThan(1e-6)
    // Ends inside the wall: linearised with a warning.
    await page.waitForSelector('[data-testid="line-warnings"]')
    expect(await page.textContent('[data-testid="line-warnings"]')).toMatch(/inside the body/)

    // Move the ends to the wall's surfaces: no warning, the whole wall.
    await page.click('[data-testid="line-through-wall"]')
    await page.waitForFunction(() => !document.querySelector('[data-testid="line-warnings"]') && !!document.querySelector('[data-testid="linearisation-equivalents"]'), undefined, { timeout: 60_000 })
    // Components and the frame about the pipe's axis (the default axis of this model is z).
    await page.selectOption('[data-testid="component-axes"]', 'cylindrical')
    await page.waitForFunction(() => /hoop/.test(document.querySelector('[data-testid="linearisation-components"]')?.textContent ?? ''), undefined, { timeout: 60_000 })
    const rows = await page.$$eval('[data-testid="linearisation-components"] tbody tr', (trs) => trs.map((tr) => Array.from(tr.children, (c) => c.textContent ?? '')))
    const hoop = rows.find((r) => /hoop/.test(r[0]))!
    // Lamé: membrane hoop p·a/(b − a) = 66.67 MPa; bending (6B/t²)[(a + b)(b − a)/(2ab) − ln(b/a)] = 9.86 MPa.
    const lameMembrane = (p * a) / (b - a)
    const B = (p * a * a * b * b) / (b * b - a * a)
    const lameBending = ((6 * B) / ((b - a) ** 2)) * (((a + b) * (b - a)) / (2 * a * b) - Math.log(b / a))
    console.log(`pipe demo through the wall: membrane hoop ${hoop[1]} MPa (Lamé ${lameMembrane.toFixed(2)}), bending ${hoop[2]} MPa (Lamé ${lameBending.toFixed(2)})`)
    expect(Math.abs(num(hoop[1]) - lameMembrane) / lameMembrane).toBeLessThan(0.015)
    expect(Math.abs(num(hoop[2]) - lameBending) / lameBending).toBeLessThan(0.05)
    const eq = await page.$$eval('[data-testid="linearisation-equivalents"] tbody tr', (trs) => trs.map((tr) => Array.from(tr.children, (c) => c.textContent ?? '')))
    expect(eq.map((r) => r[0])).toEqual(['Membrane', 'Membrane + bending', 'Peak', 'Total'])
    expect(await page.textContent('[data-testid="linearisation"]')).toMatch(/Annex 5-A/)
    expect(await page.textContent('[data-testid="linearisation"]')).toMatch(/engineer's task under the applicable code/)

    // Hover the chart: the read-out names the distance and the plotted values with units.
    const over = page.locator('[data-testid="line-chart"] .u-over')
    const box = (await over.boundingBox())!
    await page.mouse.move(box.x + box.width * 0.4, box.y + box.height * 0.5)
    await page.waitForSelector('[data-testid="line-readout"] [data-readout="vonMises"]')
    expect(await page.textContent('[data-testid="line-readout"]')).toMatch(/s = .+ m.*σvM = .+ MPa/)
    const card = page.locator('[data-card="line"]')
    await card.scrollIntoViewIfNeeded()
    await page.waitForTimeout(400)
    await card.screenshot({ path: `${OUT_DIR}/lines-card.png` })
    await page.screenshot({ path: `${OUT_DIR}/lines-scene.png` })

    // CSV: a header naming the columns, one row per point, the linearisation in a comment.
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="line-csv"]')])
    const csv = readFileSync((await dl.path())!, 'utf8')
    writeFileSync(`${OUT_DIR}/line.csv`, csv)
    const lines = csv.trim().split('\n')
    expect(lines[0]).toMatch(/^# Tractus line/)
    expect(lines.some((l) => /^# linearisation .*Annex 5-A/.test(l))).toBe(true)
    const head = lines.find((l) => l.startsWith('distance,'))!
    expect(head).toMatch(/srr,stt,szz_axis/)
    expect(lines.length - lines.indexOf(head) - 1).toBe(51)

    // Extremes markers: their labels sit on the view; one click frames the point.
    await page.check('[data-testid="extremes-shown"]')
    await page.waitForSelector('[data-testid="extreme-max"]')
    expect(await page.textContent('[data-testid="extreme-max"]')).toMatch(/^max .+ MPa$/)
    await page.waitForTimeout(600)
    await page.screenshot({ path: `${OUT_DIR}/lines-extremes.png` })

    // The review report: the line's diagram, its linearisation and its points.
    const [rep] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.click('[data-testid="review-report"]')])
    const html = readFileSync((await rep.path())!, 'utf8')
    writeFileSync(`${OUT_DIR}/review-report-line.html`, html)
    const ctx = await s.browser.newContext({ viewport: { width: 1100, height: 900 }, offline: true })
    await ctx.route('**/*', (route) => route.abort())
    const view = await ctx.newPage()
    await view.setContent(html, { waitUntil: 'load' })
    expect(await view.locator('figure[data-diagram="diagram-line"] svg polyline').count()).toBeGreaterThan(0)
    expect(await view.locator('table[data-table="linearisation"] tbody tr').count()).toBe(4)
    expect(await view.locator('table[data-table="linearisation-components"] tbody tr').count()).toBe(6)
    expect(await view.locator('table[data-table="line"] tbody tr').count()).toBe(51)
    expect(await view.textContent('section[data-block="linearisation"]')).toMatch(/Annex 5-A/)
    await view.locator('section[data-block="diagram-line"]').scrollIntoViewIfNeeded()
    await view.screenshot({ path: `${OUT_DIR}/review-report-line.png`, fullPage: true })
    await ctx.close()
    await page.close()
  })
})
