/**
 * The browser at 10^7 elements (`npm run e2e:large`; not part of `npm test` or `npm run e2e`:
 * it needs several minutes and about 3 GB beside the browser, more than CI's time with the rest).
 * Two runs of the measurement in largeRun.ts:
 * - a `.tractus` container of a 10^7-element tet4 block (test/bench/syntheticModel.ts, the bench's
 *   10 110 954-element block, written by src/io's container writer, 334 MB), opened through the
 *   file input as a user would;
 * - the CSV bundle of the same block (nodes.csv, elements.csv of about 455 MB, stress.csv and
 *   model.json), opened through the file input: each file read in slices into one buffer and
 *   parsed from its bytes, the large tables in pieces on the pool;
 * - a CSV bundle of a tet10 block of 1.6 × 10^6 elements whose stress.csv holds element-nodal
 *   stress, 1.6 × 10^7 rows, just under the CSV limit of 2 GiB (the largest file the browser reads);
 * - the app's generated block of 10^7 elements (#model=block&elements=10000000).
 * Figures go to test-output/e2e/large-10m-file.json and large-10m-block.json and are printed:
 * first picture (goal ≤ 8 s on two cores), the first section cut's round trip and the drag's
 * (goal ≤ 300 ms), main-thread tasks while dragging (goal none over 200 ms), at the first picture
 * and when the section is switched on (goal none over 400 ms). Asserted: what is functional (the
 * whole model loads, the section follows the drag); the time goals are reported, as at 10^6
 * (large.e2e.test.ts says why). TRACTUS_E2E_ELEMENTS sets another size.
 */
import { describe, expect, it } from 'vitest'
import { closeSync, existsSync, mkdirSync, openSync, statSync, writeFileSync, writeSync } from 'node:fs'
import { resolve } from 'node:path'
import { OUT_DIR, useBrowserSession } from './browser.ts'
import { runLarge } from './largeRun.ts'
import type { LargeFigures } from './largeRun.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'
import { writeCsvBundle, writeNative } from '../../src/io/index.ts'
import { csvNumber as num } from '../../src/io/writeCsvBundle.ts'
import { MAX_CSV_BYTES } from '../../src/io/sizeGuard.ts'
import type { Model } from '../../src/model/model.ts'

const ELEMENTS = Number(process.env.TRACTUS_E2E_ELEMENTS ?? 1e7)
/** tet10 elements whose element-nodal stress.csv is just under 2 GiB (about 124 bytes a row here). */
const NODAL_2G_ELEMENTS = 1.6e6

/**
 * The element-nodal stress of `model` (each element-node's row a copy of its node's), written as
 * writeCsvBundle writes it (element,node,sxx,...), 8 MB at a time: the whole text would not fit
 * in a string.
 */
function writeElementNodalStress(path: string, model: Model): void {
  const fd = openSync(path, 'w')
  try {
    const { mesh } = model, v = model.stress
    let text = 'element,node,sxx,syy,szz,sxy,syz,sxz\n'
    for (const b of mesh.blocks) {
      const nn = b.conn.length / b.ids.length
      for (let i = 0; i < b.conn.length; i++) {
        const n = b.conn[i]
        text += `${b.ids[(i / nn) | 0]},${mesh.nodeIds[n]},${num(v[6 * n])},${num(v[6 * n + 1])},${num(v[6 * n + 2])},${num(v[6 * n + 3])},${num(v[6 * n + 4])},${num(v[6 * n + 5])}\n`
        if (text.length > 8e6) { writeSync(fd, text); text = '' }
      }
    }
    writeSync(fd, text)
  } finally {
    closeSync(fd)
  }
}
const s = useBrowserSession()

/** The goals of issue 17, compared and printed (never asserted). */
function report(name: string, f: LargeFigures): void {
  const worst = (v: number[]): number => Math.max(0, ...v)
  const lines = [
    `first picture ${f.firstPictureMs} ms (goal ≤ 8000)`,
    `section cut round trip: first ${f.sectionOn.firstCutRoundTripMs} ms, drag median ${f.drag.cutRoundTripMs.median} ms, max ${f.drag.cutRoundTripMs.max} ms, after release ${f.afterRelease.cutRoundTripMs} ms (goal ≤ 300)`,
    `peak browser memory during the load ${f.load.peakBrowserRssMb} MB; engine stages ${JSON.stringify(f.load.engineStagesMs)}`,
    `longest main-thread task: drag ${f.drag.longTasks.maxMs} ms (goal ≤ 200), load ${f.load.longTasks.maxMs} ms, section on ${worst(f.sectionOn.longTaskDurationsMs)} ms (goal ≤ 400)`,
  ]
  console.log(`${name}:\n  ` + lines.join('\n  '))
}

describe('10^7 elements in the browser', () => {
  it('opens a .tractus file of a 10^7-element tet4 block and drags the section', async () => {
    const dir = resolve(OUT_DIR, 'files')
    mkdirSync(dir, { recursive: true })
    const file = resolve(dir, `block-${ELEMENTS}.tractus`)
    // Written once and kept (test-output/ is not committed): the container of the bench's block.
    if (!existsSync(file) || statSync(file).size === 0) writeFileSync(file, writeNative(syntheticModel('tet4', ELEMENTS, 1)))
    const f = await runLarge(s, { name: 'large-10m-file', elements: Math.round(0.99 * ELEMENTS), files: [file], loadTimeoutMs: 900_000 })
    report('10^7 .tractus file', f)
    expect(f.source).toBe('file')
  })

  it('opens the CSV bundle of the same 10^7-element block and drags the section', async () => {
    const dir = resolve(OUT_DIR, 'files', `bundle-${ELEMENTS}`)
    mkdirSync(dir, { recursive: true })
    // Written once and kept, as the container: nodes.csv, elements.csv, stress.csv and model.json.
    const names = ['nodes.csv', 'elements.csv', 'stress.csv', 'model.json']
    if (!names.every((n) => existsSync(resolve(dir, n)) && statSync(resolve(dir, n)).size > 0)) {
      for (const f of writeCsvBundle(syntheticModel('tet4', ELEMENTS, 1))) writeFileSync(resolve(dir, f.name), f.text)
    }
    const files = names.map((n) => resolve(dir, n))
    console.log('bundle: ' + files.map((p, i) => `${names[i]} ${statSync(p).size} bytes`).join(', '))
    const f = await runLarge(s, { name: 'large-10m-csv', elements: Math.round(0.99 * ELEMENTS), files, loadTimeoutMs: 900_000 })
    report('10^7 CSV bundle', f)
    expect(f.source).toBe('file')
  })

  it('opens a CSV bundle whose element-nodal stress.csv is nearly 2 GiB and drags the section', async () => {
    const dir = resolve(OUT_DIR, 'files', 'element-nodal-2g')
    mkdirSync(dir, { recursive: true })
    const names = ['nodes.csv', 'elements.csv', 'stress.csv', 'model.json']
    const model = syntheticModel('tet10', NODAL_2G_ELEMENTS, 1)
    if (!names.every((n) => existsSync(resolve(dir, n)) && statSync(resolve(dir, n)).size > 0)) {
      for (const f of writeCsvBundle(model)) if (f.name !== 'stress.csv') writeFileSync(resolve(dir, f.name), f.text)
      writeElementNodalStress(resolve(dir, 'stress.csv'), model)
    }
    const files = names.map((n) => resolve(dir, n))
    const size = statSync(files[2]).size
    console.log('bundle: ' + files.map((p, i) => `${names[i]} ${statSync(p).size} bytes`).join(', '))
    expect(size).toBeGreaterThan(1.5 * 2 ** 30)
    expect(size).toBeLessThanOrEqual(MAX_CSV_BYTES)
    const f = await runLarge(s, { name: 'large-csv-2g', elements: model.mesh.elementCount, files, loadTimeoutMs: 900_000 })
    report('CSV bundle with a stress.csv of nearly 2 GiB', f)
    expect(f.source).toBe('file')
  })

  it('generates a block of 10^7 elements and drags the section', async () => {
    const f = await runLarge(s, { name: 'large-10m-block', elements: ELEMENTS, loadTimeoutMs: 900_000 })
    report('10^7 generated block', f)
    // The generated cantilever's two end patches each carry its end shear P = 200 kN within 1 %.
    expect(f.patchForces).toHaveLength(2)
    for (const p of f.patchForces) expect(Math.abs(p - 2e5) / 2e5).toBeLessThan(0.01)
  })
})
