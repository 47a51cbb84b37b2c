import type { Vec3 } from '../model/model.ts'
import { bodyBalance, facesOnPlane, integrateFaceTractions } from './demoChecks.ts'
import type { DemoBalance } from './demoChecks.ts'
import { hexBoundaryFaces, selectFaces } from './hexFaces.ts'
import type { TunnelScenario } from './tunnelBlock.ts'

/**
 * Kirsch (1898): hoop stress on the wall of a circular hole in an infinite plate under far-field
 * compressions p (vertical) and K·p (horizontal), compression positive, θ from the horizontal:
 * σθ = p[(1 + K) + 2(1 - K) cos 2θ]. Derived by superposing the uniaxial result
 * σθ = σ(1 - 2 cos 2θ) (θ from the load axis; 3σ across it, -σ along it) for σ = Kp along x
 * and for σ = p along y (θ → θ - 90°). The same in plane strain (the in-plane stresses of the
 * hole problem do not depend on the elastic constants).
 */
export function kirschWallHoop(p: number, k: number, theta: number): number {
  return p * (1 + k + 2 * (1 - k) * Math.cos(2 * theta))
}

/** Statics figures of a solved tunnel block (kN, kPa; relative errors dimensionless). */
export interface TunnelStatics {
  /** Base reaction ∫ t dA over the base (kN) against weight + overburden. */
  readonly baseForce: Vec3
  readonly expectedBase: number
  readonly baseError: number
  /** Horizontal section through the tunnel axis: F_y against -(overburden + weight above). */
  readonly axisSectionForce: Vec3
  readonly expectedAxisSection: number
  readonly axisSectionError: number
  /** Vertical section x = 0: F_x against -(side pressure on one side). */
  readonly midSectionForce: Vec3
  readonly expectedMidSection: number
  readonly midSectionError: number
  readonly balance: DemoBalance
  /** Far-field vertical stress p at the axis depth (kPa) and K. */
  readonly p: number
  readonly k: number
  /** Wall hoop stress (compression positive) at springline (θ = 0, π) and crown/invert (θ = ±90°), FE and Kirsch. */
  readonly springline: number
  readonly springlineKirsch: number
  readonly crown: number
  readonly invert: number
  readonly crownKirsch: number
  /** Largest |σθ,FE - σθ,Kirsch| over the wall nodes, over p. */
  readonly wallMaxDeviation: number
  /** Root-mean-square of the same, over p. */
  readonly wallRmsDeviation: number
  /** Mean |t| on the tunnel wall over p (a free surface: ideally 0). */
  readonly wallTraction: number
}

export function tunnelStatics(sc: TunnelScenario, stress: Float64Array): TunnelStatics {
  const { coords, conn } = sc.problem
  const { width: w, height: h, slice, radius: a, k0 } = sc.spec
  const N = coords.length / 3
  const yc = sc.tunnelCentre[1]
  const faces = hexBoundaryFaces(conn, N)
  const tol = 1e-9 * w
  const base = integrateFaceTractions(coords, stress, selectFaces(faces, coords, (_x, y) => Math.abs(y) < tol))
  const expectedBase = sc.weight + sc.overburdenForce
  const gamma = sc.unitWeight
  const axis = integrateFaceTractions(coords, stress, facesOnPlane(coords, conn, 1, yc, 1e-6 * w))
  const expectedAxis = -(sc.overburdenForce + gamma * slice * (w * (h - yc) - (Math.PI * a * a) / 2))
  const mid = integrateFaceTractions(coords, stress, facesOnPlane(coords, conn, 0, 0, 1e-6 * w))
  const expectedMid = -k0 * (sc.topPressure * h + (gamma * h * h) / 2) * slice
  const p = sc.verticalAtAxis
  let sum2 = 0, count = 0, worst = 0
  const near = (angle: number) => ({ fe: 0, n: 0, angle })
  const marks = [near(0), near(Math.PI / 2), near(Math.PI), near(-Math.PI / 2)]
  for (let n = 0; n < N; n++) {
    const x = coords[3 * n], y = coords[3 * n + 1] - yc
    if (Math.abs(Math.hypot(x, y) - a) > 1e-6 * a) continue
    const th = Math.atan2(y, x), s = Math.sin(th), c = Math.cos(th), o = 6 * n
    const hoop = -(stress[o] * s * s + stress[o + 1] * c * c - 2 * stress[o + 3] * s * c)
    const d = Math.abs(hoop - kirschWallHoop(p, k0, th))
    worst = Math.max(worst, d); sum2 += d * d; count++
    for (const mk of marks) if (Math.abs(Math.atan2(Math.sin(th - mk.angle), Math.cos(th - mk.angle))) < 1e-6) { mk.fe += hoop; mk.n++ }
  }
  const wall = selectFaces(faces, coords, (x, y) => Math.abs(Math.hypot(x, y - yc) - a) < 1e-6 * a)
  return {
    baseForce: base.force, expectedBase, baseError: Math.abs(base.force[1] - expectedBase) / expectedBase,
    axisSectionForce: axis.force, expectedAxisSection: expectedAxis, axisSectionError: Math.abs(axis.force[1] - expectedAxis) / Math.abs(expectedAxis),
    midSectionForce: mid.force, expectedMidSection: expectedMid, midSectionError: Math.abs(mid.force[0] - expectedMid) / Math.abs(expectedMid),
    balance: bodyBalance(coords, conn, stress, sc.bodyForce),
    p, k: k0,
    springline: (marks[0].fe / marks[0].n + marks[2].fe / marks[2].n) / 2, springlineKirsch: kirschWallHoop(p, k0, 0),
    crown: marks[1].fe / marks[1].n, invert: marks[3].fe / marks[3].n, crownKirsch: kirschWallHoop(p, k0, Math.PI / 2),
    wallMaxDeviation: worst / p, wallRmsDeviation: Math.sqrt(sum2 / count) / p,
    wallTraction: integrateFaceTractions(coords, stress, wall).meanTraction / p,
  }
}
