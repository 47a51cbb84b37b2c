/**
 * The display rule for rounding noise, the one place it lives. On screen (the app's cards, the
 * command line's tables), in snapshots and in reports, never in JSON or CSV (they carry every
 * digit): a value whose magnitude is below NOISE_FRACTION of the largest value of its family in
 * the same table is shown as 0. Families: forces with forces, moments with moments, second
 * moments with second moments, stresses with stresses; coordinates against the model's size (the
 * diagonal of its bounds). So a centroid x of −1.4e-17 m on a part of 0.3 m reads 0, and so does
 * a shear force of 1e-17 kN beside 43 kN; 1e-6 is far above double round-off (about 1e-16 of the
 * numbers summed) and far below any figure an engineer reads to four digits.
 */
export const NOISE_FRACTION = 1e-6

/** The magnitude below which values of a family are shown as 0: NOISE_FRACTION × the largest |value| (or `scale`, when larger). */
export function noiseFloor(values: Iterable<number>, scale = 0): number {
  let big = Math.abs(scale)
  for (const v of values) { const a = Math.abs(v); if (a > big && Number.isFinite(a)) big = a }
  return NOISE_FRACTION * big
}

/** `v`, or 0 when its magnitude is below `floor` (see NOISE_FRACTION). */
export function denoise(v: number, floor: number): number {
  return Math.abs(v) < floor ? 0 : v
}

