/**
 * The piece of a section plane inside one element, and its integrals.
 *
 * A plane with unit normal m cuts an element where its corners lie on both sides. The corner
 * distances d (model length, d = (x - p)·m) are given per corner; d == 0 counts as the + side
 * everywhere, so a plane through nodes or along element faces belongs to exactly one element on
 * each spot (the one below it) and no piece of section is counted twice or missed.
 *
 * The polygon's vertices are the plane's intersections with the element's corner edges. Each
 * crossed edge is walked from its - corner to its + corner, so two neighbours sharing the edge
 * compute bit-identical points and the section has no cracks. Stress at a vertex is interpolated
 * along that edge: linearly for linear types; for quadratic types by the 1D quadratic through the
 * two corners and the mid-edge node (edge geometry taken straight between the corners).
 *
 * Integration: the ordered polygon is split into a fan of triangles and the stress is taken
 * linear over each triangle between its vertex values; a degree-2 rule on that linear field is
 * exact. For tet4 the stress is linear in the element, so the section integrals are exact. For
 * the other types it is an approximation (bilinear / quadratic stress inside the element is
 * replaced by linear pieces on the section) whose error shrinks with mesh size squared; the
 * cantilever reference test shows it.
 */
import type { ElementTypeName } from '../model/elementTypes.ts'
import { ELEMENT_TYPES } from '../model/elementTypes.ts'

/** Most crossed edges any supported element can have (hex: 12 edges). */
export const MAX_POLYGON_POINTS = 12

/**
 * Section accumulator slots (one Float64Array block of ACC_SIZE per section). Integrals are
 * taken relative to a local origin o on the section (the first vertex met), in the in-plane
 * basis (u, v): a = (x - o)·u, b = (x - o)·v. Units: area L², first moments L³, second L⁴,
 * force S·L², moment S·L³ (about o).
 */
export const ACC_AREA = 0
export const ACC_SA = 1
export const ACC_SB = 2
export const ACC_SAA = 3
export const ACC_SBB = 4
export const ACC_SAB = 5
export const ACC_FORCE = 6
export const ACC_MOMENT = 9
export const ACC_ORIGIN = 12
export const ACC_ORIGIN_SET = 15
export const ACC_CUT = 16
export const ACC_SIZE = 17

/** Reusable scratch for one polygon; create once per cut, never inside the element loop. */
export interface PolygonScratch {
  /** Vertices found by the last `elementPolygon` call. */
  count: number
  /** Corner distances of the element being cut (model length), filled by the caller. */
  readonly dist: Float64Array
  readonly pos: Float64Array
  readonly sig: Float64Array
  /** Node index when the vertex is a mesh node lying on the plane, else -1 (for de-duplication). */
  readonly key: Int32Array
  readonly angle: Float64Array
  /** Vertex order counter-clockwise about +m. */
  readonly order: Int32Array
  /** Plane coordinates about the section origin o, per vertex as found. */
  readonly a: Float64Array
  readonly b: Float64Array
  // per ordered vertex: plane coordinates, position relative to o, traction σm, r × t
  readonly oa: Float64Array
  readonly ob: Float64Array
  readonly r: Float64Array
  readonly t: Float64Array
  readonly rt: Float64Array
}

export function createPolygonScratch(): PolygonScratch {
  const n = MAX_POLYGON_POINTS
  return {
    count: 0,
    dist: new Float64Array(8),
    pos: new Float64Array(3 * n), sig: new Float64Array(6 * n), key: new Int32Array(n),
    angle: new Float64Array(n), order: new Int32Array(n),
    a: new Float64Array(n), b: new Float64Array(n), oa: new Float64Array(n), ob: new Float64Array(n), r: new Float64Array(3 * n),
    t: new Float64Array(3 * n), rt: new Float64Array(3 * n),
  }
}

/** Corner-edge table of a type as Int32Array [a, b, mid] per edge (mid = -1 for linear types). */
const EDGE_TABLES = new Map<ElementTypeName, Int32Array>()
export function edgeTable(type: ElementTypeName): Int32Array {
  let t = EDGE_TABLES.get(type)
  if (!t) {
    const edges = ELEMENT_TYPES[type].edges
    t = new Int32Array(3 * edges.length)
    edges.forEach((e, i) => { t![3 * i] = e[0]; t![3 * i + 1] = e[1]; t![3 * i + 2] = e[2] })
    EDGE_TABLES.set(type, t)
  }
  return t
}

/**
 * In-plane orthonormal basis for a unit normal m: Float64Array(9) = u, v, m with u × v = m.
 * u is built from the coordinate axis least aligned with m, so it is deterministic.
 */
export function sectionFrame(out: Float64Array, mx: number, my: number, mz: number): Float64Array {
  const ax = Math.abs(mx), ay = Math.abs(my), az = Math.abs(mz)
  // w = the axis least aligned with m; u = normalise(w × m)... written out per case
  let ux: number, uy: number, uz: number
  if (ax <= ay && ax <= az) { ux = 0; uy = -mz; uz = my } // e_x × m
  else if (ay <= az) { ux = mz; uy = 0; uz = -mx } // e_y × m
  else { ux = -my; uy = mx; uz = 0 } // e_z × m
  const l = Math.hypot(ux, uy, uz)
  ux /= l; uy /= l; uz /= l
  out[0] = ux; out[1] = uy; out[2] = uz
  out[3] = my * uz - mz * uy; out[4] = mz * ux - mx * uz; out[5] = mx * uy - my * ux // v = m × u
  out[6] = mx; out[7] = my; out[8] = mz
  return out
}

/** Monotone stand-in for atan2(dy, dx) in [-2, 2]; only the order matters here. */
function pseudoAngle(dx: number, dy: number): number {
  const s = Math.abs(dx) + Math.abs(dy)
  if (s === 0) return 0 // a vertex at the mean: only in degenerate (zero-area) polygons
  const p = dx / s
  return dy < 0 ? p - 1 : 1 - p
}

/**
 * Builds the polygon where the plane cuts one element. `sc.dist` must hold the element's corner
 * distances. `conn`/`base`: the element's nodes are conn[base .. base+nodeCount). Returns the
 * vertex count (< 3 means no area: the plane only touches a node or an edge) and leaves the
 * vertices in `sc`, ordered counter-clockwise about m in `sc.order`, with their plane
 * coordinates about the local origin o of the section accumulated in acc[off ..]; the first
 * polygon of a section fixes o (a point on the section, so the integrals keep their relative
 * accuracy far from the coordinate origin).
 */
export function elementPolygon(
  sc: PolygonScratch, acc: Float64Array, off: number, coords: Float64Array, stress: Float64Array, conn: Int32Array, base: number,
  edges: Int32Array, quadratic: boolean, frame: Float64Array,
): number {
  const dist = sc.dist, pos = sc.pos, sig = sc.sig, key = sc.key
  const edgeCount = edges.length / 3
  let n = 0
  for (let e = 0; e < edgeCount; e++) {
    const ia = edges[3 * e], ib = edges[3 * e + 1]
    const da = dist[ia], db = dist[ib]
    if ((da < 0) === (db < 0)) continue // both on one side (d == 0 is the + side)
    // walk the edge from its - corner q to its + corner r so neighbours agree bit for bit
    const lq = da < 0 ? ia : ib, lr = da < 0 ? ib : ia
    const dq = da < 0 ? da : db, dr = da < 0 ? db : da
    const nq = conn[base + lq], nr = conn[base + lr]
    if (dr === 0) {
      // the plane passes through node nr: several edges meet there, keep the point once
      let seen = false
      for (let k = 0; k < n; k++) if (key[k] === nr) { seen = true; break }
      if (seen) continue
      key[n] = nr
      pos[3 * n] = coords[3 * nr]; pos[3 * n + 1] = coords[3 * nr + 1]; pos[3 * n + 2] = coords[3 * nr + 2]
      for (let c = 0; c < 6; c++) sig[6 * n + c] = stress[6 * nr + c]
      n++
      continue
    }
    const t = dq / (dq - dr)
    key[n] = -1
    const xq = 3 * nq, xr = 3 * nr
    pos[3 * n] = coords[xq] + t * (coords[xr] - coords[xq])
    pos[3 * n + 1] = coords[xq + 1] + t * (coords[xr + 1] - coords[xq + 1])
    pos[3 * n + 2] = coords[xq + 2] + t * (coords[xr + 2] - coords[xq + 2])
    const sq = 6 * nq, sr = 6 * nr
    if (quadratic) {
      // 1D quadratic through q (t=0), the mid-edge node (t=1/2) and r (t=1)
      const sm = 6 * conn[base + edges[3 * e + 2]]
      const wq = (1 - t) * (1 - 2 * t), wm = 4 * t * (1 - t), wr = t * (2 * t - 1)
      for (let c = 0; c < 6; c++) sig[6 * n + c] = wq * stress[sq + c] + wm * stress[sm + c] + wr * stress[sr + c]
    } else {
      for (let c = 0; c < 6; c++) sig[6 * n + c] = stress[sq + c] + t * (stress[sr + c] - stress[sq + c])
    }
    n++
  }
  sc.count = n
  if (n < 3) return n
  // plane coordinates relative to the section's local origin o (fixed by its first polygon)
  if (acc[off + ACC_ORIGIN_SET] === 0) {
    acc[off + ACC_ORIGIN] = pos[0]; acc[off + ACC_ORIGIN + 1] = pos[1]; acc[off + ACC_ORIGIN + 2] = pos[2]
    acc[off + ACC_ORIGIN_SET] = 1
  }
  const ox = acc[off + ACC_ORIGIN], oy = acc[off + ACC_ORIGIN + 1], oz = acc[off + ACC_ORIGIN + 2]
  const ux = frame[0], uy = frame[1], uz = frame[2], vx = frame[3], vy = frame[4], vz = frame[5]
  const a = sc.a, b = sc.b, order = sc.order
  let ma = 0, mb = 0
  for (let k = 0; k < n; k++) {
    const rx = pos[3 * k] - ox, ry = pos[3 * k + 1] - oy, rz = pos[3 * k + 2] - oz
    const ak = rx * ux + ry * uy + rz * uz, bk = rx * vx + ry * vy + rz * vz
    a[k] = ak; b[k] = bk
    ma += ak; mb += bk
  }
  if (n === 3) {
    // a triangle needs no sorting, only the turn that makes its normal +m
    const turn = (a[1] - a[0]) * (b[2] - b[0]) - (a[2] - a[0]) * (b[1] - b[0])
    order[0] = 0; order[1] = turn >= 0 ? 1 : 2; order[2] = turn >= 0 ? 2 : 1
    return n
  }
  // order by angle in the plane about the vertices' mean, counter-clockwise seen from +m
  ma /= n; mb /= n
  const ang = sc.angle
  for (let k = 0; k < n; k++) {
    const ak = pseudoAngle(a[k] - ma, b[k] - mb)
    // insertion sort: at most 12 vertices
    let j = k
    while (j > 0 && ang[j - 1] > ak) { ang[j] = ang[j - 1]; order[j] = order[j - 1]; j-- }
    ang[j] = ak; order[j] = k
  }
  return n
}

/** Adds the polygon left in `sc` by `elementPolygon` to the section accumulator acc[off ..]. */
export function integratePolygon(acc: Float64Array, off: number, sc: PolygonScratch, frame: Float64Array): void {
  const n = sc.count
  if (n < 3) return
  const pos = sc.pos, sig = sc.sig, order = sc.order
  const ox = acc[off + ACC_ORIGIN], oy = acc[off + ACC_ORIGIN + 1], oz = acc[off + ACC_ORIGIN + 2]
  const mx = frame[6], my = frame[7], mz = frame[8]
  const a = sc.a, b = sc.b, oa = sc.oa, ob = sc.ob, r = sc.r, t = sc.t, rt = sc.rt
  for (let i = 0; i < n; i++) {
    const k = order[i]
    oa[i] = a[k]; ob[i] = b[k]
    const rx = pos[3 * k] - ox, ry = pos[3 * k + 1] - oy, rz = pos[3 * k + 2] - oz
    r[3 * i] = rx; r[3 * i + 1] = ry; r[3 * i + 2] = rz
    const s = 6 * k
    const sxx = sig[s], syy = sig[s + 1], szz = sig[s + 2], sxy = sig[s + 3], syz = sig[s + 4], sxz = sig[s + 5]
    const tx = sxx * mx + sxy * my + sxz * mz
    const ty = sxy * mx + syy * my + syz * mz
    const tz = sxz * mx + syz * my + szz * mz
    t[3 * i] = tx; t[3 * i + 1] = ty; t[3 * i + 2] = tz
    rt[3 * i] = ry * tz - rz * ty; rt[3 * i + 1] = rz * tx - rx * tz; rt[3 * i + 2] = rx * ty - ry * tx
  }
  let A = 0, Sa = 0, Sb = 0, Saa = 0, Sbb = 0, Sab = 0, Fx = 0, Fy = 0, Fz = 0, Mx = 0, My = 0, Mz = 0
  const a0 = oa[0], b0 = ob[0]
  for (let i = 1; i < n - 1; i++) {
    const j = i + 1
    const ai = oa[i], bi = ob[i], aj = oa[j], bj = ob[j]
    const At = 0.5 * ((ai - a0) * (bj - b0) - (aj - a0) * (bi - b0))
    // degree-2 rule for products of linear functions on a triangle:
    // ∫ f g dA = A/12 (Σf Σg + Σ f_i g_i), ∫ f dA = A/3 Σf
    const sa = a0 + ai + aj, sb = b0 + bi + bj
    A += At
    Sa += At * sa; Sb += At * sb
    Saa += At * (sa * sa + a0 * a0 + ai * ai + aj * aj)
    Sbb += At * (sb * sb + b0 * b0 + bi * bi + bj * bj)
    Sab += At * (sa * sb + a0 * b0 + ai * bi + aj * bj)
    const stx = t[0] + t[3 * i] + t[3 * j], sty = t[1] + t[3 * i + 1] + t[3 * j + 1], stz = t[2] + t[3 * i + 2] + t[3 * j + 2]
    const srx = r[0] + r[3 * i] + r[3 * j], sry = r[1] + r[3 * i + 1] + r[3 * j + 1], srz = r[2] + r[3 * i + 2] + r[3 * j + 2]
    Fx += At * stx; Fy += At * sty; Fz += At * stz
    Mx += At * (sry * stz - srz * sty + rt[0] + rt[3 * i] + rt[3 * j])
    My += At * (srz * stx - srx * stz + rt[1] + rt[3 * i + 1] + rt[3 * j + 1])
    Mz += At * (srx * sty - sry * stx + rt[2] + rt[3 * i + 2] + rt[3 * j + 2])
  }
  acc[off + ACC_AREA] += A
  acc[off + ACC_SA] += Sa / 3; acc[off + ACC_SB] += Sb / 3
  acc[off + ACC_SAA] += Saa / 12; acc[off + ACC_SBB] += Sbb / 12; acc[off + ACC_SAB] += Sab / 12
  acc[off + ACC_FORCE] += Fx / 3; acc[off + ACC_FORCE + 1] += Fy / 3; acc[off + ACC_FORCE + 2] += Fz / 3
  acc[off + ACC_MOMENT] += Mx / 12; acc[off + ACC_MOMENT + 1] += My / 12; acc[off + ACC_MOMENT + 2] += Mz / 12
  acc[off + ACC_CUT] += 1
}
