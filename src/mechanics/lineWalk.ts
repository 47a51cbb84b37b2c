/**
 * A straight line split at element boundaries: walking along p(t) = a + t·(b − a) from a point
 * held by the body, element by element, until the material ends or t reaches tEnd. Each piece is
 * a segment [t0, t1] of the line inside one element, so a kernel can integrate over the line with
 * that element's own shape functions, segment by segment (linearisation.ts).
 *
 * At the current t the elements that hold the line a little further on (p(t + δ), δ four
 * location tolerances along the line) are found (pointLocation.ts) and the one whose exit lies
 * farthest is taken (where the line runs along a face shared by two elements either serves).
 * An element's exit is found by bisection between t (inside) and the exit of its bounding box
 * (outside or the box's end), to a thousandth of the location tolerance; the exit is then
 * checked at three interior points, and when one of them lies outside the element (a curved
 * element the line leaves and enters again) the bisection is repeated below that point, so a
 * segment never reaches over material of another element.
 *
 * Parameters t are fractions of the line a → b (t = 0 at a, 1 at b; the walk may run past 1 or
 * start before 0 when asked). Record (S segments): `t0`, `t1` Float64Array(S); `elem` global
 * element index, `block`, `local` its block and index there, Int32Array(S); `end`: where the walk
 * stopped (≤ tEnd): the material ends there when `end` < tEnd.
 */
import type { Mesh } from '../model/model.ts'
import type { ElementGrid } from './elementGrid.ts'
import { boxExit, inElementBox } from './elementGrid.ts'
import type { PointHits } from './pointLocation.ts'
import { allocatePointHits, elementHolds, locatePoint } from './pointLocation.ts'

export interface LineWalk {
  readonly count: number
  readonly t0: Float64Array
  readonly t1: Float64Array
  readonly elem: Int32Array
  readonly block: Int32Array
  readonly local: Int32Array
  readonly end: number
}

/** Largest number of segments one walk makes (a line across 10⁶ elements is not a wall). */
const MAX_SEGMENTS = 1_000_000

const XI = new Float64Array(3)

/** The geometry of one line and the tolerance of location along it. */
interface Line {
  readonly mesh: Mesh
  readonly grid: ElementGrid
  readonly a: readonly number[]
  readonly d: readonly number[]
  readonly length: number
  readonly tol: number
}

/** Strict tolerance of boundary crossings, as a fraction of the location tolerance. */
const EDGE = 1e-3

function holds(line: Line, b: number, e: number, t: number, tol = line.tol): boolean {
  const { a, d, grid, mesh } = line
  const px = a[0] + t * d[0], py = a[1] + t * d[1], pz = a[2] + t * d[2]
  return inElementBox(grid, e, px, py, pz, tol) && elementHolds(XI, 0, mesh, b, e, px, py, pz, tol)
}

/**
 * Largest s in (lo, hi] with the line held by e over [lo, s], by bisection (lo inside, hi not).
 * Here "held" is strict (EDGE, a thousandth of the location tolerance, still far above the
 * round-off of the inversion): a surface crossed by the line is found to that precision, so a
 * wall's thickness along the line is exact to it.
 */
function bisectExit(line: Line, b: number, e: number, lo: number, hi: number): number {
  const strict = EDGE * line.tol
  const eps = strict / line.length
  for (let it = 0; it < 200 && hi - lo > eps; it++) {
    const mid = 0.5 * (lo + hi)
    if (holds(line, b, e, mid, strict)) lo = mid
    else hi = mid
  }
  return lo
}

/** Where the line, held by element e at t, leaves it (≤ tEnd). */
function elementExit(line: Line, b: number, e: number, t: number, tEnd: number): number {
  let hi = Math.min(boxExit(line.grid, e, line.a, line.d, t), tEnd)
  if (holds(line, b, e, hi, EDGE * line.tol)) return hi
  let exit = bisectExit(line, b, e, t, hi)
  // A curved element may be left and entered again: the exit must have the element all the way.
  for (let pass = 0; pass < 4; pass++) {
    let cut = -1
    for (const f of [0.25, 0.5, 0.75]) {
      const s = t + f * (exit - t)
      if (!holds(line, b, e, s)) { cut = s; break }
    }
    if (cut < 0) break
    hi = cut
    exit = bisectExit(line, b, e, t, hi)
  }
  return exit
}

/**
 * Walks the line a → b from tStart (held by the body) towards tEnd. `tol` is the location
 * tolerance (length units; pointLocation.locationTolerance). Returns a fresh record; when p(tStart)
 * lies in no element the walk is empty and `end` = tStart.
 */
export function walkLine(mesh: Mesh, grid: ElementGrid, a: readonly number[], b: readonly number[], tStart: number, tEnd: number, tol: number): LineWalk {
  const d = [b[0] - a[0], b[1] - a[1], b[2] - a[2]]
  const length = Math.hypot(d[0], d[1], d[2])
  const t0: number[] = [], t1: number[] = [], elem: number[] = [], block: number[] = [], local: number[] = []
  const empty = (end: number): LineWalk => ({
    count: t0.length, t0: Float64Array.from(t0), t1: Float64Array.from(t1), elem: Int32Array.from(elem),
    block: Int32Array.from(block), local: Int32Array.from(local), end,
  })
  if (!(length > 0)) return empty(tStart)
  const line: Line = { mesh, grid, a, d, length, tol }
  const hits: PointHits = allocatePointHits()
  // One step past a face must be clear of the tolerance that counts a point as held.
  const delta = (4 * tol) / length
  let t = tStart
  while (t < tEnd - 2 * delta && t0.length < MAX_SEGMENTS) {
    // The elements that hold the line a step further on carry it: the exit point of the last
    // element may lie a round-off outside its neighbour (the inversion's distance is not the
    // distance to the element), so the step ahead is located, not the exit itself.
    const ta = Math.min(t + delta, tEnd)
    locatePoint(hits, mesh, grid, a[0] + ta * d[0], a[1] + ta * d[1], a[2] + ta * d[2], tol)
    let best = -1, bestExit = t + 2 * delta
    for (let i = 0; i < hits.count; i++) {
      const x = elementExit(line, hits.block[i], hits.elem[i], t, tEnd)
      if (x > bestExit) { best = i; bestExit = x }
    }
    // No element carries the line on: the material ends here.
    if (best < 0) return empty(t)
    t0.push(t); t1.push(bestExit)
    const e = hits.elem[best]
    elem.push(e); block.push(hits.block[best]); local.push(hits.local[best])
    t = bestExit
  }
  // Within two steps of the end: the last segment reaches it.
  if (t0.length > 0 && t >= tEnd - 2 * delta) { t1[t1.length - 1] = tEnd; t = tEnd }
  return empty(Math.min(t, tEnd))
}
