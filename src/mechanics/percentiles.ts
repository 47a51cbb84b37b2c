/**
 * Percentiles of a large array without sorting it: linear interpolation between order
 * statistics (the "type 7" definition of Hyndman & Fan, Am. Stat. 50(4), 1996, the default of
 * most statistics packages), each order statistic found by Hoare's selection (FIND, Comm. ACM
 * 4(7), 1961) in O(n) instead of an O(n log n) sort. The numbers are those of sorting: the same
 * order statistics, interpolated the same way. A case switch computes the balance indicator's
 * median and 95th percentile over every element (10^6 and more); the sort was a sixth of it.
 *
 * Units: those of the values. Layout: any ArrayLike<number>; NaN is ignored.
 */

/** The percentiles `ps` (0..100) of `values` (NaN ignored); NaN for each p when no value is present. */
export function percentiles(values: ArrayLike<number>, ps: readonly number[]): number[] {
  let n = 0
  // a copy per call, as the sort had (a kept one would hold 8 bytes per element for good)
  const a = new Float64Array(values.length)
  for (let i = 0; i < values.length; i++) { const v = values[i]; if (!Number.isNaN(v)) a[n++] = v }
  if (n === 0) return ps.map(() => NaN)
  // the ranks each p needs, in increasing order: after selecting rank r, every rank above lies in
  // [r, n), so each selection runs on what the previous one left above it
  const at = ps.map((p) => {
    const h = (Math.min(100, Math.max(0, p)) / 100) * (n - 1)
    const lo = Math.floor(h)
    return { h, lo, hi: Math.min(n - 1, lo + 1) }
  })
  const ranks = [...new Set(at.flatMap((x) => [x.lo, x.hi]))].sort((x, y) => x - y)
  const value = new Map<number, number>()
  let from = 0
  for (const r of ranks) {
    value.set(r, select(a, from, n - 1, r))
    from = r
  }
  return at.map(({ h, lo, hi }) => {
    const vlo = value.get(lo)!, vhi = value.get(hi)!
    return vlo + (h - lo) * (vhi - vlo)
  })
}

/**
 * The k-th smallest of a[lo..hi] (lo ≤ k ≤ hi), leaving a[lo..k) ≤ a[k] ≤ a(k..hi]: Hoare's
 * partition with a median-of-three pivot; runs of equal values split on both sides, so many equal
 * values (a body in perfect balance: all zero) stay linear.
 */
function select(a: Float64Array, lo: number, hi: number, k: number): number {
  while (hi > lo) {
    const mid = (lo + hi) >>> 1
    // median of three into a[mid] (a[lo] ≤ a[mid] ≤ a[hi])
    if (a[mid] < a[lo]) swap(a, mid, lo)
    if (a[hi] < a[lo]) swap(a, hi, lo)
    if (a[hi] < a[mid]) swap(a, hi, mid)
    const pivot = a[mid]
    let i = lo, j = hi
    while (i <= j) {
      while (a[i] < pivot) i++
      while (a[j] > pivot) j--
      if (i <= j) { swap(a, i, j); i++; j-- }
    }
    // now a[lo..j] ≤ pivot, a(j..i) = pivot, a[i..hi] ≥ pivot
    if (k <= j) hi = j
    else if (k >= i) lo = i
    else return a[k]
  }
  return a[k]
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i]; a[i] = a[j]; a[j] = t
}
