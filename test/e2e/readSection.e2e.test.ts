/**
 * Reading a section at a glance, in Chromium on the lifting-lug demo: the first cut goes across
 * the part's longest extent and shows its face to the camera; "look at the section" turns the
 * view onto it; the section axes are shown (card rows, the triad at the centroid in the picture,
 * the snapshot) and can be chosen, a reference parallel to the normal is refused with a message;
 * the display units can be the model's own and typed points are in the shown unit; a plane that
 * misses says where the body is; rounding noise reads 0 while the data keeps every digit; the
 * section handle is our own small tab beside the section, and dragging it moves the plane with
 * the offset read-out following during the drag.
 */
import { describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import type { Page } from 'playwright-core'
import { colourBox, figure, newPage, OUT_DIR, useBrowserSession, waitForCut, waitForModel } from './browser.ts'
import { BACKGROUND, HANDLE, TRIAD_E1, TRIAD_E2 } from '../../src/scene/sceneLook.ts'

const s = useBrowserSession()
const LUG = '#model=demo:lifting-lug'

const text = (page: Page, sel: string): Promise<string> => page.textContent(sel).then((t) => t ?? '')
const settle = (page: Page): Promise<void> => page.waitForTimeout(1500)

async function cutOn(page: Page): Promise<void> {
  await page.keyboard.press('c')
  await waitForCut(page)
  await settle(page)
}

describe('reading a section', () => {
  it('cuts across the longest extent, shows the face, looks at it, and shows and chooses the section axes', async () => {
    const page = await newPage(s, LUG)
    await waitForModel(page)
    await cutOn(page)
    // The lug stands 280 mm along y and is 200 mm wide: the first cut is normal to y, through the centre.
    expect(await page.inputValue('[data-testid="cut-ny"]')).toBe('1')
    expect(await page.inputValue('[data-testid="cut-nx"]')).toBe('0')
    expect(await page.inputValue('[data-testid="cut-hide"]')).toBe('auto')
    // The plate section (200 × 20 mm): principal axes, the stiff one (in-plane bending) along z.
    expect(await page.getAttribute('[data-testid="cut-axes-shown"]', 'data-kind')).toBe('principal')
    expect(await text(page, '[data-testid="cut-axes-shown"] [data-row="e1"]')).toBe('(0, 0, 1)')
    expect(await text(page, '[data-testid="cut-axes-shown"] [data-row="e2"]')).toBe('(1, 0, 0)')
    expect(await text(page, '[data-testid="cut-axes-shown"] [data-row="e3"]')).toBe('(0, 1, 0)')
    // M1 is about e1 = z: it equals Mz.
    expect(await figure(page, 'bending1')).toBeCloseTo(await figure(page, 'Mz'), 6)
    await page.screenshot({ path: `${OUT_DIR}/section-first-cut.png` })

    // Look at the section: the view turns to face the cut; the face fills the open part of the view.
    await page.click('[data-testid="cut-look"]')
    await settle(page)
    const shot = await page.screenshot({ path: `${OUT_DIR}/section-look.png` })
    const cam = await page.evaluate(() => new URLSearchParams(location.hash.slice(1)).get('cam')!.split(',').map(Number))
    const dir = [cam[3] - cam[0], cam[4] - cam[1], cam[5] - cam[2]]
    const len = Math.hypot(dir[0], dir[1], dir[2])
    // Hiding the side the camera is on, the camera looks along ±n at the face: here along +y.
    expect(Math.abs(dir[1] / len)).toBeGreaterThan(0.999)
    // The triad at the centroid shows e1 and e2 in their colours.
    expect((await colourBox(page, shot, TRIAD_E1, 6)).n).toBeGreaterThan(40)
    expect((await colourBox(page, shot, TRIAD_E2, 6)).n).toBeGreaterThan(40)
    // The face fills the middle of the open part of the view (left of the cards): background only
    // between its scalloped edge and the arrows' shading, a fifth at most.
    expect((await colourBox(page, shot, BACKGROUND, 8, { x: 200, y: 320, w: 500, h: 40 })).n / (500 * 40)).toBeLessThan(0.25)

    // Reference axes along x: e1 = x, e2 = n × e1 = y × x = −z.
    await page.selectOption('[data-testid="cut-axes"]', 'reference')
    await page.selectOption('[data-testid="cut-reference"]', 'x')
    await page.waitForFunction(() => document.querySelector('[data-testid="cut-axes-shown"]')?.getAttribute('data-kind') === 'reference')
    expect(await text(page, '[data-testid="cut-axes-shown"] [data-row="e1"]')).toBe('(1, 0, 0)')
    expect(await text(page, '[data-testid="cut-axes-shown"] [data-row="e2"]')).toBe('(0, 0, −1)')
    expect(await figure(page, 'bending1')).toBeCloseTo(await figure(page, 'Mx'), 6)
    // A reference parallel to the normal is refused with a message; the default reference serves.
    await page.selectOption('[data-testid="cut-reference"]', 'y')
    await page.locator('[data-testid="cut-axes-note"]').waitFor()
    expect(await text(page, '[data-testid="cut-axes-note"]')).toMatch(/reference direction \(0, 1, 0\) is parallel to the section normal \(0, 1, 0\).*default reference is used instead/)
    await page.locator('[data-card="cut"]').screenshot({ path: `${OUT_DIR}/section-axes-card.png` })

    // The snapshot carries the axes (drawn in the table and the triad in the picture).
    await page.selectOption('[data-testid="cut-reference"]', 'auto')
    await page.selectOption('[data-testid="cut-axes"]', 'principal')
    await page.waitForFunction(() => document.querySelector('[data-testid="cut-axes-shown"]')?.getAttribute('data-kind') === 'principal')
    await settle(page)
    await page.click('[data-testid="snap-1x"]')
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="snapshot"]')])
    const png = readFileSync((await dl.path())!)
    await dl.saveAs(`${OUT_DIR}/section-axes-snapshot.png`)
    expect((await colourBox(page, png, TRIAD_E1, 6)).n).toBeGreaterThan(40)
    await page.close()
  })

  it('shows the model\'s own units, takes typed points in them, and says where the body is when the plane misses', async () => {
    const page = await newPage(s, LUG)
    await waitForModel(page)
    await cutOn(page)
    // The neck, 160 mm × 20 mm: SI shows it in m²; the model's own units in mm² and N.
    expect(await text(page, '[data-testid="cut-result"] tr[data-row="area"] .num')).toBe('0.0032 m²')
    await page.click('[data-testid="units-summary"]')
    await page.check('[data-testid="units-model"]')
    await page.waitForFunction(() => document.querySelector('[data-testid="cut-result"] tr[data-row="area"] .num')?.textContent === '3200 mm²')
    expect(await text(page, '[data-testid="cut-result"] tr[data-row="axial"] .unit')).toContain('N')
    expect(await text(page, '[data-testid="cut-result"] tr[data-row="bending1"] .unit')).toContain('N·mm')
    expect(await text(page, '[data-testid="cut-result"] tr[data-row="I1"] .unit')).toContain('mm⁴')
    await page.screenshot({ path: `${OUT_DIR}/units-model.png` })
    // A chosen set: kN and cm with the stress in MPa.
    await page.selectOption('[data-testid="units-length"]', 'cm')
    await page.selectOption('[data-testid="units-force"]', 'kN')
    await page.waitForFunction(() => document.querySelector('[data-testid="cut-result"] tr[data-row="area"] .num')?.textContent === '32 cm²')
    await page.check('[data-testid="units-model"]')
    await page.click('[data-testid="units-summary"]')
    // A typed point is in the shown unit: y = 60 mm lies in the lug (0 … 280 mm).
    await page.fill('[data-testid="cut-py"]', '60')
    await page.press('[data-testid="cut-py"]', 'Enter')
    await page.waitForFunction(() => Math.abs(Number(document.querySelector('[data-testid="cut-result"] tr[data-row="cy"] .num')?.getAttribute('data-model')) - 60) < 1e-9)
    // 5000 mm misses: the card says where the body is, in mm, and offers to move the plane into it.
    await page.fill('[data-testid="cut-py"]', '5000')
    await page.press('[data-testid="cut-py"]', 'Enter')
    await page.locator('[data-testid="cut-empty"]').waitFor()
    const miss = await text(page, '[data-testid="cut-empty"]')
    expect(miss).toMatch(/misses the body/)
    expect(miss).toMatch(/the body spans x·n = 0 … 280 mm; this plane lies at x·n = 5000 mm/)
    await page.locator('[data-card="cut"]').screenshot({ path: `${OUT_DIR}/plane-misses.png` })
    await page.click('[data-testid="cut-into-body"]')
    await waitForCut(page)
    expect(await figure(page, 'cy')).toBeCloseTo(140, 6)
    await page.close()
  })

  it('shows rounding noise as 0 on screen while the data keeps every digit', async () => {
    const page = await newPage(s, LUG)
    await waitForModel(page)
    await cutOn(page)
    // The lug is symmetric about x = 0: the neck's centroid x is 0 up to round-off (about 1e-17 m).
    const cx = await figure(page, 'cx')
    expect(Math.abs(cx)).toBeLessThan(1e-9)
    expect(await text(page, '[data-testid="cut-result"] tr[data-row="cx"] .num')).toBe('0 m')
    // The CSV export carries the value as computed (shown in m; the model is in mm).
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="export-section-csv"]')])
    const csv = readFileSync((await dl.path())!, 'utf8')
    const line = csv.split('\n').find((l) => l.startsWith('Centroid x,'))!
    expect(Number(line.split(',')[1])).toBe(cx * 0.001)
    await page.close()
  })

  it('the section handle is a small tab beside the section; dragging it moves the plane and the read-out follows during the drag', async () => {
    const page = await newPage(s, `${LUG}&cut=0,140,10,0,1,0,0`)
    await waitForModel(page)
    await waitForCut(page)
    await settle(page)
    const shot = await page.screenshot({ path: `${OUT_DIR}/handle-lug.png` })
    const tab = await colourBox(page, shot, HANDLE, 3, { x: 0, y: 40, w: 920, h: 600 })
    // A tab of about 34 × 15 px: on screen, small, and clear of the section's centre.
    expect(tab.n).toBeGreaterThan(40)
    expect(tab.n).toBeLessThan(1500)
    const cx = (tab.x0 + tab.x1) / 2, cy = (tab.y0 + tab.y1) / 2
    const before = await page.getAttribute('[data-testid="cut-offset-value"] .num', 'data-model')
    await page.mouse.move(cx, cy)
    await page.waitForTimeout(300)
    await page.mouse.down()
    const during: string[] = []
    for (let i = 1; i <= 10; i++) {
      await page.mouse.move(cx - 8 * i, cy + 5 * i)
      await page.waitForTimeout(120)
      during.push((await page.getAttribute('[data-testid="cut-offset-value"] .num', 'data-model')) ?? '')
    }
    await page.screenshot({ path: `${OUT_DIR}/handle-lug-dragging.png` })
    await page.mouse.up()
    await settle(page)
    // The read-out moved while the pointer was down, not only after the release.
    expect(during.some((v) => v !== before)).toBe(true)
    expect(await page.getAttribute('[data-testid="cut-offset-value"] .num', 'data-model')).not.toBe(before)
    await page.close()
  })
})
