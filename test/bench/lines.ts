/**
 * Benchmark of lines through the model (seeded, checks outside the timed loops): the element grid
 * built once per model, point location of random points, sampling a line of 1000 points through
 * the block, and the linearisation of a line across it (the element walk and the segment-by-segment
 * Gauss–Legendre integration). The yardstick is a pass that only streams the connectivity and the
 * coordinates (what any element-by-element kernel must read), as in the main benchmark.
 *
 * `benchLines(model)` is called by `npm run bench` (test/bench/run.ts); run alone:
 *   npx tsx test/bench/lines.ts [elements] [seed]
 */
import type { Model, Vec3 } from '../../src/model/model.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { buildElementGrid } from '../../src/mechanics/elementGrid.ts'
import { allocatePointHits, locatePoint, locationTolerance } from '../../src/mechanics/pointLocation.ts'
import { sampleLine } from '../../src/mechanics/lineSampling.ts'
import { analyseLine } from '../../src/mechanics/lineAnalysis.ts'
import { mulberry32, syntheticModel } from './syntheticModel.ts'
import { streamConnCoords } from './streamingLimit.ts'
import { measure } from './timing.ts'

export interface LineFigures {
  readonly elements: number
  /** Grid build (ms) and its multiple of the streaming pass. */
  readonly gridMs: number
  readonly gridVsStreaming: number
  readonly gridItemsPerElement: number
  /** Point location: µs per point (10 000 seeded points). */
  readonly locateUsPerPoint: number
  /** A 1000-point line through the block (ms). */
  readonly sampleMs: number
  /** Linearisation of a line across the block (ms) and its element segments. */
  readonly lineariseMs: number
  readonly segments: number
  readonly checks: Record<string, number | boolean>
}

export function benchLines(model: Model, seed: number): LineFigures {
  const mesh = model.mesh
  const field = nodalStressField(mesh, model.stress)
  const grid = measure(() => buildElementGrid(mesh), { runs: 5, warmup: 1 })
  const stream = measure(() => streamConnCoords(mesh), { runs: 7 })
  const g = grid.value
  const tol = locationTolerance(g)
  const rnd = mulberry32(seed)
  const pts = Float64Array.from({ length: 3 * 10_000 }, () => 0.02 + 0.96 * rnd())
  const hits = allocatePointHits()
  const locate = measure(() => {
    let found = 0
    for (let i = 0; i < pts.length; i += 3) found += locatePoint(hits, mesh, g, pts[i], pts[i + 1], pts[i + 2], tol).count > 0 ? 1 : 0
    return found
  }, { runs: 5 })
  const from: Vec3 = [0.013, 0.27, 0.31], to: Vec3 = [0.987, 0.73, 0.62]
  const sample = measure(() => sampleLine(mesh, g, field, null, from, to, 1000, tol), { runs: 5 })
  // Across the block through its faces x = 0 and x = 1 (a "wall" 1 thick).
  const a: Vec3 = [0, 0.41, 0.57], b: Vec3 = [1, 0.45, 0.52]
  const lin = measure(() => analyseLine(mesh, g, field, null, { from: a, to: b, points: 2 }), { runs: 5 })
  let held = 0
  for (const h of sample.value.held) if (h > 0) held++
  const l = lin.value.linearisation
  return {
    elements: mesh.elementCount,
    gridMs: grid.medianMs, gridVsStreaming: grid.medianMs / stream.medianMs, gridItemsPerElement: g.items.length / mesh.elementCount,
    locateUsPerPoint: (1000 * locate.medianMs) / 10_000,
    sampleMs: sample.medianMs,
    lineariseMs: lin.medianMs,
    segments: l?.segments ?? 0,
    checks: {
      locatedAll: locate.value === 10_000,
      sampledInside: held === 1000,
      linearised: l !== null,
      thickness: l ? l.thickness : NaN,
    },
  }
}

// Run alone: npx tsx test/bench/lines.ts [elements] [seed]
if (import.meta.url === `file://${process.argv[1]}`) {
  const elements = Number(process.argv[2] ?? 1e6), seed = Number(process.argv[3] ?? 20261201)
  const model = syntheticModel('tet4', elements, seed)
  const f = benchLines(model, seed)
  process.stdout.write(JSON.stringify(f, null, 2) + '\n')
}
