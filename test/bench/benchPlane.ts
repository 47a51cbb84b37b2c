/**
 * The section plane the benchmarks cut: oblique through the middle of the unit block, so it
 * crosses elements of every orientation and no grid plane (invented for benchmarking).
 */
import type { SectionPlane } from '../../src/mechanics/types.ts'

const n = [0.3, 0.4, 0.866]
const l = Math.hypot(n[0], n[1], n[2])

export const BENCH_PLANE: SectionPlane = {
  point: [0.5037, 0.4969, 0.5013],
  normal: [n[0] / l, n[1] / l, n[2] / l],
}
