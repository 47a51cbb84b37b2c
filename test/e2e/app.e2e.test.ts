/**
 * The app in Debian's Chromium with software WebGL: the demo renders, the colour bar shows, the
 * snapshot PNG carries the colour bar, a link restores the view, a crafted link cannot break the
 * app, help and units work, and no request leaves 127.0.0.1.
 */
import { describe, expect, it } from 'vitest'
import { readFileSync, writeFileSync } from 'node:fs'
import { colourMapTable } from '../../src/scene/colourMaps.ts'
import { snapshotLayout } from '../../src/app/snapshotLayout.ts'
import { newPage, useBrowserSession, OUT_DIR, pixelsAt, pixelStats, waitForCut, waitForModel } from './browser.ts'
import type { Page } from 'playwright-core'

const s = useBrowserSession()

/** Scene area left of the cards, under the top bar, above the colour bar. */
const SCENE_RECT = { x: 0, y: 40, w: 900, h: 560 }

async function settle(page: Page): Promise<void> {
  // Render on demand: give the last invalidated frame time to draw on software WebGL.
  await page.waitForTimeout(1200)
}

describe('Tractus in Chromium', () => {
  it('loads the demo, renders it (pixels not blank) and shows the colour bar and the caution', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    await settle(page)
    const shot = await page.screenshot({ path: `${OUT_DIR}/demo.png` })
    const stats = await pixelStats(page, shot, SCENE_RECT)
    expect(stats.nonBackground).toBeGreaterThan(0.03)
    expect(stats.distinct).toBeGreaterThan(30)
    const bar = page.locator('[data-testid="colour-bar"]')
    await expect(bar.isVisible()).resolves.toBe(true)
    const barShot = await bar.locator('canvas').screenshot()
    expect((await pixelStats(page, barShot)).distinct).toBeGreaterThan(50)
    expect(await bar.textContent()).toMatch(/MPa|ksi|–/)
    expect(await page.textContent('[data-testid="caution"]')).toContain('does not certify a design')
    // The lug demo carries its own caution about lifting devices, shown in the model card.
    expect(await page.textContent('[data-testid="model-caution"]')).toContain('designed and checked by a qualified engineer')
    await page.close()

    // A view for the README: the lug demo (when shipped) cut through its neck, von Mises on the
    // surface, the section face coloured by its normal traction.
    const lug = await newPage(s, '#model=demo:lifting-lug&q=vonMises&cut=0,140,10,0,1,0,0&hide=negative')
    await waitForModel(lug)
    if ((await lug.textContent('[data-testid="model-name"]'))?.includes('lug')) {
      await waitForCut(lug)
      await settle(lug)
      await lug.screenshot({ path: `${OUT_DIR}/readme-section.png` })
    }
    await lug.close()
  })

  it('downloads a snapshot PNG at 1x and 2x with the colour bar in it', async () => {
    const page = await newPage(s, '#q=vonMises')
    await waitForModel(page)
    await page.keyboard.press('x')
    await waitForCut(page)
    await settle(page)
    const canvas = await page.locator('[data-testid="scene"] canvas').boundingBox()
    expect(canvas).not.toBeNull()
    const map = (await page.getAttribute('[data-testid="colour-bar"]', 'data-map')) as 'viridis'
    for (const scale of [1, 2]) {
      await page.click(`[data-testid="snap-${scale}x"]`)
      const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="snapshot"]')])
      expect(dl.suggestedFilename()).toMatch(/\.png$/)
      const png = readFileSync((await dl.path())!)
      expect(png.subarray(1, 4).toString('latin1')).toBe('PNG')
      const w = Math.round(canvas!.width * scale), h = Math.round(canvas!.height * scale)
      const L = snapshotLayout(w, h, scale)
      const ts = [0.03, 0.25, 0.5, 0.75, 0.97]
      const cy = L.bar.y + Math.floor(L.bar.h / 2)
      const got = await pixelsAt(page, png, ts.map((t) => [Math.round(L.bar.x + t * L.bar.w), cy] as const))
      expect(got.size).toEqual([w, h])
      const table = colourMapTable(map, 256)
      ts.forEach((t, i) => {
        const k = Math.round(t * 255)
        const want = [table[4 * k], table[4 * k + 1], table[4 * k + 2]]
        const diff = Math.abs(got.rgb[i][0] - want[0]) + Math.abs(got.rgb[i][1] - want[1]) + Math.abs(got.rgb[i][2] - want[2])
        expect(diff, `bar colour at t=${t}`).toBeLessThan(24)
      })
      const stats = await pixelStats(page, png, { x: 0, y: Math.round(80 * scale), w: Math.round(w * 0.6), h: Math.round(h * 0.5) })
      expect(stats.nonBackground).toBeGreaterThan(0.03)
      writeFileSync(`${OUT_DIR}/snapshot-${scale}x.png`, png)
    }
    await page.close()
  })

  it('restores camera, quantity, range and section from the link', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    await page.selectOption('[data-testid="quantity"]', 'vonMises')
    await page.check('[data-testid="range-fixed"]')
    await page.fill('[data-testid="range-min"]', '0.5')
    await page.press('[data-testid="range-min"]', 'Enter')
    await page.fill('[data-testid="range-max"]', '6')
    await page.press('[data-testid="range-max"]', 'Enter')
    await page.check('[data-testid="cut-enabled"]')
    await page.click('[data-testid="cut-snap-y"]')
    // Tilt the normal and move the plane off the centre (keys: the offset steps by 1/50 of the size).
    await page.fill('[data-testid="cut-nx"]', '0.4')
    await page.press('[data-testid="cut-nx"]', 'Enter')
    await page.keyboard.press(']')
    await page.keyboard.press(']')
    await waitForCut(page)
    // Turn the view: drag on an empty part of the canvas.
    await page.mouse.move(200, 500)
    await page.mouse.down()
    await page.mouse.move(320, 440, { steps: 8 })
    await page.mouse.up()
    await page.waitForTimeout(900)
    const link = await page.evaluate(() => window.location.href)
    expect(link).toContain('cam=')
    expect(link).toContain('cut=')
    const before = {
      quantity: await page.inputValue('[data-testid="quantity"]'),
      min: await page.getAttribute('[data-testid="colour-bar"]', 'data-min'),
      max: await page.getAttribute('[data-testid="colour-bar"]', 'data-max'),
      plane: await page.$$eval('[data-testid="cut-plane"] .num', (e) => e.map((x) => x.getAttribute('data-model'))),
      axial: await page.getAttribute('[data-testid="cut-result"] tr[data-row="axial"] .num', 'data-model'),
    }
    await settle(page)
    const shotA = await page.screenshot({ path: `${OUT_DIR}/link-before.png` })

    const copy = await newPage(s, link.slice(link.indexOf('#')))
    await waitForModel(copy)
    await waitForCut(copy)
    await copy.waitForFunction((a) => document.querySelector('[data-testid="cut-result"] tr[data-row="axial"] .num')?.getAttribute('data-model') === a, before.axial)
    await settle(copy)
    expect(await copy.inputValue('[data-testid="quantity"]')).toBe(before.quantity)
    expect(await copy.getAttribute('[data-testid="colour-bar"]', 'data-min')).toBe(before.min)
    expect(await copy.getAttribute('[data-testid="colour-bar"]', 'data-max')).toBe(before.max)
    expect(await copy.$$eval('[data-testid="cut-plane"] .num', (e) => e.map((x) => x.getAttribute('data-model')))).toEqual(before.plane)
    const shotB = await copy.screenshot({ path: `${OUT_DIR}/link-after.png` })
    // Same camera → same picture: compare the scene area pixel by pixel.
    const diff = await page.evaluate(async ({ a, b, r }) => {
      const load = async (b64: string) => {
        const bmp = await createImageBitmap(new Blob([Uint8Array.from(atob(b64), (c) => c.charCodeAt(0))], { type: 'image/png' }))
        const c = new OffscreenCanvas(bmp.width, bmp.height)
        const g = c.getContext('2d')!
        g.drawImage(bmp, 0, 0)
        return g.getImageData(r.x, r.y, r.w, r.h).data
      }
      const da = await load(a), db = await load(b)
      let sum = 0
      for (let i = 0; i < da.length; i += 4) sum += Math.abs(da[i] - db[i]) + Math.abs(da[i + 1] - db[i + 1]) + Math.abs(da[i + 2] - db[i + 2])
      return sum / (da.length / 4)
    }, { a: shotA.toString('base64'), b: shotB.toString('base64'), r: SCENE_RECT })
    expect(diff, 'mean colour difference per pixel of the restored view').toBeLessThan(3)
    await page.close()
    await copy.close()
  })

  it('survives a crafted link: bad numbers, markup and unknown names are ignored', async () => {
    const hashes = [
      '#q=<script>alert(1)</script>&r=1e999,NaN&cut=1,2,3,0,0,0,x&cam=1,1,1,1,1,1,0,0,0,500&model=demo:../../etc&u=<img>',
      '#%E0%A4%A&model=block&elements=-5&map=constructor',
      '#cut=' + '9'.repeat(5000) + '&q=__proto__&r=5,1',
    ]
    for (const h of hashes) {
      const page = await newPage(s, h)
      await waitForModel(page)
      expect(await page.locator('[data-testid="colour-bar"]').isVisible()).toBe(true)
      expect(await page.locator('script:not([src])').count()).toBe(0)
      expect(await page.evaluate(() => document.querySelectorAll('img').length)).toBe(0)
      await page.close()
    }
  })

  it('switches units everywhere at once and lists the shortcuts in the help overlay', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    const gross = '[data-testid="body-balance"] tr[data-row="gross"] .num'
    const si = await page.textContent(gross)
    const model = Number(await page.getAttribute(gross, 'data-model'))
    expect(si).toContain('kN')
    await page.keyboard.press('u')
    await page.waitForFunction((sel) => document.querySelector(sel)?.textContent?.includes('kip'), gross)
    const us = (await page.textContent(gross))!
    // NIST SP 811 Appendix B: 1 lbf = 4.448 222 N, so 1 kip = 4448.222 N (model force unit N here).
    const shown = Number(us.replace('−', '-').replace(/[^0-9.e-]/g, ''))
    expect(Math.abs(shown - model / 4448.222) / (model / 4448.222)).toBeLessThan(1e-3)
    expect(await page.textContent('[data-testid="colour-bar"]')).toContain('ksi')
    await page.keyboard.press('?')
    const help = page.locator('[data-testid="help-overlay"]')
    expect(await help.isVisible()).toBe(true)
    expect(await help.textContent()).toContain('Cut on / off')
    await page.screenshot({ path: `${OUT_DIR}/help.png` })
    await page.keyboard.press('Escape')
    expect(await help.count()).toBe(0)
    await page.close()
  })
})
