/**
 * One run of the large-model browser measurement, shared by the 10^6 test in CI
 * (large.e2e.test.ts) and the 10^7 script (large10m.e2e.ts, `npm run e2e:large`). Recorded:
 * - time to first picture: from the load's start (progress shown) to the first frame after the
 *   surface was drawn (User Timing mark 'tractus:surface-drawn', then one animation frame);
 * - the engine's time per load stage and how the worker pool ran (the model card's data);
 * - section-drag update time: request-to-reply of every cut (User Timing 'tractus:cut', with the
 *   engine's own compute time) and the intervals between results shown while dragging;
 * - the main thread's long tasks (PerformanceObserver 'longtask') in each phase; with
 *   TRACTUS_E2E_TRACE=1 also what each task over 100 ms is made of (largeTrace.ts).
 * Asserted here: the model loads whole, the section follows the drag. The caller asserts what
 * else it wants from the figures.
 */
import { expect } from 'vitest'
import { readFileSync, readdirSync, writeFileSync } from 'node:fs'
import { colourBox, OUT_DIR, ORIGIN, waitForCut, waitForModel } from './browser.ts'
import type { Session } from './browser.ts'
import { HANDLE } from '../../src/scene/sceneLook.ts'
import { startTrace } from './largeTrace.ts'
import type { TaskParts } from './largeTrace.ts'

interface Task { start: number; duration: number }

declare global {
  interface Window { __longTasks?: Task[]; __cutChanges?: number[]; __firstPicture?: number }
}

const median = (v: number[]): number => {
  if (v.length === 0) return NaN
  const s = [...v].sort((a, b) => a - b)
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2
}
const round = (v: number): number => Math.round(v * 10) / 10

function summary(tasks: Task[]): { count: number; maxMs: number; totalMs: number } {
  return {
    count: tasks.length,
    maxMs: Math.round(Math.max(0, ...tasks.map((t) => t.duration))),
    totalMs: Math.round(tasks.reduce((a, t) => a + t.duration, 0)),
  }
}

export interface LargeRunOptions {
  /** Name of the figures file (test-output/e2e/<name>.json) and screenshots. */
  readonly name: string
  /** Elements asked for (the generated block) or expected at least (a file). */
  readonly elements: number
  /** Model files to open through the file input (a container, or a CSV bundle's files); absent: the generated block of `elements`. */
  readonly files?: readonly string[]
  /** Longest wait for the load (ms). */
  readonly loadTimeoutMs: number
}

/**
 * The browser's resident memory while a model loads: the sum of VmRSS over the Chromium processes
 * (renderer, its workers and the GPU process), sampled every 100 ms from /proc (Linux); stop()
 * gives the peak in MB, or null where /proc is not there.
 */
function browserMemory(): { stop(): number | null } {
  const sample = (): number | null => {
    try {
      let kb = 0
      for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
        let status = ''
        try { status = readFileSync(`/proc/${pid}/status`, 'utf8') } catch { continue }
        if (!/^Name:\s*(chrom|headless)/m.test(status)) continue
        kb += Number(/^VmRSS:\s*(\d+)/m.exec(status)?.[1] ?? 0)
      }
      return kb / 1024
    } catch {
      return null
    }
  }
  let peak = sample()
  const timer = setInterval(() => { const v = sample(); if (v !== null && peak !== null) peak = Math.max(peak, v) }, 100)
  return { stop: () => { clearInterval(timer); return peak === null ? null : Math.round(peak) } }
}

export type LargeFigures = Awaited<ReturnType<typeof runLarge>>

export async function runLarge(s: Session, o: LargeRunOptions) {
  const page = await s.context.newPage()
  page.on('pageerror', (e) => s.pageErrors.push(String(e)))
  await page.addInitScript(() => {
    window.__longTasks = []
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) window.__longTasks!.push({ start: e.startTime, duration: e.duration })
    }).observe({ type: 'longtask', buffered: true })
    // The frame after the surface's first draw is the first picture.
    new PerformanceObserver((list) => {
      if (window.__firstPicture === undefined && list.getEntriesByName('tractus:surface-drawn').length) {
        requestAnimationFrame(() => { window.__firstPicture ??= performance.now() })
      }
    }).observe({ type: 'mark' })
  })
  const tracer = process.env.TRACTUS_E2E_TRACE ? await startTrace(page) : null
  const t0 = Date.now()
  const memory = browserMemory()
  if (o.files) {
    // The start page's own model first, then the file, as a user opens one.
    await page.goto(`${ORIGIN}/`)
    await waitForModel(page, 120_000)
    await page.waitForFunction(() => window.__firstPicture !== undefined, undefined, { timeout: 120_000 })
    await page.waitForTimeout(1000)
    await page.evaluate(() => { window.__firstPicture = undefined })
    await page.setInputFiles('[data-testid="file-input"]', [...o.files])
  } else {
    await page.goto(`${ORIGIN}/#model=block&elements=${o.elements}`)
  }
  // Page start-up (script parse, first WebGL context) is not the model load: mark the start.
  await page.waitForSelector('[data-testid="progress"]', { timeout: 60_000 })
  const loadStart = await page.evaluate(() => performance.now())
  await waitForModel(page, o.loadTimeoutMs)
  await page.waitForFunction(() => window.__firstPicture !== undefined, undefined, { timeout: 120_000 })
  const loadEnd = await page.evaluate(() => window.__firstPicture!)
  const loadWallMs = Date.now() - t0
  const loadPeakRssMb = memory.stop()
  // What follows the first picture (arrows, the pool's end) belongs to the load too.
  await page.waitForTimeout(1500)
  const settledLoad = await page.evaluate(() => performance.now())
  const compute = await page.evaluate(() => {
    const el = document.querySelector('[data-testid="model-compute"]')
    return { stagesMs: JSON.parse(el?.getAttribute('data-stages') ?? '[]') as [string, number][], workers: Number(el?.getAttribute('data-workers')), sharing: el?.getAttribute('data-sharing'), line: el?.textContent }
  })
  const counts = (await page.textContent('.counts'))!
  const elements = Number(counts.split(' elements')[0].replace(/,/g, ''))
  expect(elements).toBeGreaterThanOrEqual(o.elements)
  const cores = await page.evaluate(() => navigator.hardwareConcurrency)
  const patchForces = await page.$$eval('[data-testid="patch-list"] tbody tr td[data-col="force"] .num', (e) => e.map((x) => Number(x.getAttribute('data-model'))))
  await page.screenshot({ path: `${OUT_DIR}/${o.name}-loaded.png` })

  const sectionOnStart = await page.evaluate(() => performance.now())
  await page.keyboard.press('c')
  await waitForCut(page, 120_000)
  const firstCutMs = await page.evaluate((t) => {
    const m = performance.getEntriesByName('tractus:cut').filter((e) => e.startTime >= t)
    return m.length ? { roundTrip: m[0].duration, compute: ((m[0] as PerformanceMeasure).detail as { computeMs?: number } | null)?.computeMs ?? NaN } : { roundTrip: NaN, compute: NaN }
  }, sectionOnStart)
  await page.waitForTimeout(1500)
  const sectionOnEnd = await page.evaluate(() => performance.now())
  // The section handle reads as well here as on a small part: its tab, on screen, of its own size.
  const handleShot = await page.screenshot({ path: `${OUT_DIR}/${o.name}-handle.png` })
  const tabPixels = (await colourBox(page, handleShot, HANDLE, 3, { x: 0, y: 40, w: 900, h: 600 })).n
  await page.evaluate(() => {
    performance.clearMeasures('tractus:cut')
    window.__cutChanges = []
    const target = document.querySelector('[data-testid="cut-result"]')!
    let last = ''
    new MutationObserver(() => {
      const v = document.querySelector('[data-testid="cut-result"] tr[data-row="axial"] .num')?.getAttribute('data-model') ?? ''
      if (v !== last) { last = v; window.__cutChanges!.push(performance.now()) }
    }).observe(target, { subtree: true, attributes: true, childList: true, characterData: true })
  })

  // Drag the offset slider across a good part of the part, as a user would.
  const slider = (await page.locator('[data-testid="cut-offset"]').boundingBox())!
  const y = slider.y + slider.height / 2
  const x0 = slider.x + slider.width / 2
  const dragStart = await page.evaluate(() => performance.now())
  await page.mouse.move(x0, y)
  await page.mouse.down()
  const steps = 40
  // The picture while dragging (a software renderer draws a lighter section face then), taken a
  // quarter of the way, once that step's cut has had time to arrive; the tasks of the screenshot
  // itself are left out of the drag's figures.
  let shot: [number, number] = [0, 0]
  for (let i = 1; i <= steps; i++) {
    await page.mouse.move(x0 - (slider.width * 0.4 * i) / steps, y)
    await page.waitForTimeout(60)
    if (i === steps / 4) {
      await page.waitForTimeout(400)
      const from = await page.evaluate(() => performance.now())
      await page.screenshot({ path: `${OUT_DIR}/${o.name}-dragging.png` })
      shot = [from, await page.evaluate(() => performance.now())]
    }
  }
  // the release asks for its own cut at once: its round trip is the first cut from here on
  const releaseAt = await page.evaluate(() => performance.now())
  await page.mouse.up()
  const dragEnd = await page.evaluate(() => performance.now())
  // Let the last coalesced cut arrive and draw.
  await page.waitForTimeout(2500)
  const settledEnd = await page.evaluate(() => performance.now())
  const tasks = await page.evaluate(() => window.__longTasks ?? [])
  const cutChanges = await page.evaluate(() => window.__cutChanges ?? [])
  const cuts = await page.evaluate(() => performance.getEntriesByName('tractus:cut').map((e) => ({
    start: e.startTime, roundTrip: e.duration, compute: ((e as PerformanceMeasure).detail as { computeMs?: number } | null)?.computeMs ?? NaN,
  })))
  await page.screenshot({ path: `${OUT_DIR}/${o.name}.png` })
  const traced: TaskParts[] | null = tracer ? await tracer.stop(100) : null
  const dragCuts = cuts.filter((c) => c.start >= dragStart && c.start < releaseAt)
  const shown = cutChanges.filter((t) => t >= dragStart && t <= dragEnd)
  const intervals = shown.slice(1).map((t, i) => t - shown[i])
  const during = (a: number, b: number): Task[] => tasks.filter((t) => t.start + t.duration >= a && t.start <= b)
  const ms = (v: Task[]): number[] => v.map((t) => Math.round(t.duration))
  // The drag is pointer down to pointer up; what follows (the last cut, arrows back) is reported apart.
  const dragTasks = during(dragStart, dragEnd).filter((t) => t.start + t.duration < shot[0] || t.start > shot[1])
  const afterTasks = tasks.filter((t) => t.start > dragEnd && t.start <= settledEnd)
  const figures = {
    elements,
    source: o.files ? 'file' : 'generated block',
    firstPictureMs: Math.round(loadEnd - loadStart),
    cores,
    patchForces,
    tabPixels,
    load: {
      wallMs: loadWallMs, peakBrowserRssMb: loadPeakRssMb, engineStagesMs: Object.fromEntries(compute.stagesMs), pool: { workers: compute.workers, sharing: compute.sharing, line: compute.line },
      longTasks: summary(during(loadStart, settledLoad)), longTaskDurationsMs: ms(during(loadStart, settledLoad)),
    },
    startUpLongTaskDurationsMs: ms(tasks.filter((t) => t.start < loadStart)),
    sectionOn: { firstCutRoundTripMs: round(firstCutMs.roundTrip), firstCutComputeMs: round(firstCutMs.compute), longTaskDurationsMs: ms(tasks.filter((t) => t.start >= sectionOnStart && t.start <= sectionOnEnd)) },
    drag: {
      durationMs: Math.round(dragEnd - dragStart),
      pointerSteps: steps,
      cutResultsShownDuringDrag: cutChanges.filter((t) => t <= dragEnd).length,
      cutResultsShownInAll: cutChanges.length,
      cutRoundTripMs: { median: round(median(dragCuts.map((c) => c.roundTrip))), max: round(Math.max(0, ...dragCuts.map((c) => c.roundTrip))) },
      cutComputeMs: { median: round(median(dragCuts.map((c) => c.compute))), max: round(Math.max(0, ...dragCuts.map((c) => c.compute))) },
      updateIntervalMs: { median: round(median(intervals)), max: round(Math.max(0, ...intervals)) },
      longTasks: summary(dragTasks),
      longTaskDurationsMs: ms(dragTasks),
    },
    afterRelease: { windowMs: Math.round(settledEnd - dragEnd), longTasks: summary(afterTasks), cutRoundTripMs: round(cuts.filter((c) => c.start >= releaseAt).at(-1)?.roundTrip ?? NaN) },
  }
  console.log(`${o.name} figures ` + JSON.stringify(figures))
  writeFileSync(`${OUT_DIR}/${o.name}.json`, JSON.stringify(figures, null, 2) + '\n')
  if (traced) {
    writeFileSync(`${OUT_DIR}/${o.name}-tasks.json`, JSON.stringify(traced, null, 2) + '\n')
    for (const t of traced) {
      console.log(`task at ${t.at} ms, ${t.ms} ms: ` + t.parts.slice(0, 8).map(([k, v]) => `${k} ${v}`).join('; ') +
        `\n  GPU process: ` + t.gpu.slice(0, 8).map(([k, v]) => `${k} ${v}`).join('; '))
    }
  }
  expect(figures.drag.cutResultsShownDuringDrag, 'the section updates while dragging').toBeGreaterThan(0)
  await page.close()
  return figures
}
