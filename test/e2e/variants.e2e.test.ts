/**
 * Every written form of one model, dropped in Chromium: the fixtures of test/fixtures/variants
 * (separators, decimal commas, D exponents, quotes, preambles, no header, units in headers, extra
 * columns, mapped names, type names and node orders of the user's own, ...) load to the model the
 * plain bundle gives. The first cut of each (across its longest extent, through its centre) is
 * read at full precision and must equal the plain bundle's: the numbers are written with the same
 * digits, so the same model gives the same figures to round-off. The command-line side of the same
 * check is test/io/csvVariants.test.ts.
 */
import { readFileSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { figure, newPage, useBrowserSession, waitForCut } from './browser.ts'

const s = useBrowserSession()
const ROOT = join(import.meta.dirname, '..', 'fixtures', 'variants')
const VARIANTS = readdirSync(ROOT).filter((d) => d !== 'plain').sort()
const KEYS = ['area', 'Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz', 'cx', 'cy', 'cz'] as const

function files(dir: string) {
  return readdirSync(join(ROOT, dir)).sort().map((name) => ({ name, mimeType: 'text/plain', buffer: readFileSync(join(ROOT, dir, name)) }))
}

/** Opens a page on the small demo, drops the variant's files, waits for "cantilever" and cuts. */
async function firstCut(dir: string): Promise<{ page: Page; values: Record<string, number> }> {
  const page = await newPage(s, '#model=demo:lifting-lug')
  await page.waitForFunction(() => (document.querySelector('[data-testid="model-name"]')?.textContent ?? '').includes('lug'), undefined, { timeout: 120_000 })
  await page.setInputFiles('[data-testid="file-input"]', files(dir))
  await page.waitForFunction(() => {
    const name = document.querySelector('[data-testid="model-name"]')?.textContent ?? ''
    return name === 'cantilever' && !document.querySelector('[data-testid="progress"]')
  }, undefined, { timeout: 120_000 })
  await page.keyboard.press('c')
  await waitForCut(page)
  await page.waitForTimeout(500)
  const values: Record<string, number> = {}
  for (const k of KEYS) values[k] = await figure(page, k)
  return { page, values }
}

describe('written forms of one model in the browser', () => {
  it('every variant loads to the plain bundle\'s model: its first cut is the same to round-off', async () => {
    const plain = await firstCut('plain')
    await plain.page.close()
    const scale = { force: Math.hypot(plain.values.Fx, plain.values.Fy, plain.values.Fz), moment: Math.hypot(plain.values.Mx, plain.values.My, plain.values.Mz) }
    expect(plain.values.area).toBeGreaterThan(0)
    for (const dir of VARIANTS) {
      const { page, values } = await firstCut(dir)
      for (const k of KEYS) {
        const ref = k.startsWith('F') ? scale.force : k.startsWith('M') ? scale.moment : Math.max(1, Math.abs(plain.values[k]))
        expect(Math.abs(values[k] - plain.values[k]), `${dir}: ${k} ${values[k]} vs plain ${plain.values[k]}`).toBeLessThanOrEqual(1e-12 * ref)
      }
      await page.close()
    }
  })
})
