/**
 * Surface tractions on boundary faces by Cauchy's formula t = σn (n outward unit normal).
 *
 * At each face node the normal comes from the face's own shape functions at that node
 * (t_u × t_v), so the nodes of a curved quadratic face each get their own normal, and σ is that
 * node's nodal stress. Face integrals use the face quadrature with σ interpolated by the face
 * shape functions and the area element |t_u × t_v| du dv. Where the area element is constant
 * (flat triangles, parallelograms) force and moment are exact: σ·x is at most degree 4 on a tri6
 * (degree-4 rule) and degree 4 per direction on a quad8 (3×3 Gauss, exact to 5). Curved faces are
 * integrated to the rule's accuracy. The means of |τ| and |t| are not polynomial and are
 * quadrature approximations.
 */
import type { Mesh } from '../model/model.ts'
import { FACE_KIND_BY_CODE } from '../model/elementTypes.ts'
import { faceQuadratureTables } from './boundaryFaces.ts'
import { tabulateFace } from './shapeFunctions.ts'
import type { FaceTable } from './shapeFunctions.ts'
import type { BoundaryFaces, SurfaceTractions } from './types.ts'

/** t = σn for one stress 6-vector (xx, yy, zz, xy, yz, xz) and a vector n; writes out3. */
export function tractionAt(out3: Float64Array | number[], s6: ArrayLike<number>, n3: ArrayLike<number>): Float64Array | number[] {
  const nx = n3[0], ny = n3[1], nz = n3[2]
  out3[0] = s6[0] * nx + s6[3] * ny + s6[5] * nz
  out3[1] = s6[3] * nx + s6[1] * ny + s6[4] * nz
  out3[2] = s6[5] * nx + s6[4] * ny + s6[2] * nz
  return out3
}

let nodeTables: FaceTable[] | null = null
/** Face shape derivatives at each face's own nodes, indexed by face kind code. */
export function faceNodeTables(): FaceTable[] {
  if (!nodeTables) nodeTables = FACE_KIND_BY_CODE.map((k) => tabulateFace(k, null))
  return nodeTables
}

export function computeSurfaceTractions(mesh: Mesh, stress: Float64Array, faces: BoundaryFaces): SurfaceTractions {
  const F = faces.count
  const coords = mesh.coords
  const kind = faces.kind, nodes = faces.nodes
  const S = faces.slots
  const nodeNormal = new Float64Array(3 * S * F).fill(NaN)
  const nodeTraction = new Float64Array(3 * S * F).fill(NaN)
  const nodeNormalTraction = new Float64Array(S * F).fill(NaN)
  const nodeShear = new Float64Array(S * F).fill(NaN)
  const nodeMagnitude = new Float64Array(S * F).fill(NaN)
  const force = new Float64Array(3 * F), moment = new Float64Array(3 * F)
  const meanNormal = new Float64Array(F), meanShear = new Float64Array(F), meanMagnitude = new Float64Array(F)

  const nodeTabs = faceNodeTables(), quadTabs = faceQuadratureTables()
  const xs = new Float64Array(3 * S), ss = new Float64Array(6 * S)

  for (let f = 0; f < F; f++) {
    const kc = kind[f]
    const o = S * f
    const nt = nodeTabs[kc], qt = quadTabs[kc]
    const nn = nt.nodeCount
    for (let a = 0; a < nn; a++) {
      const p = nodes[o + a]
      xs[3 * a] = coords[3 * p]; xs[3 * a + 1] = coords[3 * p + 1]; xs[3 * a + 2] = coords[3 * p + 2]
      for (let c = 0; c < 6; c++) ss[6 * a + c] = stress[6 * p + c]
    }

    // Node slots: normal from the face tangents at the node, traction from the node's stress.
    const ND = nt.derivs
    for (let b = 0; b < nn; b++) {
      let ux = 0, uy = 0, uz = 0, vx = 0, vy = 0, vz = 0
      const dof = 2 * b * nn
      for (let a = 0; a < nn; a++) {
        const du = ND[dof + 2 * a], dv = ND[dof + 2 * a + 1]
        const x = xs[3 * a], y = xs[3 * a + 1], z = xs[3 * a + 2]
        ux += du * x; uy += du * y; uz += du * z
        vx += dv * x; vy += dv * y; vz += dv * z
      }
      let nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx
      const len = Math.sqrt(nx * nx + ny * ny + nz * nz)
      // A degenerate corner (collapsed edge) has no tangent plane: fall back to the face's mean normal.
      if (len > 0) { nx /= len; ny /= len; nz /= len } else { nx = faces.normal[3 * f]; ny = faces.normal[3 * f + 1]; nz = faces.normal[3 * f + 2] }
      const sb = 6 * b
      const sxx = ss[sb], syy = ss[sb + 1], szz = ss[sb + 2], sxy = ss[sb + 3], syz = ss[sb + 4], sxz = ss[sb + 5]
      const tx = sxx * nx + sxy * ny + sxz * nz
      const ty = sxy * nx + syy * ny + syz * nz
      const tz = sxz * nx + syz * ny + szz * nz
      const tn = tx * nx + ty * ny + tz * nz
      const t2 = tx * tx + ty * ty + tz * tz
      const slot = o + b
      nodeNormal[3 * slot] = nx; nodeNormal[3 * slot + 1] = ny; nodeNormal[3 * slot + 2] = nz
      nodeTraction[3 * slot] = tx; nodeTraction[3 * slot + 1] = ty; nodeTraction[3 * slot + 2] = tz
      nodeNormalTraction[slot] = tn
      // |t - t_n n| directly: √(|t|² - t_n²) loses half the digits when the shear is small.
      const qx = tx - tn * nx, qy = ty - tn * ny, qz = tz - tn * nz
      nodeShear[slot] = Math.sqrt(qx * qx + qy * qy + qz * qz)
      nodeMagnitude[slot] = Math.sqrt(t2)
    }

    // Face integrals.
    const V = qt.values, D = qt.derivs, W = qt.weights, nq = qt.pointCount
    let fx = 0, fy = 0, fz = 0, mx = 0, my = 0, mz = 0, A = 0, In = 0, Is = 0, Im = 0
    for (let q = 0; q < nq; q++) {
      let px = 0, py = 0, pz = 0, ux = 0, uy = 0, uz = 0, vx = 0, vy = 0, vz = 0
      let sxx = 0, syy = 0, szz = 0, sxy = 0, syz = 0, sxz = 0
      const vo = q * nn, dof = 2 * q * nn
      for (let a = 0; a < nn; a++) {
        const Na = V[vo + a], du = D[dof + 2 * a], dv = D[dof + 2 * a + 1]
        const x = xs[3 * a], y = xs[3 * a + 1], z = xs[3 * a + 2]
        px += Na * x; py += Na * y; pz += Na * z
        ux += du * x; uy += du * y; uz += du * z
        vx += dv * x; vy += dv * y; vz += dv * z
        const sa = 6 * a
        sxx += Na * ss[sa]; syy += Na * ss[sa + 1]; szz += Na * ss[sa + 2]
        sxy += Na * ss[sa + 3]; syz += Na * ss[sa + 4]; sxz += Na * ss[sa + 5]
      }
      const w = W[q]
      // c = t_u × t_v carries both the normal direction and the area element.
      const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx
      const J = Math.sqrt(cx * cx + cy * cy + cz * cz)
      if (J === 0) continue // degenerate point: contributes no area
      const dA = J * w
      const nx = cx / J, ny = cy / J, nz = cz / J
      const tx = sxx * nx + sxy * ny + sxz * nz
      const ty = sxy * nx + syy * ny + syz * nz
      const tz = sxz * nx + syz * ny + szz * nz
      const tn = tx * nx + ty * ny + tz * nz
      const t2 = tx * tx + ty * ty + tz * tz
      fx += tx * dA; fy += ty * dA; fz += tz * dA
      mx += (py * tz - pz * ty) * dA; my += (pz * tx - px * tz) * dA; mz += (px * ty - py * tx) * dA
      A += dA
      In += tn * dA
      const qx = tx - tn * nx, qy = ty - tn * ny, qz = tz - tn * nz
      Is += Math.sqrt(qx * qx + qy * qy + qz * qz) * dA
      Im += Math.sqrt(t2) * dA
    }
    force[3 * f] = fx; force[3 * f + 1] = fy; force[3 * f + 2] = fz
    moment[3 * f] = mx; moment[3 * f + 1] = my; moment[3 * f + 2] = mz
    // Zero-area faces report zero means rather than NaN.
    const invA = A > 0 ? 1 / A : 0
    meanNormal[f] = In * invA; meanShear[f] = Is * invA; meanMagnitude[f] = Im * invA
  }
  return { nodeNormal, nodeTraction, nodeNormalTraction, nodeShear, nodeMagnitude, force, moment, meanNormal, meanShear, meanMagnitude }
}
