/**
 * Free body of the piece of a body on the -m side of a section plane (d < 0; d == 0 is the
 * + side as in sectionPolygon.ts): the boundary tractions on that piece, the body force on its
 * volume, and the section resultant, which together should vanish (static equilibrium,
 * div σ + ρb = 0 integrated over the piece).
 *
 * - Boundary faces wholly on the - side (all corners d < 0) contribute their own integrals
 *   ∫ t dA and ∫ x × t dA from SurfaceTractions (each face's own quadrature).
 * - Faces the plane crosses are clipped by their corner polygon: the corners on the - side and
 *   the points where the plane crosses the face's edges, on the edge's own curve for a quadratic
 *   face (the same points, bit for bit, as the section polygon's vertices on that edge, see
 *   `edgeRoot`). The clipped polygon is split into a fan of flat triangles, and t = σn is
 *   integrated on each with the element type's section rule (sectionRule.ts), the stress
 *   interpolated from all of the element's nodes at the point's reference coordinates
 *   (inverted from the linear estimate on curved elements, inverseMap.ts) — the same shape
 *   functions and rule as the section itself. On a flat face this is exact for the fields the
 *   element represents; on a curved face the flat triangles are chords of it, an approximation
 *   of the same order as the section polygon's (elementSection.ts). Faces of linear simplices
 *   (tet4) keep the closed form of the linear path, exact for their linear stress.
 * - Volume V- and its first moment come from the divergence theorem over the closed surface of
 *   the piece (V = 1/3 ∮ (x-g)·n dA, ∫ (x-g) dV = 1/4 ∮ (x-g)((x-g)·n) dA): whole faces by their
 *   area, mean normal and centroid (exact for flat faces; curved quadratic faces approximately),
 *   clipped faces by their triangles, the section by its area and centroid.
 * - The scales of the residuals: gross = 1/2 (Σ |∫ t dA| over the piece's whole and clipped faces
 *   + Σ |∫ σm dA| over the section's polygons + |ρb| V-), the load passing through the piece
 *   with the section counted by its own traction distribution (a section on a loaded face, or in
 *   torsion, has a small resultant but carries load); and L, the diagonal of the piece's bounding
 *   box (the nodes of its whole faces and the corners and crossing points of its clipped faces,
 *   which hold the section's outline). The force residual is reported over gross, the moment
 *   residual over gross · L.
 *
 * Free-body accumulator slots (FB_SIZE per section): force (S·L²), moment about the section
 * centroid c (S·L³), volume (L³), first moment of volume about g (L⁴), sum of |face force|, and
 * the bounding box (min, max: L). Start every block with `initFreeBody` (the box starts empty).
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { ElementMap } from './inverseMap.ts'
import { createElementMap, invertElementMap, loadElementMap, MAX_ELEMENT_NODES, referenceDomain } from './inverseMap.ts'
import type { PolygonScratch } from './sectionPolygon.ts'
import { createPolygonScratch, edgeRoot } from './sectionPolygon.ts'
import { sectionRule, shapeDegree } from './sectionRule.ts'
import { shapeValues } from './shapeFunctions.ts'
import type { BoundaryFaces, FreeBodyFigure, SurfaceTractions } from './types.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from './tractions.ts'

export const FB_FORCE = 0
export const FB_MOMENT = 3
export const FB_VOLUME = 6
export const FB_FIRST = 7
export const FB_GROSS = 10
export const FB_BOX_MIN = 11
export const FB_BOX_MAX = 14
export const FB_SIZE = 17

/** Corner count per face kind code (tri3, tri6, quad4, quad8), node count, and whether the face is quadratic. */
const FACE_CORNERS = [3, 3, 4, 4]
const FACE_NODES = [3, 6, 4, 8]
const FACE_QUADRATIC = [false, true, false, true]

export function faceCornerCount(kindCode: number): number {
  return FACE_CORNERS[kindCode]
}

/** Empties the free-body block fb[off ..]: zero sums, an empty bounding box. */
export function initFreeBody(fb: Float64Array, off: number): void {
  for (let s = 0; s < FB_SIZE; s++) fb[off + s] = 0
  for (let k = 0; k < 3; k++) { fb[off + FB_BOX_MIN + k] = Infinity; fb[off + FB_BOX_MAX + k] = -Infinity }
}

/** Adds block from[fo ..] into into[io ..]: sums add, boxes join. */
export function mergeFreeBody(into: Float64Array, io: number, from: Float64Array, fo: number): void {
  for (let s = 0; s < FB_BOX_MIN; s++) into[io + s] += from[fo + s]
  for (let k = 0; k < 3; k++) {
    into[io + FB_BOX_MIN + k] = Math.min(into[io + FB_BOX_MIN + k], from[fo + FB_BOX_MIN + k])
    into[io + FB_BOX_MAX + k] = Math.max(into[io + FB_BOX_MAX + k], from[fo + FB_BOX_MAX + k])
  }
}

function boxPoint(fb: Float64Array, off: number, x: number, y: number, z: number): void {
  if (x < fb[off + FB_BOX_MIN]) fb[off + FB_BOX_MIN] = x
  if (x > fb[off + FB_BOX_MAX]) fb[off + FB_BOX_MAX] = x
  if (y < fb[off + FB_BOX_MIN + 1]) fb[off + FB_BOX_MIN + 1] = y
  if (y > fb[off + FB_BOX_MAX + 1]) fb[off + FB_BOX_MAX + 1] = y
  if (z < fb[off + FB_BOX_MIN + 2]) fb[off + FB_BOX_MIN + 2] = z
  if (z > fb[off + FB_BOX_MAX + 2]) fb[off + FB_BOX_MAX + 2] = z
}

/**
 * Adds a whole boundary face f: force and moment about the coordinate origin as stored in
 * `tractions` (the caller shifts the moment to the section centroid once, M_c = M_0 - c × F),
 * its volume terms about g and its nodes to the bounding box.
 */
export function addWholeFace(
  fb: Float64Array, off: number, coords: Float64Array, faces: BoundaryFaces, tractions: SurfaceTractions, f: number, gx: number, gy: number, gz: number,
): void {
  const fx = tractions.force[3 * f], fy = tractions.force[3 * f + 1], fz = tractions.force[3 * f + 2]
  fb[off + FB_FORCE] += fx; fb[off + FB_FORCE + 1] += fy; fb[off + FB_FORCE + 2] += fz
  fb[off + FB_MOMENT] += tractions.moment[3 * f]; fb[off + FB_MOMENT + 1] += tractions.moment[3 * f + 1]; fb[off + FB_MOMENT + 2] += tractions.moment[3 * f + 2]
  const A = faces.area[f]
  const rx = faces.centroid[3 * f] - gx, ry = faces.centroid[3 * f + 1] - gy, rz = faces.centroid[3 * f + 2] - gz
  const hA = A * (rx * faces.normal[3 * f] + ry * faces.normal[3 * f + 1] + rz * faces.normal[3 * f + 2])
  fb[off + FB_VOLUME] += hA / 3
  fb[off + FB_FIRST] += 0.25 * hA * rx; fb[off + FB_FIRST + 1] += 0.25 * hA * ry; fb[off + FB_FIRST + 2] += 0.25 * hA * rz
  fb[off + FB_GROSS] += Math.sqrt(fx * fx + fy * fy + fz * fz)
  const nodes = faces.nodes, base = faces.slots * f, nf = FACE_NODES[faces.kind[f]]
  for (let k = 0; k < nf; k++) {
    const p = 3 * nodes[base + k]
    boxPoint(fb, off, coords[p], coords[p + 1], coords[p + 2])
  }
}

/** Scratch of `addClippedFace` (create once per cut or sweep). */
export interface ClipScratch {
  readonly sc: PolygonScratch
  readonly em: ElementMap
  readonly N: Float64Array
  readonly xi: Float64Array
}

export function createClipScratch(): ClipScratch {
  return { sc: createPolygonScratch(), em: createElementMap(), N: new Float64Array(MAX_ELEMENT_NODES), xi: new Float64Array(3) }
}

/**
 * Adds the part of boundary face f with d < 0, where `cs.sc.dist[0..corners)` holds the face's
 * (snapped) corner distances and the distance of any other node i is nodeDist[i] - shift. Force
 * and the moment about c go straight into fb (already about the centroid); volume terms about g.
 */
export function addClippedFace(
  fb: Float64Array, off: number, mesh: Mesh, field: StressField, faces: BoundaryFaces, f: number,
  nodeDist: Float64Array, shift: number, cs: ClipScratch, cx: number, cy: number, cz: number, gx: number, gy: number, gz: number,
): void {
  const coords = mesh.coords
  const kind = faces.kind[f]
  const nc = FACE_CORNERS[kind], quadratic = FACE_QUADRATIC[kind]
  const nodes = faces.nodes, fbase = faces.slots * f
  // the element the face belongs to, and the face's local node numbers in it
  const g = faces.elem[f]
  let bi = 0
  while (bi + 1 < mesh.blocks.length && mesh.blocks[bi + 1].offset <= g) bi++
  const blk = mesh.blocks[bi], topo = ELEMENT_TYPES[blk.type], nn = topo.nodeCount
  const ebase = (g - blk.offset) * nn, local = topo.faces[faces.localFace[f]]
  if (shapeDegree(blk.type) <= 1) {
    // linear simplex (tet4): linear stress, the closed form of the linear path is exact
    addClippedLinearFace(fb, off, coords, field.values, field.rows[bi], ebase, local, faces, f, cs.sc, cx, cy, cz, gx, gy, gz)
    return
  }
  const domain = referenceDomain(blk.type), ref = domain.ref
  const sc = cs.sc, dist = sc.dist, pos = sc.pos, xi = sc.ref
  // Sutherland–Hodgman against one plane: keep - corners, add a point where an edge crosses
  let n = 0
  for (let i = 0; i < nc; i++) {
    const j = i + 1 === nc ? 0 : i + 1
    const di = dist[i], dj = dist[j]
    if (di < 0) {
      const p = 3 * nodes[fbase + i], r = 3 * local[i]
      pos[3 * n] = coords[p]; pos[3 * n + 1] = coords[p + 1]; pos[3 * n + 2] = coords[p + 2]
      xi[3 * n] = ref[r]; xi[3 * n + 1] = ref[r + 1]; xi[3 * n + 2] = ref[r + 2]
      n++
    }
    if ((di < 0) === (dj < 0)) continue
    // same walk as the section polygons: from the - corner q to the + corner r
    const iq = di < 0 ? i : j, ir = di < 0 ? j : i
    const nq = nodes[fbase + iq], nr = nodes[fbase + ir]
    const dq = dist[iq], dr = dist[ir]
    const xq = 3 * nq, xr = 3 * nr
    let s: number
    if (dr === 0) {
      s = 1
      pos[3 * n] = coords[xr]; pos[3 * n + 1] = coords[xr + 1]; pos[3 * n + 2] = coords[xr + 2]
    } else if (!quadratic) {
      s = dq / (dq - dr)
      pos[3 * n] = coords[xq] + s * (coords[xr] - coords[xq])
      pos[3 * n + 1] = coords[xq + 1] + s * (coords[xr + 1] - coords[xq + 1])
      pos[3 * n + 2] = coords[xq + 2] + s * (coords[xr + 2] - coords[xq + 2])
    } else {
      const nm = nodes[fbase + nc + i] // mid-edge node of face edge (c_i, c_i+1)
      s = edgeRoot(dq, nodeDist[nm] - shift, dr)
      const wq = (1 - s) * (1 - 2 * s), wm = 4 * s * (1 - s), wr = s * (2 * s - 1), xm = 3 * nm
      pos[3 * n] = wq * coords[xq] + wm * coords[xm] + wr * coords[xr]
      pos[3 * n + 1] = wq * coords[xq + 1] + wm * coords[xm + 1] + wr * coords[xr + 1]
      pos[3 * n + 2] = wq * coords[xq + 2] + wm * coords[xm + 2] + wr * coords[xr + 2]
    }
    const rq = 3 * local[iq], rr = 3 * local[ir]
    xi[3 * n] = ref[rq] + s * (ref[rr] - ref[rq])
    xi[3 * n + 1] = ref[rq + 1] + s * (ref[rr + 1] - ref[rq + 1])
    xi[3 * n + 2] = ref[rq + 2] + s * (ref[rr + 2] - ref[rq + 2])
    n++
  }
  if (n < 3) return
  const em = loadElementMap(cs.em, domain, coords, blk.conn, ebase)
  const rule = sectionRule(blk.type), nq = rule.count, L0 = rule.l0, L1 = rule.l1, L2 = rule.l2, W = rule.w
  const N = cs.N, qxi = cs.xi, values = field.values, rows = field.rows[bi]
  let Fx = 0, Fy = 0, Fz = 0, Mx = 0, My = 0, Mz = 0
  const x0 = pos[0], y0 = pos[1], z0 = pos[2]
  for (let i = 1; i < n - 1; i++) {
    const j = i + 1
    const e1x = pos[3 * i] - x0, e1y = pos[3 * i + 1] - y0, e1z = pos[3 * i + 2] - z0
    const e2x = pos[3 * j] - x0, e2y = pos[3 * j + 1] - y0, e2z = pos[3 * j + 2] - z0
    // area vector S = A n (outward: the face's corner order is kept)
    const Sx = 0.5 * (e1y * e2z - e1z * e2y), Sy = 0.5 * (e1z * e2x - e1x * e2z), Sz = 0.5 * (e1x * e2y - e1y * e2x)
    for (let r = 0; r < nq; r++) {
      const l0 = L0[r], l1 = L1[r], l2 = L2[r], w = W[r]
      for (let c = 0; c < 3; c++) qxi[c] = l0 * xi[c] + l1 * xi[3 * i + c] + l2 * xi[3 * j + c]
      // the point relative to the first vertex, then to c
      const px = l1 * e1x + l2 * e2x, py = l1 * e1y + l2 * e2y, pz = l1 * e1z + l2 * e2z
      if (!em.affine) invertElementMap(em, x0 + px - em.origin[0], y0 + py - em.origin[1], z0 + pz - em.origin[2], qxi, 0)
      shapeValues(blk.type, qxi[0], qxi[1], qxi[2], N)
      let sxx = 0, syy = 0, szz = 0, sxy = 0, syz = 0, sxz = 0
      for (let k = 0; k < nn; k++) {
        const s6 = 6 * rows[ebase + k], Nk = N[k]
        sxx += Nk * values[s6]; syy += Nk * values[s6 + 1]; szz += Nk * values[s6 + 2]
        sxy += Nk * values[s6 + 3]; syz += Nk * values[s6 + 4]; sxz += Nk * values[s6 + 5]
      }
      // w σ S = ∫ t dA share of this point
      const tx = w * (sxx * Sx + sxy * Sy + sxz * Sz)
      const ty = w * (sxy * Sx + syy * Sy + syz * Sz)
      const tz = w * (sxz * Sx + syz * Sy + szz * Sz)
      const rx = x0 + px - cx, ry = y0 + py - cy, rz = z0 + pz - cz
      Fx += tx; Fy += ty; Fz += tz
      Mx += ry * tz - rz * ty; My += rz * tx - rx * tz; Mz += rx * ty - ry * tx
    }
  }
  addClipped(fb, off, Fx, Fy, Fz, Mx, My, Mz, cx, cy, cz, pos, n, gx, gy, gz)
}

/**
 * addClippedFace for the face of a linear simplex: the stress is linear, so the clip points take
 * it interpolated along the face edge and each fan triangle is integrated in closed form,
 * ∫ t dA = A/3 Σ t_k and ∫ (x - c) × t dA = A/12 (Σ r × Σ t + Σ r_k × t_k). `local`: the face's
 * local node numbers, its stress rows rows[ebase + local[k]].
 */
function addClippedLinearFace(
  fb: Float64Array, off: number, coords: Float64Array, values: Float64Array, rows: Int32Array, ebase: number,
  local: readonly number[], faces: BoundaryFaces, f: number, sc: PolygonScratch,
  cx: number, cy: number, cz: number, gx: number, gy: number, gz: number,
): void {
  const nc = FACE_CORNERS[faces.kind[f]]
  const nodes = faces.nodes, fbase = faces.slots * f
  const dist = sc.dist, pos = sc.pos, sig = sc.sig
  let n = 0
  for (let i = 0; i < nc; i++) {
    const j = i + 1 === nc ? 0 : i + 1
    const di = dist[i], dj = dist[j]
    const ni = nodes[fbase + i]
    if (di < 0) {
      pos[3 * n] = coords[3 * ni]; pos[3 * n + 1] = coords[3 * ni + 1]; pos[3 * n + 2] = coords[3 * ni + 2]
      const si = 6 * rows[ebase + local[i]]
      for (let c = 0; c < 6; c++) sig[6 * n + c] = values[si + c]
      n++
    }
    if ((di < 0) === (dj < 0)) continue
    // same walk as the section polygons: from the - corner q to the + corner r
    const iq = di < 0 ? i : j, ir = di < 0 ? j : i
    const nq = nodes[fbase + iq], nr = nodes[fbase + ir]
    const dq = dist[iq], dr = dist[ir]
    const t = dr === 0 ? 1 : dq / (dq - dr)
    const xq = 3 * nq, xr = 3 * nr
    if (dr === 0) {
      pos[3 * n] = coords[xr]; pos[3 * n + 1] = coords[xr + 1]; pos[3 * n + 2] = coords[xr + 2]
    } else {
      pos[3 * n] = coords[xq] + t * (coords[xr] - coords[xq])
      pos[3 * n + 1] = coords[xq + 1] + t * (coords[xr + 1] - coords[xq + 1])
      pos[3 * n + 2] = coords[xq + 2] + t * (coords[xr + 2] - coords[xq + 2])
    }
    const sq = 6 * rows[ebase + local[iq]], sr = 6 * rows[ebase + local[ir]]
    for (let c = 0; c < 6; c++) sig[6 * n + c] = values[sq + c] + t * (values[sr + c] - values[sq + c])
    n++
  }
  if (n < 3) return
  let Fx = 0, Fy = 0, Fz = 0, Mx = 0, My = 0, Mz = 0
  const x0 = pos[0], y0 = pos[1], z0 = pos[2]
  for (let i = 1; i < n - 1; i++) {
    const j = i + 1
    // area vector S = A n of the fan triangle (outward: the face's corner order is kept)
    const e1x = pos[3 * i] - x0, e1y = pos[3 * i + 1] - y0, e1z = pos[3 * i + 2] - z0
    const e2x = pos[3 * j] - x0, e2y = pos[3 * j + 1] - y0, e2z = pos[3 * j + 2] - z0
    const Sx = 0.5 * (e1y * e2z - e1z * e2y), Sy = 0.5 * (e1z * e2x - e1x * e2z), Sz = 0.5 * (e1x * e2y - e1y * e2x)
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
  }
  Fx /= 3; Fy /= 3; Fz /= 3
  addClipped(fb, off, Fx, Fy, Fz, Mx / 12, My / 12, Mz / 12, cx, cy, cz, pos, n, gx, gy, gz)
}

/**
 * Adds one clipped face's figures (force, moment about c) to fb, with its volume terms about g
 * (the fan of flat triangles of its n points: signed volume of each tetrahedron (g, p0, pi, pj)
 * and its centroid) and its points' bounding box.
 */
function addClipped(
  fb: Float64Array, off: number, Fx: number, Fy: number, Fz: number, Mx: number, My: number, Mz: number,
  cx: number, cy: number, cz: number, pos: Float64Array, n: number, gx: number, gy: number, gz: number,
): void {
  let V = 0, Qx = 0, Qy = 0, Qz = 0
  const x0 = pos[0], y0 = pos[1], z0 = pos[2]
  const px = x0 - gx, py = y0 - gy, pz = z0 - gz
  for (let i = 1; i < n - 1; i++) {
    const j = i + 1
    const e1x = pos[3 * i] - x0, e1y = pos[3 * i + 1] - y0, e1z = pos[3 * i + 2] - z0
    const e2x = pos[3 * j] - x0, e2y = pos[3 * j + 1] - y0, e2z = pos[3 * j + 2] - z0
    const v = (px * (e1y * e2z - e1z * e2y) + py * (e1z * e2x - e1x * e2z) + pz * (e1x * e2y - e1y * e2x)) / 6
    V += v
    Qx += 0.25 * v * (3 * px + e1x + e2x); Qy += 0.25 * v * (3 * py + e1y + e2y); Qz += 0.25 * v * (3 * pz + e1z + e2z)
  }
  fb[off + FB_FORCE] += Fx; fb[off + FB_FORCE + 1] += Fy; fb[off + FB_FORCE + 2] += Fz
  // clipped moments are about c already; the caller's origin-to-c shift must skip them, so add
  // c × F here to cancel it (keeps one shift for all faces)
  fb[off + FB_MOMENT] += Mx + (cy * Fz - cz * Fy)
  fb[off + FB_MOMENT + 1] += My + (cz * Fx - cx * Fz)
  fb[off + FB_MOMENT + 2] += Mz + (cx * Fy - cy * Fx)
  fb[off + FB_VOLUME] += V
  fb[off + FB_FIRST] += Qx; fb[off + FB_FIRST + 1] += Qy; fb[off + FB_FIRST + 2] += Qz
  fb[off + FB_GROSS] += Math.sqrt(Fx * Fx + Fy * Fy + Fz * Fz)
  for (let k = 0; k < n; k++) boxPoint(fb, off, pos[3 * k], pos[3 * k + 1], pos[3 * k + 2])
}

/**
 * Closes the free body: adds the section (area A, centroid c, resultant F_s, moment M_s about c,
 * `sectionGross` = Σ |∫ σm dA| over its polygons) and the body force ρb on V-, then returns the
 * residual force and moment about c with their scales (file header). `fb` moment is about the
 * coordinate origin with the clipped faces' c × F already added, so M_c = M - c × F_faces;
 * first moment is about g.
 */
export function closeFreeBody(
  fb: Float64Array, off: number, c: ArrayLike<number>, g: ArrayLike<number>, area: number, m: ArrayLike<number>,
  Fs: Vec3, Ms: Vec3, bodyForce: Vec3, sectionGross: number,
): FreeBodyFigure {
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
  const gross = 0.5 * (fb[off + FB_GROSS] + sectionGross + Math.hypot(bx, by, bz) * Math.abs(V))
  // the piece's bounding box, with the section centroid in it (a piece with no boundary face)
  let L2 = 0
  for (let k = 0; k < 3; k++) {
    const lo = Math.min(fb[off + FB_BOX_MIN + k], c[k]), hi = Math.max(fb[off + FB_BOX_MAX + k], c[k])
    L2 += (hi - lo) * (hi - lo)
  }
  const size = Math.sqrt(L2)
  const rel = gross > 0 ? Math.hypot(Rx, Ry, Rz) / gross : 0
  const momentRel = gross * size > 0 ? Math.hypot(mx, my, mz) / (gross * size) : 0
  return { force: [Rx, Ry, Rz], moment: [mx, my, mz], relative: rel, gross, momentRelative: momentRel, size }
}

/**
 * The boundary tractions a free body needs when the caller gave none (the traction kernel reads
 * the field through its element-node rows, so nodal and element-nodal stress alike).
 */
export function freeBodyTractions(mesh: Mesh, stress: StressField, faces: BoundaryFaces): SurfaceTractions {
  return computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, stress, faces)
}

/** The figure of an empty section (nothing cut). */
export const ZERO_FREE_BODY: FreeBodyFigure = { force: [0, 0, 0], moment: [0, 0, 0], relative: 0, gross: 0, momentRelative: 0, size: 0 }

