/**
 * The engine's worker pool in the real browser: the element balance of a generated model computed
 * by the engine alone (threads=1), by pool workers with copies (sharing=copy) and by pool workers
 * reading shared memory (the preview server sends the cross-origin isolation headers) must show
 * the same figures to the last digit. Reference: the single-threaded run, which the unit tests tie
 * to the kernel (test/unit/workers/kernelPool.test.ts).
 */
import { describe, expect, it } from 'vitest'
import { newPage, useBrowserSession, waitForModel } from './browser.ts'

const s = useBrowserSession()

interface Run { figures: string[]; workers: number; sharing: string | null; isolated: boolean; cores: number }

async function run(extra: string): Promise<Run> {
  const page = await newPage(s, `#model=block&elements=120000${extra}`)
  await waitForModel(page, 120_000)
  const out = await page.evaluate(() => {
    const el = document.querySelector('[data-testid="model-compute"]')
    return {
      figures: [...document.querySelectorAll('[data-testid="element-balance"] .num, [data-testid="body-balance"] .num')].map((n) => n.getAttribute('data-model') ?? ''),
      workers: Number(el?.getAttribute('data-workers')),
      sharing: el?.getAttribute('data-sharing') ?? null,
      isolated: self.crossOriginIsolated,
      cores: navigator.hardwareConcurrency,
    }
  })
  await page.close()
  return out
}

describe('worker pool', () => {
  it('one thread, copies and shared memory give the same element balance', async () => {
    const one = await run('&threads=1')
    const copy = await run('&threads=2&sharing=copy')
    const shared = await run('&threads=3')
    console.log('pool runs ' + JSON.stringify({ one: { workers: one.workers, sharing: one.sharing }, copy: { workers: copy.workers, sharing: copy.sharing }, shared: { workers: shared.workers, sharing: shared.sharing }, cores: one.cores }))
    expect(one.isolated, 'the page is cross-origin isolated').toBe(true)
    expect(one).toMatchObject({ workers: 0, sharing: 'none' })
    expect(copy).toMatchObject({ workers: 1, sharing: 'copy' })
    expect(shared).toMatchObject({ workers: 2, sharing: 'shared' })
    expect(one.figures.length).toBeGreaterThanOrEqual(3)
    expect(one.figures.every((f) => f !== '')).toBe(true)
    expect(copy.figures).toEqual(one.figures)
    expect(shared.figures).toEqual(one.figures)
  })
})
