/**
 * The case switch at 10^6 tet4 in Chromium. The generated cantilever (workers/syntheticModel.ts)
 * has one stress field, the case "default"; the link defines a combination of it,
 * "double" = 2 × default, so choosing it in the top bar runs the whole switch (the factored field,
 * the analysis on it with the boundary faces kept, the new surface drawn). Timed from the choice
 * to the frame after the new surface's first draw, both ways, recorded and printed
 * (test-output/e2e/cases-switch-large.json), never asserted. Asserted: the combination's section
 * force is twice the case's (superposition). TRACTUS_E2E_ELEMENTS sets another size;
 * TRACTUS_E2E_CPU=1 adds each switch's CPU time per thread from a Chrome trace (caseSwitch.ts),
 * the fairer figure on a shared machine; the median total is that of the page, the engine and the
 * pool.
 */
import { describe, expect, it } from 'vitest'
import { writeFileSync } from 'node:fs'
import { loadavg } from 'node:os'
import { figure, ORIGIN, OUT_DIR, useBrowserSession, waitForCut, waitForModel } from './browser.ts'
import { DRAWN_OBSERVER, median, startCpuTrace, switchTimed } from './caseSwitch.ts'
import type { SwitchCpu, SwitchTime } from './caseSwitch.ts'

const ELEMENTS = Number(process.env.TRACTUS_E2E_ELEMENTS ?? 1_000_000)
const CPU = process.env.TRACTUS_E2E_CPU === '1'
const s = useBrowserSession()

describe('case switch on a large model', () => {
  it(`switches between a case and a combination at ${ELEMENTS} tet4 and records the time to the new picture`, async () => {
    const page = await s.context.newPage()
    page.on('pageerror', (e) => s.pageErrors.push(String(e)))
    await page.addInitScript(DRAWN_OBSERVER)
    await page.goto(`${ORIGIN}/#model=block&elements=${ELEMENTS}&combo=double~default:2&cut=2,0,0.25,1,0,0,0`)
    await waitForModel(page, 300_000)
    await waitForCut(page, 120_000)
    await page.waitForSelector('[data-testid="case-select"]', { timeout: 60_000 })
    const single = await figure(page, 'shear1')
    const timed: SwitchTime[] = []
    const tracer = CPU ? await startCpuTrace(page) : null
    for (const name of ['double', 'default', 'double', 'default']) {
      timed.push(await switchTimed(page, name))
      await waitForCut(page, 120_000)
      await page.waitForTimeout(500)
    }
    const cpu: SwitchCpu[] = tracer ? await tracer.stop() : []
    const switches = timed.map((t, i) => (cpu[i] ? { ...t, cpuMs: cpu[i] } : t))
    await page.selectOption('[data-testid="case-select"]', 'double')
    await page.waitForFunction((v) => Math.abs(Number(document.querySelector('[data-testid="cut-result"] tr[data-row="shear1"] .num')?.getAttribute('data-model')) - 2 * v) < 1e-6 * Math.abs(v), single, { timeout: 300_000 })
    expect(await figure(page, 'shear1')).toBeCloseTo(2 * single, -1)
    // the picture after the last switch (the surface's colours on the kept geometry), to look at
    await page.waitForFunction(() => !document.querySelector('[data-testid="case-running"]'), undefined, { timeout: 120_000 })
    await page.screenshot({ path: `${OUT_DIR}/cases-switch-large.png` })
    // the app's own threads (the page, the engine, the pool); the browser's other threads carry the trace's own cost too
    const cpuTotal = cpu.map((c) => (c.main ?? 0) + (c.engine ?? 0) + (c.pool ?? 0))
    const record = {
      model: `generated tet4, ${ELEMENTS} elements`, how: 'combination "double" = 2 × default from the link', switches, medianMs: median(switches.map((x) => x.toPictureMs)),
      ...(cpu.length ? { medianCpuMs: median(cpuTotal), medianEngineCpuMs: median(cpu.map((c) => c.engine ?? 0)), medianMainCpuMs: median(cpu.map((c) => c.main ?? 0)) } : {}),
      loadAverage: loadavg(),
    }
    console.log('case switch at 10^6 tet4 (choice to new picture):', JSON.stringify(record))
    writeFileSync(`${OUT_DIR}/cases-switch-large.json`, JSON.stringify(record, null, 2))
    await page.close()
  })
})
