/**
 * The reference domains of the element families, in reference coordinates (ξ, η, ζ):
 * - tetrahedron 0 ≤ ξ, η, ζ, ξ + η + ζ ≤ 1 (volume 1/6);
 * - cube [-1, 1]³ (volume 8);
 * - wedge: triangle 0 ≤ ξ, η, ξ + η ≤ 1 times ζ ∈ [-1, 1] (volume 1);
 * - pyramid: base [-1, 1]² at ζ = 0, apex (0, 0, 1), |ξ|, |η| ≤ 1 - ζ (volume 4/3).
 *
 * Each domain gives its centroid (where the inversion of an element's map starts), a projection
 * into the closed domain (round-off and points just outside an element land on its boundary), and
 * the collapsed-cube map from [0, 1]³ onto the domain (for sampling it evenly in tests, and the
 * map the collapsed quadrature rules are built on).
 */

export type DomainName = 'tetrahedron' | 'cube' | 'wedge' | 'pyramid'

export interface ReferenceDomain {
  readonly name: DomainName
  readonly volume: number
  /** Reference centroid: the start point for inverting x(ξ) by Newton's method. */
  readonly centroid: readonly [number, number, number]
  /** Moves the reference point p (3 numbers, changed in place) into the closed domain. */
  clamp(p: Float64Array | number[]): void
  /** Writes the image of (u, v, w) ∈ [0, 1]³ to out (onto the domain; collapsed where it narrows). */
  fromUnitCube(out: Float64Array | number[], u: number, v: number, w: number): void
}

const clampUnit = (x: number): number => Math.min(1, Math.max(-1, x))

/** Clamps (p[0], p[1]) into the triangle 0 ≤ ξ, η, ξ + η ≤ 1: negatives to 0, then scaled onto ξ + η = 1. */
function clampTriangle(p: Float64Array | number[]): void {
  p[0] = Math.max(0, p[0]); p[1] = Math.max(0, p[1])
  const s = p[0] + p[1]
  if (s > 1) { p[0] /= s; p[1] /= s }
}

export const TETRAHEDRON: ReferenceDomain = {
  name: 'tetrahedron', volume: 1 / 6, centroid: [0.25, 0.25, 0.25],
  clamp(p) {
    p[0] = Math.max(0, p[0]); p[1] = Math.max(0, p[1]); p[2] = Math.max(0, p[2])
    const s = p[0] + p[1] + p[2]
    if (s > 1) { p[0] /= s; p[1] /= s; p[2] /= s }
  },
  fromUnitCube(out, u, v, w) {
    out[0] = u; out[1] = (1 - u) * v; out[2] = (1 - u) * (1 - v) * w
  },
}

export const CUBE: ReferenceDomain = {
  name: 'cube', volume: 8, centroid: [0, 0, 0],
  clamp(p) {
    p[0] = clampUnit(p[0]); p[1] = clampUnit(p[1]); p[2] = clampUnit(p[2])
  },
  fromUnitCube(out, u, v, w) {
    out[0] = 2 * u - 1; out[1] = 2 * v - 1; out[2] = 2 * w - 1
  },
}

export const WEDGE: ReferenceDomain = {
  name: 'wedge', volume: 1, centroid: [1 / 3, 1 / 3, 0],
  clamp(p) {
    clampTriangle(p)
    p[2] = clampUnit(p[2])
  },
  fromUnitCube(out, u, v, w) {
    out[0] = u; out[1] = (1 - u) * v; out[2] = 2 * w - 1
  },
}

export const PYRAMID: ReferenceDomain = {
  // Centroid of a cone: a quarter of the height above the base.
  name: 'pyramid', volume: 4 / 3, centroid: [0, 0, 0.25],
  clamp(p) {
    const z = Math.min(1, Math.max(0, p[2])), s = 1 - z
    p[0] = Math.min(s, Math.max(-s, p[0])); p[1] = Math.min(s, Math.max(-s, p[1])); p[2] = z
  },
  fromUnitCube(out, u, v, w) {
    const s = 1 - w
    out[0] = (2 * u - 1) * s; out[1] = (2 * v - 1) * s; out[2] = w
  },
}
