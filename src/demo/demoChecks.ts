import type { Vec3 } from '../model/model.ts'
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import { hex8GradientsAtGauss } from './hex8.ts'
import { hexBoundaryFaces } from './hexFaces.ts'
import type { HexFaces } from './hexFaces.ts'

/**
 * Statics checks of the demo solutions, computed from the nodal stress the demo writes (the
 * same numbers a user loads), not from the solver's internals: face integrals of t = σn,
 * section resultants on planes that follow element faces, and whole-body balance.
 * Stress order xx, yy, zz, xy, yz, xz; units are the model's.
 */
export interface FaceIntegral {
  /** ∫ t dA and ∫ (x - about) × t dA over the faces. */
  readonly force: Vec3
  readonly moment: Vec3
  readonly about: Vec3
  readonly area: number
  /** Area centroid of the faces. */
  readonly centroid: Vec3
  /** ∫ |t| dA / area. */
  readonly meanTraction: number
  /** Half the sum over faces of |∫ t dA| (the load that passes through, for a balanced set). */
  readonly gross: number
}

const G = 1 / Math.sqrt(3)
const FU = [-G, G, G, -G], FV = [-G, -G, G, G]
const SU = [-1, 1, 1, -1], SV = [-1, -1, 1, 1]

/**
 * Integrates t = σn over bilinear quad faces (outward normals by corner order), nodal stress
 * interpolated with the face's bilinear shape functions, 2×2 Gauss rule (Abramowitz & Stegun,
 * Table 25.4). Moments about `about`, or about the faces' area centroid when omitted.
 */
export function integrateFaceTractions(coords: Float64Array, stress: Float64Array, faces: HexFaces, about?: Vec3): FaceIntegral {
  let area = 0, cx = 0, cy = 0, cz = 0
  const pass = (c: Vec3 | null) => {
    const F: Vec3 = [0, 0, 0], M: Vec3 = [0, 0, 0]
    let mean = 0, gross = 0
    for (let f = 0; f < faces.count; f++) {
      let ffx = 0, ffy = 0, ffz = 0
      for (let q = 0; q < 4; q++) {
        const u = FU[q], v = FV[q]
        let x = 0, y = 0, z = 0, xu = 0, yu = 0, zu = 0, xv = 0, yv = 0, zv = 0
        let sxx = 0, syy = 0, szz = 0, sxy = 0, syz = 0, sxz = 0
        for (let k = 0; k < 4; k++) {
          const n = faces.nodes[4 * f + k], o = 3 * n, s = 6 * n
          const N = 0.25 * (1 + SU[k] * u) * (1 + SV[k] * v)
          const du = 0.25 * SU[k] * (1 + SV[k] * v), dv = 0.25 * SV[k] * (1 + SU[k] * u)
          x += N * coords[o]; y += N * coords[o + 1]; z += N * coords[o + 2]
          xu += du * coords[o]; yu += du * coords[o + 1]; zu += du * coords[o + 2]
          xv += dv * coords[o]; yv += dv * coords[o + 1]; zv += dv * coords[o + 2]
          sxx += N * stress[s]; syy += N * stress[s + 1]; szz += N * stress[s + 2]
          sxy += N * stress[s + 3]; syz += N * stress[s + 4]; sxz += N * stress[s + 5]
        }
        // Area vector n dA (outward for counter-clockwise corners seen from outside).
        const ax = yu * zv - zu * yv, ay = zu * xv - xu * zv, az = xu * yv - yu * xv
        const dA = Math.hypot(ax, ay, az)
        if (c === null) { area += dA; cx += x * dA; cy += y * dA; cz += z * dA; continue }
        const tx = sxx * ax + sxy * ay + sxz * az, ty = sxy * ax + syy * ay + syz * az, tz = sxz * ax + syz * ay + szz * az
        ffx += tx; ffy += ty; ffz += tz
        mean += Math.hypot(tx, ty, tz)
        const rx = x - c[0], ry = y - c[1], rz = z - c[2]
        M[0] += ry * tz - rz * ty; M[1] += rz * tx - rx * tz; M[2] += rx * ty - ry * tx
      }
      F[0] += ffx; F[1] += ffy; F[2] += ffz
      gross += Math.hypot(ffx, ffy, ffz)
    }
    return { F, M, mean, gross: gross / 2 }
  }
  pass(null)
  const centroid: Vec3 = area > 0 ? [cx / area, cy / area, cz / area] : [0, 0, 0]
  const c = about ?? centroid
  const r = pass(c)
  return { force: r.F, moment: r.M, about: c, area, centroid, meanTraction: area > 0 ? r.mean / area : 0, gross: r.gross }
}

/**
 * The element faces lying on the plane x_axis = value, taken from the elements on the minus
 * side, so their outward normal is +axis: a section that follows element faces. Integrated
 * with integrateFaceTractions it gives the section resultant of the README F = ∫ σm dA (force of
 * the +m side on the -m side) with moments about the section's centroid.
 */
export function facesOnPlane(coords: Float64Array, conn: Int32Array, axis: 0 | 1 | 2, value: number, tol: number): HexFaces {
  const hexFaces = ELEMENT_TYPES.hex8.faces
  const nodes: number[] = [], elem: number[] = []
  const elements = conn.length / 8
  for (let e = 0; e < elements; e++) {
    let c = 0
    for (let a = 0; a < 8; a++) c += coords[3 * conn[8 * e + a] + axis]
    if (c / 8 >= value) continue
    for (const face of hexFaces) {
      let on = true
      for (let k = 0; k < 4 && on; k++) on = Math.abs(coords[3 * conn[8 * e + face[k]] + axis] - value) < tol
      if (!on) continue
      for (let k = 0; k < 4; k++) nodes.push(conn[8 * e + face[k]])
      elem.push(e)
    }
  }
  return { count: elem.length, nodes: Int32Array.from(nodes), elem: Int32Array.from(elem) }
}

/** Whole-body balance of the nodal stress field: ∮ σn dA + ∫ ρb dV, relative to the gross load. */
export interface DemoBalance {
  readonly surfaceForce: Vec3
  readonly bodyForceTotal: Vec3
  readonly residual: Vec3
  /** Moment residual about the volume centroid. */
  readonly momentResidual: Vec3
  readonly volume: number
  /** Half of (Σ over boundary faces |∫ t dA| + |∫ ρb dV|). */
  readonly gross: number
  /** |residual| / gross. */
  readonly relative: number
  /** |moment residual| / (gross · bounding-box diagonal). */
  readonly relativeMoment: number
}

export function bodyBalance(coords: Float64Array, conn: Int32Array, stress: Float64Array, bodyForce: Vec3): DemoBalance {
  const N = coords.length / 3
  const faces = hexBoundaryFaces(conn, N)
  const xyz = new Float64Array(24), grad = new Float64Array(24)
  let vol = 0, vx = 0, vy = 0, vz = 0
  const elements = conn.length / 8
  for (let e = 0; e < elements; e++) {
    let ex = 0, ey = 0, ez = 0
    for (let a = 0; a < 8; a++) {
      const o = 3 * conn[8 * e + a]
      xyz[3 * a] = coords[o]; xyz[3 * a + 1] = coords[o + 1]; xyz[3 * a + 2] = coords[o + 2]
      ex += coords[o] / 8; ey += coords[o + 1] / 8; ez += coords[o + 2] / 8
    }
    let ve = 0
    for (let g = 0; g < 8; g++) ve += hex8GradientsAtGauss(grad, xyz, g)
    // The element centroid stands in for its volume centroid: the body's moment check is loose anyway.
    vol += ve; vx += ve * ex; vy += ve * ey; vz += ve * ez
  }
  const c: Vec3 = [vx / vol, vy / vol, vz / vol]
  const s = integrateFaceTractions(coords, stress, faces, c)
  const b: Vec3 = [bodyForce[0] * vol, bodyForce[1] * vol, bodyForce[2] * vol]
  const residual: Vec3 = [s.force[0] + b[0], s.force[1] + b[1], s.force[2] + b[2]]
  // A uniform body force acts at the volume centroid: no moment about it.
  const gross = s.gross + Math.hypot(...b) / 2
  const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity]
  for (let n = 0; n < N; n++) for (let k = 0; k < 3; k++) { lo[k] = Math.min(lo[k], coords[3 * n + k]); hi[k] = Math.max(hi[k], coords[3 * n + k]) }
  const diag = Math.hypot(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2])
  return {
    surfaceForce: s.force, bodyForceTotal: b, residual, momentResidual: s.moment, volume: vol, gross,
    relative: gross > 0 ? Math.hypot(...residual) / gross : 0,
    relativeMoment: gross > 0 ? Math.hypot(...s.moment) / (gross * diag) : 0,
  }
}
