/**
 * One point of a face's parametric map x(u, v) = Σ Nₐ(u, v) xₐ, the evaluation that the face
 * geometry (boundaryFaces.ts), the surface tractions (tractions.ts) and the element balance's
 * general path (balanceAudit.ts) all make at every face quadrature point.
 *
 * Inputs: `table` is a face kind tabulated at its quadrature points (or at its own nodes, see
 * tabulateFace); `q` the point; `xs` Float64Array(3·n) the coordinates of the face's n nodes in face
 * order (model length); `ss` Float64Array(6·n) their stress rows (xx, yy, zz, xy, yz, xz, model
 * stress units) or null when only the geometry is wanted.
 *
 * Output record `out`, Float64Array(FQP_SIZE):
 * - [FQP_X .. +2]: the position x (model length);
 * - [FQP_AREA .. +2]: the area vector x_u × x_v, not normalised: for a face ordered counter-clockwise
 *   seen from outside it points outward, and its length is the area Jacobian, so (x_u × x_v)·w is
 *   n dA for a rule weight w (length²);
 * - [FQP_STRESS .. +5]: σ = Σ Nₐ σₐ (left as is when `ss` is null).
 */
import type { FaceTable } from './shapeFunctions.ts'

export const FQP_X = 0
export const FQP_AREA = 3
export const FQP_STRESS = 6
export const FQP_SIZE = 12

export function faceQuadraturePoint(out: Float64Array, table: FaceTable, q: number, xs: Float64Array, ss: Float64Array | null): Float64Array {
  const n = table.nodeCount, V = table.values, D = table.derivs
  const vo = q * n, dof = 2 * q * n
  let px = 0, py = 0, pz = 0, ux = 0, uy = 0, uz = 0, vx = 0, vy = 0, vz = 0
  for (let a = 0; a < n; a++) {
    const Na = V[vo + a], du = D[dof + 2 * a], dv = D[dof + 2 * a + 1]
    const x = xs[3 * a], y = xs[3 * a + 1], z = xs[3 * a + 2]
    px += Na * x; py += Na * y; pz += Na * z
    ux += du * x; uy += du * y; uz += du * z
    vx += dv * x; vy += dv * y; vz += dv * z
  }
  out[FQP_X] = px; out[FQP_X + 1] = py; out[FQP_X + 2] = pz
  // Scalar locals, not vec3.cross: the tangents live in registers here (see vec3.ts).
  out[FQP_AREA] = uy * vz - uz * vy; out[FQP_AREA + 1] = uz * vx - ux * vz; out[FQP_AREA + 2] = ux * vy - uy * vx
  if (ss) {
    let sxx = 0, syy = 0, szz = 0, sxy = 0, syz = 0, sxz = 0
    for (let a = 0; a < n; a++) {
      const Na = V[vo + a], sa = 6 * a
      sxx += Na * ss[sa]; syy += Na * ss[sa + 1]; szz += Na * ss[sa + 2]
      sxy += Na * ss[sa + 3]; syz += Na * ss[sa + 4]; sxz += Na * ss[sa + 5]
    }
    out[FQP_STRESS] = sxx; out[FQP_STRESS + 1] = syy; out[FQP_STRESS + 2] = szz
    out[FQP_STRESS + 3] = sxy; out[FQP_STRESS + 4] = syz; out[FQP_STRESS + 5] = sxz
  }
  return out
}
