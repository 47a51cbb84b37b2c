/**
 * Through-thickness stress linearisation: the stress along a line through a wall (a stress
 * classification line) split into membrane, bending and peak parts, by the method of the ASME
 * Boiler and Pressure Vessel Code, Section VIII, Division 2, Part 5, Annex 5-A (continuum
 * elements); EN 13445-3, Annex C describes a like method. With x the distance from the line's
 * start (0 ≤ x ≤ t, t the wall thickness along the line):
 *   membrane  σ_m = (1/t) ∫₀ᵗ σ dx                      (every component),
 *   bending   σ_b = (6/t²) ∫₀ᵗ σ (t/2 − x) dx          (at the start; −σ_b at the end),
 *   peak      σ_F = σ − σ_m ∓ σ_b                       (at the start / the end).
 * σ_m and σ_b are a section resultant per unit width: the force and the moment about the
 * mid-thickness that the wall carries, as uniform and linear stresses.
 *
 * The line's frame (the method works in it): e1 along the line (through the wall); e2, e3 in the
 * plane of the wall. Annex 5-A (from memory, 5-A.4.1.2): bending is computed only for the local
 * hoop and meridional normal stresses, not for the component along the line nor for the shear
 * stresses. So bending is kept for σ22 and σ33 and is zero for σ11, σ12, σ23, σ13: the normal
 * stress across the wall and the transverse shears are not linear through a wall even in pure
 * plate bending (they vanish at both surfaces), so a "linear part" of them means nothing.
 * How e2, e3 are chosen:
 * - 'axis': an axis is given (pipes, vessels: the cylindrical axes the components are shown in):
 *   e2 = the hoop direction at the middle of the line (made normal to e1), e3 = e1 × e2 (the
 *   meridional, along the axis for a radial line), as the annex names them;
 * - 'bending': otherwise, the principal directions of the in-plane part of the bending tensor
 *   (e2 the larger in magnitude), so the in-plane shear has no bending part to leave out and
 *   nothing depends on an arbitrary choice; for a shell of revolution these are the hoop and
 *   meridional directions;
 * - 'membrane', 'global': when that part vanishes, the in-plane principal directions of the
 *   membrane tensor, else the global axis least aligned with e1 (made normal to it).
 * Tensors are reported in global axes (rotated back from the frame) and in the frame.
 *
 * Exact integration: the line is split at element boundaries (lineWalk.ts) and each segment is
 * integrated with 5-point Gauss–Legendre (exact for polynomials of degree 9). Along a straight
 * line through an element whose map is affine, the stress is a polynomial of the degree of the
 * shape functions (1 tet4; 2 tet10, wedge6; 3 hex8, wedge15; 4 hex20) and the bending weight
 * adds one, so the integrals are exact there, whatever the number of sample points; on curved
 * or distorted elements, and in pyramids (rational functions), they are accurate, not exact.
 *
 * Equivalent stress: von Mises by default (Division 2 uses it since its 2007 rewrite), Tresca
 * (twice the largest shear) on request (EN 13445-3 uses Tresca; from memory). Classifying the
 * parts and comparing them with allowables is the engineer's task under the applicable code.
 *
 * Units: stress in model stress units, lengths in model length units. Component order of global
 * tensors xx, yy, zz, xy, yz, xz; of frame tensors 11, 22, 33, 12, 23, 13.
 */
import { elementType } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { ComponentAxes } from './componentAxes.ts'
import { basisAt, perpendicularTo, rotateStressInto, unrotateStressInto } from './componentAxes.ts'
import { stressInElement } from './fieldAtPoint.ts'
import { principalStresses, vonMises } from './invariants.ts'
import type { LineWalk } from './lineWalk.ts'
import { invertElementMap } from './mapInversion.ts'
import { gaussLegendre } from './quadrature.ts'

export type EquivalentCriterion = 'vonMises' | 'tresca'

/** The method's name, as every answer carries it. */
export const LINEARISATION_METHOD = 'ASME BPVC Section VIII Division 2, Part 5, Annex 5-A (EN 13445-3 Annex C is alike)'

/** The caution every linearisation shown to a user carries. */
export const LINEARISATION_CAUTION = 'Classifying these parts (primary, secondary, peak) and comparing them with allowables is the engineer\'s task under the applicable code.'

export type FrameRule = 'axis' | 'bending' | 'membrane' | 'global'

export type Tensor6 = [number, number, number, number, number, number]

export interface LinearisationFrame {
  /** Along the line, from its start to its end (through the wall). */
  readonly e1: Vec3
  readonly e2: Vec3
  readonly e3: Vec3
  readonly rule: FrameRule
}

export interface Linearisation {
  /** Wall thickness along the line: the length of the material part (length units). */
  readonly thickness: number
  /** Where the material part starts and ends (length units). */
  readonly start: Vec3
  readonly end: Vec3
  readonly frame: LinearisationFrame
  /** Membrane tensor, global axes. */
  readonly membrane: Tensor6
  /** Bending tensor at the start, global axes (its negative at the end). */
  readonly bending: Tensor6
  /** The same in the line's frame (11, 22, 33, 12, 23, 13); bending is zero but for 22 and 33. */
  readonly membraneLocal: Tensor6
  readonly bendingLocal: Tensor6
  /** Total stress at the start and the end (global axes). */
  readonly totalStart: Tensor6
  readonly totalEnd: Tensor6
  /** Peak = total − membrane ∓ bending at the start and the end (global axes). */
  readonly peakStart: Tensor6
  readonly peakEnd: Tensor6
  readonly criterion: EquivalentCriterion
  readonly membraneEquivalent: number
  readonly membranePlusBendingEquivalent: { readonly from: number; readonly to: number }
  readonly peakEquivalent: { readonly from: number; readonly to: number }
  readonly totalEquivalent: { readonly from: number; readonly to: number }
  /** Element segments integrated. */
  readonly segments: number
}

export interface LinearisationOptions {
  readonly criterion?: EquivalentCriterion
  /** Cylindrical axes give the hoop/meridional frame; global axes (or none) the principal rule. */
  readonly axes?: ComponentAxes
}

/** Equivalent stress of a tensor (xx, yy, zz, xy, yz, xz): von Mises or Tresca (σ1 − σ3). */
export function equivalentStress(s: ArrayLike<number>, criterion: EquivalentCriterion): number {
  if (criterion === 'vonMises') return vonMises(s)
  const p = principalStresses(s, [0, 0, 0])
  return p[0] - p[2]
}

/** Gauss–Legendre points per segment (see the file comment: exact to degree 9). */
const GAUSS = gaussLegendre(5)

const XI = new Float64Array(3), S = new Float64Array(6)

/**
 * Linearises the stress over the material part [tIn, tOut] of the line a → b (fractions of the
 * line), integrating over the segments of `walk` (which must cover it; parts of segments outside
 * [tIn, tOut] are left out). `totalStart`, `totalEnd`: the stress at p(tIn) and p(tOut) (the
 * caller reads them as at any other point of the line).
 */
export function lineariseAlong(
  mesh: Mesh, field: StressField, walk: LineWalk, a: Vec3, b: Vec3, tIn: number, tOut: number,
  totalStart: ArrayLike<number>, totalEnd: ArrayLike<number>, options: LinearisationOptions = {},
): Linearisation {
  const criterion = options.criterion ?? 'vonMises'
  const dx = b[0] - a[0], dy = b[1] - a[1], dz = b[2] - a[2]
  const L = Math.hypot(dx, dy, dz)
  const T = (tOut - tIn) * L
  if (!(T > 0)) throw new RangeError(`linearisation over an empty part of the line (from ${tIn} to ${tOut})`)
  const I0 = new Float64Array(6), I1 = new Float64Array(6)
  const gp = GAUSS.points, gw = GAUSS.weights
  for (let s = 0; s < walk.count; s++) {
    const s0 = Math.max(walk.t0[s], tIn), s1 = Math.min(walk.t1[s], tOut)
    if (!(s1 > s0)) continue
    const bi = walk.block[s], blk = mesh.blocks[bi], topo = elementType(blk.type)
    const base = walk.local[s] * topo.nodeCount
    const mid = 0.5 * (s0 + s1), half = 0.5 * (s1 - s0)
    for (let q = 0; q < gp.length; q++) {
      const t = mid + half * gp[q]
      invertElementMap(XI, topo, mesh.coords, blk.conn, base, a[0] + t * dx, a[1] + t * dy, a[2] + t * dz)
      stressInElement(S, 0, mesh, field, bi, walk.local[s], XI)
      const w = gw[q] * half * L
      const x = (t - tIn) * L
      const lever = T / 2 - x
      for (let k = 0; k < 6; k++) { I0[k] += w * S[k]; I1[k] += w * S[k] * lever }
    }
  }
  const membrane = Array.from(I0, (v) => v / T) as Tensor6
  const bendingAll = Array.from(I1, (v) => (6 * v) / (T * T)) as Tensor6
  const e1: Vec3 = [dx / L, dy / L, dz / L]
  const mid: Vec3 = [a[0] + 0.5 * (tIn + tOut) * dx, a[1] + 0.5 * (tIn + tOut) * dy, a[2] + 0.5 * (tIn + tOut) * dz]
  const frame = lineFrame(e1, mid, membrane, bendingAll, options.axes)
  const R = [...frame.e1, ...frame.e2, ...frame.e3]
  const membraneLocal = rotateStressInto([0, 0, 0, 0, 0, 0], 0, membrane, 0, R) as Tensor6
  const bendingLocal = rotateStressInto([0, 0, 0, 0, 0, 0], 0, bendingAll, 0, R) as Tensor6
  // The annex's rule: bending for the two normal stresses in the plane of the wall only.
  bendingLocal[0] = 0; bendingLocal[3] = 0; bendingLocal[4] = 0; bendingLocal[5] = 0
  const bending = unrotateStressInto([0, 0, 0, 0, 0, 0], 0, bendingLocal, 0, R) as Tensor6
  const ts = Array.from({ length: 6 }, (_, k) => totalStart[k]) as Tensor6
  const te = Array.from({ length: 6 }, (_, k) => totalEnd[k]) as Tensor6
  const peakStart = ts.map((v, k) => v - membrane[k] - bending[k]) as Tensor6
  const peakEnd = te.map((v, k) => v - membrane[k] + bending[k]) as Tensor6
  const eq = (s: ArrayLike<number>): number => equivalentStress(s, criterion)
  return {
    thickness: T,
    start: [a[0] + tIn * dx, a[1] + tIn * dy, a[2] + tIn * dz],
    end: [a[0] + tOut * dx, a[1] + tOut * dy, a[2] + tOut * dz],
    frame, membrane, bending, membraneLocal, bendingLocal, totalStart: ts, totalEnd: te, peakStart, peakEnd, criterion,
    membraneEquivalent: eq(membrane),
    membranePlusBendingEquivalent: { from: eq(membrane.map((v, k) => v + bending[k])), to: eq(membrane.map((v, k) => v - bending[k])) },
    peakEquivalent: { from: eq(peakStart), to: eq(peakEnd) },
    totalEquivalent: { from: eq(ts), to: eq(te) },
    segments: walk.count,
  }
}

/** The line's frame (see the file comment for the rules). */
export function lineFrame(e1: Vec3, mid: Vec3, membrane: ArrayLike<number>, bending: ArrayLike<number>, axes?: ComponentAxes): LinearisationFrame {
  if (axes && axes.kind === 'cylindrical') {
    const B = basisAt([0, 0, 0, 0, 0, 0, 0, 0, 0], axes, mid[0], mid[1], mid[2])
    const h: Vec3 = [B[3], B[4], B[5]]
    const d = h[0] * e1[0] + h[1] * e1[1] + h[2] * e1[2]
    const e2: Vec3 = [h[0] - d * e1[0], h[1] - d * e1[1], h[2] - d * e1[2]]
    const l = Math.hypot(...e2)
    // A line along the hoop direction has no hoop direction across it: the other rules decide.
    if (l > 1e-6) return frameOf(e1, [e2[0] / l, e2[1] / l, e2[2] / l], 'axis', false)
  }
  const u = perpendicularTo([0, 0, 0], e1[0], e1[1], e1[2]) as Vec3
  const v: Vec3 = [e1[1] * u[2] - e1[2] * u[1], e1[2] * u[0] - e1[0] * u[2], e1[0] * u[1] - e1[1] * u[0]]
  const scale = Math.max(...Array.from(membrane, Math.abs), ...Array.from(bending, Math.abs))
  for (const [tensor, rule] of [[bending, 'bending'], [membrane, 'membrane']] as const) {
    const uu = quadForm(tensor, u, u), vv = quadForm(tensor, v, v), uv = quadForm(tensor, u, v)
    // In-plane principal directions exist when the in-plane deviator is above round-off.
    if (Math.hypot(0.5 * (uu - vv), uv) > 1e-9 * scale) {
      const th = 0.5 * Math.atan2(2 * uv, uu - vv)
      const c = Math.cos(th), s = Math.sin(th)
      const p: Vec3 = [c * u[0] + s * v[0], c * u[1] + s * v[1], c * u[2] + s * v[2]]
      const q: Vec3 = [-s * u[0] + c * v[0], -s * u[1] + c * v[1], -s * u[2] + c * v[2]]
      // e2: the principal direction of the larger magnitude.
      const lp = quadForm(tensor, p, p), lq = quadForm(tensor, q, q)
      return frameOf(e1, Math.abs(lp) >= Math.abs(lq) ? p : q, rule, true)
    }
  }
  return frameOf(e1, u, 'global', true)
}

/** e3 = e1 × e2; `canonical`: e2's largest component made positive (its sign is a free choice). */
function frameOf(e1: Vec3, e2in: Vec3, rule: FrameRule, canonical: boolean): LinearisationFrame {
  let e2 = e2in
  if (canonical) {
    let k = 0
    for (let i = 1; i < 3; i++) if (Math.abs(e2[i]) > Math.abs(e2[k])) k = i
    if (e2[k] < 0) e2 = [-e2[0], -e2[1], -e2[2]]
  }
  const e3: Vec3 = [e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2], e1[0] * e2[1] - e1[1] * e2[0]]
  return { e1, e2, e3, rule }
}

/** aᵀ σ b for σ given as xx, yy, zz, xy, yz, xz. */
function quadForm(s: ArrayLike<number>, a: ArrayLike<number>, b: ArrayLike<number>): number {
  return a[0] * (s[0] * b[0] + s[3] * b[1] + s[5] * b[2]) +
    a[1] * (s[3] * b[0] + s[1] * b[1] + s[4] * b[2]) +
    a[2] * (s[5] * b[0] + s[4] * b[1] + s[2] * b[2])
}
