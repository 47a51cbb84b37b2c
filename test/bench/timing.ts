/**
 * Timing for the benchmarks: warm-up runs, then the median of several timed runs. The value of
 * the last run is returned so checks can look at it outside the timed loop.
 */
import v8 from 'node:v8'
import vm from 'node:vm'

export interface Timing<T> {
  /** Median wall-clock time of the timed runs. */
  readonly medianMs: number
  /**
   * Median CPU time (user + system) of this process over the same runs. On a shared machine the
   * wall clock also counts time spent waiting for a core; CPU time does not (it does count GC
   * helper threads, so it can exceed the wall time on an idle machine).
   */
  readonly cpuMs: number
  readonly samplesMs: number[]
  /** Wall time of the very first call (cold: before the optimising compiler has run). */
  readonly firstMs: number
  readonly value: T
}

// A garbage collection before each timed run, so one run's garbage is not billed to the next;
// `npm run bench` starts Node without --expose-gc, so the flag is set here.
v8.setFlagsFromString('--expose-gc')
const gc = vm.runInNewContext('gc') as () => void
const pause = new Int32Array(new SharedArrayBuffer(4))

/**
 * A full collection, then `ms` (untimed) for the collector's background sweeping: before a timed
 * step whose CPU time counts every thread (process.cpuUsage), or that runs beside other threads.
 */
export function settle(ms = 50): void {
  gc()
  Atomics.wait(pause, 0, 0, ms)
}

export interface MeasureOptions {
  /** At most this many timed runs (default 7). */
  readonly runs?: number
  /** At least this many timed runs when the time budget is short (default 3). */
  readonly minRuns?: number
  /** At least this many untimed warm-up runs (default 1); more (up to 10) until `warmupMs` is spent. */
  readonly warmup?: number
  /** Warm-up continues until this much time was spent, so the optimising compiler has run (default 1000 ms, at most 10 runs). */
  readonly warmupMs?: number
  /** Timed runs stop early once this much time was spent, after `minRuns` (default 4000 ms). */
  readonly budgetMs?: number
}

/**
 * `measure(fn, options)`, or the older `measure(fn, runs, warmup)`: exactly `runs` timed runs
 * after `warmup` untimed ones (other benchmarks call it that way).
 */
export function measure<T>(fn: () => T, options: MeasureOptions | number = {}, legacyWarmup = 1): Timing<T> {
  const o: MeasureOptions = typeof options === 'number'
    ? { runs: options, minRuns: options, warmup: legacyWarmup, warmupMs: 0, budgetMs: Infinity }
    : options
  const { runs = 7, minRuns = 3, warmup = 1, warmupMs = 1000, budgetMs = 4000 } = o
  let { firstMs, value } = warmUp(fn, warmup, warmupMs)
  const samplesMs: number[] = []
  const cpu: number[] = []
  let spent = 0
  for (let i = 0; i < runs && (i < minRuns || spent < budgetMs); i++) {
    const t = timedRun(fn)
    value = t.value
    samplesMs.push(t.ms)
    cpu.push(t.cpuMs)
    spent += t.ms
    if (firstMs < 0) firstMs = t.ms
  }
  return { medianMs: median(samplesMs), cpuMs: median(cpu), samplesMs, firstMs, value: value as T }
}

/**
 * Several functions timed in turns: each is warmed up as by `measure`, then every round times
 * each once, in order, with a garbage collection before each. A kernel and its streaming
 * yardstick timed this way see the same machine: on a shared one, a busy spell lands on both
 * instead of on one of them, so their ratio holds still where separate timings drift apart.
 */
export function measureTogether(fns: readonly (() => unknown)[], options: { rounds: number; warmup?: number; warmupMs?: number }): Timing<unknown>[] {
  const { rounds, warmup = 1, warmupMs = 1000 } = options
  const firsts = fns.map((fn) => warmUp(fn, warmup, warmupMs).firstMs)
  const wall: number[][] = fns.map(() => []), cpu: number[][] = fns.map(() => [])
  const last: unknown[] = fns.map(() => undefined)
  for (let r = 0; r < rounds; r++) {
    fns.forEach((fn, k) => {
      const t = timedRun(fn)
      last[k] = t.value
      wall[k].push(t.ms)
      cpu[k].push(t.cpuMs)
    })
  }
  return fns.map((_, k) => ({ medianMs: median(wall[k]), cpuMs: median(cpu[k]), samplesMs: wall[k], firstMs: firsts[k] < 0 ? wall[k][0] : firsts[k], value: last[k] }))
}

/**
 * Untimed runs: at least `warmup`, more (up to 10) until `warmupMs` is spent, so the optimising
 * compiler has run. The wall time of the first (-1 when none ran) and the last value.
 */
function warmUp<T>(fn: () => T, warmup: number, warmupMs: number): { firstMs: number; value: T | undefined } {
  const w0 = performance.now()
  let firstMs = -1
  let value: T | undefined
  for (let i = 0; i < Math.max(10, warmup) && (i < warmup || performance.now() - w0 < warmupMs); i++) {
    value = fn()
    if (i === 0) firstMs = performance.now() - w0
  }
  return { firstMs, value }
}

/** One timed run after a garbage collection: wall and CPU time (this process, every thread). */
function timedRun<T>(fn: () => T): { ms: number; cpuMs: number; value: T } {
  gc()
  const c0 = process.cpuUsage()
  const t0 = performance.now()
  const value = fn()
  const ms = performance.now() - t0
  const c = process.cpuUsage(c0)
  return { ms, cpuMs: (c.user + c.system) / 1000, value }
}

export function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const m = s.length >> 1
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2
}

/** Least-squares slope of log(time) against log(size): the measured cost exponent. */
export function growthExponent(sizes: readonly number[], times: readonly number[]): number {
  const xs = sizes.map(Math.log), ys = times.map(Math.log)
  const n = xs.length
  const mx = xs.reduce((a, b) => a + b, 0) / n, my = ys.reduce((a, b) => a + b, 0) / n
  let sxy = 0, sxx = 0
  for (let i = 0; i < n; i++) { sxy += (xs[i] - mx) * (ys[i] - my); sxx += (xs[i] - mx) ** 2 }
  return sxy / sxx
}
