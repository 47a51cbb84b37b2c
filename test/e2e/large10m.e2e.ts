/**
 * The browser at 10^7 elements (`npm run e2e:large`; not part of `npm test` or `npm run e2e`:
 * it needs several minutes and about 3 GB beside the browser, more than CI's time with the rest).
 * Two runs of the measurement in largeRun.ts:
 * - a `.tractus` container of a 10^7-element tet4 block (test/bench/syntheticModel.ts, the bench's
 *   10 110 954-element block, written by src/io's container writer, 334 MB), opened through the
 *   file input as a user would;
 * - the app's generated block of 10^7 elements (#model=block&elements=10000000).
 * Figures go to test-output/e2e/large-10m-file.json and large-10m-block.json and are printed:
 * first picture (goal ≤ 8 s on two cores), the first section cut's round trip and the drag's
 * (goal ≤ 300 ms), main-thread tasks while dragging (goal none over 200 ms), at the first picture
 * and when the section is switched on (goal none over 400 ms). Asserted: what is functional (the
 * whole model loads, the section follows the drag); the time goals are reported, as at 10^6
 * (large.e2e.test.ts says why). TRACTUS_E2E_ELEMENTS sets another size.
 */
import { describe, expect, it } from 'vitest'
import { existsSync, mkdirSync, statSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { OUT_DIR, useBrowserSession } from './browser.ts'
import { runLarge } from './largeRun.ts'
import type { LargeFigures } from './largeRun.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'
import { writeNative } from '../../src/io/index.ts'

const ELEMENTS = Number(process.env.TRACTUS_E2E_ELEMENTS ?? 1e7)
const s = useBrowserSession()

/** The goals of issue 17, compared and printed (never asserted). */
function report(name: string, f: LargeFigures): void {
  const worst = (v: number[]): number => Math.max(0, ...v)
  const lines = [
    `first picture ${f.firstPictureMs} ms (goal ≤ 8000)`,
    `section cut round trip: first ${f.sectionOn.firstCutRoundTripMs} ms, drag median ${f.drag.cutRoundTripMs.median} ms, max ${f.drag.cutRoundTripMs.max} ms, after release ${f.afterRelease.cutRoundTripMs} ms (goal ≤ 300)`,
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
    const f = await runLarge(s, { name: 'large-10m-file', elements: Math.round(0.99 * ELEMENTS), file, loadTimeoutMs: 900_000 })
    report('10^7 .tractus file', f)
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
