/**
 * The section's polygons as they are drawn, colored, sampled for arrows and probed, built during a
 * cut (sectionCut.ts) from the same polygons and reference coordinates the resultant is
 * integrated over, so what is shown is what is summed:
 * - every vertex carries its reference coordinates ξ and the traction σm interpolated there from
 *   all of the element's nodes (its shape functions);
 * - the fill triangles: the fan of each polygon, and for types whose stress is not linear
 *   (shape-function degree > 1, sectionRule.ts) each fan triangle split into four at its edge
 *   midpoints, where the traction is evaluated too (at ξ inverted from the midpoint on curved
 *   elements), so the colors between vertices follow the element's field one level finer than
 *   the polygon; a GPU interpolates linearly inside each small triangle;
 * - per polygon its area, centroid and ∫ σm dA from the cut's own quadrature (arrows).
 * `sectionStressAt` gives the stress at any point of a drawn polygon the same way (the probe).
 *
 * Layouts: see SectionPolygons and SectionFill in types.ts.
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import type { ElementMap } from './inverseMap.ts'
import { createElementMap, invertElementMap, loadElementMap, MAX_ELEMENT_NODES, referenceDomain } from './inverseMap.ts'
import { nodalTraction } from './elementSection.ts'
import type { PolygonScratch } from './sectionPolygon.ts'
import { shapeValues } from './shapeFunctions.ts'
import type { SectionPolygons } from './types.ts'

export type PolygonCollector = ReturnType<typeof createPolygonCollector>

/**
 * The collector's arrays, grown as needed and kept from one cut to the next: dragging a section
 * re-cuts the body many times, and arrays allocated afresh each cut cost their growth copies and
 * the first touch of new memory every time (at 10^7 tet4, a quarter of a cut). Cuts whose
 * polygons are handed out as views (`views`, below) use two sets by turns, so that a cut leaves
 * the previous one's polygons whole while it collects its own; cuts that copy their polygons out
 * use a third set (made at their first use), so they never touch the views. One collector is in
 * use at a time (a cut runs synchronously).
 */
function keptSet() {
  return {
    traction: new Float64Array(8192), fillTraction: new Float64Array(8192),
    linear: new Uint8Array(1024),
    start: new Int32Array(1024), fillStart: new Int32Array(1024), elem: new Int32Array(1024),
    block: new Int32Array(1024), local: new Int32Array(1024),
    // per polygon its force, as `add` is given it
    force: new Float64Array(3 * 1024),
    pos: new Float64Array(8192), ref: new Float64Array(8192),
    fillPos: new Float64Array(8192), fillRef: new Float64Array(8192),
    index: new Uint32Array(3 * 4096), triElem: new Int32Array(4096),
    // per polygon, written by `finish`
    area: new Float64Array(1024), centroid: new Float64Array(3 * 1024),
  }
}
type KeptSet = ReturnType<typeof keptSet>
const KEPT: KeptSet[] = []
let keptTurn = 0
function keptFor(views: boolean): KeptSet {
  if (!views) return (KEPT[2] ??= keptSet())
  keptTurn = 1 - keptTurn
  const k = (KEPT[keptTurn] ??= keptSet())
  // as large as the other set at once: the last cut's size is the best guess of this one's, and
  // growing by doubling from a small set would copy the arrays a dozen times in one cut
  const other = KEPT[1 - keptTurn]
  if (other) sizeLike(k, other, false)
  return k
}

/** Replaces each array of `k` shorter than `length(key)` by a new one that long (touched when `touch`). */
function sizeTo(k: KeptSet, length: (key: keyof KeptSet) => number, touch: boolean): void {
  for (const key of Object.keys(k) as (keyof KeptSet)[]) {
    const a = k[key], n = length(key)
    if (a.length >= n) continue
    const b = new (a.constructor as new (n: number) => typeof a)(n)
    // fresh memory is mapped at its first write; writing it now keeps that out of the next cut
    if (touch) b.fill(0)
    ;(k as Record<keyof KeptSet, typeof a>)[key] = b
  }
}
function sizeLike(k: KeptSet, like: KeptSet, touch: boolean): void {
  sizeTo(k, (key) => like[key].length, touch)
}

/** The last cut's polygons, vertices, fill points and fill triangles (written by `finish`). */
const lastUse = { polygons: 0, verts: 0, fills: 0, tris: 0 }

/** Entries each kept array needs for p polygons, v vertices, f fill points and t triangles. */
function lengthFor(key: keyof KeptSet, p: number, v: number, f: number, t: number): number {
  switch (key) {
    case 'pos': case 'ref': case 'traction': return 3 * v
    case 'fillPos': case 'fillRef': case 'fillTraction': return 3 * f
    case 'index': return 3 * t
    case 'triElem': return t
    case 'centroid': case 'force': return 3 * (p + 1)
    default: return p + 1
  }
}

/**
 * Makes both sets of the view-returning cuts room for the last cut's polygons and half as many
 * again, their memory written once: for the engine's warm-up cut, so that the user's first cut,
 * and the drag's cuts after it (whose planes may cut more), neither grow their arrays nor touch
 * new memory (at 10^7 tet4 in the browser the growth alone took 183 ms of the first cut, and a
 * drag's cut that grew them took twice the others, profiled).
 */
export function readyPolygonViews(headroom = 1.5): void {
  const u = lastUse, grow = (n: number) => Math.ceil(headroom * n)
  const length = (key: keyof KeptSet) => lengthFor(key, grow(u.polygons), grow(u.verts), grow(u.fills), grow(u.tris))
  for (const i of [0, 1]) sizeTo((KEPT[i] ??= keptSet()), length, true)
}

/**
 * Collects drawn polygons into typed arrays that double when full. `m`: the section normal.
 * Polygons of linear simplices come with their vertex stress (sc.sig, exact there) and need no
 * evaluation; the others get their tractions from the shape functions in `finish`.
 * `views`: `finish` returns views of the collector's kept arrays instead of copies. They stay
 * valid until the cut after next (the sets are used by turns) and must not be transferred; at
 * 10^7 tet4 in the browser the copies were a third of a cut (118 of 419 ms, profiled), because
 * each large copy is memory the process has not touched before. The engine, which keeps only
 * the latest cut's polygons, asks for views; every other caller gets copies of its own.
 */
export function createPolygonCollector(m: Vec3, views = false) {
  const mx = m[0], my = m[1], mz = m[2]
  let count = 0, verts = 0, fills = 0, tris = 0
  const k = keptFor(views)
  let traction = k.traction, fillTraction = k.fillTraction
  let linear = k.linear
  let start = k.start, fillStart = k.fillStart, elem = k.elem
  let block = k.block, local = k.local
  let force = k.force
  let pos = k.pos, ref = k.ref
  let fillPos = k.fillPos, fillRef = k.fillRef
  let index = k.index, triElem = k.triElem
  const mid = new Float64Array(3)

  function room(p: number, v: number, f: number, t: number): void {
    if (count + p + 1 >= start.length) {
      const n = 2 * start.length
      start = growI(start, n); fillStart = growI(fillStart, n); elem = growI(elem, n)
      block = growI(block, n); local = growI(local, n); force = growF(force, 3 * n)
      const l = new Uint8Array(n)
      l.set(linear)
      linear = l
    }
    if (3 * (verts + v) > pos.length) { const n = Math.max(2 * pos.length, 3 * (verts + v)); pos = growF(pos, n); ref = growF(ref, n); traction = growF(traction, n) }
    if (3 * (fills + f) > fillPos.length) {
      const n = Math.max(2 * fillPos.length, 3 * (fills + f))
      fillPos = growF(fillPos, n); fillRef = growF(fillRef, n); fillTraction = growF(fillTraction, n)
    }
    if (3 * (tris + t) > index.length) { const n = Math.max(2 * index.length, 3 * (tris + t)); index = growU(index, n); triElem = growI(triElem, n / 3) }
  }

  /** Keeps the arrays grown during this cut for the next one (one identity check per group of arrays grown together). */
  function keep(): void {
    // the next cut starts from the grown arrays (one object per cut, not one per polygon)
    if (k.pos !== pos || k.start !== start || k.fillPos !== fillPos || k.index !== index) {
      Object.assign(k, { traction, fillTraction, linear, start, fillStart, elem, block, local, force, pos, ref, fillPos, fillRef, index, triElem })
    }
  }

  /** Adds point k of the polygon in sc (position, ξ) as fill point `fills`. */
  function fillFromVertex(sc: PolygonScratch, k: number): void {
    for (let c = 0; c < 3; c++) { fillPos[3 * fills + c] = sc.pos[3 * k + c]; fillRef[3 * fills + c] = sc.ref[3 * k + c] }
    fills++
  }

  /** Adds the midpoint of polygon vertices i and j as a fill point, ξ inverted on curved elements. */
  function fillMidpoint(sc: PolygonScratch, i: number, j: number, em: ElementMap): void {
    const o = 3 * fills
    for (let c = 0; c < 3; c++) {
      fillPos[o + c] = 0.5 * (sc.pos[3 * i + c] + sc.pos[3 * j + c])
      fillRef[o + c] = 0.5 * (sc.ref[3 * i + c] + sc.ref[3 * j + c])
    }
    if (!em.affine) {
      mid[0] = fillPos[o] - em.origin[0]; mid[1] = fillPos[o + 1] - em.origin[1]; mid[2] = fillPos[o + 2] - em.origin[2]
      invertElementMap(em, mid[0], mid[1], mid[2], fillRef, o)
    }
    fills++
  }

  return {
    /**
     * Adds the polygon in `sc` (vertices with ξ in sc.ref) of element `local` in block `blk`
     * (global index g), whose force is `f` (∫ σm dA, 3 numbers, copied). `em`: the loaded element
     * when `subdivide` (curved midpoints).
     * `withStress`: sc.sig holds the vertex stress (linear path), no evaluation needed.
     */
    add(sc: PolygonScratch, blk: number, loc: number, g: number, f: Float64Array, em: ElementMap | null, subdivide: boolean, withStress = false): void {
      const n = sc.count, order = sc.order
      const nf = subdivide ? 3 * n - 3 : n, nt = subdivide ? 4 * (n - 2) : n - 2
      room(1, n, nf, nt)
      for (let i = 0; i < n; i++) {
        const k = order[i], o = 3 * (verts + i)
        for (let c = 0; c < 3; c++) { pos[o + c] = sc.pos[3 * k + c]; ref[o + c] = sc.ref[3 * k + c] }
        if (withStress) {
          const s = 6 * k, sig = sc.sig, of = 3 * (fills + i)
          traction[o] = fillTraction[of] = sig[s] * mx + sig[s + 3] * my + sig[s + 5] * mz
          traction[o + 1] = fillTraction[of + 1] = sig[s + 3] * mx + sig[s + 1] * my + sig[s + 4] * mz
          traction[o + 2] = fillTraction[of + 2] = sig[s + 5] * mx + sig[s + 4] * my + sig[s + 2] * mz
        }
      }
      linear[count] = withStress ? 1 : 0
      const f0 = fills
      for (let i = 0; i < n; i++) fillFromVertex(sc, order[i])
      if (subdivide && em) {
        // midpoints of the sides (v_k, v_k+1), then of the fan diagonals (v_0, v_i), i = 2 .. n-2
        for (let k = 0; k < n; k++) fillMidpoint(sc, order[k], order[(k + 1) % n], em)
        for (let i = 2; i < n - 1; i++) fillMidpoint(sc, order[0], order[i], em)
        // side k's midpoint is fill point f0 + n + k, diagonal i's f0 + 2n + i - 2
        for (let i = 1; i < n - 1; i++) {
          const v0 = f0, vi = f0 + i, vj = f0 + i + 1
          const m01 = i === 1 ? f0 + n : f0 + 2 * n + i - 2
          const m12 = f0 + n + i
          const m20 = i + 1 === n - 1 ? f0 + 2 * n - 1 : f0 + 2 * n + i - 1
          const o = 3 * tris
          index[o] = v0; index[o + 1] = m01; index[o + 2] = m20
          index[o + 3] = m01; index[o + 4] = vi; index[o + 5] = m12
          index[o + 6] = m20; index[o + 7] = m12; index[o + 8] = vj
          index[o + 9] = m01; index[o + 10] = m12; index[o + 11] = m20
          triElem[tris] = g; triElem[tris + 1] = g; triElem[tris + 2] = g; triElem[tris + 3] = g
          tris += 4
        }
      } else {
        for (let i = 1; i < n - 1; i++) {
          index[3 * tris] = f0; index[3 * tris + 1] = f0 + i; index[3 * tris + 2] = f0 + i + 1
          triElem[tris++] = g
        }
      }
      verts += n
      block[count] = blk; local[count] = loc; elem[count] = g
      force[3 * count] = f[0]; force[3 * count + 1] = f[1]; force[3 * count + 2] = f[2]
      count++
      start[count] = verts
      fillStart[count] = fills
    },
    /** Tractions at every vertex and fill point by the shape functions; per-polygon integrals. */
    finish(mesh: Mesh, field: StressField): SectionPolygons {
      keep()
      lastUse.polygons = count; lastUse.verts = verts; lastUse.fills = fills; lastUse.tris = tris
      if (k.area.length < count) { const n = Math.max(count, 2 * k.area.length); k.area = new Float64Array(n); k.centroid = new Float64Array(3 * n) }
      const area = k.area, centroid = k.centroid
      const tn = FINISH_TN, N = FINISH_N
      for (let p = 0; p < count; p++) {
        if (linear[p] === 0) {
          const type = mesh.blocks[block[p]].type, nn = ELEMENT_TYPES[type].nodeCount
          nodalTraction(tn, field.values, field.rows[block[p]], local[p] * nn, nn, mx, my, mz)
          tractionsAt(traction, ref, start[p], start[p + 1], type, nn, tn, N)
          tractionsAt(fillTraction, fillRef, fillStart[p], fillStart[p + 1], type, nn, tn, N)
        }
        polygonAreaCentroid(area, centroid, p, pos, start[p], start[p + 1], mx, my, mz)
      }
      const out = views ? viewOf : copyOf
      const positions = out(pos, 3 * verts), vertexTraction = out(traction, 3 * verts)
      // No polygon split (linear types, straight polygons): the fill points are the vertices in
      // the same order with the same tractions, so the fill shares the vertices' arrays (read only)
      // instead of a second copy of each (at 10^7 tet4, a quarter of the cut's copying).
      const same = fills === verts
      return {
        count, start: out(start, count + 1), positions, traction: vertexTraction, elem: out(elem, count),
        reference: out(ref, 3 * verts), area: out(area, count), centroid: out(centroid, 3 * count), force: out(force, 3 * count),
        fill: {
          positions: same ? positions : out(fillPos, 3 * fills), traction: same ? vertexTraction : out(fillTraction, 3 * fills),
          index: out(index, 3 * tris), element: out(triElem, tris),
        },
      }
    },
  }
}

const FINISH_TN = new Float64Array(3 * MAX_ELEMENT_NODES), FINISH_N = new Float64Array(MAX_ELEMENT_NODES)

/** The first n entries of a kept array: a view (`views`) or a copy of them. */
function viewOf<T extends Float64Array | Int32Array | Uint32Array>(a: T, n: number): T { return a.subarray(0, n) as T }
function copyOf<T extends Float64Array | Int32Array | Uint32Array>(a: T, n: number): T { return a.slice(0, n) as T }

/** t = Σ N_a(ξ) tn_a at points [from, to) with ξ in ref, into out (3 per point). */
function tractionsAt(out: Float64Array, ref: Float64Array, from: number, to: number, type: ElementTypeName, nn: number, tn: Float64Array, N: Float64Array): void {
  for (let i = from; i < to; i++) {
    shapeValues(type, ref[3 * i], ref[3 * i + 1], ref[3 * i + 2], N)
    let tx = 0, ty = 0, tz = 0
    for (let k = 0; k < nn; k++) { tx += N[k] * tn[3 * k]; ty += N[k] * tn[3 * k + 1]; tz += N[k] * tn[3 * k + 2] }
    out[3 * i] = tx; out[3 * i + 1] = ty; out[3 * i + 2] = tz
  }
}

/** Area (projected on m) and area centroid of the flat polygon with vertices [s, e) of x. */
function polygonAreaCentroid(outArea: Float64Array, outCentroid: Float64Array, p: number, x: Float64Array, s: number, e: number, mx: number, my: number, mz: number): void {
  const x0 = x[3 * s], y0 = x[3 * s + 1], z0 = x[3 * s + 2]
  let A = 0, cx = 0, cy = 0, cz = 0
  for (let i = s + 1; i + 1 < e; i++) {
    const ax = x[3 * i] - x0, ay = x[3 * i + 1] - y0, az = x[3 * i + 2] - z0
    const bx = x[3 * i + 3] - x0, by = x[3 * i + 4] - y0, bz = x[3 * i + 5] - z0
    const a = 0.5 * ((ay * bz - az * by) * mx + (az * bx - ax * bz) * my + (ax * by - ay * bx) * mz)
    A += a
    cx += a * (ax + bx) / 3; cy += a * (ay + by) / 3; cz += a * (az + bz) / 3
  }
  outArea[p] = Math.abs(A)
  if (A !== 0) {
    outCentroid[3 * p] = x0 + cx / A; outCentroid[3 * p + 1] = y0 + cy / A; outCentroid[3 * p + 2] = z0 + cz / A
  } else {
    // degenerate polygon: no area; keep a finite point (the vertex mean)
    let px = 0, py = 0, pz = 0
    for (let i = s; i < e; i++) { px += x[3 * i]; py += x[3 * i + 1]; pz += x[3 * i + 2] }
    const n = Math.max(1, e - s)
    outCentroid[3 * p] = px / n; outCentroid[3 * p + 1] = py / n; outCentroid[3 * p + 2] = pz / n
  }
}

const PROBE_MAP = createElementMap()
const PROBE_N = new Float64Array(MAX_ELEMENT_NODES)

/**
 * Stress (6 numbers) at point x of drawn polygon q, by the shape functions of its element: the
 * fan triangle that holds x (the one whose smallest barycentric coordinate is largest, so a point
 * on a side or just outside by round-off still picks its neighbour) gives the linear estimate of
 * ξ from the vertices' ξ; on a curved element Newton refines it (inverseMap.ts). Returns false
 * (out untouched) when the polygon is degenerate.
 */
export function sectionStressAt(out: Float64Array, mesh: Mesh, field: StressField, polygons: SectionPolygons, q: number, x: ArrayLike<number>): boolean {
  const s = polygons.start[q], e = polygons.start[q + 1], P = polygons.positions, R = polygons.reference
  if (e - s < 3) return false
  let best = -Infinity, l1b = 0, l2b = 0, ib = -1
  for (let i = s + 1; i + 1 < e; i++) {
    const l = barycentricInTriangle(P, s, i, i + 1, x)
    if (l === null) continue
    const lo = Math.min(1 - l[0] - l[1], l[0], l[1])
    if (lo > best) { best = lo; l1b = l[0]; l2b = l[1]; ib = i }
  }
  if (ib < 0) return false
  const l0 = 1 - l1b - l2b
  const xi = new Float64Array(3)
  for (let c = 0; c < 3; c++) xi[c] = l0 * R[3 * s + c] + l1b * R[3 * ib + c] + l2b * R[3 * ib + 3 + c]
  const g = polygons.elem[q]
  let b = 0
  while (b + 1 < mesh.blocks.length && mesh.blocks[b + 1].offset <= g) b++
  const blk = mesh.blocks[b], type = blk.type, nn = ELEMENT_TYPES[type].nodeCount, base = (g - blk.offset) * nn
  const em = loadElementMap(PROBE_MAP, referenceDomain(type), mesh.coords, blk.conn, base)
  if (!em.affine) invertElementMap(em, x[0] - em.origin[0], x[1] - em.origin[1], x[2] - em.origin[2], xi, 0)
  shapeValues(type, xi[0], xi[1], xi[2], PROBE_N)
  const rows = field.rows[b], v = field.values
  for (let k = 0; k < 6; k++) out[k] = 0
  for (let a = 0; a < nn; a++) {
    const r = 6 * rows[base + a], Na = PROBE_N[a]
    for (let k = 0; k < 6; k++) out[k] += Na * v[r + k]
  }
  return true
}

/** Barycentric (λ1, λ2) of x in triangle (i, j, k) of P by least squares in its plane; null when degenerate. */
function barycentricInTriangle(P: Float64Array, i: number, j: number, k: number, x: ArrayLike<number>): [number, number] | null {
  const ex = P[3 * j] - P[3 * i], ey = P[3 * j + 1] - P[3 * i + 1], ez = P[3 * j + 2] - P[3 * i + 2]
  const fx = P[3 * k] - P[3 * i], fy = P[3 * k + 1] - P[3 * i + 1], fz = P[3 * k + 2] - P[3 * i + 2]
  const rx = x[0] - P[3 * i], ry = x[1] - P[3 * i + 1], rz = x[2] - P[3 * i + 2]
  const ee = ex * ex + ey * ey + ez * ez, ff = fx * fx + fy * fy + fz * fz, ef = ex * fx + ey * fy + ez * fz
  const det = ee * ff - ef * ef
  if (!(det > 0)) return null
  const re = rx * ex + ry * ey + rz * ez, rf = rx * fx + ry * fy + rz * fz
  return [(re * ff - rf * ef) / det, (rf * ee - re * ef) / det]
}

function growI(a: Int32Array, n: number): Int32Array<ArrayBuffer> {
  const b = new Int32Array(n)
  b.set(a.subarray(0, Math.min(a.length, n)))
  return b
}

function growU(a: Uint32Array, n: number): Uint32Array<ArrayBuffer> {
  const b = new Uint32Array(n)
  b.set(a.subarray(0, Math.min(a.length, n)))
  return b
}

function growF(a: Float64Array, n: number): Float64Array<ArrayBuffer> {
  const b = new Float64Array(n)
  b.set(a.subarray(0, Math.min(a.length, n)))
  return b
}
