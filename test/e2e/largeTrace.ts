/**
 * What each long main-thread task is made of, from a Chrome trace taken over the DevTools
 * protocol (Tracing domain) through the browser tests' Playwright session: for every task on the
 * page's main thread longer than a threshold, its start, length and the events inside it summed by
 * name (script calls with their function and file, compiles, GPU waits, paints), longest first.
 * Set TRACTUS_E2E_TRACE=1 to record it in large.e2e.test.ts; the summary goes to
 * test-output/e2e/<name>-tasks.json (the raw trace is not kept: it is hundreds of MB).
 */
import type { CDPSession, Page } from 'playwright-core'

const CATEGORIES = [
  'toplevel', 'devtools.timeline', 'disabled-by-default-devtools.timeline', 'v8', 'v8.execute', 'blink', 'gpu', 'cc', 'blink.user_timing',
  'gpu.service', 'disabled-by-default-gpu.service', 'gpu.angle',
].join(',')

interface TraceEvent {
  readonly name: string; readonly ph: string; readonly ts: number; readonly dur?: number; readonly pid: number; readonly tid: number
  readonly cat: string; readonly args?: { readonly name?: string; readonly data?: { readonly functionName?: string; readonly url?: string; readonly frame?: string } }
}

export interface TaskParts {
  /** ms since the trace's first event */
  readonly at: number
  readonly ms: number
  /** name (with function and file for script) → summed ms of the events inside the task, longest first */
  readonly parts: readonly (readonly [string, number])[]
  /**
   * The GPU process's events inside the task (the software rasteriser, shader compiles, uploads),
   * summed by name, longest first: what the main thread waits for in a read-back.
   */
  readonly gpu: readonly (readonly [string, number])[]
}

export interface Tracer {
  /** Ends the trace and returns the long tasks of the page's main thread, with their parts. */
  stop(thresholdMs?: number): Promise<TaskParts[]>
}

export async function startTrace(page: Page): Promise<Tracer> {
  const cdp: CDPSession = await page.context().newCDPSession(page)
  const events: TraceEvent[] = []
  cdp.on('Tracing.dataCollected', (e) => {
    // Keep only complete events and thread names: the rest is not used and would take gigabytes.
    for (const ev of e.value as unknown as TraceEvent[]) if (ev.ph === 'X' || ev.ph === 'M') events.push(ev)
  })
  await cdp.send('Tracing.start', { categories: CATEGORIES, transferMode: 'ReportEvents' })
  return {
    async stop(thresholdMs = 100) {
      const done = new Promise<void>((r) => cdp.once('Tracing.tracingComplete', () => r()))
      await cdp.send('Tracing.end')
      await done
      await cdp.detach()
      return longTasks(events, thresholdMs)
    },
  }
}

function label(e: TraceEvent): string {
  const d = e.args?.data
  if (d?.functionName !== undefined || d?.url) return `${e.name} ${d?.functionName || '(anonymous)'} ${(d?.url ?? '').split('/').pop()}`
  return e.name
}

export function longTasks(events: readonly TraceEvent[], thresholdMs: number): TaskParts[] {
  // The page's main thread: the renderer thread that ran the app's bundle (assets/index-*.js) most.
  const calls = new Map<string, number>()
  for (const e of events) if (e.name === 'FunctionCall' && /\/assets\/index-/.test(e.args?.data?.url ?? '')) calls.set(`${e.pid}:${e.tid}`, (calls.get(`${e.pid}:${e.tid}`) ?? 0) + 1)
  const best = [...calls].sort((a, b) => b[1] - a[1])[0]
  if (!best) return []
  const [pid, tid] = best[0].split(':').map(Number)
  const main = { pid, tid }
  const mine = events.filter((e) => e.pid === main.pid && e.tid === main.tid && e.ph === 'X' && e.dur !== undefined).sort((a, b) => a.ts - b.ts)
  // the GPU process, named by its metadata event
  const gpuPid = events.find((e) => e.ph === 'M' && e.name === 'process_name' && /gpu/i.test(e.args?.name ?? ''))?.pid
  const gpuEvents = gpuPid === undefined ? [] : events.filter((e) => e.pid === gpuPid && e.ph === 'X' && e.dur !== undefined)
  let t0 = Infinity
  for (const e of events) if (e.ts > 0 && e.ts < t0) t0 = e.ts
  const out: TaskParts[] = []
  for (const task of mine) {
    if (task.name !== 'RunTask' && task.name !== 'ThreadControllerImpl::RunTask') continue
    const ms = task.dur! / 1000
    if (ms < thresholdMs) continue
    const end = task.ts + task.dur!
    const sums = new Map<string, number>()
    for (const e of mine) {
      if (e === task || e.ts < task.ts || e.ts + e.dur! > end) continue
      if (e.name === 'RunTask' || e.name === 'ThreadControllerImpl::RunTask') continue
      const k = label(e)
      sums.set(k, (sums.get(k) ?? 0) + e.dur! / 1000)
    }
    const parts = [...sums].sort((a, b) => b[1] - a[1]).slice(0, 14).map(([k, v]) => [k, Math.round(v)] as const)
    const gpuSums = new Map<string, number>()
    for (const e of gpuEvents) {
      if (e.ts < task.ts || e.ts + e.dur! > end || e.name === 'RunTask' || e.name === 'ThreadControllerImpl::RunTask') continue
      gpuSums.set(e.name, (gpuSums.get(e.name) ?? 0) + e.dur! / 1000)
    }
    const gpu = [...gpuSums].sort((a, b) => b[1] - a[1]).slice(0, 14).map(([k, v]) => [k, Math.round(v)] as const)
    out.push({ at: Math.round((task.ts - t0) / 1000), ms: Math.round(ms), parts, gpu })
  }
  // A task nested in another (the old and new names of the same task) is listed once.
  return out.filter((t, i) => i === 0 || t.at !== out[i - 1].at)
}
