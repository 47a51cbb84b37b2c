/**
 * A line through the model, as the viewer and the command line ask for it: the values sampled
 * along it (lineSampling.ts), their components in the chosen axes (componentAxes.ts), and the
 * through-thickness linearisation (linearisation.ts) over its material part, with the warnings
 * and refusals a user needs to trust it.
 *
 * The material part: a linearisation needs the line to run through the wall from one surface to
 * the other. An end counts as on the surface when the body's boundary lies within the surface
 * tolerance (2 % of the line's length by default) of it, on either side: a point picked on a
 * curved face drawn with flat triangles lies off the true face by about the chord's sag. Such an
 * end is moved onto the boundary (with a note when it moved by more than 10⁻⁶ of the line). An end
 * inside the body with material beyond the tolerance is kept, with a warning: the result is then
 * not a through-wall linearisation. An end outside the body by more than the tolerance, and a line
 * that leaves the body between its ends, are refused for linearisation (the sampled values are
 * still reported; their gaps show where the line is outside).
 *
 * Units: model units throughout. Field-agnostic: a StressField and a nodal displacement array.
 */
import { InputError } from '../model/errors.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { ComponentAxes } from './componentAxes.ts'
import { basisAt, checkAxes, rotateStressInto, rotateVectorInto } from './componentAxes.ts'
import type { ElementGrid } from './elementGrid.ts'
import { meanStressAt } from './fieldAtPoint.ts'
import type { EquivalentCriterion, Linearisation } from './linearisation.ts'
import { lineariseAlong } from './linearisation.ts'
import type { LineSamples } from './lineSampling.ts'
import { sampleLine } from './lineSampling.ts'
import type { LineWalk } from './lineWalk.ts'
import { walkLine } from './lineWalk.ts'
import { checkPoint } from './plane.ts'
import { allocatePointHits, locatePoint, locationTolerance } from './pointLocation.ts'

/** Default surface tolerance: 2 % of the line's length (see the file comment). */
export const SURFACE_TOLERANCE = 0.02

/** Most sample points of one line. */
export const MAX_LINE_POINTS = 100_000

export interface LineRequest {
  readonly from: Vec3
  readonly to: Vec3
  /** Sample points, ≥ 2. */
  readonly points: number
  readonly criterion?: EquivalentCriterion
  /** Axes of the reported components and of the linearisation frame (global by default). */
  readonly axes?: ComponentAxes
  /** Fraction of the line's length within which an end counts as on the surface. */
  readonly surfaceTolerance?: number
}

export interface LineAnalysis {
  readonly from: Vec3
  readonly to: Vec3
  readonly samples: LineSamples
  readonly axes: ComponentAxes
  /** Stress (6P) and displacement (3P) in `axes` (the global ones repeat samples' arrays). */
  readonly components: Float64Array
  readonly displacementComponents: Float64Array | null
  readonly linearisation: Linearisation | null
  /** Why there is no linearisation (a sentence), or null. */
  readonly refused: string | null
  /** What the user should know about the line (sentences). */
  readonly warnings: readonly string[]
  /** True when no sample point lies in the body. */
  readonly outside: boolean
}

/**
 * Checks a line request: finite ends, distinct, 2 ≤ points ≤ MAX_LINE_POINTS. Violations are
 * InputErrors naming the field (the command line reports them as usage errors).
 */
export function checkLineRequest(req: LineRequest): void {
  checkPoint(req.from, 'line start')
  checkPoint(req.to, 'line end')
  const L = Math.hypot(req.to[0] - req.from[0], req.to[1] - req.from[1], req.to[2] - req.from[2])
  if (!(L > 0)) throw new InputError('bad-argument', `the line starts and ends at the same point (${req.from.join(', ')}); give two different points`, { field: 'to' })
  if (!Number.isInteger(req.points) || req.points < 2 || req.points > MAX_LINE_POINTS) {
    throw new InputError('bad-argument', `a line needs from 2 to ${MAX_LINE_POINTS} sample points (got ${req.points})`, { field: 'points' })
  }
}

/** Samples and linearises the line of `req` (see the file comment). */
export function analyseLine(mesh: Mesh, grid: ElementGrid, field: StressField, displacement: Float64Array | null, req: LineRequest): LineAnalysis {
  checkLineRequest(req)
  const axes = checkAxes(req.axes ?? { kind: 'global' })
  const tol = locationTolerance(grid)
  const samples = sampleLine(mesh, grid, field, displacement, req.from, req.to, req.points, tol)
  const P = samples.count
  let components = samples.stress, displacementComponents = samples.displacement
  if (axes.kind !== 'global') {
    components = new Float64Array(6 * P)
    displacementComponents = samples.displacement ? new Float64Array(3 * P) : null
    const R = new Float64Array(9)
    for (let i = 0; i < P; i++) {
      basisAt(R, axes, samples.points[3 * i], samples.points[3 * i + 1], samples.points[3 * i + 2])
      rotateStressInto(components, 6 * i, samples.stress, 6 * i, R)
      if (displacementComponents && samples.displacement) rotateVectorInto(displacementComponents, 3 * i, samples.displacement, 3 * i, R)
    }
  }
  let outside = true
  for (let i = 0; i < P; i++) if (samples.held[i] > 0) { outside = false; break }
  const warnings: string[] = []
  const part = materialPart(mesh, grid, req.from, req.to, tol, req.surfaceTolerance ?? SURFACE_TOLERANCE, warnings)
  let linearisation: Linearisation | null = null
  let refused: string | null = null
  if (typeof part === 'string') refused = part
  else {
    const hits = allocatePointHits()
    const at = (t: number): Float64Array => {
      const s = new Float64Array(6)
      locatePoint(hits, mesh, grid, ...pointAt(req.from, req.to, t), tol)
      meanStressAt(s, 0, mesh, field, hits)
      return s
    }
    linearisation = lineariseAlong(mesh, field, part.walk, req.from, req.to, part.tIn, part.tOut, at(part.tIn), at(part.tOut), { criterion: req.criterion, axes })
  }
  return { from: req.from, to: req.to, samples, axes, components, displacementComponents, linearisation, refused, warnings, outside }
}

function pointAt(a: Vec3, b: Vec3, t: number): [number, number, number] {
  return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), a[2] + t * (b[2] - a[2])]
}

function heldAt(mesh: Mesh, grid: ElementGrid, a: Vec3, b: Vec3, t: number, tol: number): boolean {
  return locatePoint(HITS, mesh, grid, ...pointAt(a, b, t), tol).count > 0
}

const HITS = allocatePointHits()

/**
 * A distance along the line for messages, as a share of its length (messages carry no units: the
 * viewer and the command line show lengths in different systems): "1.5 % of the line's length".
 */
function share(t: number): string {
  return `${Number((100 * t).toPrecision(3))} % of the line's length`
}

/**
 * The part of the line a → b to linearise over, as fractions [tIn, tOut] with its element walk,
 * or the reason (a sentence) it cannot be linearised. Notes and warnings go to `warnings`.
 */
export function materialPart(
  mesh: Mesh, grid: ElementGrid, a: Vec3, b: Vec3, tol: number, surfaceTolerance: number, warnings: string[],
): { tIn: number; tOut: number; walk: LineWalk } | string {
  const L = Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2])
  const tau = surfaceTolerance
  const note = 1e-6
  let tIn: number
  if (heldAt(mesh, grid, a, b, 0, tol)) {
    // Inside: how far does the material reach behind the start? Walk the reversed line.
    const back = walkLine(mesh, grid, b, a, 1, 1 + tau, tol)
    const behind = back.end - 1
    if (behind >= tau * (1 - 1e-9)) {
      tIn = 0
      warnings.push(`The start of the line lies inside the body (the material continues more than ${share(tau)} behind it), not on its surface: the linearisation is not through the whole wall.`)
    } else {
      tIn = -behind
      if (behind > note) warnings.push(`The start of the line lay ${share(behind)} inside the surface; the linearisation starts on the surface.`)
    }
  } else {
    // Outside: the surface must be within the tolerance ahead.
    let first = -1
    for (let k = 1; k <= 16; k++) if (heldAt(mesh, grid, a, b, (k / 16) * tau, tol)) { first = (k / 16) * tau; break }
    if (first < 0) return `the start of the line lies outside the body (no material within ${share(tau)} of it along the line); put both ends on the wall's surfaces`
    // The surface to a thousandth of the location tolerance, as the walk finds element exits.
    let lo = first - tau / 16, hi = first
    for (let it = 0; it < 200 && (hi - lo) * L > 1e-3 * tol; it++) {
      const mid = 0.5 * (lo + hi)
      if (heldAt(mesh, grid, a, b, mid, 1e-3 * tol)) hi = mid
      else lo = mid
    }
    tIn = hi
    if (tIn > note) warnings.push(`The start of the line lay ${share(tIn)} outside the surface; the linearisation starts on the surface.`)
  }
  const walk = walkLine(mesh, grid, a, b, tIn, 1 + tau, tol)
  const end = walk.end
  if (end < 1 - tau) {
    return `the line leaves the body at ${Number((100 * end).toPrecision(3))} % of its length from the start; a linearisation needs material all along the line`
  }
  let tOut: number
  if (end >= 1 + tau * (1 - 1e-9)) {
    tOut = 1
    warnings.push(`The end of the line lies inside the body (the material continues more than ${share(tau)} beyond it), not on its surface: the linearisation is not through the whole wall.`)
  } else {
    tOut = end
    if (Math.abs(end - 1) > note) warnings.push(`The end of the line lay ${share(Math.abs(end - 1))} ${end < 1 ? 'outside' : 'inside'} the surface; the linearisation ends on the surface.`)
  }
  return { tIn, tOut, walk }
}

/**
 * The line through the body along from → to, stretched or shortened to where it enters and
 * leaves the material (the wall's two surfaces), starting from the held sample point nearest the
 * middle of the given line. Null when no point of the line (33 tried) lies in the body.
 */
export function lineThroughWall(mesh: Mesh, grid: ElementGrid, from: Vec3, to: Vec3): { from: Vec3; to: Vec3 } | null {
  const tol = locationTolerance(grid)
  const L = Math.hypot(to[0] - from[0], to[1] - from[1], to[2] - from[2])
  if (!(L > 0)) return null
  let t0 = NaN
  for (let k = 0; k <= 32 && Number.isNaN(t0); k++) {
    // 0.5, 0.5 ± 1/32, ±2/32 ...: nearest the middle first.
    const t = 0.5 + (k % 2 === 0 ? 1 : -1) * Math.ceil(k / 2) / 32
    if (heldAt(mesh, grid, from, to, t, tol)) t0 = t
  }
  if (Number.isNaN(t0)) return null
  const reach = grid.size / L + 1
  const ahead = walkLine(mesh, grid, from, to, t0, t0 + reach, tol).end
  const behind = 1 - walkLine(mesh, grid, to, from, 1 - t0, 1 - t0 + reach, tol).end
  return { from: pointAt(from, to, behind), to: pointAt(from, to, ahead) }
}
