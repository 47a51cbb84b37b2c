/**
 * Mesh error or model error? A verdict in words on the whole-body balance.
 *
 * A valid finite-element result read back with recovered nodal stress is never exactly in
 * balance: the recovery leaves traction on faces that carry no load and misses some at singular
 * supports, and the surface integral picks that up (5–15 % of the gross load on coarse meshes is
 * usual). A reviewer must be able to tell that from a result whose stress does not belong to its
 * model (a missing or wrong body force, a stress file from another mesh or node numbering).
 *
 * Figures (all dimensionless):
 * - total = |R| / G, R = ∮ t dA + ∫ ρb dV over the body, G its gross load (balanceAudit.ts);
 * - free = |R_free| / G, R_free = ∫ t dA over the nominally free surface (faces outside every
 *   load-entry patch), and load = |R − R_free| / G, what the loaded patches and ρb leave;
 * - freeLevel = free-surface mean |t| over the reference stress (loadPatches.ts);
 * - median = median element balance indicator |r_e| / g_e (balanceAudit.ts);
 * - coherence = |Σ r_e| / Σ |r_e| over the elements: near 1 when every element is out of balance
 *   in the same direction, as a body force the stress does not carry makes it (each element is
 *   off by ρb·V_e); discretisation error points every which way and stays well below (0.15–0.4
 *   on the solved cantilevers and columns of the tests, 0.96–1.0 with ρb missing or doubled).
 *
 * The rule, in this order (thresholds ours, from those solved models; no code gives them):
 *   1. total ≤ 1 %: `mesh` — in balance to that figure.
 *   2. coherence ≥ 0.9: `model` — the stress balances another body force; the message gives the
 *      body force per unit volume it implies, ρb_implied = ρb_declared − Σ r_e / V.
 *   3. median ≥ 0.25 or freeLevel ≥ 0.25: `model` — half the elements are out of balance by a
 *      quarter of their own load, or the free surface carries traction of the order of the
 *      stress: a stress field that does not belong to this mesh (sound coarse meshes stay under
 *      0.1 and 0.03).
 *   4. median ≤ 0.1 and freeLevel ≤ 0.1: `mesh` — consistent with the discretisation; the message
 *      says how much the free surface and the loaded patches each leave.
 *   5. otherwise `inconclusive`, with the figures.
 */
import type { Vec3 } from '../model/model.ts'
import { percentiles } from './balanceAudit.ts'
import { topIndices } from './leastBalanced.ts'
import type { BodyBalance, BoundaryFaces, ElementBalance, LoadPatches, SurfaceTractions } from './types.ts'

export type BalanceVerdictKind = 'mesh' | 'model' | 'inconclusive'

export interface BalanceVerdict {
  readonly kind: BalanceVerdictKind
  /** One sentence a reviewer can read: the verdict's reason with its figures. */
  readonly reason: string
}

/** The body residual split by where it arises (model force units), the figures and the verdict. */
export interface BalanceSplit {
  /** Net force ∫ t dA over the nominally free surface. */
  readonly freeSurfaceForce: Vec3
  /** What the loaded patches and the body force leave: residual − freeSurfaceForce. */
  readonly loadForce: Vec3
  /** |freeSurfaceForce| / gross and |loadForce| / gross (0 when gross is 0). */
  readonly freeRelative: number
  readonly loadRelative: number
  /** |Σ r_e| / Σ |r_e| over the elements (0 when every element balances). */
  readonly coherence: number
  /** The body force per unit volume the stress balances: declared ρb − Σ r_e / V. */
  readonly impliedBodyForce: Vec3
  readonly verdict: BalanceVerdict
}

/** The pipeline's verdict stage: the split, and the spread of the element indicator it used. */
export interface BalanceVerdictResult extends BalanceSplit {
  /** Median, 95th percentile and largest element balance indicator (NaN for an empty mesh). */
  readonly indicator: { readonly p50: number; readonly p95: number; readonly max: number }
  /** Global indices of the least balanced elements, largest indicator first (leastBalanced.ts). */
  readonly leastBalanced: readonly number[]
}

/** How many of the least balanced elements the verdict stage lists unless told otherwise. */
export const LEAST_BALANCED_COUNT = 5

export const VERDICT_BALANCED = 0.01
export const VERDICT_COHERENT = 0.9
export const VERDICT_MODEL_LEVEL = 0.25
export const VERDICT_MESH_LEVEL = 0.1

/** Inputs of the decision rule (see the file header). */
export interface VerdictFigures {
  readonly total: number
  readonly free: number
  readonly load: number
  readonly freeLevel: number
  readonly median: number
  readonly coherence: number
  readonly declared: Vec3
  readonly implied: Vec3
}

const pct = (x: number): string => {
  const p = 100 * x
  return p >= 10 ? `${p.toFixed(0)} %` : p >= 0.1 ? `${p.toFixed(1)} %` : `${p.toPrecision(1)} %`
}
/** A vector to three digits; components below 1e-6 of its largest are rounding noise, shown as 0. */
const vec = (v: Vec3): string => {
  const big = Math.max(Math.abs(v[0]), Math.abs(v[1]), Math.abs(v[2]))
  return `(${v.map((x) => (Math.abs(x) <= 1e-6 * big ? '0' : x.toPrecision(3))).join(', ')})`
}

/**
 * Splits the body residual and gives the verdict. `bodyForce`: the declared ρb (model units);
 * `medianIndicator`: the median of `elements.indicator` (the caller has it from its summary).
 */
export function balanceSplit(
  faces: BoundaryFaces, tractions: SurfaceTractions, patches: LoadPatches, body: BodyBalance,
  elements: ElementBalance, medianIndicator: number, bodyForce: Vec3,
): BalanceSplit {
  const label = patches.faceLabel, F = tractions.force
  let fx = 0, fy = 0, fz = 0
  for (let f = 0; f < faces.count; f++) {
    if (label[f] !== -1) continue // a loaded face: its force is a load, not recovery error
    fx += F[3 * f]; fy += F[3 * f + 1]; fz += F[3 * f + 2]
  }
  const r = elements.residual, E = r.length / 3
  let sx = 0, sy = 0, sz = 0, sabs = 0
  for (let e = 0; e < E; e++) {
    const a = r[3 * e], b = r[3 * e + 1], c = r[3 * e + 2]
    sx += a; sy += b; sz += c; sabs += Math.sqrt(a * a + b * b + c * c)
  }
  const coherence = sabs > 0 ? Math.hypot(sx, sy, sz) / sabs : 0
  const V = body.volume
  // Σ r_e = ∫ (div σ + ρb) dV elementwise, so the stress balances ρb − Σ r_e / V on average.
  const impliedBodyForce: Vec3 = V > 0 ? [bodyForce[0] - sx / V, bodyForce[1] - sy / V, bodyForce[2] - sz / V] : [bodyForce[0], bodyForce[1], bodyForce[2]]
  const freeSurfaceForce: Vec3 = [fx, fy, fz]
  const R = body.force
  const loadForce: Vec3 = [R[0] - fx, R[1] - fy, R[2] - fz]
  const g = body.gross
  const freeRelative = g > 0 ? Math.hypot(fx, fy, fz) / g : 0
  const loadRelative = g > 0 ? Math.hypot(loadForce[0], loadForce[1], loadForce[2]) / g : 0
  const verdict = decideBalance({
    total: body.relative, free: freeRelative, load: loadRelative, freeLevel: patches.freeSurface.relative,
    median: medianIndicator, coherence, declared: bodyForce, implied: impliedBodyForce,
  })
  return { freeSurfaceForce, loadForce, freeRelative, loadRelative, coherence, impliedBodyForce, verdict }
}

/** The decision rule of the file header. */
export function decideBalance(x: VerdictFigures): BalanceVerdict {
  if (!Number.isFinite(x.total) || !Number.isFinite(x.median) || !Number.isFinite(x.freeLevel)) {
    // an empty body or a non-finite stress: no figure to judge by
    return { kind: 'inconclusive', reason: 'inconclusive: the balance figures are not finite numbers (an empty body or a non-finite stress value)' }
  }
  if (x.total <= VERDICT_BALANCED) {
    return { kind: 'mesh', reason: `in balance: the residual force is ${pct(x.total)} of the gross load` }
  }
  if (x.coherence >= VERDICT_COHERENT) {
    return {
      kind: 'model',
      reason: `inconsistent: the elements are out of balance all in one direction, as a body force the stress does not carry makes them; ` +
        `the stress balances a body force of about ${vec(x.implied)} per unit volume, the model declares ${vec(x.declared)} (check ρb, its sign and its units)`,
    }
  }
  if (x.median >= VERDICT_MODEL_LEVEL || x.freeLevel >= VERDICT_MODEL_LEVEL) {
    const what = x.median >= VERDICT_MODEL_LEVEL
      ? `half the elements are out of balance by ${pct(x.median)} or more of their own load`
      : `the nominally free surface carries a mean traction of ${pct(x.freeLevel)} of the reference stress`
    return { kind: 'model', reason: `inconsistent: ${what}; the stress may belong to another mesh or node numbering, or loads act where the model shows none` }
  }
  if (x.median <= VERDICT_MESH_LEVEL && x.freeLevel <= VERDICT_MESH_LEVEL) {
    return {
      kind: 'mesh',
      reason: `consistent with the mesh: the residual (${pct(x.total)} of the gross load) is what the stress recovery leaves: ` +
        `the free surface carries ${pct(x.free)} and the loaded patches and body force leave ${pct(x.load)}; ` +
        `the median element is in balance to ${pct(x.median)}; a finer mesh reduces it`,
    }
  }
  return {
    kind: 'inconclusive',
    reason: `inconclusive: the residual is ${pct(x.total)} of the gross load, the median element is out of balance by ${pct(x.median)} ` +
      `and the free surface carries a mean traction of ${pct(x.freeLevel)} of the reference stress; refine the mesh or check the loads`,
  }
}

/** The spread of the element indicator the verdict reads: median, 95th percentile, largest, and the least balanced elements. */
export type IndicatorSpread = Pick<BalanceVerdictResult, 'indicator' | 'leastBalanced'>

/** The indicator's spread (percentiles by selection, percentiles.ts) and the `count` least balanced elements (one pass). */
export function indicatorSpread(indicator: ArrayLike<number>, count = LEAST_BALANCED_COUNT): IndicatorSpread {
  const [p50, p95, max] = percentiles(indicator, [50, 95, 100])
  return { indicator: { p50, p95, max }, leastBalanced: topIndices(indicator, count) }
}

/**
 * The verdict stage of the analysis pipeline: the indicator's spread (shared with the cards and
 * the audit command; a caller that computed it elsewhere, the engine's pool, hands it in), the
 * least balanced elements and the split with its verdict.
 */
export function computeBalanceVerdict(
  faces: BoundaryFaces, tractions: SurfaceTractions, patches: LoadPatches, body: BodyBalance, elements: ElementBalance, bodyForce: Vec3,
  leastBalancedCount = LEAST_BALANCED_COUNT, spread: IndicatorSpread = indicatorSpread(elements.indicator, leastBalancedCount),
): BalanceVerdictResult {
  return { ...balanceSplit(faces, tractions, patches, body, elements, spread.indicator.p50, bodyForce), ...spread }
}
