/**
 * The least balanced elements: the indices of the k largest element balance indicators
 * (ElementBalance.indicator, dimensionless), largest first, in one pass over the E elements
 * (k small: an insertion into a list of at most k). Ties keep the lower index first; zero and NaN
 * indicators are never listed. Shared by the pipeline's verdict stage (the app's Equilibrium
 * card) and the `audit` command.
 */

/** Indices of the `k` largest positive values of `values`, largest first. */
export function topIndices(values: ArrayLike<number>, k: number): number[] {
  const best: number[] = []
  if (!(k >= 1)) return best
  for (let i = 0; i < values.length; i++) {
    const v = values[i]
    if (!(v > 0)) continue
    if (best.length === k && v <= values[best[k - 1]]) continue
    let j = best.length < k ? best.length : k - 1
    while (j > 0 && values[best[j - 1]] < v) { best[j] = best[j - 1]; j-- }
    best[j] = i
  }
  return best
}
