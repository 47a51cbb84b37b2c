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
  const t0 = await page.evaluate(() => { performance.mark('tractus:case-chosen'); return performance.now() })
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


// --- CPU time of a switch, from a Chrome trace (a shared machine's wall time says little) ---

interface TraceEvent {
  readonly name: string; readonly ph: string; readonly ts: number; readonly dur?: number; readonly tdur?: number
  readonly pid: number; readonly tid: number; readonly args?: { readonly name?: string; readonly data?: { readonly url?: string } }
}

/** CPU ms each thread spent inside one switch's window (choice to new picture), by thread: main, engine, pool, and the others by name. */
export type SwitchCpu = Record<string, number>

/**
 * Starts a trace of the page; `stop` returns, for each window from a 'tractus:case-chosen' mark
 * (switchTimed sets it) to the next 'tractus:surface-drawn', the thread time (CPU) of the tasks
 * of every thread inside it: the page's main thread, the engine worker, the pool workers, the GPU
 * process's threads (software WebGL draws there). Tasks that cross a window's edge count in part.
 */
export async function startCpuTrace(page: Page): Promise<{ stop(): Promise<SwitchCpu[]> }> {
  const cdp = await page.context().newCDPSession(page)
  const events: TraceEvent[] = []
  cdp.on('Tracing.dataCollected', (e) => {
    for (const ev of e.value as unknown as TraceEvent[]) {
      if (ev.ph === 'M' || (ev.ph === 'X' && ev.tdur !== undefined) || ev.name === 'FunctionCall' || ev.name.startsWith('tractus:')) events.push(ev)
    }
  })
  await cdp.send('Tracing.start', { categories: 'toplevel,devtools.timeline,blink.user_timing,__metadata', transferMode: 'ReportEvents' })
  return {
    async stop() {
      const done = new Promise<void>((r) => cdp.once('Tracing.tracingComplete', () => r()))
      await cdp.send('Tracing.end')
      await done
      await cdp.detach()
      return switchCpu(events)
    },
  }
}

function switchCpu(events: readonly TraceEvent[]): SwitchCpu[] {
  const key = (e: TraceEvent) => `${e.pid}:${e.tid}`
  const names = new Map<string, string>()
  const processes = new Map<number, string>()
  for (const e of events) if (e.ph === 'M' && e.name === 'process_name' && e.args?.name) processes.set(e.pid, e.args.name)
  // other threads by process and name (the GPU process's, the renderer's V8 helpers)
  for (const e of events) if (e.ph === 'M' && e.name === 'thread_name' && e.args?.name) names.set(key(e), `${processes.get(e.pid) ?? e.pid}/${e.args.name}`)
  // the app's threads by the script they run
  for (const e of events) {
    const url = e.args?.data?.url ?? ''
    if (e.name !== 'FunctionCall') continue
    if (/engine\.worker/.test(url)) names.set(key(e), 'engine')
    else if (/kernelPool\.worker/.test(url)) names.set(key(e), 'pool')
    else if (/\/assets\/index-/.test(url)) names.set(key(e), 'main')
  }
  const chosen = events.filter((e) => e.name === 'tractus:case-chosen').map((e) => e.ts).sort((a, b) => a - b)
  const drawn = events.filter((e) => e.name === 'tractus:surface-drawn').map((e) => e.ts).sort((a, b) => a - b)
  // outermost timed tasks per thread
  const byThread = new Map<string, TraceEvent[]>()
  for (const e of events) {
    if (e.ph !== 'X' || e.tdur === undefined || e.dur === undefined) continue
    const list = byThread.get(key(e))
    if (list) list.push(e)
    else byThread.set(key(e), [e])
  }
  const tops = new Map<string, TraceEvent[]>()
  for (const [k, list] of byThread) {
    list.sort((a, b) => a.ts - b.ts || b.dur! - a.dur!)
    let end = -Infinity
    const out: TraceEvent[] = []
    for (const e of list) if (e.ts >= end) { out.push(e); end = e.ts + e.dur! }
    tops.set(k, out)
  }
  return chosen.map((from) => {
    const to = drawn.find((t) => t > from) ?? from
    const cpu: SwitchCpu = {}
    for (const [k, list] of tops) {
      let sum = 0
      for (const e of list) {
        const a = Math.max(from, e.ts), b = Math.min(to, e.ts + e.dur!)
        if (b > a) sum += (e.tdur! * (b - a)) / Math.max(1, e.dur!)
      }
      if (sum >= 1000) {
        const n = names.get(k) ?? `thread ${k}`
        cpu[n] = Math.round((cpu[n] ?? 0) + sum / 1000)
      }
    }
    cpu.wall = Math.round((to - from) / 1000)
    return cpu
  })
}
