/**
 * Reading the whole model at a glance, in Chromium: load-entry patches by the user's rule (the
 * tunnel splits into its faces, the lug's base patch is its base, force and moment in the card
 * and the exports); arrows coloured by normal traction with a bar of their own and a length
 * scale in the view and in the snapshot; the Equilibrium card names the point of the residual
 * moment and lists the least balanced elements, one click frames and marks one; a link made on
 * the user's own files says which files it needs and applies its view once they are opened, an
 * unknown demo says so; inputs say what they refuse; framing keeps clear of the cards; view
 * buttons and the key map.
 */
import { describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import { PerspectiveCamera, Vector3 } from 'three'
import type { Page } from 'playwright-core'
import { colourMapTable } from '../../src/scene/colourMaps.ts'
import { snapshotLayout } from '../../src/app/snapshotLayout.ts'
import { MARKER, SCALE_ARROW } from '../../src/scene/sceneLook.ts'
import { bundleFiles, cantileverModel } from './bundle.ts'
import { colourBox, newPage, OUT_DIR, pixelsAt, useBrowserSession, waitForCut, waitForModel } from './browser.ts'

const s = useBrowserSession()

const settle = (page: Page): Promise<void> => page.waitForTimeout(1500)
const text = (page: Page, sel: string): Promise<string> => page.textContent(sel).then((t) => t ?? '')

/** Pixels within `tol` of an sRGB hex colour in a PNG. */
const countColour = async (page: Page, png: Buffer, hex: string, tol: number): Promise<number> => (await colourBox(page, png, hex, tol)).n

/** The camera of the view link: position, target, up, fov. */
async function camera(page: Page): Promise<{ position: Vector3; target: Vector3; up: Vector3; fov: number }> {
  const c = await page.evaluate(() => new URLSearchParams(location.hash.slice(1)).get('cam')?.split(',').map(Number) ?? [])
  return { position: new Vector3(c[0], c[1], c[2]), target: new Vector3(c[3], c[4], c[5]), up: new Vector3(c[6], c[7], c[8]), fov: c[9] }
}

async function lookDirection(page: Page): Promise<Vector3> {
  const c = await camera(page)
  return c.target.clone().sub(c.position).normalize()
}

/** Waits until the link's camera differs from `before` (the view has moved and been reported). */
async function camChanged(page: Page, before: string | null): Promise<void> {
  await page.waitForFunction((b) => new URLSearchParams(location.hash.slice(1)).get('cam') !== b, before, { timeout: 15_000 })
}
const camText = (page: Page) => page.evaluate(() => new URLSearchParams(location.hash.slice(1)).get('cam'))

async function download(page: Page, testId: string): Promise<string> {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.click(`[data-testid="${testId}"]`)])
  return readFileSync((await dl.path())!, 'utf8')
}

describe('load-entry patches', () => {
  it('tunnel: top, two sides, base and the two slice faces; the rule can be set; force and moment in the card and the exports', async () => {
    const page = await newPage(s, '#model=demo:tunnel-block')
    await waitForModel(page)
    const rows = page.locator('[data-testid="patch-list"] tbody tr')
    expect(await rows.count()).toBe(6)
    const j = JSON.parse(await download(page, 'export-patches-json')) as { rule: { featureAngle: number; lowerThresholdFraction: number }; patches: { area: number; force: number[]; moment: number[]; momentMagnitude: number; part: number }[] }
    expect(j.rule).toMatchObject({ featureAngle: 40, lowerThresholdFraction: 0.005 })
    // Two 180 m² faces (top and base, 60 m × 3 m) and two more (the sides), two 3550 m² slice faces.
    expect(j.patches.map((p) => Math.round(p.area)).sort((a, b) => a - b)).toEqual([180, 180, 180, 180, 3550, 3550])
    for (const p of j.patches) expect(p.moment).toHaveLength(3)
    const csv = await download(page, 'export-patches-csv')
    expect(csv.split('\n')[2]).toContain('Mx kN·m')
    // The card: click a patch for its force and moment vectors.
    await rows.nth(4).click()
    expect(await text(page, '[data-testid="patch-detail"] caption')).toMatch(/Patch 4: \d+ faces/)
    expect(await page.locator('[data-testid="patch-detail"] [data-row="moment"] .num').count()).toBe(3)
    await page.locator('[data-card="load-entry"]').screenshot({ path: `${OUT_DIR}/patches-tunnel.png` })
    // No split at folds (180°): the outer faces join into one patch; the free tunnel wall stays free.
    await page.click('[data-testid="patch-rule"] summary')
    await page.fill('[data-testid="patch-angle"]', '180')
    await page.press('[data-testid="patch-angle"]', 'Enter')
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="patch-list"] tbody tr').length === 1)
    // A lower threshold above the threshold is refused and says why; the rule in use stays.
    await page.fill('[data-testid="patch-lower"]', '9')
    await page.press('[data-testid="patch-lower"]', 'Enter')
    expect(await text(page, '[data-testid="patch-rule-error"]')).toMatch(/lower threshold \(9 %\) may not exceed the threshold \(5 %\)/)
    await page.click('[data-testid="patch-defaults"]')
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="patch-list"] tbody tr').length === 6)
    await page.close()
  })

  it('lug: the base patch is the welded base (200 mm × 20 mm) and carries the 50 kN pull', async () => {
    const page = await newPage(s, '#model=demo:lifting-lug')
    await waitForModel(page)
    const j = JSON.parse(await download(page, 'export-patches-json')) as { patches: { area: number; centroid: number[]; forceMagnitude: number }[] }
    // SI display: m² and kN.
    const base = j.patches.find((p) => Math.abs(p.centroid[1]) < 1e-9)!
    expect(base.area).toBeCloseTo(0.004, 12)
    expect(Math.abs(base.forceMagnitude - 50) / 50).toBeLessThan(0.01)
    await page.close()
  })
})

describe('arrows', () => {
  it('are coloured by normal traction with a bar of their own, and a scale arrow of a round value stands in the view and the snapshot', async () => {
    const page = await newPage(s, '#model=demo:lifting-lug&q=vonMises')
    await waitForModel(page)
    await page.keyboard.press('a')
    await page.locator('[data-testid="arrow-colour-bar"]').waitFor()
    expect(await text(page, '[data-testid="arrow-colour-bar"]')).toMatch(/Arrows: normal traction tₙ \[MPa\]/)
    // von Mises is on viridis, so the arrows take a diverging map of their own, centred on zero.
    expect(await page.getAttribute('[data-testid="arrow-colour-bar"]', 'data-map')).toBe('RdBu')
    expect(Number(await page.getAttribute('[data-testid="arrow-colour-bar"]', 'data-min'))).toBe(-Number(await page.getAttribute('[data-testid="arrow-colour-bar"]', 'data-max')))
    await settle(page)
    const shot = await page.screenshot({ path: `${OUT_DIR}/arrows-scale.png` })
    expect(await countColour(page, shot, SCALE_ARROW, 4)).toBeGreaterThan(20)
    // With normal traction on the surface the arrows share its bar: no second bar.
    await page.keyboard.press('1')
    await page.waitForFunction(() => !document.querySelector('[data-testid="arrow-colour-bar"]'))
    await page.keyboard.press('4')
    await page.locator('[data-testid="arrow-colour-bar"]').waitFor()
    // The snapshot: the scale arrow in the picture and the arrows' bar over the footer.
    await page.click('[data-testid="snap-2x"]')
    const canvas = (await page.locator('[data-testid="scene"] canvas').boundingBox())!
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="snapshot"]')])
    const png = readFileSync((await dl.path())!)
    await dl.saveAs(`${OUT_DIR}/arrows-snapshot-2x.png`)
    expect(await countColour(page, png, SCALE_ARROW, 4)).toBeGreaterThan(40)
    const w = Math.round(canvas.width * 2), h = Math.round(canvas.height * 2), L = snapshotLayout(w, h, 2)
    const y = L.footer.y - Math.round(58 * 2) + Math.round(16 * 2) + 5
    const x0 = L.margin, bw = Math.round(220 * 2)
    const got = await pixelsAt(page, png, [[x0 + Math.round(0.03 * bw), y], [x0 + Math.round(0.97 * bw), y]])
    const table = colourMapTable('RdBu', 256)
    ;[0.03, 0.97].forEach((t, i) => {
      const k = Math.round(t * 255)
      const diff = Math.abs(got.rgb[i][0] - table[4 * k]) + Math.abs(got.rgb[i][1] - table[4 * k + 1]) + Math.abs(got.rgb[i][2] - table[4 * k + 2])
      expect(diff, `arrow bar colour at t=${t}`).toBeLessThan(24)
    })
    await page.close()
  })
})

describe('equilibrium', () => {
  it('names the point of the residual moment and lists the five least balanced elements; a click frames and marks one', async () => {
    const page = await newPage(s, '#model=demo:lifting-lug')
    await waitForModel(page)
    expect(await text(page, '[data-testid="body-balance"]')).toMatch(/about the volume centroid/)
    expect(await page.locator('[data-testid="body-balance"] [data-row="about"] .num').count()).toBe(3)
    const rows = page.locator('[data-testid="least-balanced"] tbody tr')
    expect(await rows.count()).toBe(5)
    const ind = await page.$$eval('[data-testid="least-balanced"] tbody tr td:nth-child(2) .num', (e) => e.map((x) => Number(x.getAttribute('data-model'))))
    // Largest first, and the first is the card's "Largest" figure.
    for (let i = 1; i < ind.length; i++) expect(ind[i]).toBeLessThanOrEqual(ind[i - 1])
    const largest = Number(await page.getAttribute('[data-testid="element-balance"] tr:nth-child(3) .num', 'data-model'))
    expect(ind[0]).toBeCloseTo(largest, 6)
    const before = await camText(page)
    await rows.first().click()
    await camChanged(page, before)
    await settle(page)
    const shot = await page.screenshot({ path: `${OUT_DIR}/least-balanced.png` })
    expect(await countColour(page, shot, MARKER, 6)).toBeGreaterThan(30)
    expect(await rows.first().getAttribute('class')).toBe('sel')
    await page.locator('[data-card="equilibrium"]').screenshot({ path: `${OUT_DIR}/equilibrium-card.png` })
    await page.close()
  })
})

describe('view links', () => {
  it('a link made on the user\'s own files names them, waits, and applies its view once they are opened', async () => {
    const model = cantileverModel('own files', 12, 4, 3)
    const page = await newPage(s)
    await waitForModel(page)
    await page.setInputFiles('[data-testid="file-input"]', bundleFiles(model))
    await page.waitForFunction(() => document.querySelector('[data-testid="model-name"]')?.textContent === 'own files')
    await waitForModel(page)
    await page.keyboard.press('c')
    await page.keyboard.press(']')
    await page.keyboard.press(']')
    await waitForCut(page)
    await settle(page)
    // The link holds the plane on screen: its offset is the card's (the address follows the view after a pause).
    const offset = await page.getAttribute('[data-testid="cut-offset-value"] .num', 'data-model')
    await page.waitForFunction((o) => location.hash.includes('model=files:') && new URLSearchParams(location.hash.slice(1)).get('cut')?.split(',')[6] === o, offset)
    const plane = await page.$$eval('[data-testid="cut-plane"] .num', (e) => e.map((x) => x.getAttribute('data-model')))
    const link = await page.evaluate(() => location.hash)
    expect(link).toMatch(/model=files:[^&]*nodes\.csv/)
    expect(link).toMatch(/fsha=[0-9a-f]{12}/)
    await page.close()

    const other = await newPage(s, link)
    await waitForModel(other)
    const notice = other.locator('[data-testid="link-notice"]')
    await notice.waitFor()
    expect(await notice.getAttribute('data-kind')).toBe('needs-files')
    const said = await notice.textContent()
    for (const f of ['nodes.csv', 'elements.csv', 'stress.csv']) expect(said).toContain(f)
    // The demo shown meanwhile does not take the other model's plane.
    expect(await other.isChecked('[data-testid="cut-enabled"]')).toBe(false)
    await other.screenshot({ path: `${OUT_DIR}/link-needs-files.png` })
    // Reloading keeps the link (the address is not overwritten while it waits).
    expect(await other.evaluate(() => location.hash)).toBe(link)
    await other.setInputFiles('[data-testid="file-input"]', bundleFiles(model))
    await other.waitForFunction(() => document.querySelector('[data-testid="model-name"]')?.textContent === 'own files')
    await waitForCut(other)
    await other.waitForFunction((p) => JSON.stringify(Array.from(document.querySelectorAll('[data-testid="cut-plane"] .num'), (x) => x.getAttribute('data-model'))) === JSON.stringify(p), plane)
    expect(await other.locator('[data-testid="link-notice"]').count()).toBe(0)
    await other.close()
  })

  it('an unknown demo name says so and its view is not put on another model', async () => {
    const page = await newPage(s, '#model=demo:no-such-part&cut=0,1,0,0,1,0,0&q=vonMises')
    await waitForModel(page)
    const notice = page.locator('[data-testid="link-notice"]')
    await notice.waitFor()
    expect(await notice.getAttribute('data-kind')).toBe('unknown-demo')
    expect(await notice.textContent()).toMatch(/names the demo "no-such-part", which this copy of Tractus does not have; showing .+ instead, without the link's section and camera/)
    expect(await page.isChecked('[data-testid="cut-enabled"]')).toBe(false)
    await page.locator('[data-testid="link-notice"]').screenshot({ path: `${OUT_DIR}/link-unknown-demo.png` })
    await page.close()
  })
})

describe('inputs and layout', () => {
  it('marks what it refuses, keeps labels with their controls, widens all cards from the top bar, and frames clear of the cards', async () => {
    const page = await newPage(s, '#model=demo:lifting-lug')
    await waitForModel(page)
    await page.keyboard.press('c')
    await waitForCut(page)
    // A zero normal: every normal field is marked and the reason shown; the plane stays.
    await page.fill('[data-testid="cut-ny"]', '0')
    await page.press('[data-testid="cut-ny"]', 'Enter')
    await page.locator('[data-testid="cut-input-error"]').waitFor()
    expect(await page.locator('label.field.bad [data-testid^="cut-n"]').count()).toBe(3)
    expect(await text(page, '[data-testid="cut-input-error"]')).toMatch(/has no direction.*previous plane is kept/)
    // The sweep count is refused outside 2–2000, not clamped in silence.
    await page.fill('[data-testid="sweep-count"]', '5000')
    await page.press('[data-testid="sweep-count"]', 'Enter')
    expect(await text(page, '[data-testid="sweep-count-error"]')).toMatch(/5000 sections: give a whole number from 2 to 2000/)
    expect(await page.locator('label.field.bad [data-testid="sweep-count"]').count()).toBe(1)
    // "Fill" sits with its control.
    const fill = (await page.locator('[data-testid="cut-fill"]').boundingBox())!
    const label = (await page.locator('label.pair:has([data-testid="cut-fill"]) .lbl').boundingBox())!
    expect(Math.abs(label.y - fill.y)).toBeLessThan(fill.height)
    expect(fill.x - (label.x + label.width)).toBeLessThan(16)
    // Wide cards: one switch in the top bar widens the whole column.
    await page.click('[data-testid="wide-cards"]')
    expect((await page.locator('.cards').boundingBox())!.width).toBeGreaterThan(600)
    await page.click('[data-testid="wide-cards"]')
    expect((await page.locator('.cards').boundingBox())!.width).toBeLessThan(400)

    // Framing a patch puts it in the part of the view the cards leave open.
    const patches = JSON.parse(await download(page, 'export-patches-json')) as { patches: { centroid: number[] }[] }
    const before = await camText(page)
    await page.click('[data-testid="patch-list"] tbody tr:first-child button')
    await camChanged(page, before)
    const cam = await camera(page)
    const box = (await page.locator('[data-testid="scene"] canvas').boundingBox())!
    const cards = (await page.locator('.cards').boundingBox())!
    const c = new PerspectiveCamera(cam.fov, box.width / box.height, 0.001, 1e6)
    c.up.copy(cam.up)
    c.position.copy(cam.position)
    c.lookAt(cam.target)
    c.updateMatrixWorld()
    // The export is in m (SI), the model in mm.
    const p = new Vector3(...patches.patches[0].centroid.map((v) => v * 1000)).project(c)
    const px = box.x + ((p.x + 1) / 2) * box.width
    expect(px).toBeGreaterThan(box.x + 40)
    expect(px).toBeLessThan(cards.x - 40)
    await page.screenshot({ path: `${OUT_DIR}/frame-patch.png` })
    await page.close()
  })
})

describe('views and keys', () => {
  it('view buttons look along each axis and isometric; Shift+X/Y/Z turn the view, X/Y/Z the cut; the key map says so', async () => {
    const page = await newPage(s, '#model=demo:lifting-lug')
    await waitForModel(page)
    await settle(page)
    let before = await camText(page)
    await page.click('[data-testid="view-+x"]')
    await camChanged(page, before)
    expect((await lookDirection(page)).x).toBeGreaterThan(0.999)
    before = await camText(page)
    await page.click('[data-testid="view--y"]')
    await camChanged(page, before)
    expect((await lookDirection(page)).y).toBeLessThan(-0.999)
    before = await camText(page)
    await page.click('[data-testid="view-iso"]')
    await camChanged(page, before)
    // Isometric: the three axes foreshortened alike, from the front right and above (z up).
    const iso = await lookDirection(page)
    for (const [k, sgn] of [['x', -1], ['y', 1], ['z', -1]] as const) expect(iso[k] * sgn).toBeCloseTo(1 / Math.sqrt(3), 6)
    await page.screenshot({ path: `${OUT_DIR}/view-iso.png` })
    before = await camText(page)
    await page.keyboard.press('Shift+Z')
    await camChanged(page, before)
    expect((await lookDirection(page)).z).toBeGreaterThan(0.999)
    // The plain letter turns the cut, not the view.
    before = await camText(page)
    await page.keyboard.press('x')
    await waitForCut(page)
    expect(await page.inputValue('[data-testid="cut-nx"]')).toBe('1')
    await page.waitForTimeout(600)
    expect(await camText(page)).toBe(before)
    await page.keyboard.press('?')
    const help = page.locator('[data-testid="help-overlay"]')
    await help.waitFor()
    const map = (await help.textContent())!
    expect(map).toContain('Shift+X  Shift+Y  Shift+Z')
    expect(map).toContain('Look along +x, +y or +z (view only; the cut stays)')
    expect(map).toContain('Turn the cut normal to x, y or z (the view stays)')
    expect(await help.locator('caption').allTextContents()).toEqual(['View', 'Cut', 'Colour and arrows', 'Model, units and output'])
    await page.screenshot({ path: `${OUT_DIR}/key-map.png` })
    await page.close()
  })
})
