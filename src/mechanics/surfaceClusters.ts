/**
 * Clusters of the boundary surface's triangles, so the scene can leave out whole clusters that
 * cannot show: those facing away from the camera, and those wholly on the side of the section
 * plane that is clipped away (clusterVisibility.ts). On a software rasteriser the cost of a frame
 * of a large model is mostly per triangle (measured at 10^7 elements: the surface's 230 000
 * triangles drawn with none of them visible cost as much as drawn in full), so what is not drawn
 * is saved.
 *
 * Two steps around the grouping by part (triangleGroups.ts, which is stable):
 * 1. `sortTrianglesSpatially`: the triangles (and every carried per-triangle array) in order of
 *    the direction their plane faces (the largest component of the normal and its sign: six
 *    directions, a seventh for degenerate triangles), then of the Morton code of their centroid on
 *    a 512³ grid over the surface's box: neighbours on the same side of the body lie together.
 * 2. `surfaceClusters`: consecutive runs of at most `size` triangles, never across a group's
 *    bounds (a part's range) nor across a change of facing direction, each with a bounding sphere
 *    of its vertices and a cone holding every non-degenerate triangle's normal.
 *
 * Layout (`SurfaceClusters`, K clusters):
 * - `start`: Int32Array(K + 1), cluster k holds triangles start[k] .. start[k + 1] − 1;
 * - `bounds`: Float32Array(8·K): the sphere's centre (3, length units) and radius, the cone's
 *   unit axis (3) and the cosine of its half-angle (−1 when the cone is not usable: a cluster of
 *   degenerate triangles or of normals spread over a half-space). Rounded outward: the radius up
 *   and the cosine down, so that the tests made with them stay conservative in 32-bit floats.
 *
 * The normal is the triangle's own, (p1 − p0) × (p2 − p0) as wound (counter-clockwise from
 * outside), which decides what the rasteriser culls, not the vertex normals (curved faces).
 * Both steps are linear in the triangles (a radix sort).
 */

export interface SurfaceClusters {
  readonly start: Int32Array
  readonly bounds: Float32Array
}

/** Floats per cluster in `bounds`. */
export const CLUSTER_STRIDE = 8

/** Triangles per cluster by default: about a thousand clusters at 10^6 surface triangles. */
export const CLUSTER_SIZE = 1024

/** The facing direction (0..5: +x, −x, +y, −y, +z, −z; 6: degenerate) of the triangle with the given normal. */
function facing(nx: number, ny: number, nz: number): number {
  const ax = Math.abs(nx), ay = Math.abs(ny), az = Math.abs(nz)
  if (!(ax + ay + az > 0)) return 6
  if (ax >= ay && ax >= az) return nx > 0 ? 0 : 1
  if (ay >= az) return ny > 0 ? 2 : 3
  return nz > 0 ? 4 : 5
}

/** The 9 low bits of v spread to every third bit (a Morton code's one axis). */
function spread9(v: number): number {
  let x = v & 0x1ff
  x = (x | (x << 16)) & 0x030000ff
  x = (x | (x << 8)) & 0x0300f00f
  x = (x | (x << 4)) & 0x030c30c3
  x = (x | (x << 2)) & 0x09249249
  return x
}

/** The triangle's geometric normal (not unit) into out[0..3). */
function triangleNormal(positions: Float32Array, index: Uint32Array, t: number, out: Float64Array): void {
  const a = 3 * index[3 * t], b = 3 * index[3 * t + 1], c = 3 * index[3 * t + 2]
  const ux = positions[b] - positions[a], uy = positions[b + 1] - positions[a + 1], uz = positions[b + 2] - positions[a + 2]
  const vx = positions[c] - positions[a], vy = positions[c + 1] - positions[a + 1], vz = positions[c + 2] - positions[a + 2]
  out[0] = uy * vz - uz * vy
  out[1] = uz * vx - ux * vz
  out[2] = ux * vy - uy * vx
}
const NORMAL = new Float64Array(3)

/** An axis-aligned box as (min x, y, z, max x, y, z), emptied. */
function emptyBox(box: Float64Array): Float64Array {
  box[0] = box[1] = box[2] = Infinity
  box[3] = box[4] = box[5] = -Infinity
  return box
}
const BOX = new Float64Array(6)

/** Grows the box to hold the point at positions[p .. p + 3). */
function addToBox(box: Float64Array, positions: Float32Array, p: number): void {
  const x = positions[p], y = positions[p + 1], z = positions[p + 2]
  box[0] = Math.min(box[0], x); box[1] = Math.min(box[1], y); box[2] = Math.min(box[2], z)
  box[3] = Math.max(box[3], x); box[4] = Math.max(box[4], y); box[5] = Math.max(box[5], z)
}

/**
 * Sorts the triangles of `index` (and each `carried` per-triangle array) by facing direction, then
 * by the Morton code of their centroid, in place (a stable LSD radix sort on a 30-bit key).
 */
export function sortTrianglesSpatially(positions: Float32Array, index: Uint32Array, carried: readonly (Int32Array | Uint32Array)[]): void {
  const T = index.length / 3
  if (T < 2) return
  const box = emptyBox(BOX)
  for (let i = 0; i < positions.length; i += 3) addToBox(box, positions, i)
  const x0 = box[0], y0 = box[1], z0 = box[2], x1 = box[3], y1 = box[4], z1 = box[5]
  const sx = x1 > x0 ? 511.999 / (x1 - x0) : 0, sy = y1 > y0 ? 511.999 / (y1 - y0) : 0, sz = z1 > z0 ? 511.999 / (z1 - z0) : 0
  const keys = new Uint32Array(T)
  const n = NORMAL
  for (let t = 0; t < T; t++) {
    const a = 3 * index[3 * t], b = 3 * index[3 * t + 1], c = 3 * index[3 * t + 2]
    triangleNormal(positions, index, t, n)
    const cx = (positions[a] + positions[b] + positions[c]) / 3, cy = (positions[a + 1] + positions[b + 1] + positions[c + 1]) / 3
    const cz = (positions[a + 2] + positions[b + 2] + positions[c + 2]) / 3
    // a NaN coordinate lands in cell 0 (| 0 of NaN)
    const m = spread9(((cx - x0) * sx) | 0) | (spread9(((cy - y0) * sy) | 0) << 1) | (spread9(((cz - z0) * sz) | 0) << 2)
    keys[t] = ((facing(n[0], n[1], n[2]) << 27) | m) >>> 0
  }
  const order = radixOrder(keys)
  const idx = index.slice()
  for (let t = 0; t < T; t++) {
    const s = order[t]
    index[3 * t] = idx[3 * s]; index[3 * t + 1] = idx[3 * s + 1]; index[3 * t + 2] = idx[3 * s + 2]
  }
  for (const arr of carried) {
    const copy = arr.slice(0, T)
    for (let t = 0; t < T; t++) arr[t] = copy[order[t]]
  }
}

/** The permutation that sorts `keys` (30-bit) stably: order[i] is the i-th smallest key's position. */
function radixOrder(keys: Uint32Array): Int32Array {
  const T = keys.length
  let order = new Int32Array(T), next = new Int32Array(T)
  for (let t = 0; t < T; t++) order[t] = t
  const count = new Int32Array(1024)
  for (let shift = 0; shift < 30; shift += 10) {
    count.fill(0)
    for (let t = 0; t < T; t++) count[(keys[t] >>> shift) & 1023]++
    for (let d = 0, s = 0; d < 1024; d++) { const c = count[d]; count[d] = s; s += c }
    for (let i = 0; i < T; i++) { const t = order[i]; next[count[(keys[t] >>> shift) & 1023]++] = t }
    const swap = order; order = next; next = swap
  }
  return order
}

/**
 * The clusters of a surface whose triangles were sorted by sortTrianglesSpatially (then grouped,
 * if at all, by a stable sort): runs of at most `size` triangles within each range
 * [ranges[g], ranges[g + 1]) (ranges that tile [0, T), as triangleGroups.ts's offsets do; all
 * triangles as one range when `ranges` is null), cut where the facing direction changes.
 */
export function surfaceClusters(positions: Float32Array, index: Uint32Array, ranges: Int32Array | null, size = CLUSTER_SIZE): SurfaceClusters {
  const T = index.length / 3
  const bounds = ranges ?? Int32Array.of(0, T)
  const starts: number[] = []
  const n = NORMAL
  for (let g = 0; g + 1 < bounds.length; g++) {
    const lo = bounds[g], hi = bounds[g + 1]
    let first = lo, dir = -1
    for (let t = lo; t < hi; t++) {
      triangleNormal(positions, index, t, n)
      const d = facing(n[0], n[1], n[2])
      if (t === first) { dir = d; continue }
      if (d !== dir || t - first >= size) { starts.push(first); first = t; dir = d }
    }
    if (hi > lo) starts.push(first)
  }
  const K = starts.length
  const start = new Int32Array(K + 1)
  for (let k = 0; k < K; k++) start[k] = starts[k]
  // the ranges tile [0, T): each cluster ends where the next begins
  start[K] = T
  const out = new Float32Array(CLUSTER_STRIDE * K)
  for (let k = 0; k < K; k++) clusterBounds(positions, index, start[k], start[k + 1], out, CLUSTER_STRIDE * k)
  return { start, bounds: out }
}

/** Sphere and normal cone of triangles [lo, hi) into out[o .. o + 8). */
function clusterBounds(positions: Float32Array, index: Uint32Array, lo: number, hi: number, out: Float32Array, o: number): void {
  const box = emptyBox(BOX)
  let ax = 0, ay = 0, az = 0
  const n = NORMAL
  for (let t = lo; t < hi; t++) {
    for (let c = 0; c < 3; c++) addToBox(box, positions, 3 * index[3 * t + c])
    triangleNormal(positions, index, t, n)
    const l = Math.hypot(n[0], n[1], n[2])
    if (l > 0) { ax += n[0] / l; ay += n[1] / l; az += n[2] / l }
  }
  const cx = (box[0] + box[3]) / 2, cy = (box[1] + box[4]) / 2, cz = (box[2] + box[5]) / 2
  let r2 = 0, cosMin = 1
  const al = Math.hypot(ax, ay, az)
  const ux = al > 0 ? ax / al : 0, uy = al > 0 ? ay / al : 0, uz = al > 0 ? az / al : 0
  for (let t = lo; t < hi; t++) {
    for (let c = 0; c < 3; c++) {
      const p = 3 * index[3 * t + c]
      const dx = positions[p] - cx, dy = positions[p + 1] - cy, dz = positions[p + 2] - cz
      r2 = Math.max(r2, dx * dx + dy * dy + dz * dz)
    }
    triangleNormal(positions, index, t, n)
    const l = Math.hypot(n[0], n[1], n[2])
    if (l > 0) cosMin = Math.min(cosMin, (n[0] * ux + n[1] * uy + n[2] * uz) / l)
  }
  const r = Math.sqrt(r2)
  out[o] = cx; out[o + 1] = cy; out[o + 2] = cz
  // outward rounding: the radius grows by the 32-bit rounding of the centre and of itself
  const scale = Math.max(Math.abs(cx), Math.abs(cy), Math.abs(cz), r)
  out[o + 3] = r + 1e-6 * scale
  out[o + 4] = ux; out[o + 5] = uy; out[o + 6] = uz
  // a cone is usable when the axis is defined and every normal lies within a half-space of it
  out[o + 7] = al > 0 && cosMin > 1e-3 ? cosMin - 1e-5 : -1
  if (!(r < Infinity)) { out[o + 3] = Infinity; out[o + 7] = -1 }
}
