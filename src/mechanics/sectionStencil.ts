/**
 * The stencil of a section: everything about a cut that does not depend on the stress, built
 * once, so that each load case then costs only a pass over the section's own element-nodes.
 *
 * The resultant of a section is linear in the stress. With t = σm and, on each cut element, the
 * stress interpolated from its nodes, σ(ξ) = Σ_a N_a(ξ) σ_a, the section's integrals are
 *   ∫ t dA   = Σ_a W_a  σ_a m,   W_a  = ∫ N_a dA,
 *   ∫ a t dA = Σ_a WA_a σ_a m,   WA_a = ∫ a N_a dA,      ∫ b t dA likewise with WB_a,
 * (a, b the plane coordinates about the section's local origin, sectionPolygon.ts), and the
 * moment follows from these (sectionMomentAtOrigin). The weights W, WA, WB of every cut
 * element's nodes are integrated here once, by the same polygons (elementPolygonRef, exact ξ of
 * the vertices) and the same Dunavant rules (sectionRule.ts, degree p + 1) as the single cut
 * (sectionCut.ts), so a case's figures equal the single cut's to round-off; on tet4 the degree-2
 * rule is exact for the linear traction times (1, a, b), as the closed forms there are.
 *
 * Regions and limits use the cut record of sectionRegions.ts; regions are ordered by area,
 * largest first (an order that, unlike the single cut's largest-force-first, is the same for
 * every case).
 *
 * Units: model length; weights W in length², WA and WB in length³. Layout: cut element i is
 * element `local[i]` of block `block[i]`, its nodes' weights at weights[3·(first[i] + a) ..]
 * (W, WA, WB), its region `label[i]` (-1 when a limit leaves it out).
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import { ZERO_FREE_BODY } from './freeBody.ts'
import { createSectionPoints } from './elementSection.ts'
import { polygonPoints } from './elementSection.ts'
import { createElementMap, loadElementMap, MAX_ELEMENT_NODES, referenceDomain } from './inverseMap.ts'
import { checkPoint, unitNormal } from './plane.ts'
import type { SectionAxesChoice } from './sectionAxes.ts'
import { nodeDistances } from './sectionCut.ts'
import {
  ACC_AREA, ACC_AT, ACC_BT, ACC_FORCE, ACC_SIZE, addPolygonArea, createPolygonScratch, crossingCases, elementPolygonRef, sectionFrame,
} from './sectionPolygon.ts'
import { emptySection, sectionRecord } from './sectionProperties.ts'
import type { SectionLimit } from './sectionRegions.ts'
import {
  addAccumulator, createCutRecord, labelRegions, recordElement, regionAccumulators, selectCutElements, selectionAccumulator,
} from './sectionRegions.ts'
import { sectionRule } from './sectionRule.ts'
import { shapeValues } from './shapeFunctions.ts'
import type { SectionPlane, SectionResult } from './types.ts'

export interface SectionStencil {
  readonly point: Vec3
  readonly normal: Vec3
  readonly frame: Float64Array
  /** Cut elements (of the selection and outside it). */
  readonly count: number
  readonly block: Int32Array
  readonly local: Int32Array
  readonly first: Int32Array
  readonly label: Int32Array
  readonly weights: Float64Array
  /** Regions (of the selection), largest area first. */
  readonly regionCount: number
  /** Geometric accumulators (ACC_SIZE each): [0] the section (the selection, with a limit), then the regions in order. */
  readonly acc: Float64Array
  readonly regionParts: readonly (readonly number[])[]
  /** Cut elements per group (the section, then the regions). */
  readonly cutElements: Int32Array
  readonly limited: boolean
  readonly about: Vec3 | null
  readonly axes: SectionAxesChoice | undefined
}

export interface StencilOptions {
  readonly limit?: SectionLimit | null
  readonly about?: Vec3
  readonly axes?: SectionAxesChoice
}

/** Builds the stencil of `plane` on `mesh`: one pass over nodes and elements, then the cut elements' weights. */
export function buildSectionStencil(mesh: Mesh, plane: SectionPlane, options: StencilOptions = {}): SectionStencil {
  const m = unitNormal(plane.normal)
  checkPoint(plane.point, 'section point')
  if (options.about) checkPoint(options.about, 'moment point')
  const point: Vec3 = [plane.point[0], plane.point[1], plane.point[2]]
  const frame = sectionFrame(new Float64Array(9), m[0], m[1], m[2])
  const coords = mesh.coords, N = mesh.nodeCount
  const d = new Float64Array(N)
  nodeDistances(d, coords, N, point, m)
  const whole = new Float64Array(ACC_SIZE)
  const sc = createPolygonScratch(), em = createElementMap(), pts = createSectionPoints()
  const rec = createCutRecord()
  const shape = new Float64Array(MAX_ELEMENT_NODES)
  let first: Int32Array = new Int32Array(1024), weights: Float64Array = new Float64Array(3 * 1024 * 4)
  let entries = 0
  mesh.blocks.forEach((block, bi) => {
    const topo = ELEMENT_TYPES[block.type], type = block.type
    const nn = topo.nodeCount, cc = topo.cornerCount, conn = block.conn, count = conn.length / nn
    const cases = crossingCases(type), domain = referenceDomain(type), rule = sectionRule(type)
    const dist = sc.dist
    for (let e = 0, base = 0; e < count; e++, base += nn) {
      let neg = 0
      for (let c = 0; c < cc; c++) {
        const dc = d[conn[base + c]]
        dist[c] = dc
        if (dc < 0) neg++
      }
      if (neg === 0 || neg === cc) continue // all corners on one side
      if (elementPolygonRef(sc, whole, 0, coords, d, 0, conn, base, cases, frame, domain.ref) < 3) continue
      const o = recordElement(rec, bi, e)
      addPolygonArea(rec.acc, o, sc)
      addAccumulator(whole, 0, rec.acc, o)
      loadElementMap(em, domain, coords, conn, base)
      const q = polygonPoints(pts.ref, pts.w, pts.a, pts.b, 0, sc, rule, em)
      const i = rec.n - 1
      if (i + 2 > first.length) first = growInt(first, 2 * first.length)
      if (3 * (entries + nn) > weights.length) weights = growFloat(weights, Math.max(2 * weights.length, 3 * (entries + nn)))
      first[i] = entries
      const wo = 3 * entries
      for (let k = 0; k < 3 * nn; k++) weights[wo + k] = 0
      for (let p = 0; p < q; p++) {
        shapeValues(type, pts.ref[3 * p], pts.ref[3 * p + 1], pts.ref[3 * p + 2], shape)
        const w = pts.w[p], wa = w * pts.a[p], wb = w * pts.b[p]
        for (let a = 0; a < nn; a++) {
          const na = shape[a]
          weights[wo + 3 * a] += w * na
          weights[wo + 3 * a + 1] += wa * na
          weights[wo + 3 * a + 2] += wb * na
        }
      }
      entries += nn
      first[i + 1] = entries
    }
  })
  const n = rec.n
  const limit = options.limit ?? null
  const sel = new Int32Array(n), lab = new Int32Array(n)
  const selected = selectCutElements(sel, rec, mesh, limit, whole, frame)
  const count = whole[ACC_AREA] > 0 ? labelRegions(lab, sel, selected, rec, mesh, d) : 0
  const ra = regionAccumulators(count, lab, sel, selected, rec, mesh, whole)
  // regions by area, largest first (ties: first met)
  const order = Array.from({ length: count }, (_, g) => g).sort((x, y) => ra.acc[y * ACC_SIZE + ACC_AREA] - ra.acc[x * ACC_SIZE + ACC_AREA] || x - y)
  const rank = new Int32Array(count)
  order.forEach((g, r) => { rank[g] = r })
  const label = new Int32Array(n).fill(-1)
  const cutElements = new Int32Array(1 + count)
  for (let s = 0; s < selected; s++) {
    label[sel[s]] = rank[lab[s]]
    cutElements[0]++
    cutElements[1 + rank[lab[s]]]++
  }
  const acc = new Float64Array((1 + count) * ACC_SIZE)
  if (limit) selectionAccumulator(acc, sel, selected, rec, whole)
  else acc.set(whole.subarray(0, ACC_SIZE))
  order.forEach((g, r) => acc.set(ra.acc.subarray(g * ACC_SIZE, (g + 1) * ACC_SIZE), (1 + r) * ACC_SIZE))
  const regionParts = order.map((g) => ra.parts[g])
  return {
    point, normal: m, frame, count: n, block: rec.block.slice(0, n), local: rec.local.slice(0, n), first: first.slice(0, n + 1),
    label, weights: weights.slice(0, 3 * entries), regionCount: count, acc, regionParts, cutElements, limited: limit !== null,
    about: options.about ? [options.about[0], options.about[1], options.about[2]] : null, axes: options.axes,
  }
}

/** Slots per group of a case's integrals: ∫ t dA, ∫ a t dA, ∫ b t dA. */
export const CASE_SLOTS = 9

/**
 * One case's pass: the traction integrals of every group (the section, then each region) into
 * out[CASE_SLOTS·g ..] (zeroed first), from the field's element-node rows. Cut elements a limit
 * leaves out add nothing.
 */
export function stencilIntegrals(out: Float64Array, s: SectionStencil, mesh: Mesh, field: StressField): Float64Array {
  out.fill(0, 0, CASE_SLOTS * (1 + s.regionCount))
  const mx = s.normal[0], my = s.normal[1], mz = s.normal[2], values = field.values, W = s.weights
  const blocks = mesh.blocks
  for (let i = 0; i < s.count; i++) {
    const g = s.label[i]
    if (g < 0) continue
    const bi = s.block[i], rows = field.rows[bi]
    const nn = ELEMENT_TYPES[blocks[bi].type].nodeCount
    const base = s.local[i] * nn
    let Fx = 0, Fy = 0, Fz = 0, Ax = 0, Ay = 0, Az = 0, Bx = 0, By = 0, Bz = 0
    for (let a = 0, w = 3 * s.first[i]; a < nn; a++, w += 3) {
      const r = 6 * rows[base + a]
      const sxx = values[r], syy = values[r + 1], szz = values[r + 2], sxy = values[r + 3], syz = values[r + 4], sxz = values[r + 5]
      const tx = sxx * mx + sxy * my + sxz * mz
      const ty = sxy * mx + syy * my + syz * mz
      const tz = sxz * mx + syz * my + szz * mz
      const w0 = W[w], wa = W[w + 1], wb = W[w + 2]
      Fx += w0 * tx; Fy += w0 * ty; Fz += w0 * tz
      Ax += wa * tx; Ay += wa * ty; Az += wa * tz
      Bx += wb * tx; By += wb * ty; Bz += wb * tz
    }
    const o = CASE_SLOTS * (1 + g)
    out[o] += Fx; out[o + 1] += Fy; out[o + 2] += Fz
    out[o + 3] += Ax; out[o + 4] += Ay; out[o + 5] += Az
    out[o + 6] += Bx; out[o + 7] += By; out[o + 8] += Bz
  }
  // the section is the sum of its regions (every selected element has a region)
  for (let g = 0; g < s.regionCount; g++) for (let k = 0; k < CASE_SLOTS; k++) out[k] += out[CASE_SLOTS * (1 + g) + k]
  return out
}

/**
 * The section record of group g (0 = the section, 1 + r = region r) from a case's integrals
 * (`ints` as stencilIntegrals writes them): area properties of the stencil, force and moment of
 * the case. No free body (a stencil knows nothing of the body's surface): `freeBody` is zero and
 * `freeBodyDefined` false. Moments about the stencil's `about` for the section, about each
 * region's own centroid for a region.
 */
export function stencilRecord(s: SectionStencil, ints: Float64Array, g: number): SectionResult {
  if (!(s.acc[g * ACC_SIZE + ACC_AREA] > 0)) return { ...emptySection(s.point, s.normal, s.frame, g === 0 ? s.about : null, s.axes), limited: s.limited, freeBodyDefined: false }
  const acc = s.acc.slice(g * ACC_SIZE, (g + 1) * ACC_SIZE)
  const o = CASE_SLOTS * g
  for (let k = 0; k < 3; k++) {
    acc[ACC_FORCE + k] = ints[o + k]
    acc[ACC_AT + k] = ints[o + 3 + k]
    acc[ACC_BT + k] = ints[o + 6 + k]
  }
  const r = sectionRecord(acc, 0, s.point, s.normal, s.frame, g === 0 ? s.about : null, ZERO_FREE_BODY, 0, s.axes)
  return { ...r, cutElements: s.cutElements[g], limited: s.limited, freeBodyDefined: false }
}

function growInt(a: Int32Array, n: number): Int32Array {
  const b = new Int32Array(n)
  b.set(a)
  return b
}

function growFloat(a: Float64Array, n: number): Float64Array {
  const b = new Float64Array(n)
  b.set(a)
  return b
}
