/**
 * Section properties and the section record: area, centroid, section axes (principal or
 * reference, sectionAxes.ts) with the second moments of area about them, and the resultant in
 * section axes, from a section accumulator (sectionPolygon.ts).
 */
import type { Vec3 } from '../model/model.ts'
import type { FreeBodyFigure, SectionResult } from './types.ts'
import { ZERO_FREE_BODY } from './freeBody.ts'
import { axesWithoutArea, resolveSectionAxes } from './sectionAxes.ts'
import type { SectionAxesChoice } from './sectionAxes.ts'
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
 * Centroidal area tensor of an accumulated section in its frame (u, v, m): Juu = ∫ b² dA (about
 * u), Jvv = ∫ a² dA (about v), Puv = ∫ a b dA, with a, b the centroidal coordinates along u, v.
 */
export function areaTensor(acc: Float64Array, off: number): { Juu: number; Jvv: number; Puv: number } {
  const A = acc[off + ACC_AREA]
  const ca = acc[off + ACC_SA] / A, cb = acc[off + ACC_SB] / A
  return {
    Juu: acc[off + ACC_SBB] - A * cb * cb,
    Jvv: acc[off + ACC_SAA] - A * ca * ca,
    Puv: acc[off + ACC_SAB] - A * ca * cb,
  }
}

/**
 * The section axes (principal or reference, sectionAxes.ts) and the second moments about them:
 * I1 about e1, I2 about e2, their product I12 (0 for principal axes, where I1 ≥ I2).
 */
export function sectionAxesOf(acc: Float64Array, off: number, frame: Float64Array, choice?: SectionAxesChoice): ReturnType<typeof resolveSectionAxes> {
  const { Juu, Jvv, Puv } = areaTensor(acc, off)
  return resolveSectionAxes(frame, Juu, Jvv, Puv, choice)
}

/** The record of a plane that misses the body: every figure zero, centroid = the plane point. */
export function emptySection(point: Vec3, m: Vec3, _frame: Float64Array, about: Vec3 | null, choice?: SectionAxesChoice): SectionResult {
  return {
    empty: true, plane: { point, normal: m }, area: 0, centroid: [point[0], point[1], point[2]],
    about: about ?? [point[0], point[1], point[2]], force: [0, 0, 0], moment: [0, 0, 0],
    axes: axesWithoutArea(m, choice),
    secondMoments: { I1: 0, I2: 0, I12: 0, J: 0 }, axial: 0, shear: [0, 0], torque: 0, bending: [0, 0],
    freeBody: ZERO_FREE_BODY, cutElements: 0, unmappedPoints: 0,
  }
}

/**
 * Builds the section record from a non-empty accumulator. The moment is moved from the local
 * origin o to `about` (default: the centroid): M_about = M_o + (o - about) × F.
 */
export function sectionRecord(
  acc: Float64Array, off: number, point: Vec3, m: Vec3, frame: Float64Array, about: Vec3 | null, freeBody: FreeBodyFigure, unmappedPoints: number,
  choice?: SectionAxesChoice,
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
  const { axes, I1, I2, I12 } = sectionAxesOf(acc, off, frame, choice)
  const { e1, e2 } = axes
  const dot = (x: Vec3, y: Vec3) => x[0] * y[0] + x[1] * y[1] + x[2] * y[2]
  return {
    empty: false, plane: { point, normal: m }, area: acc[off + ACC_AREA], centroid, about: [p[0], p[1], p[2]],
    force: F, moment: M, axes,
    secondMoments: { I1, I2, I12, J: I1 + I2 },
    axial: dot(F, m), shear: [dot(F, e1), dot(F, e2)], torque: dot(M, m), bending: [dot(M, e1), dot(M, e2)],
    freeBody, cutElements: acc[off + ACC_CUT], unmappedPoints,
  }
}
