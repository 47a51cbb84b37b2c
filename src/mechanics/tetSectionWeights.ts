/**
 * The section of one tet4 and the section weights of its four nodes, in closed form.
 *
 * In a tet4 the stress is linear, σ(x) = Σ_a λ_a(x) σ_a (λ the barycentric coordinates), so
 * over the element's section polygon P
 *   ∫_P σ dA = Σ_a W_a σ_a,   ∫_P a σ dA = Σ_a WA_a σ_a,   ∫_P b σ dA = Σ_a WB_a σ_a,
 * with W_a = ∫_P λ_a dA, WA_a = ∫_P a λ_a dA, WB_a = ∫_P b λ_a dA (a, b the plane coordinates
 * about the section's local origin, sectionPolygon.ts). The vertices of P lie on the crossed
 * edges (q, r) at x = x_q + s (x_r - x_q), where λ_q = 1 - s, λ_r = s and the other two are 0.
 * On the fan of triangles of P, with f linear, ∫ f dA = A/3 Σ f_k and
 * ∫ a f dA = A/12 (Σ a_k Σ f_k + Σ a_k f_k) per triangle (exact: degree 2 on a triangle, the
 * closed forms of the single cut's `integratePolygon`). So each vertex k gets the weights
 * w_k = Σ A/3, wa_k = Σ A/12 (Σa + a_k), wb_k likewise (over the triangles holding it), and
 * passes (1 - s) of them to node q and s to node r. No quadrature point, no shape function call
 * and no allocation per element.
 *
 * The polygon is found as the single cut finds it (sectionPolygon.ts): the crossing table of
 * tet4 (cyclic vertex order), each crossed edge walked from its - corner to its + corner, a
 * vertex on a node of the plane (d = 0) kept once; the first vertex of the section fixes its
 * local origin. A plane section of a tetrahedron is convex, so the fan from the first vertex in
 * table order covers it; its orientation about +m is taken from its signed area.
 *
 * Units: model length; weights W in length², WA and WB in length³. Layout: w[wo + 3a ..] = W_a,
 * WA_a, WB_a for local node a (12 numbers).
 */
import type { CrossingCases } from './sectionPolygon.ts'
import {
  ACC_AREA, ACC_CUT, ACC_ORIGIN, ACC_ORIGIN_SET, ACC_SA, ACC_SAA, ACC_SAB, ACC_SB, ACC_SBB, CASE_STRIDE,
} from './sectionPolygon.ts'

// The slots as module constants: an imported binding read in a per-element function is a getter
// call where tsx compiles the modules to CommonJS (a script run from outside the project).
const AREA = ACC_AREA, SA = ACC_SA, SB = ACC_SB, SAA = ACC_SAA, SBB = ACC_SBB, SAB = ACC_SAB, CUT = ACC_CUT
const ORIGIN = ACC_ORIGIN, ORIGIN_SET = ACC_ORIGIN_SET, STRIDE = CASE_STRIDE

// per-vertex scratch (a tet4 polygon has at most 4 vertices)
const VX = new Float64Array(4), VY = new Float64Array(4), VZ = new Float64Array(4)
const VA = new Float64Array(4), VB = new Float64Array(4), VS = new Float64Array(4)
const VW = new Float64Array(4), VWA = new Float64Array(4), VWB = new Float64Array(4)
const VQ = new Int32Array(4), VR = new Int32Array(4), VNODE = new Int32Array(4)

/**
 * The section of the tet4 whose corners are conn[base .. base + 4) with corner distances
 * dist[0..3] (snapped, d = 0 on the + side): its nodes' weights into w[wo .. wo + 12)
 * (overwritten), its area integrals (area, first and second moments about the section's local
 * origin) and one cut element added to out[oo ..]. The local origin is read from (and, for the
 * section's first polygon, set in) origin[ACC_ORIGIN ..]. Returns the vertex count: below 3 the
 * plane only touches a node or an edge, and nothing is written.
 */
export function tetSectionWeights(
  w: Float64Array, wo: number, out: Float64Array, oo: number, origin: Float64Array, dist: Float64Array,
  coords: Float64Array, conn: Int32Array, base: number, cases: CrossingCases, frame: Float64Array,
): number {
  const mask = (dist[0] < 0 ? 1 : 0) | (dist[1] < 0 ? 2 : 0) | (dist[2] < 0 ? 4 : 0) | (dist[3] < 0 ? 8 : 0)
  const ne = cases.count[mask], ce = cases.edges, e0 = mask * STRIDE
  let n = 0
  for (let k = 0; k < ne; k++) {
    const lq = ce[e0 + 3 * k], lr = ce[e0 + 3 * k + 1]
    const dq = dist[lq], dr = dist[lr]
    const xq = 3 * conn[base + lq], xr = 3 * conn[base + lr]
    if (dr === 0) {
      // the plane passes through corner lr: several crossed edges end there, keep the point once
      let seen = false
      for (let j = 0; j < n; j++) if (VNODE[j] === lr) seen = true
      if (seen) continue
      VNODE[n] = lr; VQ[n] = lq; VR[n] = lr; VS[n] = 1
      VX[n] = coords[xr]; VY[n] = coords[xr + 1]; VZ[n] = coords[xr + 2]
      n++
      continue
    }
    const s = dq / (dq - dr)
    VNODE[n] = -1; VQ[n] = lq; VR[n] = lr; VS[n] = s
    VX[n] = coords[xq] + s * (coords[xr] - coords[xq])
    VY[n] = coords[xq + 1] + s * (coords[xr + 1] - coords[xq + 1])
    VZ[n] = coords[xq + 2] + s * (coords[xr + 2] - coords[xq + 2])
    n++
  }
  if (n < 3) return n
  if (origin[ORIGIN_SET] === 0) {
    origin[ORIGIN] = VX[0]; origin[ORIGIN + 1] = VY[0]; origin[ORIGIN + 2] = VZ[0]
    origin[ORIGIN_SET] = 1
  }
  const ox = origin[ORIGIN], oy = origin[ORIGIN + 1], oz = origin[ORIGIN + 2]
  const ux = frame[0], uy = frame[1], uz = frame[2], vx = frame[3], vy = frame[4], vz = frame[5]
  let twice = 0
  for (let k = 0; k < n; k++) {
    const rx = VX[k] - ox, ry = VY[k] - oy, rz = VZ[k] - oz
    VA[k] = rx * ux + ry * uy + rz * uz
    VB[k] = rx * vx + ry * vy + rz * vz
    VW[k] = 0; VWA[k] = 0; VWB[k] = 0
  }
  for (let k = 0, j = n - 1; k < n; j = k++) twice += VA[j] * VB[k] - VA[k] * VB[j]
  // the table's cycle turned to face +m: the fan's triangles then have positive area
  const turn = twice >= 0 ? 0.5 : -0.5
  let A = 0, Sa = 0, Sb = 0, Saa = 0, Sbb = 0, Sab = 0
  const a0 = VA[0], b0 = VB[0]
  for (let i = 1; i < n - 1; i++) {
    const j = i + 1
    const ai = VA[i], bi = VB[i], aj = VA[j], bj = VB[j]
    const At = turn * ((ai - a0) * (bj - b0) - (aj - a0) * (bi - b0))
    const sa = a0 + ai + aj, sb = b0 + bi + bj, t = At / 3, h = At / 12
    A += At
    Sa += At * sa; Sb += At * sb
    Saa += At * (sa * sa + a0 * a0 + ai * ai + aj * aj)
    Sbb += At * (sb * sb + b0 * b0 + bi * bi + bj * bj)
    Sab += At * (sa * sb + a0 * b0 + ai * bi + aj * bj)
    VW[0] += t; VW[i] += t; VW[j] += t
    VWA[0] += h * (sa + a0); VWA[i] += h * (sa + ai); VWA[j] += h * (sa + aj)
    VWB[0] += h * (sb + b0); VWB[i] += h * (sb + bi); VWB[j] += h * (sb + bj)
  }
  for (let k = wo; k < wo + 12; k++) w[k] = 0
  for (let k = 0; k < n; k++) {
    const s = VS[k], r = 1 - s, q3 = wo + 3 * VQ[k], r3 = wo + 3 * VR[k]
    const W = VW[k], WA = VWA[k], WB = VWB[k]
    w[q3] += r * W; w[q3 + 1] += r * WA; w[q3 + 2] += r * WB
    w[r3] += s * W; w[r3 + 1] += s * WA; w[r3 + 2] += s * WB
  }
  out[oo + AREA] += A
  out[oo + SA] += Sa / 3; out[oo + SB] += Sb / 3
  out[oo + SAA] += Saa / 12; out[oo + SBB] += Sbb / 12; out[oo + SAB] += Sab / 12
  out[oo + CUT] += 1
  return n
}
