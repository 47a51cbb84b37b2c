/**
 * The intake step in Chromium: files with names and headers of the user's own open the column
 * mapping (first rows, pre-filled dropdowns), nothing loads until it is complete and the model on
 * screen stays meanwhile; the mapping saves as model.json and loads the same model; files that
 * state no units ask for them and load marked "units not declared"; element-nodal stress loads
 * and offers the stress jump as a colour quantity.
 */
import { readFileSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { elementType } from '../../src/model/elementTypes.ts'
import { newPage, useBrowserSession, OUT_DIR, waitForModel } from './browser.ts'
import { bundleTexts, cantileverModel } from './bundle.ts'

const s = useBrowserSession()

type Upload = { name: string; mimeType: string; buffer: Buffer }
const upload = (name: string, text: string): Upload => ({ name, mimeType: 'text/plain', buffer: Buffer.from(text, 'utf8') })

const dir = join(import.meta.dirname, '..', 'fixtures', 'variants', 'mapped-names')
/** The mapped-names fixture as a user first drops it: its model.json without "files" and "columns". */
function unmappedFiles(): Upload[] {
  return readdirSync(dir).sort().map((name) => {
    let text = readFileSync(join(dir, name), 'utf8')
    if (name === 'model.json') { const j = JSON.parse(text) as Record<string, unknown>; delete j.files; delete j.columns; text = JSON.stringify(j) }
    return upload(name, text)
  })
}

async function modelName(page: Page): Promise<string> {
  return (await page.textContent('[data-testid="model-name"]')) ?? ''
}

/** A two-part bar with element-nodal stress (σyy jumps at the joint) and declared units. */
function elementNodalBar(): Upload[] {
  const mesh = boxMesh({ nx: 8, ny: 2, nz: 2, lx: 4, ly: 1, lz: 1 }, 'hex8')
  const b = mesh.blocks[0], nn = elementType('hex8').nodeCount
  const nodes = ['id,x,y,z', ...Array.from({ length: mesh.nodeCount }, (_, n) => [n + 1, mesh.coords[3 * n], mesh.coords[3 * n + 1], mesh.coords[3 * n + 2]].join(','))]
  const elements = ['id,type,part,' + Array.from({ length: nn }, (_, a) => `n${a + 1}`).join(',')]
  const stress = ['element,node,sxx,syy,szz,sxy,syz,sxz']
  for (let e = 0; e < b.ids.length; e++) {
    const part = mesh.coords[3 * b.conn[e * nn + 6]] <= 2 ? 1 : 2
    elements.push([e + 1, 'hex8', part, ...Array.from(b.conn.subarray(e * nn, (e + 1) * nn), (n) => n + 1)].join(','))
    for (let a = 0; a < nn; a++) {
      // σxx uniform; σyy differs per part and, in element 3, from its neighbours (a coarse spot).
      const syy = (part === 1 ? 20 : 60) + (e === 2 ? 30 : 0)
      stress.push([e + 1, b.conn[e * nn + a] + 1, 100, syy, 0, 0, 0, 0].join(','))
    }
  }
  return [
    upload('nodes.csv', nodes.join('\n') + '\n'), upload('elements.csv', elements.join('\n') + '\n'), upload('stress.csv', stress.join('\n') + '\n'),
    upload('model.json', JSON.stringify({ name: 'two-material bar', units: { length: 'mm', stress: 'MPa' }, parts: { 1: 'steel', 2: 'aluminium' } })),
  ]
}

describe('intake step', () => {
  it('maps the columns of files of the user\'s own; nothing loads until complete; saves model.json; loads', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    const before = await modelName(page)
    await page.setInputFiles('[data-testid="file-input"]', unmappedFiles())
    const step = page.locator('[data-testid="intake-step"]')
    await step.waitFor()
    expect(await page.textContent('[data-testid="intake-why"]')).toContain('missing nodes.csv')
    // The model on screen stays while the step is open.
    expect(await modelName(page)).toBe(before)
    // Roles and columns pre-filled from the names.
    const files = ['conn.txt', 'mesh_nodes.txt', 'nodal_disp.txt', 'nodal_stress.txt']
    for (const [i, role] of ['elements', 'nodes', 'displacement', 'stress'].entries()) {
      expect(await page.textContent(`[data-testid="intake-file-${i}"] .file-name`)).toBe(files[i])
      expect(await page.inputValue(`[data-testid="intake-role-${i}"]`)).toBe(role)
    }
    expect(await page.inputValue('[data-testid="intake-col-elements-id"]')).toBe('0')
    expect(await page.inputValue('[data-testid="intake-col-stress-sxx"]')).toBe('1')
    // First rows are shown.
    expect(await page.locator('[data-testid="intake-file-1"] tbody tr').count()).toBe(5)
    await page.screenshot({ path: `${OUT_DIR}/intake-mapping.png`, fullPage: true })
    // Unmapping a field makes the mapping incomplete: Load is disabled and says what is missing.
    await page.selectOption('[data-testid="intake-col-stress-sxx"]', '-1')
    expect(await page.isDisabled('[data-testid="intake-load"]')).toBe(true)
    expect(await page.textContent('[data-testid="intake-problems"]')).toContain('nodal_stress.txt: choose the column of σxx.')
    await page.screenshot({ path: `${OUT_DIR}/intake-mapping-incomplete.png` })
    await page.selectOption('[data-testid="intake-col-stress-sxx"]', '1')
    // Save as model.json: the files and columns for next time.
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="intake-save"]')])
    expect(download.suggestedFilename()).toBe('model.json')
    const saved = JSON.parse(readFileSync(await download.path(), 'utf8')) as { files: Record<string, string>; columns: Record<string, Record<string, unknown>>; units: unknown }
    expect(saved.files).toEqual({ elements: 'conn.txt', nodes: 'mesh_nodes.txt', displacement: 'nodal_disp.txt', stress: 'nodal_stress.txt' })
    expect(saved.columns.stress.sxx).toBe('S_XX')
    expect(saved.units).toEqual({ length: 'mm', stress: 'MPa' })
    await page.click('[data-testid="intake-load"]')
    await page.waitForFunction(() => document.querySelector('[data-testid="model-name"]')?.textContent === 'cantilever')
    await waitForModel(page)
    expect(await step.count()).toBe(0)
    expect(await page.locator('[data-testid="units-undeclared"]').count()).toBe(0)
    await page.close()
  })

  it('cancel keeps the previous model', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    const before = await modelName(page)
    await page.setInputFiles('[data-testid="file-input"]', unmappedFiles())
    await page.locator('[data-testid="intake-step"]').waitFor()
    await page.click('[data-testid="intake-cancel"]')
    expect(await page.locator('[data-testid="intake-step"]').count()).toBe(0)
    expect(await modelName(page)).toBe(before)
    await page.close()
  })

  it('asks the units the files do not state; the model loads marked "units not declared"', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    const files = bundleTexts(cantileverModel('no units stated')).filter((f) => f.name !== 'model.json').map((f) => upload(f.name, f.text))
    await page.setInputFiles('[data-testid="file-input"]', files)
    await page.locator('[data-testid="intake-step"]').waitFor()
    expect(await page.textContent('#intake-title')).toBe('Units of these files')
    expect(await page.isDisabled('[data-testid="intake-load"]')).toBe(true)
    expect(await page.textContent('[data-testid="intake-problems"]')).toContain('Choose the length unit (the files do not state it).')
    await page.selectOption('[data-testid="intake-length"]', 'mm')
    await page.selectOption('[data-testid="intake-stress"]', 'MPa')
    await page.screenshot({ path: `${OUT_DIR}/intake-units.png` })
    await page.click('[data-testid="intake-load"]')
    await page.waitForFunction(() => document.querySelector('[data-testid="model-name"]')?.textContent === 'model')
    await waitForModel(page)
    expect(await page.textContent('.counts')).toContain('model units mm, MPa')
    expect(await page.textContent('[data-testid="units-undeclared"]')).toBe('units not declared')
    expect(await page.textContent('[data-testid="model-warnings"]')).toContain('as chosen when the files were opened, not stated in them')
    await page.waitForTimeout(500)
    await page.screenshot({ path: `${OUT_DIR}/intake-units-loaded.png` })
    await page.close()
  })

  it('element-nodal stress loads at once and offers the stress jump', async () => {
    const page = await newPage(s)
    await waitForModel(page)
    await page.setInputFiles('[data-testid="file-input"]', elementNodalBar())
    await page.waitForFunction(() => document.querySelector('[data-testid="model-name"]')?.textContent === 'two-material bar')
    await waitForModel(page)
    const options = await page.$$eval('[data-testid="quantity"] option', (o) => o.map((x) => (x as HTMLOptionElement).value))
    expect(options).toContain('stressJump')
    await page.selectOption('[data-testid="quantity"]', 'stressJump')
    await page.waitForTimeout(1000)
    await page.screenshot({ path: `${OUT_DIR}/intake-stress-jump.png` })
    await page.close()
  })
})
