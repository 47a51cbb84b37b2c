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
  readonly value: T
}

// A garbage collection before each timed run, so one run's garbage is not billed to the next;
// `npm run bench` starts Node without --expose-gc, so the flag is set here.
v8.setFlagsFromString('--expose-gc')
const gc = vm.runInNewContext('gc') as () => void

export function measure<T>(fn: () => T, runs: number, warmup = 1): Timing<T> {
  let value: T = undefined as T
  for (let i = 0; i < warmup; i++) value = fn()
  const samplesMs: number[] = []
  const cpu: number[] = []
  for (let i = 0; i < runs; i++) {
    gc()
    const c0 = process.cpuUsage()
    const t0 = performance.now()
    value = fn()
    samplesMs.push(performance.now() - t0)
    const c = process.cpuUsage(c0)
    cpu.push((c.user + c.system) / 1000)
  }
  return { medianMs: median(samplesMs), cpuMs: median(cpu), samplesMs, value }
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
