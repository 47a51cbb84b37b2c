/**
 * Section axes: the in-plane directions e1, e2 (with e3 = m, the unit section normal) that the
 * section resultant is resolved in (shears V1 = F·e1, V2 = F·e2; bending M1 = M·e1, M2 = M·e2).
 *
 * Two choices (the user's):
 * - `principal`: e1, e2 the principal axes of the section's area about its centroid, I1 ≥ I2,
 *   e1 the axis about which the second moment is I1 (the stiff bending axis). Where I1 − I2 is at
 *   most 1 % of I1 (a square bar, a round bolt, a tunnel in a square block) the principal axes are
 *   decided by round-off, so e1 follows the reference direction instead (`followsReference`).
 * - `reference`: e1 = the projection onto the plane of a reference direction r, normalised;
 *   e2 = e3 × e1. A reference parallel to m has no projection and is refused (InputError).
 * Either way the reference fixes the signs: principal e1 is the one of ±e1 within [−90°, 90°) of
 * the projected reference, turning about e3 (so e1 = r̂ × e3 when e1 is perpendicular to it).
 *
 * Default reference (no r given): the first of x, y, z whose projection onto the plane is
 * longest, i.e. the axis with the smallest |m_i|, ties in the order x, y, z (ours; a cut normal
 * to x then has e1 = y, e2 = z, so M1 = My and M2 = Mz; normal to z: e1 = x, e2 = y). A sweep
 * uses one reference for all its sections, so its axes do not jump from section to section.
 *
 * Second moments about the chosen axes (length⁴), with p = (x − c)·e1, q = (x − c)·e2:
 * I1 = ∫ q² dA (about e1), I2 = ∫ p² dA (about e2), I12 = ∫ p q dA (0 for principal axes).
 *
 * Input: the centroidal area tensor in the section frame (u, v, m) of sectionPolygon.ts
 * (`sectionFrame`, u × v = m): Juu = ∫ b² dA, Jvv = ∫ a² dA, Puv = ∫ a b dA, with a = (x − c)·u,
 * b = (x − c)·v.
 */
import { InputError } from '../model/errors.ts'
import type { Vec3 } from '../model/model.ts'

export type SectionAxesKind = 'principal' | 'reference'

/** What the user asks for: principal or reference axes, with an optional reference direction. */
export interface SectionAxesChoice {
  readonly kind: SectionAxesKind
  /** Reference direction r (any length, not parallel to m); absent: the default of this file's header. */
  readonly reference?: Vec3 | null
}

/** The axes a section was resolved in, and why. */
export interface SectionAxes {
  readonly kind: SectionAxesKind
  /** The reference direction used (unit vector), given or default. */
  readonly reference: Vec3
  readonly e1: Vec3
  readonly e2: Vec3
  readonly e3: Vec3
  /** Principal axes whose moments lie within EQUAL_MOMENTS of each other: e1 follows the reference. */
  readonly followsReference: boolean
}

/** Principal moments closer than this fraction of I1 count as equal (the axes then follow the reference). */
export const EQUAL_MOMENTS = 0.01

/** A projection shorter than this fraction of |r| counts as none (r parallel to m). */
const PARALLEL = 1e-6

export const PRINCIPAL_AXES: SectionAxesChoice = { kind: 'principal' }

/** The default reference for unit normal m: x, y or z, the one with the smallest |m_i| (ties x, y, z). */
export function defaultReference(m: Vec3): Vec3 {
  const a = [Math.abs(m[0]), Math.abs(m[1]), Math.abs(m[2])]
  // A tie up to round-off (a normal of (1, 1, 0)/√2) goes to the earlier axis.
  const tol = 1e-12
  let k = 0
  if (a[1] < a[k] - tol) k = 1
  if (a[2] < a[k] - tol) k = 2
  return k === 0 ? [1, 0, 0] : k === 1 ? [0, 1, 0] : [0, 0, 1]
}

const fmt = (v: readonly number[]): string => `(${v.map((x) => Number(x.toPrecision(4))).join(', ')})`

/**
 * The unit projection of `reference` onto the plane with unit normal m. A reference that is zero,
 * not finite or parallel to m is refused with an InputError naming `field`.
 */
export function projectReference(m: Vec3, reference: Vec3, field = 'reference'): Vec3 {
  const [rx, ry, rz] = reference
  const len = Math.hypot(rx, ry, rz)
  if (!(len > 0) || !Number.isFinite(len)) {
    throw new InputError('bad-argument', `the reference direction ${fmt(reference)} has no direction; give three finite numbers, not all zero`, { field })
  }
  const d = rx * m[0] + ry * m[1] + rz * m[2]
  const px = rx - d * m[0], py = ry - d * m[1], pz = rz - d * m[2]
  const p = Math.hypot(px, py, pz)
  if (!(p > PARALLEL * len)) {
    throw new InputError('bad-argument',
      `the reference direction ${fmt(reference)} is parallel to the section normal ${fmt(m)}, so it has no projection onto the plane; give a direction that is not parallel to the normal`,
      { field })
  }
  return [px / p, py / p, pz / p]
}

/** Unit reference direction of a choice for normal m (given or default). */
export function referenceOf(m: Vec3, choice: SectionAxesChoice | undefined): Vec3 {
  const r = choice?.reference
  if (!r) return defaultReference(m)
  const l = Math.hypot(r[0], r[1], r[2])
  return l > 0 && Number.isFinite(l) ? [r[0] / l, r[1] / l, r[2] / l] : defaultReference(m)
}

/** Axes for a section with no area (the plane misses the body): e1 = the projected reference. */
export function axesWithoutArea(m: Vec3, choice: SectionAxesChoice | undefined): SectionAxes {
  const reference = referenceOf(m, choice)
  const e1 = projectReference(m, reference)
  return { kind: choice?.kind ?? 'principal', reference, e1, e2: cross(m, e1), e3: [m[0], m[1], m[2]], followsReference: true }
}

/**
 * Axes and second moments of a section from its centroidal area tensor (see the file header).
 * `frame`: u (0..2), v (3..5), m (6..8) of sectionFrame.
 */
export function resolveSectionAxes(
  frame: ArrayLike<number>, Juu: number, Jvv: number, Puv: number, choice: SectionAxesChoice | undefined,
): { axes: SectionAxes; I1: number; I2: number; I12: number } {
  const m: Vec3 = [frame[6], frame[7], frame[8]]
  const reference = referenceOf(m, choice)
  const r = projectReference(m, reference)
  // r in the frame: angle φ from u
  const ru = r[0] * frame[0] + r[1] * frame[1] + r[2] * frame[2]
  const rv = r[0] * frame[3] + r[1] * frame[4] + r[2] * frame[5]
  const mean = 0.5 * (Juu + Jvv), half = 0.5 * (Juu - Jvv)
  const rad = Math.hypot(half, Puv)
  const kind = choice?.kind ?? 'principal'
  let c: number, s: number, followsReference = false
  if (kind === 'principal' && !(2 * rad <= EQUAL_MOMENTS * (mean + rad))) {
    // Eigenvector of the larger eigenvalue of [[Juu, −P], [−P, Jvv]] at angle θ from u:
    // tan 2θ = −2P / (Juu − Jvv).
    const theta = 0.5 * Math.atan2(-Puv, half)
    c = Math.cos(theta); s = Math.sin(theta)
    // Sign: within [−90°, 90°) of the reference, turning about m.
    const along = c * ru + s * rv // cos of the angle from r to e1
    const across = ru * s - rv * c // sin of that angle (r × e1 · m)
    if (along < -1e-9 || (Math.abs(along) <= 1e-9 && across > 0)) { c = -c; s = -s }
  } else {
    c = ru; s = rv
    followsReference = kind === 'principal'
  }
  const e1: Vec3 = [c * frame[0] + s * frame[3], c * frame[1] + s * frame[4], c * frame[2] + s * frame[5]]
  const e2 = cross(m, e1)
  // p = c a + s b, q = −s a + c b: I1 = ∫ q², I2 = ∫ p², I12 = ∫ p q.
  let I1 = c * c * Juu - 2 * c * s * Puv + s * s * Jvv
  let I2 = s * s * Juu + 2 * c * s * Puv + c * c * Jvv
  let I12 = c * s * (Juu - Jvv) + (c * c - s * s) * Puv
  if (kind === 'principal' && !followsReference) { I1 = mean + rad; I2 = mean - rad; I12 = 0 }
  return { axes: { kind, reference, e1, e2, e3: m, followsReference }, I1, I2, I12 }
}

/** The axes in words, for tables and cards: which kind, and why e1 lies where it does. */
export function describeAxes(axes: SectionAxes): string {
  const r = fmt(axes.reference.map((v) => (Math.abs(v) < 1e-12 ? 0 : v)))
  if (axes.kind === 'reference') return `reference axes: e1 is the projection of ${r} onto the plane`
  if (axes.followsReference) return `principal axes; I1 and I2 are within 1 %, so e1 follows the reference ${r}`
  const along = axes.e1[0] * axes.reference[0] + axes.e1[1] * axes.reference[1] + axes.e1[2] * axes.reference[2]
  return Math.abs(along) <= 1e-9
    ? `principal axes (I1 ≥ I2); e1 is perpendicular to the reference ${r}, so e2 lies along it`
    : `principal axes (I1 ≥ I2), e1 signed towards the reference ${r}`
}

function cross(a: Vec3, b: Vec3): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}
