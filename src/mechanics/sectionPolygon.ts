/**
 * The piece of a section plane inside one element, and its integrals.
 *
 * A plane with unit normal m cuts an element where its corners lie on both sides. The corner
 * distances d (model length, d = (x - p)·m) are given per corner; d == 0 counts as the + side
 * everywhere, so a plane through nodes or along element faces belongs to exactly one element on
 * each spot (the one below it) and no piece of section is counted twice or missed.
 *
 * The polygon's vertices are the plane's crossings with the element's corner edges. Each crossed
 * edge is walked from its - corner to its + corner, so two neighbours sharing the edge compute
 * bit-identical points and the section has no cracks.
 *
 * Two ways to integrate over it:
 * - tet4 (`elementPolygon`, `integratePolygon`): the stress is linear in the element, so the vertex
 *   stress interpolated along the edge and a degree-2 closed form over the fan of triangles,
 *   ∫ f g dA = A/12 (Σf Σg + Σ f_i g_i), are exact.
 * - every other type (`elementPolygonRef`, then elementSection.ts): the vertices also get their
 *   reference coordinates ξ, and the stress anywhere on the polygon is interpolated from all of
 *   the element's nodes at the point's ξ. On an edge with a mid-edge node the vertex lies where
 *   the plane crosses the edge's own quadratic curve (exactly on the element's edge, so its ξ is
 *   exact too); the polygon's sides between vertices are straight (chords of the element's
 *   section where its faces are curved; see elementSection.ts for that approximation).
 * The area integrals (area, first and second moments of area) come from the vertices in closed
 * form for both.
 */
import type { ElementTypeName } from '../model/elementTypes.ts'
import { ELEMENT_TYPES } from '../model/elementTypes.ts'

import { ELEMENT_TYPE_NAMES } from '../model/elementTypes.ts'
import type { Vec3 } from '../model/model.ts'
import { checkPoint, unitNormal } from './plane.ts'

/** Most crossed edges any registered type can have (hex: 12 edges); also the polygon's vertex bound. */
export const MAX_POLYGON_POINTS = Math.max(...ELEMENT_TYPE_NAMES.map((t) => ELEMENT_TYPES[t].edges.length))
/** Most corners of any registered type (the corner-distance scratch). */
export const MAX_CORNERS = Math.max(8, ...ELEMENT_TYPE_NAMES.map((t) => ELEMENT_TYPES[t].cornerCount))

/**
 * Section accumulator slots (one Float64Array block of ACC_SIZE per section). Integrals are
 * taken relative to a local origin o on the section (the first vertex met), in the in-plane
 * basis (u, v): a = (x - o)·u, b = (x - o)·v. Units: area L², first moments L³, second L⁴,
 * force S·L², first moments of traction S·L³. Since o lies on the plane, x - o = a u + b v and the
 * moment about o needs only ∫ a t dA and ∫ b t dA.
 */
export const ACC_AREA = 0
export const ACC_SA = 1
export const ACC_SB = 2
export const ACC_SAA = 3
export const ACC_SBB = 4
export const ACC_SAB = 5
export const ACC_FORCE = 6
/** ∫ a t dA and ∫ b t dA (t = σm); the moment about o is u × ∫ a t + v × ∫ b t (sectionMomentAtOrigin). */
export const ACC_AT = 9
export const ACC_BT = 12
export const ACC_ORIGIN = 15
export const ACC_ORIGIN_SET = 18
export const ACC_CUT = 19
/** Σ |∫ t dA| over the section's polygons (one per cut element): the section's share of a free body's gross load. */
export const ACC_GROSS = 20
export const ACC_SIZE = 21

/** Reusable scratch for one polygon; create once per cut, never inside the element loop. */
export interface PolygonScratch {
  /** Vertices found by the last `elementPolygon` / `elementPolygonRef` call. */
  count: number
  /** Corner distances of the element being cut (model length), filled by the caller. */
  readonly dist: Float64Array
  readonly pos: Float64Array
  /** Stress (stride 6) or traction (stride 3) per vertex as found (tet4 path). */
  readonly sig: Float64Array
  /** Reference coordinates ξ per vertex as found (elementPolygonRef). */
  readonly ref: Float64Array
  /** Node index when the vertex is a mesh node lying on the plane, else -1 (for de-duplication). */
  readonly key: Int32Array
  readonly angle: Float64Array
  /** Vertex order counter-clockwise about +m. */
  readonly order: Int32Array
  /** Plane coordinates about the section origin o, per vertex as found. */
  readonly a: Float64Array
  readonly b: Float64Array
  /** Traction σm per vertex in polygon order. */
  readonly t: Float64Array
  /** ∫ σm dA over the last polygon integrated (S·L²). */
  readonly force: Float64Array
}

export function createPolygonScratch(): PolygonScratch {
  const n = MAX_POLYGON_POINTS
  return {
    count: 0,
    dist: new Float64Array(MAX_CORNERS),
    pos: new Float64Array(3 * n), sig: new Float64Array(6 * n), ref: new Float64Array(3 * n), key: new Int32Array(n),
    angle: new Float64Array(n), order: new Int32Array(n),
    a: new Float64Array(n), b: new Float64Array(n), t: new Float64Array(3 * n), force: new Float64Array(3),
  }
}

/**
 * Crossing cases of a type, indexed by the sign mask of its corners (bit c set when corner c is
 * on the - side): which corner edges the plane crosses, each oriented from its - corner q to its
 * + corner r, listed in the cyclic order of the polygon (two crossed edges are neighbours on the
 * polygon when they share a face). A table lookup instead of one unpredictable branch per edge.
 * Cases where some face has four crossed edges (only possible on a warped quadrilateral face)
 * have no unique cycle and are ordered by angle instead (`sorted` = 0).
 */
export interface CrossingCases {
  readonly cornerCount: number
  readonly quadratic: boolean
  /** Crossed edges per mask. */
  readonly count: Uint8Array
  /** Per mask (stride CASE_STRIDE), the crossed edges as [q, r, mid] local node numbers (mid -1 if linear). */
  readonly edges: Int8Array
  /** 1 when `edges` is in cyclic order, 0 when the polygon must be ordered by angle. */
  readonly sorted: Uint8Array
}

/** Numbers per mask in `CrossingCases.edges`. */
export const CASE_STRIDE = 3 * MAX_POLYGON_POINTS

const CASES = new Map<ElementTypeName, CrossingCases>()

export function crossingCases(type: ElementTypeName): CrossingCases {
  const known = CASES.get(type)
  if (known) return known
  const topo = ELEMENT_TYPES[type]
  const cc = topo.cornerCount, E = topo.edges.length, masks = 1 << cc
  const count = new Uint8Array(masks), edges = new Int8Array(masks * CASE_STRIDE).fill(-1), sorted = new Uint8Array(masks)
  // corner edges of every face, as edge numbers
  const edgeOf = (a: number, b: number) => topo.edges.findIndex(([x, y]) => (x === a && y === b) || (x === b && y === a))
  const faceEdges = topo.faces.map((f, i) => {
    const n = topo.faceKinds[i].startsWith('tri') ? 3 : 4
    return Array.from({ length: n }, (_, k) => edgeOf(f[k], f[(k + 1) % n]))
  })
  for (let mask = 1; mask < masks - 1; mask++) {
    const neg = (c: number) => ((mask >> c) & 1) === 1
    const crossed: number[] = []
    for (let e = 0; e < E; e++) if (neg(topo.edges[e][0]) !== neg(topo.edges[e][1])) crossed.push(e)
    // neighbours on the polygon: the other crossed edge of each face
    const nb = new Map<number, number[]>(crossed.map((e) => [e, []]))
    let ok = true
    for (const fe of faceEdges) {
      const hit = fe.filter((e) => nb.has(e))
      if (hit.length === 2) { nb.get(hit[0])!.push(hit[1]); nb.get(hit[1])!.push(hit[0]) } else if (hit.length !== 0) ok = false
    }
    let cycle = crossed
    if (ok) {
      cycle = [crossed[0]]
      let prev = -1, cur = crossed[0]
      for (;;) {
        const next = nb.get(cur)!.find((e) => e !== prev)
        if (next === undefined || next === crossed[0]) break
        cycle.push(next); prev = cur; cur = next
      }
      if (cycle.length !== crossed.length) { ok = false; cycle = crossed }
    }
    count[mask] = cycle.length
    sorted[mask] = ok ? 1 : 0
    cycle.forEach((e, k) => {
      const [a, b, m] = topo.edges[e]
      const q = neg(a) ? a : b, r = neg(a) ? b : a
      edges.set([q, r, m], mask * CASE_STRIDE + 3 * k)
    })
  }
  const t: CrossingCases = { cornerCount: cc, quadratic: topo.quadratic, count, edges, sorted }
  CASES.set(type, t)
  return t
}

/**
 * What every section of one plane starts from: the plane's unit normal m and point (both checked:
 * a zero normal or a non-finite point is the InputError of plane.ts, as is a non-finite moment
 * point `about`) and its in-plane frame (sectionFrame). Shared by the single cut and the
 * multi-case stencil, so both refuse the same input the same way.
 */
export function sectionBasis(plane: { readonly point: readonly number[]; readonly normal: readonly number[] }, about?: readonly number[]): { m: Vec3; point: Vec3; frame: Float64Array } {
  const m = unitNormal(plane.normal)
  checkPoint(plane.point, 'section point')
  if (about) checkPoint(about, 'moment point')
  const point: Vec3 = [plane.point[0], plane.point[1], plane.point[2]]
  return { m, point, frame: sectionFrame(new Float64Array(9), m[0], m[1], m[2]) }
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
 * Builds the polygon where the plane cuts a linear element (the tet4 path: the vertex values are
 * interpolated linearly along the edges, which is exact for a linear field). `sc.dist` must hold
 * the element's corner distances. `field` holds per row either the stress (stride 6) or the
 * traction σm (stride 3, when m is fixed for many planes, as in a sweep); vertices get it
 * interpolated into `sc.sig`. The element's nodes are conn[base .. base+nodeCount) and their
 * field rows rows[base ..] (the StressField index; `conn` itself for nodal data). Returns the
 * vertex count (< 3 means no area: the plane only touches a node or an edge) and leaves the
 * vertices in `sc`, ordered counter-clockwise about m in `sc.order`, with their plane
 * coordinates about the local origin o of the section accumulated in acc[off ..]; the first
 * polygon of a section fixes o (a point on the section, so the integrals keep their relative
 * accuracy far from the coordinate origin).
 */
export function elementPolygon(
  sc: PolygonScratch, acc: Float64Array, off: number, coords: Float64Array, field: Float64Array, stride: number,
  conn: Int32Array, rows: Int32Array, base: number, cases: CrossingCases, frame: Float64Array,
): number {
  const dist = sc.dist, pos = sc.pos, sig = sc.sig, key = sc.key
  const mask = cornerMask(dist, cases.cornerCount)
  const ne = cases.count[mask], ce = cases.edges, e0 = mask * CASE_STRIDE
  let n = 0
  for (let k = 0; k < ne; k++) {
    // crossed edge from its - corner q to its + corner r: neighbours agree bit for bit
    const lq = ce[e0 + 3 * k], lr = ce[e0 + 3 * k + 1]
    const dq = dist[lq], dr = dist[lr]
    const nq = conn[base + lq], nr = conn[base + lr]
    if (dr === 0) {
      // the plane passes through node nr: several edges meet there, keep the point once
      if (seenNode(key, n, nr)) continue
      key[n] = nr
      pos[3 * n] = coords[3 * nr]; pos[3 * n + 1] = coords[3 * nr + 1]; pos[3 * n + 2] = coords[3 * nr + 2]
      const fr = stride * rows[base + lr]
      for (let c = 0; c < stride; c++) sig[6 * n + c] = field[fr + c]
      n++
      continue
    }
    const t = dq / (dq - dr)
    key[n] = -1
    const xq = 3 * nq, xr = 3 * nr
    pos[3 * n] = coords[xq] + t * (coords[xr] - coords[xq])
    pos[3 * n + 1] = coords[xq + 1] + t * (coords[xr + 1] - coords[xq + 1])
    pos[3 * n + 2] = coords[xq + 2] + t * (coords[xr + 2] - coords[xq + 2])
    const sq = stride * rows[base + lq], sr = stride * rows[base + lr], o = 6 * n
    if (stride === 3) {
      const f0 = field[sq], f1 = field[sq + 1], f2 = field[sq + 2]
      sig[o] = f0 + t * (field[sr] - f0); sig[o + 1] = f1 + t * (field[sr + 1] - f1); sig[o + 2] = f2 + t * (field[sr + 2] - f2)
    } else {
      for (let c = 0; c < 6; c++) sig[o + c] = field[sq + c] + t * (field[sr + c] - field[sq + c])
    }
    n++
  }
  sc.count = n
  if (n < 3) return n
  return orderPolygon(sc, acc, off, n, cases.sorted[mask] === 1, frame)
}

/**
 * Builds the polygon where the plane cuts an element of any type, with the reference coordinates
 * ξ of its vertices in `sc.ref` (no field values: elementSection.ts interpolates the stress from
 * all nodes at those ξ). `sc.dist` holds the (snapped) corner distances; the distance of any other
 * node i (the mid-edge nodes) is nodeDist[i] - shift. `ref`: the type's node reference
 * coordinates, 3 per local node (inverseMap.ts `referenceDomain(type).ref`).
 *
 * A vertex on an edge with a mid-edge node m lies where the edge's own curve
 * x(s) = x_q (1-s)(1-2s) + x_m 4s(1-s) + x_r s(2s-1) crosses the plane: d(s) = α + βs + γs² with
 * α = d_q, β = 4d_m - 3d_q - d_r, γ = 2d_q - 4d_m + 2d_r has one root in (0, 1] (d_q < 0 ≤ d_r),
 * taken by the cancellation-free form of the quadratic formula; a straight edge (|γ| ≤ 1e-9 |β|)
 * takes the linear root. Every element holding the edge computes it from the same three nodes in
 * the same order, so the points agree bit for bit. Its ξ = ξ_q + s (ξ_r - ξ_q) is exact, as
 * every registered type puts its mid-edge nodes at the reference midpoints.
 * A plane through a curved edge's interior whose end corners lie on one side is not seen (the
 * corner signs decide, as for linear types): a tangential graze of depth O(h²).
 */
export function elementPolygonRef(
  sc: PolygonScratch, acc: Float64Array, off: number, coords: Float64Array, nodeDist: Float64Array, shift: number,
  conn: Int32Array, base: number, cases: CrossingCases, frame: Float64Array, ref: Float64Array,
): number {
  const dist = sc.dist, pos = sc.pos, key = sc.key, xi = sc.ref
  const mask = cornerMask(dist, cases.cornerCount)
  const ne = cases.count[mask], ce = cases.edges, e0 = mask * CASE_STRIDE
  let n = 0
  for (let k = 0; k < ne; k++) {
    const lq = ce[e0 + 3 * k], lr = ce[e0 + 3 * k + 1], lm = ce[e0 + 3 * k + 2]
    const dq = dist[lq], dr = dist[lr]
    const nq = conn[base + lq], nr = conn[base + lr]
    if (dr === 0) {
      // the plane passes through node nr: several edges meet there, keep the point once
      if (seenNode(key, n, nr)) continue
      key[n] = nr
      pos[3 * n] = coords[3 * nr]; pos[3 * n + 1] = coords[3 * nr + 1]; pos[3 * n + 2] = coords[3 * nr + 2]
      xi[3 * n] = ref[3 * lr]; xi[3 * n + 1] = ref[3 * lr + 1]; xi[3 * n + 2] = ref[3 * lr + 2]
      n++
      continue
    }
    key[n] = -1
    const xq = 3 * nq, xr = 3 * nr
    let s: number
    if (lm < 0) {
      s = dq / (dq - dr)
      pos[3 * n] = coords[xq] + s * (coords[xr] - coords[xq])
      pos[3 * n + 1] = coords[xq + 1] + s * (coords[xr + 1] - coords[xq + 1])
      pos[3 * n + 2] = coords[xq + 2] + s * (coords[xr + 2] - coords[xq + 2])
    } else {
      const nm = conn[base + lm], dm = nodeDist[nm] - shift
      s = edgeRoot(dq, dm, dr)
      const wq = (1 - s) * (1 - 2 * s), wm = 4 * s * (1 - s), wr = s * (2 * s - 1), xm = 3 * nm
      pos[3 * n] = wq * coords[xq] + wm * coords[xm] + wr * coords[xr]
      pos[3 * n + 1] = wq * coords[xq + 1] + wm * coords[xm + 1] + wr * coords[xr + 1]
      pos[3 * n + 2] = wq * coords[xq + 2] + wm * coords[xm + 2] + wr * coords[xr + 2]
    }
    const rq = 3 * lq, rr = 3 * lr
    xi[3 * n] = ref[rq] + s * (ref[rr] - ref[rq])
    xi[3 * n + 1] = ref[rq + 1] + s * (ref[rr + 1] - ref[rq + 1])
    xi[3 * n + 2] = ref[rq + 2] + s * (ref[rr + 2] - ref[rq + 2])
    n++
  }
  sc.count = n
  if (n < 3) return n
  return orderPolygon(sc, acc, off, n, cases.sorted[mask] === 1, frame)
}

/** Bit c set when corner c lies on the - side (d < 0): the index into the crossing cases. */
function cornerMask(dist: Float64Array, cc: number): number {
  let mask = 0
  for (let c = 0; c < cc; c++) mask |= (dist[c] < 0 ? 1 : 0) << c
  return mask
}

/** Whether node `node` is already one of the first n vertices (a plane through a node meets several edges there). */
function seenNode(key: Int32Array, n: number, node: number): boolean {
  for (let j = 0; j < n; j++) if (key[j] === node) return true
  return false
}

/**
 * The parameter s ∈ (0, 1] where the quadratic through d(0) = dq < 0, d(1/2) = dm, d(1) = dr > 0
 * vanishes (elementPolygonRef). Also used for the edges of clipped boundary faces (freeBody.ts).
 */
export function edgeRoot(dq: number, dm: number, dr: number): number {
  const beta = 4 * dm - 3 * dq - dr, gamma = 2 * dq - 4 * dm + 2 * dr
  if (!(Math.abs(gamma) > 1e-9 * Math.abs(beta))) return dq / (dq - dr) // straight: the linear root
  // d changes sign on [0, 1], so the discriminant is ≥ 0 up to round-off
  const disc = Math.max(0, beta * beta - 4 * dq * gamma)
  const q = -0.5 * (beta + (beta < 0 ? -1 : 1) * Math.sqrt(disc))
  const s1 = q / gamma, s2 = q !== 0 ? dq / q : s1
  // the root in [0, 1] (the other lies outside or is the same); clamp round-off
  const s = s1 >= 0 && s1 <= 1 ? s1 : s2
  return s < 0 ? 0 : s > 1 ? 1 : s
}

/**
 * Plane coordinates (a, b) of the n vertices in `sc` about the section's local origin o (fixed
 * by the first polygon of the section) and their counter-clockwise order about +m. `cyclic`: the
 * vertices are already in cyclic order (crossing table), else they are ordered by angle.
 */
function orderPolygon(sc: PolygonScratch, acc: Float64Array, off: number, n: number, cyclic: boolean, frame: Float64Array): number {
  const pos = sc.pos
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
  if (cyclic) {
    // cyclic already (dropping repeated on-plane nodes keeps it cyclic); turn it to face +m
    let twice = 0
    for (let k = 0, j = n - 1; k < n; j = k++) twice += a[j] * b[k] - a[k] * b[j]
    if (twice >= 0) { for (let k = 0; k < n; k++) order[k] = k } else { for (let k = 0; k < n; k++) order[k] = n - 1 - k }
    return n
  }
  // no unique cycle (a warped face crossed four times): order by angle about the mean
  ma /= n; mb /= n
  const ang = sc.angle
  for (let k = 0; k < n; k++) {
    const ak = pseudoAngle(a[k] - ma, b[k] - mb)
    // insertion sort: at most MAX_POLYGON_POINTS vertices
    let j = k
    while (j > 0 && ang[j - 1] > ak) { ang[j] = ang[j - 1]; order[j] = order[j - 1]; j-- }
    ang[j] = ak; order[j] = k
  }
  return n
}

/**
 * Adds the polygon left in `sc` by `elementPolygon` to the section accumulator acc[off ..];
 * `stride` as given to elementPolygon (6: vertices carry stress, 3: they carry σm already).
 * Fan of triangles from the first vertex; on each, the degree-2 rule for products of linear
 * functions, ∫ f g dA = A/12 (Σf Σg + Σ f_i g_i) and ∫ f dA = A/3 Σf.
 */
export function integratePolygon(acc: Float64Array, off: number, sc: PolygonScratch, frame: Float64Array, stride: number): void {
  const n = sc.count
  if (n < 3) return
  const sig = sc.sig, order = sc.order, a = sc.a, b = sc.b, t = sc.t
  const mx = frame[6], my = frame[7], mz = frame[8]
  // traction at each vertex, in polygon order
  for (let i = 0; i < n; i++) {
    const s = 6 * order[i]
    if (stride === 3) { t[3 * i] = sig[s]; t[3 * i + 1] = sig[s + 1]; t[3 * i + 2] = sig[s + 2] } else {
      const sxx = sig[s], syy = sig[s + 1], szz = sig[s + 2], sxy = sig[s + 3], syz = sig[s + 4], sxz = sig[s + 5]
      t[3 * i] = sxx * mx + sxy * my + sxz * mz
      t[3 * i + 1] = sxy * mx + syy * my + syz * mz
      t[3 * i + 2] = sxz * mx + syz * my + szz * mz
    }
  }
  let A = 0, Sa = 0, Sb = 0, Saa = 0, Sbb = 0, Sab = 0, Fx = 0, Fy = 0, Fz = 0
  let Ax = 0, Ay = 0, Az = 0, Bx = 0, By = 0, Bz = 0
  const k0 = order[0]
  const a0 = a[k0], b0 = b[k0], t0x = t[0], t0y = t[1], t0z = t[2]
  const k1 = order[1]
  let ai = a[k1], bi = b[k1], tix = t[3], tiy = t[4], tiz = t[5]
  for (let i = 1; i < n - 1; i++) {
    const kj = order[i + 1]
    const aj = a[kj], bj = b[kj], tjx = t[3 * i + 3], tjy = t[3 * i + 4], tjz = t[3 * i + 5]
    const At = 0.5 * ((ai - a0) * (bj - b0) - (aj - a0) * (bi - b0))
    const sa = a0 + ai + aj, sb = b0 + bi + bj
    const stx = t0x + tix + tjx, sty = t0y + tiy + tjy, stz = t0z + tiz + tjz
    A += At
    Sa += At * sa; Sb += At * sb
    Saa += At * (sa * sa + a0 * a0 + ai * ai + aj * aj)
    Sbb += At * (sb * sb + b0 * b0 + bi * bi + bj * bj)
    Sab += At * (sa * sb + a0 * b0 + ai * bi + aj * bj)
    Fx += At * stx; Fy += At * sty; Fz += At * stz
    Ax += At * (sa * stx + a0 * t0x + ai * tix + aj * tjx)
    Ay += At * (sa * sty + a0 * t0y + ai * tiy + aj * tjy)
    Az += At * (sa * stz + a0 * t0z + ai * tiz + aj * tjz)
    Bx += At * (sb * stx + b0 * t0x + bi * tix + bj * tjx)
    By += At * (sb * sty + b0 * t0y + bi * tiy + bj * tjy)
    Bz += At * (sb * stz + b0 * t0z + bi * tiz + bj * tjz)
    ai = aj; bi = bj; tix = tjx; tiy = tjy; tiz = tjz
  }
  acc[off + ACC_AREA] += A
  acc[off + ACC_SA] += Sa / 3; acc[off + ACC_SB] += Sb / 3
  acc[off + ACC_SAA] += Saa / 12; acc[off + ACC_SBB] += Sbb / 12; acc[off + ACC_SAB] += Sab / 12
  const fx = Fx / 3, fy = Fy / 3, fz = Fz / 3
  acc[off + ACC_FORCE] += fx; acc[off + ACC_FORCE + 1] += fy; acc[off + ACC_FORCE + 2] += fz
  acc[off + ACC_AT] += Ax / 12; acc[off + ACC_AT + 1] += Ay / 12; acc[off + ACC_AT + 2] += Az / 12
  acc[off + ACC_BT] += Bx / 12; acc[off + ACC_BT + 1] += By / 12; acc[off + ACC_BT + 2] += Bz / 12
  acc[off + ACC_CUT] += 1
  acc[off + ACC_GROSS] += Math.sqrt(fx * fx + fy * fy + fz * fz)
  const force = sc.force
  force[0] = fx; force[1] = fy; force[2] = fz
}

/**
 * Adds the area integrals of the polygon left in `sc` (area, first and second moments about the
 * section's local origin) to acc[off ..] and counts the cut element: the geometric half of
 * `integratePolygon`, for polygons whose traction elementSection.ts integrates. Fan from the
 * first vertex; ∫ a dA = A/3 Σa, ∫ a b dA = A/12 (Σa Σb + Σ a_i b_i) on each triangle.
 */
export function addPolygonArea(acc: Float64Array, off: number, sc: PolygonScratch): void {
  const n = sc.count, order = sc.order, a = sc.a, b = sc.b
  let A = 0, Sa = 0, Sb = 0, Saa = 0, Sbb = 0, Sab = 0
  const k0 = order[0], a0 = a[k0], b0 = b[k0]
  for (let i = 1; i < n - 1; i++) {
    const ki = order[i], kj = order[i + 1]
    const ai = a[ki], bi = b[ki], aj = a[kj], bj = b[kj]
    const At = 0.5 * ((ai - a0) * (bj - b0) - (aj - a0) * (bi - b0))
    const sa = a0 + ai + aj, sb = b0 + bi + bj
    A += At
    Sa += At * sa; Sb += At * sb
    Saa += At * (sa * sa + a0 * a0 + ai * ai + aj * aj)
    Sbb += At * (sb * sb + b0 * b0 + bi * bi + bj * bj)
    Sab += At * (sa * sb + a0 * b0 + ai * bi + aj * bj)
  }
  acc[off + ACC_AREA] += A
  acc[off + ACC_SA] += Sa / 3; acc[off + ACC_SB] += Sb / 3
  acc[off + ACC_SAA] += Saa / 12; acc[off + ACC_SBB] += Sbb / 12; acc[off + ACC_SAB] += Sab / 12
  acc[off + ACC_CUT] += 1
}

/**
 * Moment of the section traction about its local origin o, M_o = ∫ (a u + b v) × t dA
 * = u × ∫ a t dA + v × ∫ b t dA, into out (S·L³).
 */
export function sectionMomentAtOrigin(out: Float64Array, acc: Float64Array, off: number, frame: Float64Array): Float64Array {
  const ux = frame[0], uy = frame[1], uz = frame[2], vx = frame[3], vy = frame[4], vz = frame[5]
  const ax = acc[off + ACC_AT], ay = acc[off + ACC_AT + 1], az = acc[off + ACC_AT + 2]
  const bx = acc[off + ACC_BT], by = acc[off + ACC_BT + 1], bz = acc[off + ACC_BT + 2]
  out[0] = uy * az - uz * ay + vy * bz - vz * by
  out[1] = uz * ax - ux * az + vz * bx - vx * bz
  out[2] = ux * ay - uy * ax + vx * by - vy * bx
  return out
}
