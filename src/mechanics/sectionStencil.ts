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
 * (sectionCut.ts), so a case's figures equal the single cut's to round-off; tet4 takes closed
 * forms (tetSectionWeights.ts), exact for its linear field as the single cut's are.
 *
 * Cost (10^6 tet4, one oblique plane): the build is one pass like the single cut's, without its
 * free body; compiling merges the element-nodes by stress row (a node is shared by about a dozen
 * cut elements) and sorts them in memory order; each case is then one walk over those rows,
 * bound by reading their scattered stress, so two cases share a walk (stencilIntegrals).
 *
 * Regions and limits use the cut record of sectionRegions.ts; regions are ordered by area,
 * largest first (an order that, unlike the single cut's largest-force-first, is the same for
 * every case).
 *
 * Units: model length; weights W in length², WA and WB in length³. Layout: cut element i is
 * element `local[i]` of block `block[i]`, its nodes' weights at weights[3·(first[i] + a) ..]
 * (W, WA, WB), its region `label[i]` (-1 when a limit leaves it out). `block`, `local`, `first`
 * and `weights` are views of grows-only storage that the next build reuses (a fresh 3 MB array
 * per plane costs more in page faults than the whole build): compile the stencil (for every
 * rows index it will meet) before building another.
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'
import { ZERO_FREE_BODY } from './freeBody.ts'
import { createSectionPoints, growFloat, growInt, polygonPoints } from './elementSection.ts'
import { createElementMap, loadElementMap, MAX_ELEMENT_NODES, referenceDomain } from './inverseMap.ts'
import type { SectionAxesChoice } from './sectionAxes.ts'
import { cutElements, planeDistances } from './sectionCut.ts'
import {
  ACC_AREA, ACC_AT, ACC_BT, ACC_CUT, ACC_FORCE, ACC_SAB, ACC_SIZE, MAX_CORNERS, addPolygonArea, createPolygonScratch, crossingCases, elementPolygonRef,
} from './sectionPolygon.ts'
import { emptySection, sectionRecord } from './sectionProperties.ts'
import type { CutRecord, SectionLimit } from './sectionRegions.ts'
import {
  addAccumulator, createCutRecord, labelRegions, recordElement, regionAccumulators, selectCutElements, selectionAccumulator,
} from './sectionRegions.ts'
import { sectionRule, shapeDegree } from './sectionRule.ts'
import { shapeValues } from './shapeFunctions.ts'
import { tetSectionWeights } from './tetSectionWeights.ts'
import type { SectionPlane, SectionResult } from './types.ts'

export interface SectionStencil {
  readonly point: Vec3
  readonly normal: Vec3
  readonly frame: Float64Array
  /** Cut elements (of the selection and outside it). */
  readonly count: number
  /** Element-node entries (weights.length / 3). */
  readonly entries: number
  readonly block: Int32Array
  readonly local: Int32Array
  readonly first: Int32Array
  /** Output record each cut element adds to: 0 the section, 1 + r region r (with regions); -1 when a limit leaves it out. */
  readonly label: Int32Array
  readonly weights: Float64Array
  /** Regions (of the selection), largest area first; 0 when regions were not asked for. */
  readonly regionCount: number
  /** Geometric accumulators (ACC_SIZE each): [0] the section (the selection, with a limit), then the regions in order. */
  readonly acc: Float64Array
  readonly regionParts: readonly (readonly number[])[]
  /** Cut elements per record (the section, then the regions). */
  readonly cutElements: Int32Array
  readonly limited: boolean
  readonly about: Vec3 | null
  readonly axes: SectionAxesChoice | undefined
}

export interface StencilOptions {
  /** Split the section into its connected regions (sectionRegions.ts). */
  readonly regions?: boolean
  readonly limit?: SectionLimit | null
  readonly about?: Vec3
  readonly axes?: SectionAxesChoice
}

/**
 * Builds the stencil of `plane` on `mesh`: one pass over the nodes and the elements, then each
 * cut element's polygon and its nodes' weights. tet4 (shape-function degree 1) takes the closed
 * forms of tetSectionWeights.ts, exact for its linear field; every other type its Dunavant points
 * (elementSection.ts). Nothing is allocated per element: the entries go to grows-only storage
 * (views of it are valid until the next build, see above).
 */
export function buildSectionStencil(mesh: Mesh, plane: SectionPlane, options: StencilOptions = {}): SectionStencil {
  const { m, point, frame, d } = planeDistances(mesh, plane, options.about)
  const coords = mesh.coords
  const whole = new Float64Array(ACC_SIZE)
  const limit = options.limit ?? null
  const rec = options.regions || limit ? record : null
  if (rec) rec.n = 0
  const st = store
  st.n = 0; st.entries = 0
  mesh.blocks.forEach((block, bi) => {
    const topo = ELEMENT_TYPES[block.type]
    if (shapeDegree(block.type) <= 1 && topo.nodeCount === 4) stencilTets(st, whole, rec, d, coords, block.conn, bi, frame)
    else stencilBlock(st, whole, rec, d, coords, block.type, block.conn, bi, frame)
  })
  const n = st.n, entries = st.entries
  const label = new Int32Array(n)
  let regionCount = 0
  let acc: Float64Array
  let regionParts: number[][] = []
  if (rec) {
    const sel = new Int32Array(n), lab = new Int32Array(n)
    const selected = selectCutElements(sel, rec, mesh, limit, whole, frame)
    label.fill(-1)
    const count = options.regions && whole[ACC_AREA] > 0 ? labelRegions(lab, sel, selected, rec, mesh, d) : 0
    if (count > 0) {
      const ra = regionAccumulators(count, lab, sel, selected, rec, mesh, whole)
      // regions by area, largest first (ties: first met)
      const order = Array.from({ length: count }, (_, g) => g).sort((x, y) => ra.acc[y * ACC_SIZE + ACC_AREA] - ra.acc[x * ACC_SIZE + ACC_AREA] || x - y)
      const rank = new Int32Array(count)
      order.forEach((g, r) => { rank[g] = r })
      acc = new Float64Array((1 + count) * ACC_SIZE)
      order.forEach((g, r) => acc.set(ra.acc.subarray(g * ACC_SIZE, (g + 1) * ACC_SIZE), (1 + r) * ACC_SIZE))
      regionParts = order.map((g) => ra.parts[g])
      for (let s = 0; s < selected; s++) label[sel[s]] = 1 + rank[lab[s]]
      regionCount = count
    } else {
      acc = new Float64Array(ACC_SIZE)
      for (let s = 0; s < selected; s++) label[sel[s]] = 0
    }
    if (limit) selectionAccumulator(acc, sel, selected, rec, whole)
    else acc.set(whole.subarray(0, ACC_SIZE))
  } else acc = whole
  const perRecord = new Int32Array(1 + regionCount)
  for (let i = 0; i < n; i++) {
    const g = label[i]
    if (g < 0) continue
    perRecord[0]++
    if (g > 0) perRecord[g]++
  }
  return {
    point, normal: m, frame, count: n, entries, block: st.block.subarray(0, n), local: st.local.subarray(0, n), first: st.first.subarray(0, n + 1),
    label, weights: st.weights.subarray(0, 3 * entries), regionCount, acc, regionParts, cutElements: perRecord, limited: limit !== null,
    about: options.about ? [options.about[0], options.about[1], options.about[2]] : null, axes: options.axes,
  }
}

/** The per-element record of the latest stencil with regions or a limit (grows only). */
const record = createCutRecord()


/** Grows-only entries of the latest stencil: see SectionStencil for the layout. */
interface StencilStore {
  n: number
  entries: number
  first: Int32Array
  block: Int32Array
  local: Int32Array
  weights: Float64Array
}
const store: StencilStore = { n: 0, entries: 0, first: new Int32Array(1024), block: new Int32Array(1024), local: new Int32Array(1024), weights: new Float64Array(3 * 4096) }

/** Room for `elements` more cut elements of `nn` nodes each. */
function reserve(st: StencilStore, elements: number, nn: number): void {
  if (st.n + elements + 1 > st.first.length) {
    const size = Math.max(2 * st.first.length, st.n + elements + 1)
    st.first = growInt(st.first, size); st.block = growInt(st.block, size); st.local = growInt(st.local, size)
  }
  const need = 3 * (st.entries + elements * nn)
  if (need > st.weights.length) st.weights = growFloat(st.weights, Math.max(2 * st.weights.length, need))
}

// slots as module constants (imported bindings are getter calls under tsx)
const AREA = ACC_AREA, SAB = ACC_SAB, CUT = ACC_CUT

/** One element's area integrals (tetSectionWeights) before it is known to be cut: a record block's slots. */
const ELEMENT_ACC = new Float64Array(ACC_SIZE)

/**
 * The cut tet4 of one block (4 nodes each): polygons, area integrals into `whole` (and into the
 * record with regions or a limit), and their nodes' weights in closed form (tetSectionWeights).
 */
function stencilTets(
  st: StencilStore, whole: Float64Array, rec: CutRecord | null, d: Float64Array, coords: Float64Array, conn: Int32Array, bi: number, frame: Float64Array,
): void {
  const list = cutElements(d, conn, conn.length / 4, 4, 4)
  const items = list.items, count = list.n
  reserve(st, count, 4)
  const cases = crossingCases('tet4'), dist = DIST
  // imported kernels once into locals (getter calls per element under tsx)
  const weigh = tetSectionWeights, record = recordElement
  const first = st.first, block = st.block, local = st.local, weights = st.weights, el = ELEMENT_ACC
  let n = st.n, entries = st.entries
  for (let c = 0; c < count; c++) {
    const e = items[c], base = 4 * e
    dist[0] = d[conn[base]]; dist[1] = d[conn[base + 1]]; dist[2] = d[conn[base + 2]]; dist[3] = d[conn[base + 3]]
    if (rec) {
      for (let k = AREA; k <= SAB; k++) el[k] = 0
      if (weigh(weights, 3 * entries, el, 0, whole, dist, coords, conn, base, cases, frame) < 3) continue
      // the record's block holds the area integrals only (a stencil's traction comes per case)
      const o = record(rec, bi, e), ra = rec.acc
      for (let k = AREA; k <= SAB; k++) { ra[o + k] = el[k]; whole[k] += el[k] }
      ra[o + CUT] = 1; whole[CUT] += 1
    } else if (weigh(weights, 3 * entries, whole, 0, whole, dist, coords, conn, base, cases, frame) < 3) continue
    first[n] = entries; block[n] = bi; local[n] = e
    entries += 4
    n++
  }
  first[n] = entries
  st.n = n; st.entries = entries
}

const DIST = new Float64Array(MAX_CORNERS)

/**
 * The cut elements of one block of any other type: polygons with exact vertex ξ, area integrals,
 * and their nodes' weights from the Dunavant points of sectionRule.ts (degree p + 1, as the
 * single cut integrates them).
 */
function stencilBlock(
  st: StencilStore, whole: Float64Array, rec: CutRecord | null, d: Float64Array, coords: Float64Array, type: ElementTypeName,
  conn: Int32Array, bi: number, frame: Float64Array,
): void {
  const topo = ELEMENT_TYPES[type]
  const nn = topo.nodeCount, cc = topo.cornerCount, count = conn.length / nn
  const cases = crossingCases(type), domain = referenceDomain(type), rule = sectionRule(type)
  const sc = SCRATCH, em = MAP, pts = POINTS, shape = SHAPE, dist = sc.dist
  const list = cutElements(d, conn, count, nn, cc)
  reserve(st, list.n, nn)
  const polygon = elementPolygonRef, area = addPolygonArea, points = polygonPoints, load = loadElementMap, values = shapeValues
  const weights = st.weights
  for (let c = 0; c < list.n; c++) {
    const e = list.items[c], base = nn * e
    for (let k = 0; k < cc; k++) dist[k] = d[conn[base + k]]
    if (polygon(sc, whole, 0, coords, d, 0, conn, base, cases, frame, domain.ref) < 3) continue
    if (rec) {
      const o = recordElement(rec, bi, e)
      area(rec.acc, o, sc)
      addAccumulator(whole, 0, rec.acc, o)
    } else area(whole, 0, sc)
    const n = st.n, wo = 3 * st.entries
    st.first[n] = st.entries; st.block[n] = bi; st.local[n] = e
    for (let k = 0; k < 3 * nn; k++) weights[wo + k] = 0
    load(em, domain, coords, conn, base)
    const q = points(pts.ref, pts.w, pts.a, pts.b, 0, sc, rule, em)
    for (let p = 0; p < q; p++) {
      values(type, pts.ref[3 * p], pts.ref[3 * p + 1], pts.ref[3 * p + 2], shape)
      const wp = pts.w[p], wa = wp * pts.a[p], wb = wp * pts.b[p]
      for (let a = 0; a < nn; a++) {
        const na = shape[a]
        weights[wo + 3 * a] += wp * na; weights[wo + 3 * a + 1] += wa * na; weights[wo + 3 * a + 2] += wb * na
      }
    }
    st.entries += nn
    st.n = n + 1
    st.first[n + 1] = st.entries
  }
}

const SCRATCH = createPolygonScratch(), MAP = createElementMap(), POINTS = createSectionPoints(), SHAPE = new Float64Array(MAX_ELEMENT_NODES)



/**
 * A stencil compiled for one field layout: the element-node entries of each output record merged
 * by stress row (a node shared by several cut elements is read once per case), rows ascending.
 * Record g's entries are start[g] .. start[g+1]-1: row index `row[e]`, weights at w[3e ..].
 * Every field whose rows are those of `field` (nodal fields on one mesh, the cases of one
 * element-nodal model) uses the same compiled stencil.
 */
export interface CompiledStencil {
  readonly records: number
  readonly start: Int32Array
  readonly row: Int32Array
  readonly w: Float64Array
  readonly rows: readonly Int32Array[]
}

export function compileStencil(s: SectionStencil, mesh: Mesh, field: StressField): CompiledStencil {
  const records = 1 + s.regionCount
  const rowCount = field.values.length / 6
  // elements by record (counting sort), so each record's entries are merged together
  const per = new Int32Array(records + 1)
  for (let i = 0; i < s.count; i++) if (s.label[i] >= 0) per[s.label[i] + 1]++
  for (let g = 0; g < records; g++) per[g + 1] += per[g]
  const byRecord = new Int32Array(per[records])
  const fill = per.slice(0, records)
  for (let i = 0; i < s.count; i++) if (s.label[i] >= 0) byRecord[fill[s.label[i]]++] = i
  // element-nodal rows are each element-node's own: nothing to merge, and their order is the elements'
  const merge = field.layout !== 'element-nodal'
  const slot = merge ? slotScratch(rowCount) : null
  const total = s.weights.length / 3
  const cs = compileScratch(total)
  const row = cs.row, w = cs.w, start = new Int32Array(records + 1)
  const nodes = mesh.blocks.map((b) => ELEMENT_TYPES[b.type].nodeCount)
  const mergeOne = mergeElement, copyOne = copyElement
  let k = 0
  for (let g = 0; g < records; g++) {
    start[g] = k
    const from = k
    for (let j = per[g]; j < per[g + 1]; j++) {
      const i = byRecord[j], bi = s.block[i], nn = nodes[bi]
      k = slot ? mergeOne(row, w, k, slot, field.rows[bi], s.local[i] * nn, nn, s.weights, 3 * s.first[i])
        : copyOne(row, w, k, field.rows[bi], s.local[i] * nn, nn, s.weights, 3 * s.first[i])
    }
    if (slot) {
      for (let e = from; e < k; e++) slot[row[e]] = -1 // the slots are clear again for the next record
      sortEntries(row, w, from, k, rowCount)
    }
  }
  start[records] = k
  return { records, start, row: row.slice(0, k), w: w.slice(0, 3 * k), rows: field.rows }
}

/**
 * Adds one element's entries (nn rows from rows[base ..], weights from W[o ..]) to the merged
 * entries ending at k: a row met before in this record (slot[r] ≥ 0) adds to its entry, else
 * opens one. Returns the new end.
 */
function mergeElement(
  row: Int32Array, w: Float64Array, k: number, slot: Int32Array, rows: Int32Array, base: number, nn: number, W: Float64Array, o: number,
): number {
  for (let a = 0; a < nn; a++, o += 3) {
    const r = rows[base + a]
    let e = slot[r]
    if (e < 0) { e = k++; slot[r] = e; row[e] = r; w[3 * e] = 0; w[3 * e + 1] = 0; w[3 * e + 2] = 0 }
    w[3 * e] += W[o]; w[3 * e + 1] += W[o + 1]; w[3 * e + 2] += W[o + 2]
  }
  return k
}

/** Appends one element's entries unmerged (element-nodal rows); returns the new end. */
function copyElement(row: Int32Array, w: Float64Array, k: number, rows: Int32Array, base: number, nn: number, W: Float64Array, o: number): number {
  for (let a = 0; a < nn; a++, o += 3, k++) {
    row[k] = rows[base + a]
    w[3 * k] = W[o]; w[3 * k + 1] = W[o + 1]; w[3 * k + 2] = W[o + 2]
  }
  return k
}

/** Grows-only entry number per row for merging, -1 where none (cleared by its user after each record). */
let slots = new Int32Array(0)
function slotScratch(rowCount: number): Int32Array {
  if (slots.length < rowCount) slots = new Int32Array(rowCount).fill(-1)
  return slots
}

/** Grows-only room for the compiled entries (copied out at the end). */
const compiled = { row: new Int32Array(0), w: new Float64Array(0) }
function compileScratch(entries: number): typeof compiled {
  if (compiled.row.length < entries) { compiled.row = new Int32Array(entries); compiled.w = new Float64Array(3 * entries) }
  return compiled
}

/** Grows-only scratch of the radix sort (keys and entry numbers, two of each, and the weights). */
const sorting = { keys: new Int32Array(0), keys2: new Int32Array(0), index: new Int32Array(0), index2: new Int32Array(0), w: new Float64Array(0) }
const RADIX_BITS = 11, RADIX = 1 << RADIX_BITS
const radixCount = new Int32Array(RADIX)

/**
 * Sorts entries [from, to) by row (memory order of the stress values), weights alongside: a
 * least-significant-digit radix sort of the rows (11 bits a pass, as many passes as rows < rowCount
 * need), then the weights gathered in the new order.
 */
function sortEntries(row: Int32Array, w: Float64Array, from: number, to: number, rowCount: number): void {
  const n = to - from
  if (n < 2) return
  const t = sorting
  if (t.keys.length < n) {
    const size = Math.max(n, 2 * t.keys.length)
    t.keys = new Int32Array(size); t.keys2 = new Int32Array(size); t.index = new Int32Array(size); t.index2 = new Int32Array(size); t.w = new Float64Array(3 * size)
  }
  let keys = t.keys, index = t.index, keys2 = t.keys2, index2 = t.index2
  for (let i = 0; i < n; i++) { keys[i] = row[from + i]; index[i] = i }
  const bits = 32 - Math.clz32(Math.max(1, rowCount - 1)), count = radixCount
  for (let shift = 0; shift < bits; shift += RADIX_BITS) {
    count.fill(0)
    for (let i = 0; i < n; i++) count[(keys[i] >>> shift) & (RADIX - 1)]++
    for (let b = 0, sum = 0; b < RADIX; b++) { const c = count[b]; count[b] = sum; sum += c }
    for (let i = 0; i < n; i++) {
      const key = keys[i], p = count[(key >>> shift) & (RADIX - 1)]++
      keys2[p] = key; index2[p] = index[i]
    }
    const k = keys; keys = keys2; keys2 = k
    const x = index; index = index2; index2 = x
  }
  const w2 = t.w
  for (let i = 0; i < 3 * n; i++) w2[i] = w[3 * from + i]
  for (let i = 0; i < n; i++) {
    const j = 3 * index[i], o = 3 * (from + i)
    row[from + i] = keys[i]
    w[o] = w2[j]; w[o + 1] = w2[j + 1]; w[o + 2] = w2[j + 2]
  }
}

/** Where a single case's pass writes the twin it does not need (grows only). */
let spare = new Float64Array(0)

/** Slots per record of a case's integrals: ∫ t dA, ∫ a t dA, ∫ b t dA. */
export const CASE_SLOTS = 9

/**
 * One case's pass: the traction integrals of every record (the section, then each region) into
 * out[CASE_SLOTS·g ..] (zeroed first), from the field's values through the compiled stencil
 * (compileStencil on a field with the same rows). With regions the section is their sum.
 * Given a second case (`out2`, `values2`), both are integrated in the same walk over the
 * entries: the stress rows of two cases are then read side by side, twice the memory reads in
 * flight, which is what a case's pass waits on (its rows are scattered over a large array).
 */
export function stencilIntegrals(
  out: Float64Array, c: CompiledStencil, m: Vec3, values: Float64Array, out2: Float64Array | null = null, values2: Float64Array | null = null,
): Float64Array {
  const records = c.records
  const mx = m[0], my = m[1], mz = m[2], W = c.w, row = c.row, start = c.start
  const two = out2 !== null && values2 !== null
  if (!two && spare.length < CASE_SLOTS * records) spare = new Float64Array(CASE_SLOTS * records)
  const o2 = two ? out2 : spare, v2 = two ? values2 : values
  for (let g = 0; g < records; g++) recordPass(out, o2, CASE_SLOTS * g, start[g], start[g + 1], row, W, values, v2, mx, my, mz)
  // the section is the sum of its regions (record 0 holds no element then)
  for (let g = 1; g < records; g++) {
    for (let k = 0; k < CASE_SLOTS; k++) {
      out[k] += out[CASE_SLOTS * g + k]
      o2[k] += o2[CASE_SLOTS * g + k]
    }
  }
  return out
}

/**
 * ∫ t dA, ∫ a t dA, ∫ b t dA over entries [from, to) into out[o .. o + 9) from `values`, and
 * into out2 from `values2`, in one walk (a single case passes its values twice: the second read
 * hits the cache).
 */
function recordPass(
  out: Float64Array, out2: Float64Array, o: number, from: number, to: number, row: Int32Array, W: Float64Array,
  values: Float64Array, values2: Float64Array, mx: number, my: number, mz: number,
): void {
  let Fx = 0, Fy = 0, Fz = 0, Ax = 0, Ay = 0, Az = 0, Bx = 0, By = 0, Bz = 0
  let Gx = 0, Gy = 0, Gz = 0, Cx = 0, Cy = 0, Cz = 0, Dx = 0, Dy = 0, Dz = 0
  for (let e = from; e < to; e++) {
    const r = 6 * row[e], q = 3 * e
    const w0 = W[q], wa = W[q + 1], wb = W[q + 2]
    const sxx = values[r], syy = values[r + 1], szz = values[r + 2], sxy = values[r + 3], syz = values[r + 4], sxz = values[r + 5]
    const uxx = values2[r], uyy = values2[r + 1], uzz = values2[r + 2], uxy = values2[r + 3], uyz = values2[r + 4], uxz = values2[r + 5]
    const tx = sxx * mx + sxy * my + sxz * mz
    const ty = sxy * mx + syy * my + syz * mz
    const tz = sxz * mx + syz * my + szz * mz
    Fx += w0 * tx; Fy += w0 * ty; Fz += w0 * tz
    Ax += wa * tx; Ay += wa * ty; Az += wa * tz
    Bx += wb * tx; By += wb * ty; Bz += wb * tz
    const px = uxx * mx + uxy * my + uxz * mz
    const py = uxy * mx + uyy * my + uyz * mz
    const pz = uxz * mx + uyz * my + uzz * mz
    Gx += w0 * px; Gy += w0 * py; Gz += w0 * pz
    Cx += wa * px; Cy += wa * py; Cz += wa * pz
    Dx += wb * px; Dy += wb * py; Dz += wb * pz
  }
  out[o] = Fx; out[o + 1] = Fy; out[o + 2] = Fz
  out[o + 3] = Ax; out[o + 4] = Ay; out[o + 5] = Az
  out[o + 6] = Bx; out[o + 7] = By; out[o + 8] = Bz
  out2[o] = Gx; out2[o + 1] = Gy; out2[o + 2] = Gz
  out2[o + 3] = Cx; out2[o + 4] = Cy; out2[o + 5] = Cz
  out2[o + 6] = Dx; out2[o + 7] = Dy; out2[o + 8] = Dz
}

/**
 * The section record of record g (0 = the section, 1 + r = region r) from a case's integrals
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
