/**
 * A lighter section face for drawing while the plane is dragged: the fill triangles of the cut
 * (SectionFill of sectionDrawing.ts) simplified by vertex clustering (Rossignac and Borrel,
 * "Multi-resolution 3D approximations for rendering complex scenes", 1993) on a square grid in
 * the plane. Every fill point falls in one grid cell; the points of a cell become one point at
 * their mean position carrying the mean of their normal traction m·(σm) and of their shear
 * magnitude |σm − (m·σm)m|; a triangle whose corners fall in three different cells becomes a
 * triangle of those cells' points (once, however many fine triangles give it), the others vanish.
 * A cell with an empty neighbour lies on the face's outline: it takes instead its own point
 * farthest towards its empty neighbours, with that point's values, so the outline stays where the
 * full face has it (means pulled it inwards by up to a cell, which showed as notches along the
 * edge while dragging).
 *
 * Why: on a software rasteriser the section face of a 10^7-element model (over 10^5 small
 * triangles) is most of what a drag frame waits for; the coarse face of about `budget` triangles
 * is drawn instead while dragging, and the full face on release.
 *
 * What it keeps: the face stays in the plane (means of points in the plane); a field linear in
 * position keeps its value at each point (the mean of a linear function is its value at the
 * mean); values stay within the fine face's range; the outline's points are points of the
 * outline (a cell is sized so the face has about `budget / 2` cells). The colour ranges returned are the fine
 * face's, so the legend does not change between the drag and the release.
 *
 * O(V + T) with V fill points and T triangles; cells and triangles are found by open-addressing
 * hash tables over typed arrays (cell coordinates hashed as in Teschner et al., "Optimized
 * spatial hashing for collision detection of deformable objects", 2003).
 */
import type { Vec3 } from '../model/model.ts'
import type { SectionFill } from './types.ts'
import { unitNormal } from './plane.ts'
import { sectionFrame } from './sectionPolygon.ts'

export interface CoarseSectionFill {
  /** Float32Array(3·C): per cell the mean position of its points (an outline cell: its outermost point), length units. */
  readonly positions: Float32Array
  /** Uint32Array(3·T'): triangles of cell points, each counter-clockwise about m (as the fine ones). */
  readonly index: Uint32Array
  /** Float32Array(C): per cell the mean of m·(σm) over its points (an outline cell: at its point), stress units. */
  readonly normalTraction: Float32Array
  /** Float32Array(C): per cell the mean of |σm − (m·σm)m| over its points (an outline cell: at its point), stress units. */
  readonly shearTraction: Float32Array
  /** Float32Array(3·C): the displacement there, taken as the tractions are, when one was given. */
  readonly displacement?: Float32Array
  /** [min, max] of the fine face's values over the finite ones ([0, 0] when none). */
  readonly ranges: { readonly normalTraction: readonly [number, number]; readonly shearTraction: readonly [number, number] }
  /** The cell's side, length units. */
  readonly cell: number
}

const tableSize = (n: number): number => 1 << Math.max(4, Math.ceil(Math.log2(2 * n + 1)))

/** Scratch kept from call to call (a drag makes one call per step): grown, never shrunk. */
let OF = new Int32Array(0)
let SUM = new Float64Array(0), COUNT = new Float64Array(0), BEST = new Float64Array(0)
let CELL_I = new Int32Array(0), CELL_J = new Int32Array(0), OUT_U = new Int32Array(0), OUT_V = new Int32Array(0), REP = new Int32Array(0)
const grown = <T extends Float64Array | Int32Array>(a: T, n: number, make: (n: number) => T): T => (a.length >= n ? a : make(Math.max(n, 2 * a.length)))
/**
 * The two hash tables, kept too, as views of the size asked for (a drag makes one call per step,
 * and new memory costs its first touch here). Each slot holds its three numbers side by side (a
 * cell: id, i, j; a triangle: its cells p < q < r), so a probe reads one cache line, and the
 * tables are sized by the budget (about budget / 2 cells), not by the points, so they stay small.
 * Measured in Node at 10^7 elements: 14–21 ms a call before and after this layout (no gain seen
 * on this machine); in a browser worker about 16 ms a drag step.
 */
const TABLES: Int32Array[] = [new Int32Array(0), new Int32Array(0)]
function table(k: number, slots: number): Int32Array {
  if (TABLES[k].length < 3 * slots) TABLES[k] = new Int32Array(3 * slots)
  return TABLES[k].subarray(0, 3 * slots)
}
const H1 = 73856093, H2 = 19349663, H3 = 83492791
const FRAME = new Float64Array(9)

/** Slot hashes: a cell by its (i, j), a triangle by its three cells. */
const cellHash = (t: Int32Array, s: number): number => Math.imul(t[s + 1], H1) ^ Math.imul(t[s + 2], H2)
const triangleHash = (t: Int32Array, s: number): number => Math.imul(t[s], H1) ^ Math.imul(t[s + 1], H2) ^ Math.imul(t[s + 2], H3)

/** A table twice the size, its slots put back by `hash` (rare: the budget sizes the tables). */
function grownTable(t: Int32Array, hash: (t: Int32Array, s: number) => number): Int32Array {
  const n = (2 * t.length) / 3, m = n - 1, d = new Int32Array(3 * n).fill(-1)
  for (let s = 0; s < t.length; s += 3) {
    if (t[s] === -1) continue
    let g = hash(t, s) & m
    while (d[3 * g] !== -1) g = (g + 1) & m
    d[3 * g] = t[s]; d[3 * g + 1] = t[s + 1]; d[3 * g + 2] = t[s + 2]
  }
  return d
}

/** The id of cell (i, j) in the cell table, or -1 when no point fell in it. */
function cellAt(cells: Int32Array, mask: number, i: number, j: number): number {
  let h = (Math.imul(i, H1) ^ Math.imul(j, H2)) & mask
  while (cells[3 * h] !== -1 && (cells[3 * h + 1] !== i || cells[3 * h + 2] !== j)) h = (h + 1) & mask
  return cells[3 * h]
}

/**
 * The coarse face of about `budget` triangles (budget ≥ 2). `normal` the section normal m, any
 * length; `displacement` Float32Array(3·V) per fill point, averaged like the tractions.
 */
export function coarsenSectionFill(fill: SectionFill, normal: Vec3, budget: number, displacement?: Float32Array | Float64Array): CoarseSectionFill {
  const { positions: x, traction: t, index } = fill
  const m = unitNormal(normal)
  const [mx, my, mz] = m
  const frame = sectionFrame(FRAME, mx, my, mz)
  const e1x = frame[0], e1y = frame[1], e1z = frame[2], e2x = frame[3], e2y = frame[4], e2z = frame[5]
  const V = x.length / 3, T = index.length / 3
  // --- the face's bounds in the plane and its area ---
  let u0 = Infinity, v0 = Infinity, u1 = -Infinity, v1 = -Infinity
  for (let i = 0; i < V; i++) {
    const px = x[3 * i], py = x[3 * i + 1], pz = x[3 * i + 2]
    const a = px * e1x + py * e1y + pz * e1z, b = px * e2x + py * e2y + pz * e2z
    if (a < u0) u0 = a
    if (a > u1) u1 = a
    if (b < v0) v0 = b
    if (b > v1) v1 = b
  }
  let area = 0
  for (let k = 0; k < T; k++) {
    const a = 3 * index[3 * k], b = 3 * index[3 * k + 1], c = 3 * index[3 * k + 2]
    const ux = x[b] - x[a], uy = x[b + 1] - x[a + 1], uz = x[b + 2] - x[a + 2]
    const wx = x[c] - x[a], wy = x[c + 1] - x[a + 1], wz = x[c + 2] - x[a + 2]
    area += Math.abs((uy * wz - uz * wy) * mx + (uz * wx - ux * wz) * my + (ux * wy - uy * wx) * mz)
  }
  area /= 2
  // at least a millionth of the extent: cell coordinates stay far inside 32-bit integers
  const extent = Math.max(u1 - u0, v1 - v0, 0)
  const cell = Math.max(area > 0 ? Math.sqrt(area / Math.max(1, budget / 2)) : extent, 1e-6 * extent) || 1
  const inv = 1 / cell
  // --- cells: an id per occupied cell, sums of what is averaged ---
  let cells = table(0, tableSize(Math.min(V, budget / 2 + 16))).fill(-1)
  let mask = cells.length / 3 - 1
  const of = (OF = grown(OF, V, (n) => new Int32Array(n)))
  let count = (COUNT = grown(COUNT, Math.min(V, budget) + 1, (n) => new Float64Array(n)))
  let sum = (SUM = grown(SUM, 8 * count.length, (n) => new Float64Array(n)))
  count.fill(0, 0, count.length)
  sum.fill(0, 0, 8 * count.length)
  let C = 0
  const withU = displacement !== undefined && displacement.length === 3 * V
  let lo0 = Infinity, hi0 = -Infinity, lo1 = Infinity, hi1 = -Infinity
  // Points come element by element, so a point's cell is most often the one before's.
  let lastI = NaN, lastJ = NaN, lastId = -1
  for (let i = 0; i < V; i++) {
    const px = x[3 * i], py = x[3 * i + 1], pz = x[3 * i + 2]
    const ci = Math.floor((px * e1x + py * e1y + pz * e1z - u0) * inv), cj = Math.floor((px * e2x + py * e2y + pz * e2z - v0) * inv)
    let id = lastId
    if (ci !== lastI || cj !== lastJ) {
      let h = (Math.imul(ci, H1) ^ Math.imul(cj, H2)) & mask
      while (cells[3 * h] !== -1 && (cells[3 * h + 1] !== ci || cells[3 * h + 2] !== cj)) h = (h + 1) & mask
      id = cells[3 * h]
      if (id === -1) {
        id = C++
        cells[3 * h] = id; cells[3 * h + 1] = ci; cells[3 * h + 2] = cj
        if (C >= count.length) {
          const c2 = new Float64Array(2 * count.length); c2.set(count); count = COUNT = c2
          const s2 = new Float64Array(16 * c2.length); s2.set(sum); sum = SUM = s2
        }
        if (2 * C > mask + 1) { cells = TABLES[0] = grownTable(cells, cellHash); mask = cells.length / 3 - 1 }
      }
      lastI = ci; lastJ = cj; lastId = id
    }
    of[i] = id
    const tx = t[3 * i], ty = t[3 * i + 1], tz = t[3 * i + 2]
    const tn = tx * mx + ty * my + tz * mz
    const sx = tx - tn * mx, sy = ty - tn * my, sz = tz - tn * mz
    const ts = Math.sqrt(sx * sx + sy * sy + sz * sz)
    // the ranges of the values as the full face sends them (32-bit), so the legend keeps still
    const fn = Math.fround(tn), fs = Math.fround(ts)
    if (fn < lo0 && fn !== -Infinity) lo0 = fn
    if (fn > hi0 && fn !== Infinity) hi0 = fn
    if (fs < lo1 && fs !== -Infinity) lo1 = fs
    if (fs > hi1 && fs !== Infinity) hi1 = fs
    count[id]++
    const o = 8 * id
    sum[o] += px; sum[o + 1] += py; sum[o + 2] += pz
    sum[o + 3] += tn; sum[o + 4] += ts
    if (withU) { sum[o + 5] += displacement[3 * i]; sum[o + 6] += displacement[3 * i + 1]; sum[o + 7] += displacement[3 * i + 2] }
  }
  // --- the outline: a cell with an empty neighbour takes, instead of its mean, its point farthest
  // towards its empty neighbours (the sum of their directions), which lies on the face's outline,
  // so the light face keeps the full face's outline where a mean would pull it inwards ---
  const ci = (CELL_I = grown(CELL_I, C, (k) => new Int32Array(k))), cj = (CELL_J = grown(CELL_J, C, (k) => new Int32Array(k)))
  const ou = (OUT_U = grown(OUT_U, C, (k) => new Int32Array(k))), ov = (OUT_V = grown(OUT_V, C, (k) => new Int32Array(k)))
  const rep = (REP = grown(REP, C, (k) => new Int32Array(k))), best = (BEST = grown(BEST, C, (k) => new Float64Array(k)))
  for (let h = 0; h < cells.length; h += 3) if (cells[h] !== -1) { ci[cells[h]] = cells[h + 1]; cj[cells[h]] = cells[h + 2] }
  let outline = 0
  for (let c = 0; c < C; c++) {
    let su = 0, sv = 0
    for (let di = -1; di <= 1; di++) {
      for (let dj = -1; dj <= 1; dj++) if ((di !== 0 || dj !== 0) && cellAt(cells, mask, ci[c] + di, cj[c] + dj) === -1) { su += di; sv += dj }
    }
    ou[c] = su; ov[c] = sv; rep[c] = -1; best[c] = -Infinity
    if (su !== 0 || sv !== 0) outline++
  }
  if (outline > 0) {
    for (let i = 0; i < V; i++) {
      const c = of[i], a = ou[c], b = ov[c]
      if (a === 0 && b === 0) continue
      const px = x[3 * i], py = x[3 * i + 1], pz = x[3 * i + 2]
      const reach = (px * e1x + py * e1y + pz * e1z) * a + (px * e2x + py * e2y + pz * e2z) * b
      if (reach > best[c]) { best[c] = reach; rep[c] = i }
    }
  }
  const positions = new Float32Array(3 * C), normalTraction = new Float32Array(C), shearTraction = new Float32Array(C)
  const du = withU ? new Float32Array(3 * C) : undefined
  for (let c = 0; c < C; c++) {
    const r = rep[c]
    if (r >= 0) {
      // the outline point itself, with its own values
      positions[3 * c] = x[3 * r]; positions[3 * c + 1] = x[3 * r + 1]; positions[3 * c + 2] = x[3 * r + 2]
      const tx = t[3 * r], ty = t[3 * r + 1], tz = t[3 * r + 2]
      const tn = tx * mx + ty * my + tz * mz
      const sx = tx - tn * mx, sy = ty - tn * my, sz = tz - tn * mz
      normalTraction[c] = tn; shearTraction[c] = Math.sqrt(sx * sx + sy * sy + sz * sz)
      if (du) { du[3 * c] = displacement![3 * r]; du[3 * c + 1] = displacement![3 * r + 1]; du[3 * c + 2] = displacement![3 * r + 2] }
      continue
    }
    const w = 1 / count[c], o = 8 * c
    positions[3 * c] = sum[o] * w; positions[3 * c + 1] = sum[o + 1] * w; positions[3 * c + 2] = sum[o + 2] * w
    normalTraction[c] = sum[o + 3] * w; shearTraction[c] = sum[o + 4] * w
    if (du) { du[3 * c] = sum[o + 5] * w; du[3 * c + 1] = sum[o + 6] * w; du[3 * c + 2] = sum[o + 7] * w }
  }
  // --- triangles of three different cells, each once (keyed by its cells in sorted order) ---
  let tris = table(1, tableSize(Math.min(T, 2 * C + 16))).fill(-1)
  let tmask = tris.length / 3 - 1
  let out = new Uint32Array(3 * Math.min(T, 2 * C + 16))
  let n = 0
  for (let k = 0; k < T; k++) {
    const a = of[index[3 * k]], b = of[index[3 * k + 1]], c = of[index[3 * k + 2]]
    if (a === b || b === c || a === c) continue
    const p = a < b ? (a < c ? a : c) : (b < c ? b : c)
    const r = a > b ? (a > c ? a : c) : (b > c ? b : c)
    const q = a + b + c - p - r
    let h = (Math.imul(p, H1) ^ Math.imul(q, H2) ^ Math.imul(r, H3)) & tmask
    while (tris[3 * h] !== -1 && (tris[3 * h] !== p || tris[3 * h + 1] !== q || tris[3 * h + 2] !== r)) h = (h + 1) & tmask
    if (tris[3 * h] !== -1) continue
    tris[3 * h] = p; tris[3 * h + 1] = q; tris[3 * h + 2] = r
    if (3 * (n + 1) > out.length) { const o2 = new Uint32Array(2 * out.length); o2.set(out); out = o2 }
    // counter-clockwise about m, as the fine triangles are: a triangle that clustering folded over
    // is turned back, or its back face would shade darker than the face around it
    const ux = positions[3 * b] - positions[3 * a], uy = positions[3 * b + 1] - positions[3 * a + 1], uz = positions[3 * b + 2] - positions[3 * a + 2]
    const wx = positions[3 * c] - positions[3 * a], wy = positions[3 * c + 1] - positions[3 * a + 1], wz = positions[3 * c + 2] - positions[3 * a + 2]
    const flip = (uy * wz - uz * wy) * mx + (uz * wx - ux * wz) * my + (ux * wy - uy * wx) * mz < 0
    out[3 * n] = a; out[3 * n + 1] = flip ? c : b; out[3 * n + 2] = flip ? b : c
    n++
    if (2 * n > tmask + 1) { tris = TABLES[1] = grownTable(tris, triangleHash); tmask = tris.length / 3 - 1 }
  }
  return {
    positions, index: out.slice(0, 3 * n), normalTraction, shearTraction,
    ...(du ? { displacement: du } : {}),
    ranges: { normalTraction: lo0 <= hi0 ? [lo0, hi0] : [0, 0], shearTraction: lo1 <= hi1 ? [lo1, hi1] : [0, 0] },
    cell,
  }
}
