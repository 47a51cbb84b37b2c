/**
 * A sweep of N parallel sections: planes with unit normal m at offsets from..to along m
 * (plane k passes through offsets[k]·m; `to` < `from` sweeps backwards), all resultants in one
 * pass over the elements, not N cuts.
 *
 * Each node gets D = x·m once, and each stress row its traction σm (the same for every plane;
 * the shape functions interpolate it like the stress, since σm is linear in σ). Each element's
 * corners span [Dmin, Dmax] along m; only the planes inside that span (widened by the snap band)
 * can cut it, a run of consecutive k found from the uniform spacing. For each, the corner
 * distances d = D - o_k, snapped like a single cut's (SNAP_EPS), decide; the element's polygon
 * goes into section k's accumulator with the same kernels as `cutSection` (the closed forms for
 * tet4, the element's shape functions at the polygon's quadrature points for every other type,
 * its map loaded once for all the planes that cut it), visiting elements in the same order, so a
 * sweep equals single cuts at the same offsets up to the rounding of d.
 *
 * Free bodies: a boundary face lies wholly on the - side of plane k from some k on (the offsets
 * ascend). Its whole-face figures are dropped into the bucket where that run starts and summed
 * cumulatively over k; only the faces a plane crosses are clipped per plane.
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import { InputError } from '../model/errors.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import { extractBoundaryFaces } from './boundaryFaces.ts'
import {
  addClippedFace, addWholeFace, closeFreeBody, createClipScratch, faceCornerCount, FB_SIZE, freeBodyTractions, initFreeBody, mergeFreeBody,
} from './freeBody.ts'
import { accumulateTraction, createSectionPoints, polygonPoints } from './elementSection.ts'
import { createElementMap, loadElementMap, MAX_ELEMENT_NODES, referenceDomain } from './inverseMap.ts'
import { momentAboutCentroid, SNAP_EPS, unitNormal } from './sectionCut.ts'
import {
  ACC_AREA, ACC_FORCE, ACC_GROSS, ACC_SIZE, addPolygonArea, createPolygonScratch, crossingCases, elementPolygon, elementPolygonRef,
  integratePolygon, sectionFrame,
} from './sectionPolygon.ts'
import { emptySection, sectionCentroid, sectionRecord } from './sectionProperties.ts'
import { sectionRule, shapeDegree } from './sectionRule.ts'
import type { SectionAxesChoice } from './sectionAxes.ts'
import type { BoundaryFaces, SectionResult, SurfaceTractions } from './types.ts'

export interface SweepOptions {
  /** Precomputed boundary faces of `mesh`, reused across calls. */
  readonly faces?: BoundaryFaces
  /** Precomputed tractions on `faces`, reused across calls. */
  readonly tractions?: SurfaceTractions
  /** Section axes of every section: one choice and one reference for the whole sweep (sectionAxes.ts). */
  readonly axes?: SectionAxesChoice
}

/** Largest number of sections one sweep computes (about 45 doubles of accumulators each). */
export const MAX_SWEEP_SECTIONS = 100_000

export function sweepSections(
  mesh: Mesh, stress: StressField, bodyForce: Vec3, normal: Vec3, from: number, to: number, count: number,
  options: SweepOptions = {},
): { offsets: Float64Array; results: SectionResult[] } {
  const m = unitNormal(normal, 'sweep direction')
  if (!Number.isFinite(from) || !Number.isFinite(to)) {
    throw new InputError('bad-argument', `the sweep range ${from} .. ${to} must be two finite numbers`, { field: 'range' })
  }
  if (!Number.isInteger(count) || count < 1 || count > MAX_SWEEP_SECTIONS) {
    throw new InputError('bad-argument', `the section count ${count} must be a whole number from 1 to ${MAX_SWEEP_SECTIONS}`, { field: 'count' })
  }
  const offsets = new Float64Array(count)
  const h = count > 1 ? (to - from) / (count - 1) : 0
  for (let k = 0; k < count; k++) offsets[k] = k === count - 1 && count > 1 ? to : from + k * h
  // work on ascending offsets os (index j); a descending sweep maps back with k = count-1-j
  const descending = h < 0
  const os = descending ? offsets.slice().reverse() : offsets
  const hs = Math.abs(h)
  const frame = sectionFrame(new Float64Array(9), m[0], m[1], m[2])
  const coords = mesh.coords, N = mesh.nodeCount
  // D = x·m and the node's part of the snap band (see SNAP_EPS in sectionCut.ts): for the plane
  // at o, d = D - o is taken as 0 when |d| ≤ T + SNAP_EPS·|o|, the band a single cut uses, so
  // nodes lying on a plane up to round-off all count as lying on it
  const D = new Float64Array(N), T = new Float64Array(N)
  const amx = Math.abs(m[0]), amy = Math.abs(m[1]), amz = Math.abs(m[2])
  for (let i = 0; i < N; i++) {
    const x = coords[3 * i], y = coords[3 * i + 1], z = coords[3 * i + 2]
    D[i] = x * m[0] + y * m[1] + z * m[2]
    T[i] = SNAP_EPS * (Math.abs(x) * amx + Math.abs(y) * amy + Math.abs(z) * amz)
  }
  // m is the same for every plane: the traction σm of every stress row (3 numbers, not 6), which
  // the shape functions interpolate like the stress (σm is linear in σ)
  const values = stress.values, R = values.length / 6
  const tN = new Float64Array(3 * R)
  for (let i = 0; i < R; i++) {
    const s = 6 * i
    tN[3 * i] = values[s] * m[0] + values[s + 3] * m[1] + values[s + 5] * m[2]
    tN[3 * i + 1] = values[s + 3] * m[0] + values[s + 1] * m[1] + values[s + 4] * m[2]
    tN[3 * i + 2] = values[s + 5] * m[0] + values[s + 4] * m[1] + values[s + 2] * m[2]
  }
  // candidate planes are found with the band at its widest, then every plane uses its own
  const wide = 2 * SNAP_EPS * Math.max(Math.abs(from), Math.abs(to))

  const acc = new Float64Array(count * ACC_SIZE)
  const sc = createPolygonScratch(), pts = createSectionPoints(), em = createElementMap()
  const tn = new Float64Array(3 * MAX_ELEMENT_NODES), shape = new Float64Array(MAX_ELEMENT_NODES), f3 = new Float64Array(3)
  const dist = sc.dist
  // points whose map inversion failed, per section (inverseMap.ts)
  const unmapped = new Int32Array(count)
  mesh.blocks.forEach((block, bi) => {
    const topo = ELEMENT_TYPES[block.type]
    const nn = topo.nodeCount, cc = topo.cornerCount
    const cases = crossingCases(block.type)
    const linear = shapeDegree(block.type) <= 1
    const domain = referenceDomain(block.type), rule = sectionRule(block.type)
    const conn = block.conn, rows = stress.rows[bi]
    const n = conn.length / nn
    for (let e = 0, base = 0; e < n; e++, base += nn) {
      let lo = Infinity, hi = -Infinity
      for (let c = 0; c < cc; c++) {
        const i = conn[base + c], v = D[i], t = 2 * T[i] + wide
        if (v - t < lo) lo = v - t
        if (v + t > hi) hi = v + t
      }
      // candidates: planes with lo < o <= hi (widened by the snap band); the corner signs decide
      const ja = firstAbove(os, hs, lo), jb = lastAtOrBelow(os, hs, hi)
      let loaded = false
      for (let k = ja; k <= jb; k++) {
        const o = os[k]
        if (!snappedDistances(dist, D, T, conn, base, cc, o)) continue
        const off = k * ACC_SIZE
        if (linear) {
          // the same linear path as a single cut (sectionCut.ts), on σm rows
          if (elementPolygon(sc, acc, off, coords, tN, 3, conn, rows, base, cases, frame) < 3) continue
          integratePolygon(acc, off, sc, frame, 3)
          continue
        }
        if (elementPolygonRef(sc, acc, off, coords, D, o, conn, base, cases, frame, domain.ref) < 3) continue
        addPolygonArea(acc, off, sc)
        if (!loaded) {
          // once per element for all its planes: the map and the nodal traction
          loadElementMap(em, domain, coords, conn, base)
          for (let a = 0; a < nn; a++) {
            const r = 3 * rows[base + a]
            tn[3 * a] = tN[r]; tn[3 * a + 1] = tN[r + 1]; tn[3 * a + 2] = tN[r + 2]
          }
          loaded = true
        }
        const failed = em.failures
        const q = polygonPoints(pts.ref, pts.w, pts.a, pts.b, 0, sc, rule, em)
        unmapped[k] += em.failures - failed
        accumulateTraction(acc, off, block.type, nn, tn, pts.ref, pts.w, pts.a, pts.b, 0, q, shape, f3, 0)
      }
    }
  })

  // centroids of the non-empty sections; the free body needs them before the face pass
  const cen = new Float64Array(3 * count)
  const c3 = new Float64Array(3)
  for (let k = 0; k < count; k++) {
    if (!(acc[k * ACC_SIZE + ACC_AREA] > 0)) continue
    sectionCentroid(c3, acc, k * ACC_SIZE, frame)
    cen[3 * k] = c3[0]; cen[3 * k + 1] = c3[1]; cen[3 * k + 2] = c3[2]
  }
  const faces = options.faces ?? extractBoundaryFaces(mesh)
  const tractions = options.tractions ?? freeBodyTractions(mesh, stress, faces)
  // volume origin g: one mesh node, so volume sums stay relative to the body's own size
  const g = N > 0 ? [coords[0], coords[1], coords[2]] : [0, 0, 0]
  const whole = new Float64Array((count + 1) * FB_SIZE) // bucketed whole-face figures
  const fb = new Float64Array(count * FB_SIZE) // clipped-face figures per section
  for (let k = 0; k <= count; k++) initFreeBody(whole, k * FB_SIZE)
  for (let k = 0; k < count; k++) initFreeBody(fb, k * FB_SIZE)
  const cs = createClipScratch(), cdist = cs.sc.dist
  const nodes = faces.nodes, kind = faces.kind, S = faces.slots
  for (let f = 0; f < faces.count; f++) {
    const nc = faceCornerCount(kind[f]), fbase = S * f
    let lo = Infinity, hi = -Infinity
    for (let c = 0; c < nc; c++) {
      const i = nodes[fbase + c], v = D[i], t = 2 * T[i] + wide
      if (v - t < lo) lo = v - t
      if (v + t > hi) hi = v + t
    }
    // wholly on the - side from the first plane jw where all corners are -, on to the last
    // (the corner test is monotone in o); guess from hi, settle with the exact test
    let jw = firstAbove(os, hs, hi)
    while (jw > 0 && allNegative(D, T, nodes, fbase, nc, os[jw - 1])) jw--
    while (jw < count && !allNegative(D, T, nodes, fbase, nc, os[jw])) jw++
    if (jw < count) addWholeFace(whole, jw * FB_SIZE, coords, faces, tractions, f, g[0], g[1], g[2])
    // crossed: candidates as for elements, the corner signs decide
    const ja = firstAbove(os, hs, lo), jb = Math.min(lastAtOrBelow(os, hs, hi), jw - 1)
    for (let k = ja; k <= jb; k++) {
      if (!(acc[k * ACC_SIZE + ACC_AREA] > 0)) continue
      if (!snappedDistances(cdist, D, T, nodes, fbase, nc, os[k])) continue
      const failed = cs.em.failures
      addClippedFace(fb, k * FB_SIZE, mesh, stress, faces, f, D, os[k], cs, cen[3 * k], cen[3 * k + 1], cen[3 * k + 2], g[0], g[1], g[2])
      unmapped[k] += cs.em.failures - failed
    }
  }
  // cumulative whole-face sums (and bounding boxes): the - side grows with the offset
  for (let k = 1; k < count; k++) mergeFreeBody(whole, k * FB_SIZE, whole, (k - 1) * FB_SIZE)
  for (let k = 0; k < count; k++) mergeFreeBody(fb, k * FB_SIZE, whole, k * FB_SIZE)

  const results: SectionResult[] = []
  for (let k = 0; k < count; k++) {
    const j = descending ? count - 1 - k : k
    const off = j * ACC_SIZE
    const point: Vec3 = [offsets[k] * m[0], offsets[k] * m[1], offsets[k] * m[2]]
    if (!(acc[off + ACC_AREA] > 0)) { results.push(emptySection(point, m, frame, null, options.axes)); continue }
    const c = cen.subarray(3 * j, 3 * j + 3)
    const Fs: Vec3 = [acc[off + ACC_FORCE], acc[off + ACC_FORCE + 1], acc[off + ACC_FORCE + 2]]
    const freeBody = closeFreeBody(fb, j * FB_SIZE, c, g, acc[off + ACC_AREA], m, Fs, momentAboutCentroid(acc, off, c, frame), bodyForce, acc[off + ACC_GROSS])
    results.push(sectionRecord(acc, off, point, m, frame, null, freeBody, unmapped[j], options.axes))
  }
  return { offsets, results }
}

/**
 * Corner distances d = D - o of an element or face into `dist`, snapped to 0 inside the band T;
 * true when the corners lie on both sides (some d < 0, some d ≥ 0).
 */
function snappedDistances(dist: Float64Array, D: Float64Array, T: Float64Array, nodes: Int32Array, base: number, nc: number, o: number): boolean {
  let neg = 0
  const to = SNAP_EPS * Math.abs(o)
  for (let c = 0; c < nc; c++) {
    const i = nodes[base + c], r = D[i] - o, t = T[i] + to
    const d = r < -t || r > t ? r : 0
    dist[c] = d
    if (d < 0) neg++
  }
  return neg > 0 && neg < nc
}

/**
 * All corners of a face strictly on the - side of the plane at o (same snap as above). Monotone in
 * o up to rounding; the caller clips a face per plane only before the run where this holds, so a
 * face is never counted both whole and clipped.
 */
function allNegative(D: Float64Array, T: Float64Array, nodes: Int32Array, base: number, nc: number, o: number): boolean {
  const to = SNAP_EPS * Math.abs(o)
  for (let c = 0; c < nc; c++) {
    const i = nodes[base + c]
    if (!(D[i] - o < -(T[i] + to))) return false
  }
  return true
}

// Index searches on the ascending, uniform internal offsets: a guess from the spacing, then exact
// comparisons with the stored offsets (the guess may be off by one from rounding).

/** First j with o_j > x (o.length when none). */
function firstAbove(o: Float64Array, h: number, x: number): number {
  const n = o.length
  let k = h > 0 ? Math.floor((x - o[0]) / h) : 0
  k = k > 0 ? (k > n ? n : k) : 0 // also catches NaN
  while (k > 0 && o[k - 1] > x) k--
  while (k < n && !(o[k] > x)) k++
  return k
}

/** Last j with o_j <= x (-1 when none). */
function lastAtOrBelow(o: Float64Array, h: number, x: number): number {
  const n = o.length
  let k = h > 0 ? Math.floor((x - o[0]) / h) : n - 1
  k = k > -1 ? (k > n - 1 ? n - 1 : k) : -1
  while (k < n - 1 && o[k + 1] <= x) k++
  while (k >= 0 && !(o[k] <= x)) k--
  return k
}
