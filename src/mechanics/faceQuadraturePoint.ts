/**
 * The points of a face's parametric map x(u, v) = Σ Nₐ(u, v) xₐ, the evaluation that the face
 * geometry (boundaryFaces.ts), the surface tractions (tractions.ts) and the element balance's
 * general path (balanceAudit.ts) all make at every face quadrature point.
 *
 * Inputs: `table` is a face kind tabulated at its quadrature points (or at its own nodes, see
 * tabulateFace); `xs` Float64Array(3·n) the coordinates of the face's n nodes in face order (model
 * length); `ss` Float64Array(6·n) their stress rows (xx, yy, zz, xy, yz, xz, model stress units)
 * or null when no stress is wanted; `position` false when no position is wanted (each part left
 * out saves a sum over the nodes at every point: the element balance needs no position).
 *
 * Output `out`, Float64Array(FQP_SIZE · table.pointCount): record q at FQP_SIZE·q holds
 * - [FQP_X .. +2]: the position x (model length; left as is when `position` is false);
 * - [FQP_AREA .. +2]: the area vector x_u × x_v, not normalised: for a face ordered counter-clockwise
 *   seen from outside it points outward, and its length is the area Jacobian, so (x_u × x_v)·w is
 *   n dA for a rule weight w (length²);
 * - [FQP_STRESS .. +5]: σ = Σ Nₐ σₐ (left as is when `ss` is null).
 *
 * All points of a face in one call: the callers' loops over faces are hot (every boundary face,
 * every element face), and a call per point measurably slowed them where it was not inlined.
 */
import type { FaceTable } from './shapeFunctions.ts'

export const FQP_X = 0
export const FQP_AREA = 3
export const FQP_STRESS = 6
export const FQP_SIZE = 12

/** Scratch for the points of any of `tables` (the largest point count decides). */
export function createFacePoints(tables: readonly FaceTable[]): Float64Array {
  return new Float64Array(FQP_SIZE * Math.max(1, ...tables.map((t) => t.pointCount)))
}

export function faceQuadraturePoints(out: Float64Array, table: FaceTable, xs: Float64Array, ss: Float64Array | null, position: boolean): Float64Array {
  const n = table.nodeCount, nq = table.pointCount, V = table.values, D = table.derivs
  for (let q = 0; q < nq; q++) {
    const vo = q * n, dof = 2 * q * n, o = FQP_SIZE * q
    let ux = 0, uy = 0, uz = 0, vx = 0, vy = 0, vz = 0
    for (let a = 0; a < n; a++) {
      const du = D[dof + 2 * a], dv = D[dof + 2 * a + 1]
      const x = xs[3 * a], y = xs[3 * a + 1], z = xs[3 * a + 2]
      ux += du * x; uy += du * y; uz += du * z
      vx += dv * x; vy += dv * y; vz += dv * z
    }
    if (position) {
      let px = 0, py = 0, pz = 0
      for (let a = 0; a < n; a++) {
        const Na = V[vo + a]
        px += Na * xs[3 * a]; py += Na * xs[3 * a + 1]; pz += Na * xs[3 * a + 2]
      }
      out[o + FQP_X] = px; out[o + FQP_X + 1] = py; out[o + FQP_X + 2] = pz
    }
    // Scalar locals, not vec3.cross: the tangents live in registers here (see vec3.ts).
    out[o + FQP_AREA] = uy * vz - uz * vy; out[o + FQP_AREA + 1] = uz * vx - ux * vz; out[o + FQP_AREA + 2] = ux * vy - uy * vx
    if (ss) {
      let sxx = 0, syy = 0, szz = 0, sxy = 0, syz = 0, sxz = 0
      for (let a = 0; a < n; a++) {
        const Na = V[vo + a], sa = 6 * a
        sxx += Na * ss[sa]; syy += Na * ss[sa + 1]; szz += Na * ss[sa + 2]
        sxy += Na * ss[sa + 3]; syz += Na * ss[sa + 4]; sxz += Na * ss[sa + 5]
      }
      out[o + FQP_STRESS] = sxx; out[o + FQP_STRESS + 1] = syy; out[o + FQP_STRESS + 2] = szz
      out[o + FQP_STRESS + 3] = sxy; out[o + FQP_STRESS + 4] = syz; out[o + FQP_STRESS + 5] = sxz
    }
  }
  return out
}
