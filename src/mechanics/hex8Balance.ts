/**
 * The hex8 element balance in closed form (see balanceAudit.ts for what the balance is): for
 * every element of one hex8 block, the six face forces ∫ σn dA, their sum plus ρb·V (the
 * residual), half the sum of their magnitudes plus half |ρb|·|V| (the gross load) and the
 * indicator. Units are the caller's (force = stress × length², V in length³).
 *
 * Inputs: `x` coordinates (3 per node), `conn` the block's connectivity (8 corners per element,
 * numbered as in elements/hexahedra.ts), `rows` the stress row of each element-node beside it
 * (StressField.rows), `stress` 6 per row (xx, yy, zz, xy, yz, xz). Element `e` of the block is
 * `off + e` of `out`.
 *
 * Method (exact: each term integrates a polynomial exactly). The trilinear map is
 * x(ξ, η, ζ) = Σ_k α_k P_k with P = 1, ξ, η, ζ, ξη, ηζ, ζξ, ξηζ; its sums H_k = Σ_a P_k(ξ_a) x_a
 * = 8 α_k over the corners a are one butterfly (23 additions a coordinate; H_0 is not needed,
 * so no coordinate enters except through differences, and the volume is free of cancellation far
 * from the origin). On the face ξ = s (s = ±1) with face variables (u, v) = (η, ζ), cyclic for
 * the other axes ((ζ, ξ) on η = s, (ξ, η) on ζ = s), x = A + B u + C v + D uv with
 * 8B = H_2 + s H_4, 8C = H_3 + s H_6, 8D = H_5 + s H_7 (cyclically), and x_u × x_v =
 * B×C + u B×D + v D×C points out of the element on s = +1 and into it on s = −1 (for a
 * positively oriented element; the same faces, in the same sense, as the face node lists of
 * ELEMENT_TYPES.hex8, so an inverted element is treated as the face quadrature treats it).
 * σ on the face is bilinear, σ = S_A + S_B u + S_C v + S_D uv; with the corner sums of the face
 * s_a = 4 S_A, s_b = 4 S_B, s_c = 4 S_C, the terms of even degree give (∫1 = 4, ∫u² = ∫v² = 4/3
 * on [-1, 1]²)
 *   ∫ σn dA = s (4 S_A (B×C) + 4/3 (S_B (B×D) + S_C (D×C)))
 *           = s (3 s_a (b×c) + s_b (b×d) + s_c (d×c)) / 192,   b = 8B, c = 8C, d = 8D.
 * The corner sums come from the element's twelve edge sums (each edge on two faces): on a face,
 * with e₊, e₋ its two edges along v (at u = +1, −1) and f₊, f₋ its two edges along u,
 * s_a = e₊ + e₋, s_b = e₊ − e₋, s_c = f₊ − f₋, so s_a k + s_b (b×d) = e₊ p + e₋ q with
 * k = 3 b×c, p = k + b×d, q = k − b×d: two products where the sums would take two more additions.
 * Volume by the divergence theorem (div x = 3): V = ⅓ ∮ (x − α_0)·n dA, and on the face
 * (x − α_0)·n integrates to 4 (s α_axis)·(s B×C) (the other terms are odd or B·(B×D) = 0), so
 *   V = Σ_axis H_axis · (n₊ + n₋) / 384,   n_s = b×c of the face at s.
 * Per element: the butterfly writes b, c, d of the six faces and H_1..H_3 into scratch, the
 * stress's edge sums go to scratch (one component at a time, straight from the rows: for nodal
 * stress the rows are the nodes, read from the connectivity already loaded), then one loop over
 * the faces. About 800 floating-point operations an element instead of the 1 000 of
 * the face-by-face form (corner sums and relative coordinates per face, b, c, d from corners);
 * the loop is arithmetic-bound, so that is its speed. computeElementBalanceGeneral (the 2×2 face
 * quadrature) is the plain path the tests hold it to.
 */
import type { Vec3 } from '../model/model.ts'
import type { ElementBalance } from './types.ts'

/** hex8 corner reference coordinates (elements/hexahedra.ts), 3 per corner. */
const REF = [[-1, -1, -1], [1, -1, -1], [1, 1, -1], [-1, 1, -1], [-1, -1, 1], [1, -1, 1], [1, 1, 1], [-1, 1, 1]]

/** The 12 edges as corner pairs (the same edges as ELEMENT_TYPES.hex8.edges). */
const EDGES = [[0, 1], [1, 2], [2, 3], [0, 3], [4, 5], [5, 6], [6, 7], [4, 7], [0, 4], [1, 5], [2, 6], [3, 7]]

/**
 * Per face (axis a = 0, 1, 2 for ξ, η, ζ; s = +1 then −1), 6 numbers: s, 3a (H_axis in the
 * scratch h), then the offsets 6·edge of e₊, e₋, f₊, f₋ into the edge sums. Built from REF and
 * EDGES at load.
 */
const FACE_TABLE: Int32Array = (() => {
  const rows: number[] = []
  for (let a = 0; a < 3; a++) {
    const u = (a + 1) % 3, v = (a + 2) % 3
    for (const s of [1, -1]) {
      const on = [0, 1, 2, 3, 4, 5, 6, 7].filter((k) => REF[k][a] === s)
      // the edge of this face through its two corners with reference coordinate `at` = `sign`
      const edge = (at: number, sign: number): number => {
        const [p, q] = on.filter((k) => REF[k][at] === sign)
        return EDGES.findIndex(([i, j]) => (i === p && j === q) || (i === q && j === p))
      }
      rows.push(s, 3 * a, 6 * edge(u, 1), 6 * edge(u, -1), 6 * edge(v, 1), 6 * edge(v, -1))
    }
  }
  return Int32Array.from(rows)
})()

/** Numbers per face in FACE_TABLE. */
const FT = 6

/** Fills `out` for the elements of one hex8 block (element e at out index off + e). */
export function hex8Balance(out: ElementBalance, off: number, x: Float64Array, conn: Int32Array, rows: Int32Array, stress: Float64Array, bodyForce: Vec3): void {
  const count = conn.length >> 3
  const R = out.residual, G = out.gross, I = out.indicator
  const T = FACE_TABLE
  // nodal stress: the rows are the connectivity itself (StressField.rows), or a view of the same
  // bytes where the block was sliced
  const nodal = rows === conn || (rows.buffer === conn.buffer && rows.byteOffset === conn.byteOffset && rows.length === conn.length)
  const bx = bodyForce[0], by = bodyForce[1], bz = bodyForce[2]
  const bMag = Math.sqrt(bx * bx + by * by + bz * bz)
  // h: H_1, H_2, H_3 (3 each); fv: b, c, d of the faces in FACE_TABLE order (9 each); es: the
  // 12 edge sums of the 6 stress components (6 an edge)
  const h = new Float64Array(9), fv = new Float64Array(54), es = new Float64Array(72)
  for (let e = 0; e < count; e++) {
    const base = 8 * e
    // the butterfly of the coordinates, one component at a time
    const p0 = 3 * conn[base], p1 = 3 * conn[base + 1], p2 = 3 * conn[base + 2], p3 = 3 * conn[base + 3]
    const p4 = 3 * conn[base + 4], p5 = 3 * conn[base + 5], p6 = 3 * conn[base + 6], p7 = 3 * conn[base + 7]
    for (let k = 0; k < 3; k++) {
      const x0 = x[p0 + k], x1 = x[p1 + k], x2 = x[p2 + k], x3 = x[p3 + k]
      const x4 = x[p4 + k], x5 = x[p5 + k], x6 = x[p6 + k], x7 = x[p7 + k]
      // ξ pairs at (η, ζ) = (−, −), (+, −), (−, +), (+, +): sums and differences
      const s01 = x0 + x1, d01 = x1 - x0, s32 = x3 + x2, d32 = x2 - x3
      const s45 = x4 + x5, d45 = x5 - x4, s76 = x7 + x6, d76 = x6 - x7
      // then η at ζ = −1 (a) and ζ = +1 (b), then ζ
      const a0 = s01 + s32, a2 = s32 - s01, a1 = d01 + d32, a4 = d32 - d01
      const b0 = s45 + s76, b2 = s76 - s45, b1 = d45 + d76, b4 = d76 - d45
      const H1 = a1 + b1, H2 = a2 + b2, H3 = b0 - a0, H4 = a4 + b4, H5 = b2 - a2, H6 = b1 - a1, H7 = b4 - a4
      h[k] = H1; h[3 + k] = H2; h[6 + k] = H3
      // b, c, d of the faces ξ = ±1 (H_2 ± H_4, H_3 ± H_6, H_5 ± H_7), η = ±1 (H_3 ± H_5,
      // H_1 ± H_4, H_6 ± H_7) and ζ = ±1 (H_1 ± H_6, H_2 ± H_5, H_4 ± H_7), 9 numbers a face
      fv[k] = H2 + H4; fv[3 + k] = H3 + H6; fv[6 + k] = H5 + H7
      fv[9 + k] = H2 - H4; fv[12 + k] = H3 - H6; fv[15 + k] = H5 - H7
      fv[18 + k] = H3 + H5; fv[21 + k] = H1 + H4; fv[24 + k] = H6 + H7
      fv[27 + k] = H3 - H5; fv[30 + k] = H1 - H4; fv[33 + k] = H6 - H7
      fv[36 + k] = H1 + H6; fv[39 + k] = H2 + H5; fv[42 + k] = H4 + H7
      fv[45 + k] = H1 - H6; fv[48 + k] = H2 - H5; fv[51 + k] = H4 - H7
    }
    // the edge sums of the stress, one component at a time; nodal stress has its rows at the
    // nodes, so the connectivity already read gives them (eight loads fewer: 6–7 % faster)
    let r0: number, r1: number, r2: number, r3: number, r4: number, r5: number, r6: number, r7: number
    if (nodal) {
      r0 = 2 * p0; r1 = 2 * p1; r2 = 2 * p2; r3 = 2 * p3; r4 = 2 * p4; r5 = 2 * p5; r6 = 2 * p6; r7 = 2 * p7
    } else {
      r0 = 6 * rows[base]; r1 = 6 * rows[base + 1]; r2 = 6 * rows[base + 2]; r3 = 6 * rows[base + 3]
      r4 = 6 * rows[base + 4]; r5 = 6 * rows[base + 5]; r6 = 6 * rows[base + 6]; r7 = 6 * rows[base + 7]
    }
    for (let c = 0; c < 6; c++) {
      const t0 = stress[r0 + c], t1 = stress[r1 + c], t2 = stress[r2 + c], t3 = stress[r3 + c]
      const t4 = stress[r4 + c], t5 = stress[r5 + c], t6 = stress[r6 + c], t7 = stress[r7 + c]
      es[c] = t0 + t1; es[6 + c] = t1 + t2; es[12 + c] = t2 + t3; es[18 + c] = t0 + t3
      es[24 + c] = t4 + t5; es[30 + c] = t5 + t6; es[36 + c] = t6 + t7; es[42 + c] = t4 + t7
      es[48 + c] = t0 + t4; es[54 + c] = t1 + t5; es[60 + c] = t2 + t6; es[66 + c] = t3 + t7
    }
    let rx = 0, ry = 0, rz = 0, g = 0, v384 = 0
    for (let f = 0, o = 0; f < 6 * FT; f += FT, o += 9) {
      const s = T[f], ha = T[f + 1]
      const bx_ = fv[o], by_ = fv[o + 1], bz_ = fv[o + 2], cx = fv[o + 3], cy = fv[o + 4], cz = fv[o + 5]
      const dx = fv[o + 6], dy = fv[o + 7], dz = fv[o + 8]
      const nx = by_ * cz - bz_ * cy, ny = bz_ * cx - bx_ * cz, nz = bx_ * cy - by_ * cx
      v384 += h[ha] * nx + h[ha + 1] * ny + h[ha + 2] * nz
      const ux = by_ * dz - bz_ * dy, uy = bz_ * dx - bx_ * dz, uz = bx_ * dy - by_ * dx
      const wx = dy * cz - dz * cy, wy = dz * cx - dx * cz, wz = dx * cy - dy * cx
      const kx = 3 * nx, ky = 3 * ny, kz = 3 * nz
      const px = kx + ux, py = ky + uy, pz = kz + uz, qx = kx - ux, qy = ky - uy, qz = kz - uz
      const ep = T[f + 2], em = T[f + 3], fp = T[f + 4], fm = T[f + 5]
      // xx, yy, zz, xy, yz, xz: e₊ p + e₋ q + (f₊ − f₋) w along the direction(s) each multiplies
      let a = es[ep], b = es[em], c = es[fp] - es[fm]
      let fx = a * px + b * qx + c * wx
      a = es[ep + 1]; b = es[em + 1]; c = es[fp + 1] - es[fm + 1]
      let fy = a * py + b * qy + c * wy
      a = es[ep + 2]; b = es[em + 2]; c = es[fp + 2] - es[fm + 2]
      let fz = a * pz + b * qz + c * wz
      a = es[ep + 3]; b = es[em + 3]; c = es[fp + 3] - es[fm + 3]
      fx += a * py + b * qy + c * wy
      fy += a * px + b * qx + c * wx
      a = es[ep + 4]; b = es[em + 4]; c = es[fp + 4] - es[fm + 4]
      fy += a * pz + b * qz + c * wz
      fz += a * py + b * qy + c * wy
      a = es[ep + 5]; b = es[em + 5]; c = es[fp + 5] - es[fm + 5]
      fx += a * pz + b * qz + c * wz
      fz += a * px + b * qx + c * wx
      // a branch, not s·f: faces alternate + and −, so it is always predicted (measured 9 % faster)
      if (s > 0) { rx += fx; ry += fy; rz += fz } else { rx -= fx; ry -= fy; rz -= fz }
      g += Math.sqrt(fx * fx + fy * fy + fz * fz)
    }
    const v = v384 * (1 / 384)
    rx = rx * (1 / 192) + bx * v; ry = ry * (1 / 192) + by * v; rz = rz * (1 / 192) + bz * v
    const ge = off + e
    R[3 * ge] = rx; R[3 * ge + 1] = ry; R[3 * ge + 2] = rz
    const gr = 0.5 * (g * (1 / 192) + bMag * Math.abs(v))
    G[ge] = gr
    I[ge] = gr > 0 ? Math.sqrt(rx * rx + ry * ry + rz * rz) / gr : 0
  }
}
