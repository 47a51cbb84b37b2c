/**
 * Candidates for coincident points (face centroids of parts meshed apart): every pair of points
 * whose projections on one fixed unit direction lie within `reach`. Two points within `reach` of
 * each other are within it along any unit direction, so the candidates hold every such pair;
 * callers then test the distance and the corners. One sort and one sweep: no hash of quantised
 * cells, whose 27 lookups per point cost more than the sort on a body's boundary faces.
 *
 * Layout: `points` 3·P (x, y, z per point, model length); returns each point's candidates in CSR
 * form, `list[start[i] .. start[i + 1])` ascending. Points with a non-finite coordinate get none.
 */

/**
 * A unit direction (1, √2, √3)/√6: its components have irrational ratios, so points on a regular
 * grid (a box's boundary faces) never share a projection unless they share a position.
 */
const DIRECTION = [1 / Math.sqrt(6), Math.sqrt(2 / 6), Math.sqrt(3 / 6)] as const

export function nearPoints(points: Float64Array, count: number, reach: number): { start: Int32Array; list: Int32Array } {
  if (keyScratch.length < count) { keyScratch = new Float64Array(count); orderScratch = new Int32Array(count); tmpScratch = new Int32Array(count) }
  const key = keyScratch
  let finite = 0
  for (let i = 0; i < count; i++) {
    key[i] = DIRECTION[0] * points[3 * i] + DIRECTION[1] * points[3 * i + 1] + DIRECTION[2] * points[3 * i + 2]
    if (Number.isFinite(key[i])) orderScratch[finite++] = i
  }
  const order = sortByKey(orderScratch, tmpScratch, finite, key)
  // two passes over the windows: count, then fill
  const start = new Int32Array(count + 1)
  for (let a = 0; a < finite; a++) {
    const i = order[a], ki = key[i]
    for (let b = a + 1; b < finite && key[order[b]] - ki <= reach; b++) { start[i + 1]++; start[order[b] + 1]++ }
  }
  for (let i = 0; i < count; i++) start[i + 1] += start[i]
  const list = new Int32Array(start[count]), fill = start.slice(0, count)
  for (let a = 0; a < finite; a++) {
    const i = order[a], ki = key[i]
    for (let b = a + 1; b < finite && key[order[b]] - ki <= reach; b++) { const j = order[b]; list[fill[i]++] = j; list[fill[j]++] = i }
  }
  for (let i = 0; i < count; i++) if (start[i + 1] - start[i] > 1) list.subarray(start[i], start[i + 1]).sort()
  return { start, list }
}

/** Grows-only scratch of nearPoints: the projections, and the order of the points along them (and its merge buffer). */
let keyScratch = new Float64Array(0), orderScratch = new Int32Array(0), tmpScratch = new Int32Array(0)

/**
 * Sorts idx[0 .. n) by key[idx] ascending, a bottom-up merge sort between idx and tmp (room for
 * n each); returns the one holding the result. No comparator callback: a typed array sorted with
 * one goes through a temporary heap copy, whose garbage made the section's outline (some hundreds
 * of faces per cut at 10^6 elements) cost ten times its median now and then.
 */
function sortByKey(idx: Int32Array, tmp: Int32Array, n: number, key: Float64Array): Int32Array {
  let src = idx, dst = tmp
  for (let w = 1; w < n; w *= 2) {
    for (let lo = 0; lo < n; lo += 2 * w) {
      const mid = Math.min(lo + w, n), hi = Math.min(lo + 2 * w, n)
      let i = lo, j = mid, k = lo
      while (i < mid && j < hi) dst[k++] = key[src[j]] < key[src[i]] ? src[j++] : src[i++]
      while (i < mid) dst[k++] = src[i++]
      while (j < hi) dst[k++] = src[j++]
    }
    const x = src; src = dst; dst = x
  }
  return src
}
