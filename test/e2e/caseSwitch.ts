/**
 * The case switch timed in the browser: from choosing a case in the top bar to the frame after the
 * new surface's first draw (User Timing mark 'tractus:surface-drawn', as the large-model test
 * times the first picture), with the engine's own request-to-reply ('tractus:case') beside it.
 */
import type { Page } from 'playwright-core'

export interface SwitchTime {
  readonly to: string; readonly toPictureMs: number; readonly engineMs: number | null
  /** The engine's stages of the switch (the model card's data), ms. */
  readonly stagesMs: Record<string, number>
}

declare global {
  interface Window { __drawn?: number[] }
}

/** Records the frame after each first draw of a surface (the new picture), as performance.now() times. */
export const DRAWN_OBSERVER = (): void => {
  window.__drawn = []
  new PerformanceObserver((list) => {
    if (list.getEntriesByName('tractus:surface-drawn').length) requestAnimationFrame(() => window.__drawn!.push(performance.now()))
  }).observe({ type: 'mark' })
}

/** Chooses `name` in the top bar; the time to the frame after the new surface was drawn, and the engine's request-to-reply ('tractus:case'). */
export async function switchTimed(page: Page, name: string): Promise<SwitchTime> {
  await page.evaluate(() => performance.clearMeasures('tractus:case'))
  const t0 = await page.evaluate(() => performance.now())
  await page.selectOption('[data-testid="case-select"]', name)
  const drawn = await (await page.waitForFunction((t) => window.__drawn!.find((x) => x > t) ?? false, t0, { timeout: 300_000 })).jsonValue() as number
  const engine = await page.evaluate(() => performance.getEntriesByName('tractus:case').at(-1)?.duration ?? null)
  await page.waitForFunction(() => !document.querySelector('[data-testid="case-running"]'), undefined, { timeout: 120_000 })
  const stages = await page.evaluate(() => JSON.parse(document.querySelector('[data-testid="model-compute"]')?.getAttribute('data-stages') ?? '[]') as [string, number][])
  return { to: name, toPictureMs: Math.round(drawn - t0), engineMs: engine === null ? null : Math.round(engine), stagesMs: Object.fromEntries(stages) }
}

export function median(v: number[]): number {
  const x = [...v].sort((a, b) => a - b)
  return x.length % 2 ? x[(x.length - 1) / 2] : (x[x.length / 2 - 1] + x[x.length / 2]) / 2
}

