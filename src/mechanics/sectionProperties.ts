/**
 * Section properties and the section record: area, centroid, principal second moments of area
 * and axes, and the resultant in section axes, from a section accumulator (sectionPolygon.ts).
 */
import type { Vec3 } from '../model/model.ts'
import type { FreeBodyFigure, SectionResult } from './types.ts'
import { ZERO_FREE_BODY } from './freeBody.ts'
import {
  ACC_AREA, ACC_CUT, ACC_FORCE, ACC_ORIGIN, ACC_SA, ACC_SAA, ACC_SAB, ACC_SB, ACC_SBB, sectionMomentAtOrigin,
} from './sectionPolygon.ts'

/** Area centroid of an accumulated section, written to out (model length). Area must be > 0. */
export function sectionCentroid(out: Float64Array, acc: Float64Array, off: number, frame: Float64Array): Float64Array {
  const A = acc[off + ACC_AREA]
  const ca = acc[off + ACC_SA] / A, cb = acc[off + ACC_SB] / A
  for (let k = 0; k < 3; k++) out[k] = acc[off + ACC_ORIGIN + k] + ca * frame[k] + cb * frame[3 + k]
  return out
}

/**
 * Principal second moments of area about the centroid. With the centroidal integrals
 * Jaa = ∫ b² dA (about the u axis), Jbb = ∫ a² dA (about v) and the product P = ∫ a b dA, the
 * area tensor in (u, v) is [[Jaa, -P], [-P, Jbb]]; its eigenvalues are I1 ≥ I2 and e1 is the axis
 * about which the second moment is I1 (the stiff bending axis). Ties (I1 = I2, e.g. a circle)
 * keep e1 = u. e1 is signed so that its largest component is positive; e2 = e3 × e1.
 */
export function principalAxes(acc: Float64Array, off: number, frame: Float64Array): { I1: number; I2: number; e1: Vec3; e2: Vec3 } {
  const A = acc[off + ACC_AREA]
  const ca = acc[off + ACC_SA] / A, cb = acc[off + ACC_SB] / A
  const Jaa = acc[off + ACC_SBB] - A * cb * cb
  const Jbb = acc[off + ACC_SAA] - A * ca * ca
  const P = acc[off + ACC_SAB] - A * ca * cb
  const mean = 0.5 * (Jaa + Jbb), half = 0.5 * (Jaa - Jbb)
  const rad = Math.hypot(half, P)
  // eigenvector of the larger eigenvalue at angle θ from u: tan 2θ = -2P / (Jaa - Jbb)
  const theta = rad > 1e-14 * Math.abs(mean) ? 0.5 * Math.atan2(-P, half) : 0
  const c = Math.cos(theta), s = Math.sin(theta)
  let e1: Vec3 = [c * frame[0] + s * frame[3], c * frame[1] + s * frame[4], c * frame[2] + s * frame[5]]
  let big = 0
  for (let k = 1; k < 3; k++) if (Math.abs(e1[k]) > Math.abs(e1[big]) * (1 + 1e-12)) big = k
  if (e1[big] < 0) e1 = [-e1[0], -e1[1], -e1[2]]
  const m0 = frame[6], m1 = frame[7], m2 = frame[8]
  const e2: Vec3 = [m1 * e1[2] - m2 * e1[1], m2 * e1[0] - m0 * e1[2], m0 * e1[1] - m1 * e1[0]]
  return { I1: mean + rad, I2: mean - rad, e1, e2 }
}

/** The record of a plane that misses the body: every figure zero, centroid = the plane point. */
export function emptySection(point: Vec3, m: Vec3, frame: Float64Array, about: Vec3 | null): SectionResult {
  return {
    empty: true, plane: { point, normal: m }, area: 0, centroid: [point[0], point[1], point[2]],
    about: about ?? [point[0], point[1], point[2]], force: [0, 0, 0], moment: [0, 0, 0],
    axes: { e1: [frame[0], frame[1], frame[2]], e2: [frame[3], frame[4], frame[5]], e3: [m[0], m[1], m[2]] },
    secondMoments: { I1: 0, I2: 0, J: 0 }, axial: 0, shear: [0, 0], torque: 0, bending: [0, 0],
    freeBody: ZERO_FREE_BODY, cutElements: 0, unmappedPoints: 0,
  }
}

/**
 * Builds the section record from a non-empty accumulator. The moment is moved from the local
 * origin o to `about` (default: the centroid): M_about = M_o + (o - about) × F.
 */
export function sectionRecord(
  acc: Float64Array, off: number, point: Vec3, m: Vec3, frame: Float64Array, about: Vec3 | null, freeBody: FreeBodyFigure, unmappedPoints: number,
): SectionResult {
  const c = sectionCentroid(new Float64Array(3), acc, off, frame)
  const centroid: Vec3 = [c[0], c[1], c[2]]
  const p: Vec3 = about ?? centroid
  const F: Vec3 = [acc[off + ACC_FORCE], acc[off + ACC_FORCE + 1], acc[off + ACC_FORCE + 2]]
  const dx = acc[off + ACC_ORIGIN] - p[0], dy = acc[off + ACC_ORIGIN + 1] - p[1], dz = acc[off + ACC_ORIGIN + 2] - p[2]
  const Mo = sectionMomentAtOrigin(new Float64Array(3), acc, off, frame)
  const M: Vec3 = [
    Mo[0] + dy * F[2] - dz * F[1],
    Mo[1] + dz * F[0] - dx * F[2],
    Mo[2] + dx * F[1] - dy * F[0],
  ]
  const { I1, I2, e1, e2 } = principalAxes(acc, off, frame)
  const dot = (x: Vec3, y: Vec3) => x[0] * y[0] + x[1] * y[1] + x[2] * y[2]
  return {
    empty: false, plane: { point, normal: m }, area: acc[off + ACC_AREA], centroid, about: [p[0], p[1], p[2]],
    force: F, moment: M, axes: { e1, e2, e3: [m[0], m[1], m[2]] },
    secondMoments: { I1, I2, J: I1 + I2 },
    axial: dot(F, m), shear: [dot(F, e1), dot(F, e2)], torque: dot(M, m), bending: [dot(M, e1), dot(M, e2)],
    freeBody, cutElements: acc[off + ACC_CUT], unmappedPoints,
  }
}
