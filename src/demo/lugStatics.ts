import type { Vec3 } from '../model/model.ts'
import { bodyBalance, facesOnPlane, integrateFaceTractions } from './demoChecks.ts'
import type { DemoBalance } from './demoChecks.ts'
import { hexBoundaryFaces, selectFaces } from './hexFaces.ts'
import type { LugScenario } from './liftingLug.ts'

/** Statics figures of a solved lifting lug (N, N·mm, MPa; relative errors dimensionless). */
export interface LugStatics {
  /** Section plane height (mm) through the shank, normal +y. */
  readonly sectionY: number
  readonly sectionForce: Vec3
  readonly sectionMoment: Vec3
  /** Pin load resultant and its moment about the section centroid (from the nodal loads). */
  readonly pinForce: Vec3
  readonly expectedMoment: Vec3
  /** |F - P| / |P| and |M - M_P| / |M_P|. */
  readonly sectionForceError: number
  readonly sectionMomentError: number
  /** Sum of the support reactions plus the pin load, relative to |P| (solver statics). */
  readonly reactionError: number
  readonly balance: DemoBalance
  /** Nominal net-section stress P / (2 (R - a) t) and the largest hoop stress on the hole wall (MPa). */
  readonly nominalStress: number
  readonly peakHoopStress: number
  /** Angle (degrees from +x, counter-clockwise) of the peak hoop stress on the hole wall. */
  readonly peakHoopAngleDeg: number
  /** Mean |t| on the hole wall away from the contact arc and on the plate's flat faces, over the nominal stress. */
  readonly freeHoleTraction: number
  readonly freeFaceTraction: number
}

export function lugStatics(sc: LugScenario, stress: Float64Array, reaction: Float64Array, sectionY?: number): LugStatics {
  const { coords, conn } = sc.problem
  const { holeHeight: H, holeRadius: a, headRadius: R, thickness: t } = sc.spec
  const N = coords.length / 3
  // Default section: the shank row closest to mid-way between base and head.
  let y = sectionY ?? sc.shankTop / 2
  if (sectionY === undefined) {
    let best = Infinity
    for (const h of sc.rowHeights) if (h > 0 && Math.abs(h - sc.shankTop / 2) < best) { best = Math.abs(h - sc.shankTop / 2); y = h }
  }
  const sec = integrateFaceTractions(coords, stress, facesOnPlane(coords, conn, 1, y, 1e-6 * R))
  const P = sc.pinForce, c = sec.centroid, h = sc.holeCentre, m0 = sc.pinMomentAboutHole
  const rx = h[0] - c[0], ry = h[1] - c[1], rz = h[2] - c[2]
  const expected: Vec3 = [m0[0] + ry * P[2] - rz * P[1], m0[1] + rz * P[0] - rx * P[2], m0[2] + rx * P[1] - ry * P[0]]
  const pn = Math.hypot(...P)
  const dF = Math.hypot(sec.force[0] - P[0], sec.force[1] - P[1], sec.force[2] - P[2]) / pn
  const dM = Math.hypot(sec.moment[0] - expected[0], sec.moment[1] - expected[1], sec.moment[2] - expected[2]) / Math.hypot(...expected)
  const r: Vec3 = [0, 0, 0]
  for (let n = 0; n < N; n++) for (let k = 0; k < 3; k++) r[k] += reaction[3 * n + k]
  const reactionError = Math.hypot(r[0] + P[0], r[1] + P[1], r[2] + P[2]) / pn
  const nominal = pn / (2 * (R - a) * t)
  let peak = -Infinity, peakAngle = 0
  for (let n = 0; n < N; n++) {
    const x = coords[3 * n], yy = coords[3 * n + 1] - H
    if (Math.abs(Math.hypot(x, yy) - a) > 1e-6 * a) continue
    const phi = Math.atan2(yy, x), s = Math.sin(phi), co = Math.cos(phi), o = 6 * n
    const hoop = stress[o] * s * s + stress[o + 1] * co * co - 2 * stress[o + 3] * s * co
    if (hoop > peak) { peak = hoop; peakAngle = (phi * 180) / Math.PI }
  }
  const faces = hexBoundaryFaces(conn, N)
  const th = (sc.spec.angleDeg * Math.PI) / 180, dx = Math.sin(th), dy = Math.cos(th)
  const margin = ((sc.spec.contactHalfAngleDeg + 15) * Math.PI) / 180
  const freeHole = selectFaces(faces, coords, (x, yy) => {
    const r2 = Math.hypot(x, yy - H)
    return Math.abs(r2 - a) < 1e-6 * a && Math.acos((x * dx + (yy - H) * dy) / r2) > margin
  })
  const flat = selectFaces(faces, coords, (_x, _y, z) => Math.abs(z) < 1e-9 * t || Math.abs(z - t) < 1e-9 * t)
  return {
    sectionY: y, sectionForce: sec.force, sectionMoment: sec.moment, pinForce: P, expectedMoment: expected,
    sectionForceError: dF, sectionMomentError: dM, reactionError,
    balance: bodyBalance(coords, conn, stress, sc.bodyForce),
    nominalStress: nominal, peakHoopStress: peak, peakHoopAngleDeg: peakAngle,
    freeHoleTraction: integrateFaceTractions(coords, stress, freeHole).meanTraction / nominal,
    freeFaceTraction: integrateFaceTractions(coords, stress, flat).meanTraction / nominal,
  }
}
