/**
 * Browser helpers for the end-to-end tests: Debian's Chromium through playwright-core, software
 * WebGL, and a guard that records every request leaving 127.0.0.1 (the suite fails on any).
 */
import { afterAll, afterEach, beforeAll, expect } from 'vitest'
import { chromium } from 'playwright-core'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'

/** Port of the preview server: 4173, or E2E_PORT where several checkouts test at once. */
export const PORT = Number(process.env.E2E_PORT ?? 4173)
export const ORIGIN = `http://127.0.0.1:${PORT}`
export const OUT_DIR = resolve(import.meta.dirname, '../../test-output/e2e')
mkdirSync(OUT_DIR, { recursive: true })

export interface Session {
  browser: Browser
  context: BrowserContext
  /** Requests to anywhere but this origin (blob: and data: are local). */
  outside: string[]
  /** Uncaught page errors. */
  pageErrors: string[]
  close(): Promise<void>
}

export async function openBrowser(): Promise<Session> {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
  const context = await browser.newContext({ viewport: { width: 1280, height: 720 }, acceptDownloads: true })
  // One PNG decoder in every page, for the pixel helpers below: pixels of `rect` (default: all).
  await context.addInitScript(() => {
    (globalThis as unknown as { __tractusPng: unknown }).__tractusPng = async (b64: string, rect?: { x: number; y: number; w: number; h: number }) => {
      const bytes = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0))
      const bmp = await createImageBitmap(new Blob([bytes], { type: 'image/png' }))
      const c = new OffscreenCanvas(bmp.width, bmp.height)
      const g = c.getContext('2d')!
      g.drawImage(bmp, 0, 0)
      const r = rect ?? { x: 0, y: 0, w: bmp.width, h: bmp.height }
      return { data: g.getImageData(r.x, r.y, r.w, r.h).data, width: bmp.width, height: bmp.height, rect: r }
    }
  })
  const outside: string[] = []
  const pageErrors: string[] = []
  // Anything not from the preview server is recorded and refused.
  await context.route('**/*', (route) => {
    const url = route.request().url()
    if (url.startsWith(ORIGIN + '/') || url.startsWith('blob:') || url.startsWith('data:')) return route.continue()
    outside.push(url)
    return route.abort()
  })
  context.on('request', (req) => {
    const url = req.url()
    if (!(url.startsWith(ORIGIN + '/') || url.startsWith('blob:') || url.startsWith('data:'))) outside.push(url)
  })
  context.on('page', (p) => p.on('pageerror', (e) => pageErrors.push(String(e))))
  return { browser, context, outside, pageErrors, close: () => browser.close() }
}

/**
 * One browser for the test file, with the guards every browser test shares: after each test, no
 * request may have left 127.0.0.1 and no page may have thrown. The returned session is filled in
 * by beforeAll, so use it inside tests only.
 */
export function useBrowserSession(): Session {
  const s = {} as Session
  beforeAll(async () => { Object.assign(s, await openBrowser()) })
  afterAll(async () => { await s.close?.() })
  afterEach(() => {
    expect(s.outside, 'requests that left 127.0.0.1').toEqual([])
    expect(s.pageErrors, 'uncaught page errors').toEqual([])
  })
  return s
}

export async function newPage(s: Session, hash = ''): Promise<Page> {
  const page = await s.context.newPage()
  page.on('pageerror', (e) => s.pageErrors.push(String(e)))
  await page.goto(ORIGIN + '/' + hash)
  return page
}

/** Waits until a model is shown and no job runs. */
export async function waitForModel(page: Page, timeout = 120_000): Promise<void> {
  await page.waitForFunction(() => {
    const name = document.querySelector('[data-testid="model-name"]')?.textContent ?? ''
    return name !== '' && name !== 'No model loaded' && !document.querySelector('[data-testid="progress"]')
  }, undefined, { timeout })
}

/** Waits until the section card shows a result for the plane the store holds. */
export async function waitForCut(page: Page, timeout = 60_000): Promise<void> {
  await page.waitForSelector('[data-testid="cut-result"]', { timeout })
}

/** Reads the full-precision model-unit value of a figure row of the section card. */
export async function figure(page: Page, key: string): Promise<number> {
  const s = await page.getAttribute(`[data-testid="cut-result"] tr[data-row="${key}"] .num`, 'data-model')
  return Number(s)
}

type PngPixels = (b64: string, rect?: { x: number; y: number; w: number; h: number }) => Promise<{ data: Uint8ClampedArray; width: number; height: number; rect: { x: number; y: number; w: number; h: number } }>

/** Fraction of non-background pixels and the number of distinct colours in a PNG screenshot region. */
export async function pixelStats(page: Page, png: Buffer, rect?: { x: number; y: number; w: number; h: number }): Promise<{ nonBackground: number; distinct: number; width: number; height: number }> {
  return page.evaluate(async ({ b64, rect }) => {
    const { data: d, width, height } = await (globalThis as unknown as { __tractusPng: PngPixels }).__tractusPng(b64, rect)
    const bmp = { width, height }
    const bg = [d[0], d[1], d[2]]
    let non = 0
    const seen = new Set<number>()
    for (let i = 0; i < d.length; i += 4) {
      if (Math.abs(d[i] - bg[0]) + Math.abs(d[i + 1] - bg[1]) + Math.abs(d[i + 2] - bg[2]) > 24) non++
      seen.add((d[i] << 16) | (d[i + 1] << 8) | d[i + 2])
    }
    return { nonBackground: non / (d.length / 4), distinct: seen.size, width: bmp.width, height: bmp.height }
  }, { b64: png.toString('base64'), rect })
}

/** Reads pixels of a PNG at given points, [r, g, b] each. */
export async function pixelsAt(page: Page, png: Buffer, points: readonly (readonly [number, number])[]): Promise<{ size: [number, number]; rgb: [number, number, number][] }> {
  return page.evaluate(async ({ b64, points }) => {
    const bytes = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0))
    const bmp = await createImageBitmap(new Blob([bytes], { type: 'image/png' }))
    const c = new OffscreenCanvas(bmp.width, bmp.height)
    const g = c.getContext('2d')!
    g.drawImage(bmp, 0, 0)
    const rgb = points.map(([x, y]) => { const d = g.getImageData(x, y, 1, 1).data; return [d[0], d[1], d[2]] as [number, number, number] })
    return { size: [bmp.width, bmp.height] as [number, number], rgb }
  }, { b64: png.toString('base64'), points: points.map((p) => [p[0], p[1]]) })
}

/**
 * Pixels of a PNG within `tol` (per channel) of an sRGB hex colour, in `rect` (default: all):
 * their count and bounding box.
 */
export async function colourBox(page: Page, png: Buffer, hex: string, tol: number, rect?: { x: number; y: number; w: number; h: number }): Promise<{ n: number; x0: number; y0: number; x1: number; y1: number }> {
  return page.evaluate(async ({ b64, hex, tol, rect }) => {
    const { data: d, rect: r } = await (globalThis as unknown as { __tractusPng: PngPixels }).__tractusPng(b64, rect)
    const want = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16))
    let n = 0, x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity
    for (let y = 0; y < r.h; y++) for (let x = 0; x < r.w; x++) {
      const o = 4 * (y * r.w + x)
      if (Math.abs(d[o] - want[0]) <= tol && Math.abs(d[o + 1] - want[1]) <= tol && Math.abs(d[o + 2] - want[2]) <= tol) {
        n++; x0 = Math.min(x0, x + r.x); y0 = Math.min(y0, y + r.y); x1 = Math.max(x1, x + r.x); y1 = Math.max(y1, y + r.y)
      }
    }
    return { n, x0, y0, x1, y1 }
  }, { b64: png.toString('base64'), hex, tol, rect })
}
