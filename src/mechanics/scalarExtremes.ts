/**
 * The smallest and largest finite value of a scalar array and where they are (the first index
 * of each, so the answer is the same on every run): the extremes markers of the shown quantity.
 * NaN and ±Infinity are skipped; an array without a finite value gives index −1 and NaN values.
 */
export interface ScalarExtremes {
  readonly min: number
  readonly minIndex: number
  readonly max: number
  readonly maxIndex: number
}

export function scalarExtremes(values: ArrayLike<number>): ScalarExtremes {
  let min = Infinity, max = -Infinity, minIndex = -1, maxIndex = -1
  for (let i = 0; i < values.length; i++) {
    const v = values[i]
    // NaN fails both comparisons; the infinities are skipped explicitly.
    if (v < min && v !== -Infinity) { min = v; minIndex = i }
    if (v > max && v !== Infinity) { max = v; maxIndex = i }
  }
  return minIndex < 0 ? { min: NaN, minIndex: -1, max: NaN, maxIndex: -1 } : { min, minIndex, max, maxIndex }
}
