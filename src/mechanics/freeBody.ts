/**
 * Free body of the piece of a body on the -m side of a section plane (d < 0; d == 0 is the
 * + side as in sectionPolygon.ts): the boundary tractions on that piece, the body force on its
 * volume, and the section resultant, which together should vanish (static equilibrium,
 * div σ + ρb = 0 integrated over the piece).
 *
 * - Boundary faces wholly on the - side (all corners d < 0) contribute their own integrals
 *   ∫ t dA and ∫ x × t dA from SurfaceTractions (each face's own quadrature).
 * - Faces the plane crosses are clipped by their corner polygon; the clipped polygon is split into
 *   a fan of flat triangles and t = σn is integrated with stress linear between vertex values.
 *   Clip points take the stress of the crossed face edge like the section vertices do (quadratic
 *   along edges of quadratic faces). For curved quadratic faces this straight-corner clipping is
 *   an approximation of the same order as the section polygons.
 * - Volume V- and its first moment come from the divergence theorem over the closed surface of
 *   the piece (V = 1/3 ∮ (x-g)·n dA, ∫ (x-g) dV = 1/4 ∮ (x-g)((x-g)·n) dA): whole faces by their
 *   area, mean normal and centroid (exact for flat faces; curved quadratic faces approximately),
 *   clipped faces by their triangles, the section by its area and centroid.
 *
 * Free-body accumulator slots (FB_SIZE per section): force (S·L²), moment about the section
 * centroid c (S·L³), volume (L³), first moment of volume about g (L⁴), sum of |face force|.
 */
import type { Vec3 } from '../model/model.ts'
import type { BalanceFigure, BoundaryFaces, SurfaceTractions } from './types.ts'
import type { PolygonScratch } from './sectionPolygon.ts'

export const FB_FORCE = 0
export const FB_MOMENT = 3
export const FB_VOLUME = 6
export const FB_FIRST = 7
export const FB_GROSS = 10
export const FB_SIZE = 11

/** Corner count per face kind code (tri3, tri6, quad4, quad8) and whether the face is quadratic. */
const FACE_CORNERS = [3, 3, 4, 4]
const FACE_QUADRATIC = [false, true, false, true]

export function faceCornerCount(kindCode: number): number {
  return FACE_CORNERS[kindCode]
}

/**
 * Adds a whole boundary face f: force and moment about the coordinate origin as stored in
 * `tractions` (the caller shifts the moment to the section centroid once, M_c = M_0 - c × F),
 * and its volume terms about g.
 */
export function addWholeFace(fb: Float64Array, off: number, faces: BoundaryFaces, tractions: SurfaceTractions, f: number, gx: number, gy: number, gz: number): void {
  const fx = tractions.force[3 * f], fy = tractions.force[3 * f + 1], fz = tractions.force[3 * f + 2]
  fb[off + FB_FORCE] += fx; fb[off + FB_FORCE + 1] += fy; fb[off + FB_FORCE + 2] += fz
  fb[off + FB_MOMENT] += tractions.moment[3 * f]; fb[off + FB_MOMENT + 1] += tractions.moment[3 * f + 1]; fb[off + FB_MOMENT + 2] += tractions.moment[3 * f + 2]
  const A = faces.area[f]
  const rx = faces.centroid[3 * f] - gx, ry = faces.centroid[3 * f + 1] - gy, rz = faces.centroid[3 * f + 2] - gz
  const hA = A * (rx * faces.normal[3 * f] + ry * faces.normal[3 * f + 1] + rz * faces.normal[3 * f + 2])
  fb[off + FB_VOLUME] += hA / 3
  fb[off + FB_FIRST] += 0.25 * hA * rx; fb[off + FB_FIRST + 1] += 0.25 * hA * ry; fb[off + FB_FIRST + 2] += 0.25 * hA * rz
  fb[off + FB_GROSS] += Math.hypot(fx, fy, fz)
}

/**
 * Adds the part of boundary face f with d < 0, where `sc.dist[0..corners)` holds the face's corner
 * distances. Force and the moment about c go straight into fb (already about the centroid);
 * volume terms about g. Uses sc.pos / sc.sig as scratch (the face polygon has at most 8 points).
 */
export function addClippedFace(
  fb: Float64Array, off: number, coords: Float64Array, stress: Float64Array, faces: BoundaryFaces, f: number,
  sc: PolygonScratch, cx: number, cy: number, cz: number, gx: number, gy: number, gz: number,
): void {
  const kind = faces.kind[f]
  const nc = FACE_CORNERS[kind], quadratic = FACE_QUADRATIC[kind]
  const nodes = faces.nodes, base = faces.slots * f
  const dist = sc.dist, pos = sc.pos, sig = sc.sig
  // Sutherland–Hodgman against one plane: keep - corners, add a point where an edge crosses
  let n = 0
  for (let i = 0; i < nc; i++) {
    const j = i + 1 === nc ? 0 : i + 1
    const di = dist[i], dj = dist[j]
    const ni = nodes[base + i]
    if (di < 0) {
      pos[3 * n] = coords[3 * ni]; pos[3 * n + 1] = coords[3 * ni + 1]; pos[3 * n + 2] = coords[3 * ni + 2]
      for (let c = 0; c < 6; c++) sig[6 * n + c] = stress[6 * ni + c]
      n++
    }
    if ((di < 0) === (dj < 0)) continue
    // same walk as the section polygons: from the - corner q to the + corner r
    const nj = nodes[base + j]
    const nq = di < 0 ? ni : nj, nr = di < 0 ? nj : ni
    const dq = di < 0 ? di : dj, dr = di < 0 ? dj : di
    const t = dr === 0 ? 1 : dq / (dq - dr)
    const xq = 3 * nq, xr = 3 * nr
    if (dr === 0) {
      pos[3 * n] = coords[xr]; pos[3 * n + 1] = coords[xr + 1]; pos[3 * n + 2] = coords[xr + 2]
    } else {
      pos[3 * n] = coords[xq] + t * (coords[xr] - coords[xq])
      pos[3 * n + 1] = coords[xq + 1] + t * (coords[xr + 1] - coords[xq + 1])
      pos[3 * n + 2] = coords[xq + 2] + t * (coords[xr + 2] - coords[xq + 2])
    }
    const sq = 6 * nq, sr = 6 * nr
    if (quadratic) {
      const sm = 6 * nodes[base + nc + i] // mid-edge node of face edge (c_i, c_i+1)
      const wq = (1 - t) * (1 - 2 * t), wm = 4 * t * (1 - t), wr = t * (2 * t - 1)
      for (let c = 0; c < 6; c++) sig[6 * n + c] = wq * stress[sq + c] + wm * stress[sm + c] + wr * stress[sr + c]
    } else {
      for (let c = 0; c < 6; c++) sig[6 * n + c] = stress[sq + c] + t * (stress[sr + c] - stress[sq + c])
    }
    n++
  }
  if (n < 3) return
  let Fx = 0, Fy = 0, Fz = 0, Mx = 0, My = 0, Mz = 0, V = 0, Qx = 0, Qy = 0, Qz = 0
  const x0 = pos[0], y0 = pos[1], z0 = pos[2]
  for (let i = 1; i < n - 1; i++) {
    const j = i + 1
    const e1x = pos[3 * i] - x0, e1y = pos[3 * i + 1] - y0, e1z = pos[3 * i + 2] - z0
    const e2x = pos[3 * j] - x0, e2y = pos[3 * j + 1] - y0, e2z = pos[3 * j + 2] - z0
    // area vector S = A n (outward: the face's corner order is kept)
    const Sx = 0.5 * (e1y * e2z - e1z * e2y), Sy = 0.5 * (e1z * e2x - e1x * e2z), Sz = 0.5 * (e1x * e2y - e1y * e2x)
    // A t_k = σ_k S at the three vertices; ∫ t dA = Σ/3, ∫ (x-c) × t dA = (Σr × Σt + Σ r_k × t_k)/12
    let stx = 0, sty = 0, stz = 0, srx = 0, sry = 0, srz = 0, rtx = 0, rty = 0, rtz = 0
    for (let q = 0; q < 3; q++) {
      const k = q === 0 ? 0 : q === 1 ? i : j
      const s = 6 * k
      const tx = sig[s] * Sx + sig[s + 3] * Sy + sig[s + 5] * Sz
      const ty = sig[s + 3] * Sx + sig[s + 1] * Sy + sig[s + 4] * Sz
      const tz = sig[s + 5] * Sx + sig[s + 4] * Sy + sig[s + 2] * Sz
      const rx = pos[3 * k] - cx, ry = pos[3 * k + 1] - cy, rz = pos[3 * k + 2] - cz
      stx += tx; sty += ty; stz += tz; srx += rx; sry += ry; srz += rz
      rtx += ry * tz - rz * ty; rty += rz * tx - rx * tz; rtz += rx * ty - ry * tx
    }
    Fx += stx; Fy += sty; Fz += stz
    Mx += sry * stz - srz * sty + rtx; My += srz * stx - srx * stz + rty; Mz += srx * sty - sry * stx + rtz
    // signed volume of the tetrahedron (g, p0, pi, pj) and its centroid
    const px = x0 - gx, py = y0 - gy, pz = z0 - gz
    const v = (px * Sx + py * Sy + pz * Sz) / 3
    V += v
    Qx += 0.25 * v * (3 * px + e1x + e2x); Qy += 0.25 * v * (3 * py + e1y + e2y); Qz += 0.25 * v * (3 * pz + e1z + e2z)
  }
  Fx /= 3; Fy /= 3; Fz /= 3
  fb[off + FB_FORCE] += Fx; fb[off + FB_FORCE + 1] += Fy; fb[off + FB_FORCE + 2] += Fz
  // clipped moments are about c already; the caller's origin-to-c shift must skip them, so add
  // c × F here to cancel it (keeps one shift for all faces)
  fb[off + FB_MOMENT] += Mx / 12 + (cy * Fz - cz * Fy)
  fb[off + FB_MOMENT + 1] += My / 12 + (cz * Fx - cx * Fz)
  fb[off + FB_MOMENT + 2] += Mz / 12 + (cx * Fy - cy * Fx)
  fb[off + FB_VOLUME] += V
  fb[off + FB_FIRST] += Qx; fb[off + FB_FIRST + 1] += Qy; fb[off + FB_FIRST + 2] += Qz
  fb[off + FB_GROSS] += Math.hypot(Fx, Fy, Fz)
}

/**
 * Closes the free body: adds the section (area A, centroid c, resultant F_s, moment M_s about c)
 * and the body force ρb on V-, then returns the residual force and moment about c relative to the
 * piece's gross load. gross = 1/2 (Σ |face force| over the piece's boundary faces and clipped
 * faces + |F_s| + |ρb| V-): in a balanced piece the loads in equal the loads out, so half the sum
 * of magnitudes is the load passing through it (the convention of the element audit).
 * `fb` moment is about the coordinate origin with the clipped faces' c × F already added, so
 * M_c = M - c × F_faces; first moment is about g.
 */
export function closeFreeBody(
  fb: Float64Array, off: number, c: ArrayLike<number>, g: ArrayLike<number>, area: number, m: ArrayLike<number>,
  Fs: Vec3, Ms: Vec3, bodyForce: Vec3,
): BalanceFigure {
  const cx = c[0], cy = c[1], cz = c[2]
  const ffx = fb[off + FB_FORCE], ffy = fb[off + FB_FORCE + 1], ffz = fb[off + FB_FORCE + 2]
  let mx = fb[off + FB_MOMENT] - (cy * ffz - cz * ffy)
  let my = fb[off + FB_MOMENT + 1] - (cz * ffx - cx * ffz)
  let mz = fb[off + FB_MOMENT + 2] - (cx * ffy - cy * ffx)
  // section: its volume terms about g (flat, so (x-g)·m = h is constant over it)
  const sx = cx - g[0], sy = cy - g[1], sz = cz - g[2]
  const hA = area * (sx * m[0] + sy * m[1] + sz * m[2])
  const V = fb[off + FB_VOLUME] + hA / 3
  const Qx = fb[off + FB_FIRST] + 0.25 * hA * sx, Qy = fb[off + FB_FIRST + 1] + 0.25 * hA * sy, Qz = fb[off + FB_FIRST + 2] + 0.25 * hA * sz
  // body force: total ρb V, moment about c: ∫ (x - c) dV × ρb = (Q_g + V (g - c)) × ρb
  const bx = bodyForce[0], by = bodyForce[1], bz = bodyForce[2]
  const qx = Qx - V * sx, qy = Qy - V * sy, qz = Qz - V * sz
  mx += qy * bz - qz * by; my += qz * bx - qx * bz; mz += qx * by - qy * bx
  const Rx = ffx + Fs[0] + bx * V, Ry = ffy + Fs[1] + by * V, Rz = ffz + Fs[2] + bz * V
  mx += Ms[0]; my += Ms[1]; mz += Ms[2]
  const gross = 0.5 * (fb[off + FB_GROSS] + Math.hypot(Fs[0], Fs[1], Fs[2]) + Math.hypot(bx, by, bz) * Math.abs(V))
  const rel = gross > 0 ? Math.hypot(Rx, Ry, Rz) / gross : 0
  return { force: [Rx, Ry, Rz], moment: [mx, my, mz], relative: rel, gross }
}
