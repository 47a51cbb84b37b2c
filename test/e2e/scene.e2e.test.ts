/**
 * The 3D scene in Debian's Chromium with software WebGL: the section handle drags the plane
 * along its normal without turning the camera, and a 4× snapshot comes back at four times the
 * view's size (rendered in tiles) with the model in it.
 */
import { describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import { newPage, pixelStats, useBrowserSession, OUT_DIR, waitForCut, waitForModel } from './browser.ts'
import type { Page } from 'playwright-core'
import { BACKGROUND, HANDLE } from '../../src/scene/sceneLook.ts'

const s = useBrowserSession()

/** A screenshot pixel (CSS px) within `tol` of an sRGB hex colour, near the middle of all such pixels, and their count. */
async function findColour(page: Page, png: Buffer, hex: string, tol: number): Promise<{ x: number; y: number; n: number }> {
  return page.evaluate(async ({ b64, hex, tol }) => {
    const bytes = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0))
    const bmp = await createImageBitmap(new Blob([bytes], { type: 'image/png' }))
    const c = new OffscreenCanvas(bmp.width, bmp.height)
    const g = c.getContext('2d')!
    g.drawImage(bmp, 0, 0)
    const d = g.getImageData(0, 0, bmp.width, bmp.height).data
    const want = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16))
    let sx = 0, sy = 0, n = 0
    for (let y = 0; y < bmp.height; y++) for (let x = 0; x < bmp.width; x++) {
      const o = 4 * (y * bmp.width + x)
      if (Math.abs(d[o] - want[0]) <= tol && Math.abs(d[o + 1] - want[1]) <= tol && Math.abs(d[o + 2] - want[2]) <= tol) { sx += x; sy += y; n++ }
    }
    // The matching pixel nearest the centroid: the centroid of a thin shape may miss it.
    const cx = sx / n, cy = sy / n
    let best = Infinity, bx = NaN, by = NaN
    for (let y = 0; y < bmp.height; y++) for (let x = 0; x < bmp.width; x++) {
      const o = 4 * (y * bmp.width + x)
      if (Math.abs(d[o] - want[0]) <= tol && Math.abs(d[o + 1] - want[1]) <= tol && Math.abs(d[o + 2] - want[2]) <= tol) {
        const q = (x - cx) ** 2 + (y - cy) ** 2
        if (q < best) { best = q; bx = x; by = y }
      }
    }
    return { x: bx, y: by, n }
  }, { b64: png.toString('base64'), hex, tol })
}

/** Share of the pixels in `rect` that differ from an sRGB hex colour by more than 24 (sum of |Δ|). */
async function shareUnlike(page: Page, png: Buffer, hex: string, rect: { x: number; y: number; w: number; h: number }): Promise<number> {
  return page.evaluate(async ({ b64, hex, rect }) => {
    const bytes = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0))
    const bmp = await createImageBitmap(new Blob([bytes], { type: 'image/png' }))
    const c = new OffscreenCanvas(bmp.width, bmp.height)
    const g = c.getContext('2d')!
    g.drawImage(bmp, 0, 0)
    const d = g.getImageData(rect.x, rect.y, rect.w, rect.h).data
    const want = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16))
    let n = 0
    for (let i = 0; i < d.length; i += 4) if (Math.abs(d[i] - want[0]) + Math.abs(d[i + 1] - want[1]) + Math.abs(d[i + 2] - want[2]) > 24) n++
    return n / (d.length / 4)
  }, { b64: png.toString('base64'), hex, rect })
}

/** Share of the pixels in `rect` whose colours differ by more than `tol` (sum over r, g, b) between two PNGs of one size. */
async function shareDiffering(page: Page, a: Buffer, b: Buffer, rect: { x: number; y: number; w: number; h: number }, tol: number): Promise<number> {
  return page.evaluate(async ({ a64, b64, rect, tol }) => {
    const pixels = async (s: string) => {
      const bmp = await createImageBitmap(new Blob([Uint8Array.from(atob(s), (c) => c.charCodeAt(0))], { type: 'image/png' }))
      const c = new OffscreenCanvas(bmp.width, bmp.height)
      const g = c.getContext('2d')!
      g.drawImage(bmp, 0, 0)
      return g.getImageData(rect.x, rect.y, rect.w, rect.h).data
    }
    const [p, q] = [await pixels(a64), await pixels(b64)]
    let n = 0
    for (let i = 0; i < p.length; i += 4) if (Math.abs(p[i] - q[i]) + Math.abs(p[i + 1] - q[i + 1]) + Math.abs(p[i + 2] - q[i + 2]) > tol) n++
    return n / (p.length / 4)
  }, { a64: a.toString('base64'), b64: b.toString('base64'), rect, tol })
}

const planeText = (page: Page) => page.textContent('[data-testid="cut-plane"]')
const hashParam = (page: Page, key: string) => page.evaluate((k) => new URLSearchParams(location.hash.slice(1)).get(k), key)

describe('scene', () => {
  it('dragging the section handle moves the plane along its normal and leaves the camera alone', async () => {
    const page = await newPage(s, '#cut=2,0,0.25,1,0,0,0')
    await waitForModel(page)
    await waitForCut(page)
    await page.waitForTimeout(2000)
    const before = await planeText(page)
    const camBefore = await hashParam(page, 'cam')
    // The handle is drawn unlit in one colour, so its pixels find it on screen.
    const shot = await page.screenshot({ path: `${OUT_DIR}/scene-handle-before.png` })
    const handle = await findColour(page, shot, HANDLE, 3)
    expect(handle.n, 'handle pixels on screen').toBeGreaterThan(30)
    await page.mouse.move(handle.x, handle.y)
    await page.waitForTimeout(300)
    await page.mouse.down()
    for (let i = 1; i <= 12; i++) { await page.mouse.move(handle.x - 10 * i, handle.y + 3 * i); await page.waitForTimeout(50) }
    await page.mouse.up()
    await page.waitForTimeout(2500)
    const after = await planeText(page)
    expect(after).not.toBe(before)
    const x = Number(/\(([-\d.e]+),/.exec(after ?? '')?.[1])
    expect(Number.isFinite(x)).toBe(true)
    expect(x).not.toBeCloseTo(2, 3)
    expect(await hashParam(page, 'cam')).toBe(camBefore)
    await page.screenshot({ path: `${OUT_DIR}/scene-handle-after.png` })
    await page.close()
  })

  // A face of more than 2·10^4 fill triangles (the generated block of 2·10^5 tet4, cut along its
  // length through mid-depth, tilted so the normal traction varies, ±24 kPa, about 16 000
  // polygons; the colour range set to ±20 kPa so the face shows its gradient):
  // software WebGL draws its light face while the offset slider is dragged (workers/sectionFace.ts)
  // and the full face again on release, at the same plane.
  it('a large section face stays drawn, with its colours, while dragged, and its full face comes back on release', async () => {
    const page = await newPage(s, '#model=block&elements=200000&cut=2,0,0.25,0.05,0,1,0&r=-20000,20000')
    await waitForModel(page, 120_000)
    await waitForCut(page, 60_000)
    await page.waitForTimeout(2000)
    const view = { x: 0, y: 40, w: 900, h: 600 }
    const rest = await page.screenshot({ path: `${OUT_DIR}/scene-large-face-rest.png` })
    const slider = (await page.locator('[data-testid="cut-offset"]').boundingBox())!
    const y = slider.y + slider.height / 2, x0 = slider.x + slider.width / 2
    const before = await planeText(page)
    // Pressed in the middle (offset 0: the range is symmetric), then moved by the arrow keys while
    // the pointer stays down: a pixel of this slider is 0.07 m, and the block only 0.5 m deep.
    await page.mouse.move(x0, y)
    await page.mouse.down()
    for (let i = 1; i <= 6; i++) { await page.keyboard.press('ArrowRight'); await page.waitForTimeout(150) }
    await page.waitForTimeout(1500)
    // while the pointer is still down: the plane has moved, the face shows its gradient
    const during = await planeText(page)
    expect(during).not.toBe(before)
    const dragging = await page.screenshot({ path: `${OUT_DIR}/scene-large-face-dragging.png` })
    const [a, d] = [await pixelStats(page, rest, view), await pixelStats(page, dragging, view)]
    // (at rest the section's arrows and axes add to the picture)
    expect(d.nonBackground).toBeGreaterThan(0.7 * a.nonBackground)
    expect(d.distinct).toBeGreaterThan(200)
    // released where it is: the full face at the same plane, a picture all but equal to the light one's
    await page.mouse.up()
    await page.waitForTimeout(2500)
    expect(await planeText(page)).toBe(during)
    const after = await page.screenshot({ path: `${OUT_DIR}/scene-large-face-after.png` })
    expect(await shareDiffering(page, dragging, after, view, 40)).toBeLessThan(0.05)
    await page.close()
  })

  it('a 4× snapshot is four times the view, rendered in tiles, with the model across a tile edge', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    await page.waitForTimeout(1500)
    const box = (await page.locator('[data-testid="scene"] canvas').boundingBox())!
    await page.click('[data-testid="snap-4x"]')
    const [dl] = await Promise.all([page.waitForEvent('download', { timeout: 120_000 }), page.click('[data-testid="snapshot"]')])
    const path = `${OUT_DIR}/scene-snapshot-4x.png`
    await dl.saveAs(path)
    const png = readFileSync(path)
    // PNG header: width and height, big-endian, at bytes 16 and 20 (PNG specification, IHDR).
    const w = png.readUInt32BE(16), h = png.readUInt32BE(20)
    expect(w).toBe(Math.round(box.width) * 4)
    expect(h).toBeGreaterThanOrEqual(Math.round(box.height) * 4)
    // Tiles are at most 2048 px: the model, framed in the middle, shows on both sides of the
    // first tile edge (x = 2048), near the picture's vertical middle.
    const y = Math.round(box.height * 2) - 150
    expect(await shareUnlike(page, png, BACKGROUND, { x: 1700, y, w: 340, h: 300 })).toBeGreaterThan(0.5)
    expect(await shareUnlike(page, png, BACKGROUND, { x: 2056, y, w: 340, h: 300 })).toBeGreaterThan(0.5)
    await page.close()
  })
})
