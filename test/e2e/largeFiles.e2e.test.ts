/**
 * Files of a large model in the browser: the main thread hands the user's files to the engine
 * worker as they are (handles), and the worker reads them in slices (workers/inputFiles.ts).
 * - A container and the CSV bundle of the same model, each spanning several slices, open to the
 *   same model: the same counts, the same patch forces and the same section resultant.
 * - A CSV file over 512 MiB (the longest string, once its limit) opens: its rows are parsed from
 *   its bytes, and an error in its last row, after 520 MiB of comment lines, names that row's line.
 * - A file over its limit is refused at once, by a card naming the file, its size and the limit,
 *   and saying what to do. The files are sparse: nothing is written or read.
 */
import { describe, expect, it } from 'vitest'
import { mkdirSync, openSync, closeSync, ftruncateSync, rmSync, writeFileSync, writeSync } from 'node:fs'
import { resolve } from 'node:path'
import { useBrowserSession, OUT_DIR, figure, newPage, waitForCut, waitForModel } from './browser.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'
import { writeCsvBundle, writeNative } from '../../src/io/index.ts'
import { MAX_CONTAINER_BYTES, MAX_CSV_BYTES, MAX_TEXT_BYTES } from '../../src/io/sizeGuard.ts'

const s = useBrowserSession()
const DIR = resolve(OUT_DIR, 'files')
mkdirSync(DIR, { recursive: true })

/** A sparse file of `size` bytes (no disk used, and the app must not read it). */
function sparse(name: string, size: number): string {
  const path = resolve(DIR, name)
  const fd = openSync(path, 'w')
  ftruncateSync(fd, size)
  closeSync(fd)
  return path
}

/**
 * `text` written to `path` with `mib` MiB of comment lines (1 KiB each) before its last row;
 * returns the path and the line number of that row.
 */
function padded(path: string, text: string, mib: number): { path: string; lastLine: number } {
  const body = text.endsWith('\n') ? text.slice(0, -1) : text
  const cut = body.lastIndexOf('\n') + 1
  const line = '#' + ' padding'.repeat(127) + '\n'
  const block = Buffer.from(line.repeat(1024))
  const fd = openSync(path, 'w')
  try {
    writeSync(fd, body.slice(0, cut))
    for (let k = 0; k < mib; k++) writeSync(fd, block)
    writeSync(fd, body.slice(cut) + '\n')
  } finally {
    closeSync(fd)
  }
  return { path, lastLine: body.slice(0, cut).split('\n').length + 1024 * mib }
}

async function openAndCut(files: string[]): Promise<{ counts: string; patches: number[]; axial: number }> {
  const page = await newPage(s)
  // the demo's load first, so that the model waited for below is the file's and not the demo's
  await waitForModel(page)
  const demo = await page.textContent('[data-testid="model-name"]')
  await page.setInputFiles('[data-testid="file-input"]', files)
  await page.waitForFunction((demo) => {
    const name = document.querySelector('[data-testid="model-name"]')?.textContent ?? ''
    return name !== demo && name !== 'No model loaded' && !document.querySelector('[data-testid="progress"]')
  }, demo, { timeout: 120_000 })
  await page.keyboard.press('c')
  await waitForCut(page)
  const counts = (await page.textContent('.counts'))!
  const patches = await page.$$eval('[data-testid="patch-list"] tbody tr td[data-col="force"] .num', (e) => e.map((x) => Number(x.getAttribute('data-model'))))
  const axial = await figure(page, 'axial')
  await page.close()
  return { counts, patches, axial }
}

describe('large files', () => {
  it('a container and a CSV bundle, read in slices, open to the same model', async () => {
    // About 3 × 10^5 tet4: the container is 12 MB and elements.csv 10 MB, so several 16 MiB slices in all.
    const model = syntheticModel('tet4', 3e5, 1)
    const bytes = writeNative(model)
    const container = resolve(DIR, 'block.tractus')
    writeFileSync(container, bytes)
    const bundle = writeCsvBundle(model).map((f) => { const p = resolve(DIR, f.name); writeFileSync(p, f.text); return p })
    const a = await openAndCut([container])
    const b = await openAndCut(bundle)
    expect(a.counts).toMatch(/elements/)
    expect(b).toEqual(a)
    expect(a.patches.length).toBeGreaterThan(0)
  })

  it('a container over 2 GiB is refused by a card naming it, its size and the limit, and sending it to the command line', async () => {
    const page = await newPage(s)
    // the demo's load first: its end would clear a card shown before it
    await waitForModel(page)
    const size = MAX_CONTAINER_BYTES + 4096
    await page.setInputFiles('[data-testid="file-input"]', [sparse('huge.tractus', size)])
    await page.waitForSelector('[data-testid="error-card"]')
    const card = (await page.textContent('[data-testid="error-card"]'))!
    expect(card).toContain(`huge.tractus: the file is 2.00 GiB (${size} bytes), more than the limit of 2.00 GiB (${MAX_CONTAINER_BYTES} bytes)`)
    expect(card).toContain('npx tractus audit huge.tractus')
    await page.screenshot({ path: `${OUT_DIR}/large-files-refused.png` })
    await page.close()
  })

  it('a CSV file over 512 MiB opens from its bytes, and an error in its last row names that line', async () => {
    const model = syntheticModel('tet4', 2000, 1)
    const files = writeCsvBundle(model)
    const dir = resolve(DIR, 'padded')
    mkdirSync(dir, { recursive: true })
    const others = files.filter((f) => f.name !== 'nodes.csv').map((f) => { const p = resolve(dir, f.name); writeFileSync(p, f.text); return p })
    const nodes = files.find((f) => f.name === 'nodes.csv')!.text
    const big = padded(resolve(dir, 'nodes.csv'), nodes, 520)
    try {
      const page = await newPage(s)
      await waitForModel(page)
      const demo = await page.textContent('[data-testid="model-name"]')
      await page.setInputFiles('[data-testid="file-input"]', [big.path, ...others])
      await page.waitForFunction((demo) => {
        const name = document.querySelector('[data-testid="model-name"]')?.textContent ?? ''
        return name !== demo && !document.querySelector('[data-testid="progress"]')
      }, demo, { timeout: 75_000 })
      expect(await page.$('[data-testid="error-card"]')).toBeNull()
      expect(await page.textContent('.counts')).toContain(`${model.mesh.elementCount.toLocaleString('en-US')} elements`)
      await page.close()

      // The last node row's x spoiled: the card names its line, past the padding.
      const rows = nodes.trimEnd().split('\n')
      rows[rows.length - 1] = rows[rows.length - 1].replace(/^(\d+),[^,]*/, '$1,1.2.3')
      const bad = padded(resolve(dir, 'nodes.csv'), rows.join('\n') + '\n', 520)
      const page2 = await newPage(s)
      await waitForModel(page2)
      await page2.setInputFiles('[data-testid="file-input"]', [bad.path, ...others])
      await page2.waitForSelector('[data-testid="error-card"]', { timeout: 75_000 })
      const card = (await page2.textContent('[data-testid="error-card"]'))!
      expect(card).toContain(`nodes.csv, line ${bad.lastLine}`)
      await page2.close()
    } finally {
      rmSync(big.path, { force: true })
    }
  })

  it('a CSV file over 2 GiB is refused before the intake step, with what to do instead', async () => {
    const page = await newPage(s)
    // the demo's load first: its end would clear a card shown before it
    await waitForModel(page)
    const size = MAX_CSV_BYTES + 1
    const small = writeCsvBundle(syntheticModel('tet4', 100, 1)).filter((f) => f.name !== 'elements.csv').map((f) => { const p = resolve(DIR, 'small-' + f.name); writeFileSync(p, f.text); return p })
    await page.setInputFiles('[data-testid="file-input"]', [...small, sparse('elements.csv', size)])
    await page.waitForSelector('[data-testid="error-card"]')
    const card = (await page.textContent('[data-testid="error-card"]'))!
    expect(card).toContain(`elements.csv: the file is 2.00 GiB (${size} bytes), more than the limit of 2.00 GiB (${MAX_CSV_BYTES} bytes)`)
    expect(card).toContain('stress.NAME.csv')
    expect(MAX_CSV_BYTES).toBeGreaterThan(MAX_TEXT_BYTES)
    expect(await page.$('[data-testid="intake-step"]')).toBeNull()
    await page.screenshot({ path: `${OUT_DIR}/large-files-csv-refused.png` })
    await page.close()
  })
})
