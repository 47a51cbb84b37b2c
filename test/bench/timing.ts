/**
 * Timing for the benchmarks: warm-up runs, then the median of several timed runs. The value of
 * the last run is returned so checks can look at it outside the timed loop.
 */
export interface Timing<T> {
  readonly medianMs: number
  readonly samplesMs: number[]
  readonly value: T
}

const gc = (globalThis as { gc?: () => void }).gc

export function measure<T>(fn: () => T, runs: number, warmup = 1): Timing<T> {
  let value: T = undefined as T
  for (let i = 0; i < warmup; i++) value = fn()
  const samplesMs: number[] = []
  for (let i = 0; i < runs; i++) {
    // Collect before each run when allowed, so one run's garbage is not billed to the next.
    if (gc) gc()
    const t0 = performance.now()
    value = fn()
    samplesMs.push(performance.now() - t0)
  }
  return { medianMs: median(samplesMs), samplesMs, value }
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
