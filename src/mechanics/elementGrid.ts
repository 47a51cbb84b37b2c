/**
 * A uniform grid over the elements' bounding boxes, built once per model and kept by its owner
 * (the engine worker builds it on the first line through a model; the command line per run), so
 * that finding the elements near a point costs a cell look-up instead of a pass over the mesh.
 *
 * Record (E elements, C = nx·ny·nz cells):
 * - `boxes`: Float32Array(6E), per element min x, y, z then max x, y, z of its nodes, widened by
 *   10 % of the box's own size on every side and by `pad` (so curved quadratic edges, which may
 *   bulge a little beyond their nodes, stay inside, and round-off of single precision cannot cut
 *   a box short), model length units;
 * - `origin`, `cell`: the grid's lower corner and cell size per axis (length units); `dims` the
 *   cell counts; cell (i, j, k) is i + nx·(j + ny·k);
 * - `cellStart`: Int32Array(C + 1), `items`: Int32Array: the elements whose box overlaps cell c
 *   are items[cellStart[c] .. cellStart[c + 1]) (compressed rows, ascending element index);
 * - `size`: the diagonal of the elements' bounding box (length units), the scale of tolerances;
 * - `blockStart`: Int32Array(blocks + 1), the global index of each block's first element (and E
 *   at the end), so an element's block is found by a short scan (a mesh has a few blocks).
 *
 * Cell size: about eight elements per cell (the cube root of the box volume over E/8), at most
 * 512 cells along an axis and 4·10⁶ in all: a widened element box then overlaps about five cells
 * (measured on 10⁶ tet4: 5.3 entries per element), so memory stays near a few integers per
 * element, and a look-up checks a few dozen boxes before inverting the few that hold the point.
 */
import { elementType } from '../model/elementTypes.ts'
import type { Mesh } from '../model/model.ts'

export interface ElementGrid {
  readonly boxes: Float32Array
  readonly origin: readonly [number, number, number]
  readonly cell: readonly [number, number, number]
  readonly dims: readonly [number, number, number]
  readonly cellStart: Int32Array
  readonly items: Int32Array
  readonly size: number
  readonly blockStart: Int32Array
}

const MAX_PER_AXIS = 512
const MAX_CELLS = 4_000_000

/** Builds the grid of `mesh`: O(elements), in passes (node boxes, widened boxes, cell counts, cell lists). */
export function buildElementGrid(mesh: Mesh): ElementGrid {
  const E = mesh.elementCount
  const x = mesh.coords
  const boxes = new Float32Array(6 * E)
  // Pass 1: each element's node box, in double precision, and the box of all of them.
  const raw = new Float64Array(6)
  const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity]
  const blockStart = new Int32Array(mesh.blocks.length + 1)
  const nodeBox = (conn: Int32Array, first: number, nn: number): void => {
    raw.fill(Infinity, 0, 3); raw.fill(-Infinity, 3, 6)
    for (let a = 0; a < nn; a++) {
      const n = 3 * conn[first + a]
      for (let k = 0; k < 3; k++) {
        const v = x[n + k]
        if (v < raw[k]) raw[k] = v
        if (v > raw[3 + k]) raw[3 + k] = v
      }
    }
  }
  for (let b = 0; b < mesh.blocks.length; b++) {
    const blk = mesh.blocks[b]
    blockStart[b] = blk.offset
    blockStart[b + 1] = blk.offset + blk.ids.length
    const nn = elementType(blk.type).nodeCount
    for (let e = 0; e < blk.ids.length; e++) {
      nodeBox(blk.conn, e * nn, nn)
      for (let k = 0; k < 3; k++) { lo[k] = Math.min(lo[k], raw[k]); hi[k] = Math.max(hi[k], raw[3 + k]) }
    }
  }
  // No elements: a unit box keeps every figure finite (nothing will be found in it).
  if (!(lo[0] <= hi[0])) { lo.fill(0); hi.fill(1) }
  const size = Math.hypot(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]) || 1
  const pad = 1e-6 * size
  // Pass 2: the boxes widened (single precision, rounded outward by the pad).
  for (const blk of mesh.blocks) {
    const nn = elementType(blk.type).nodeCount
    for (let e = 0; e < blk.ids.length; e++) {
      nodeBox(blk.conn, e * nn, nn)
      const w = 0.1 * Math.max(raw[3] - raw[0], raw[4] - raw[1], raw[5] - raw[2]) + pad
      const o = 6 * (blk.offset + e)
      for (let k = 0; k < 3; k++) { boxes[o + k] = raw[k] - w; boxes[o + 3 + k] = raw[3 + k] + w }
    }
  }
  // The grid covers the widened boxes too.
  const margin = 0.15 * size + pad
  const origin: [number, number, number] = [lo[0] - margin, lo[1] - margin, lo[2] - margin]
  const ext = [hi[0] - lo[0] + 2 * margin, hi[1] - lo[1] + 2 * margin, hi[2] - lo[2] + 2 * margin]
  const target = Math.min(MAX_CELLS, Math.max(1, E / 8))
  const h = Math.cbrt((ext[0] * ext[1] * ext[2]) / target)
  const dims: [number, number, number] = [0, 0, 0]
  for (let k = 0; k < 3; k++) dims[k] = Math.min(MAX_PER_AXIS, Math.max(1, Math.ceil(ext[k] / h)))
  while (dims[0] * dims[1] * dims[2] > MAX_CELLS) for (let k = 0; k < 3; k++) dims[k] = Math.max(1, Math.floor(dims[k] / 2))
  const cell: [number, number, number] = [ext[0] / dims[0], ext[1] / dims[1], ext[2] / dims[2]]
  const C = dims[0] * dims[1] * dims[2]
  const cellStart = new Int32Array(C + 1)
  const range = new Int32Array(6)
  const cellRange = (e: number): void => {
    for (let k = 0; k < 3; k++) {
      range[k] = clampIndex(Math.floor((boxes[6 * e + k] - origin[k]) / cell[k]), dims[k])
      range[3 + k] = clampIndex(Math.floor((boxes[6 * e + 3 + k] - origin[k]) / cell[k]), dims[k])
    }
  }
  for (let e = 0; e < E; e++) {
    cellRange(e)
    for (let k = range[2]; k <= range[5]; k++) for (let j = range[1]; j <= range[4]; j++) for (let i = range[0]; i <= range[3]; i++) {
      cellStart[i + dims[0] * (j + dims[1] * k) + 1]++
    }
  }
  for (let c = 0; c < C; c++) cellStart[c + 1] += cellStart[c]
  const items = new Int32Array(cellStart[C])
  const fill = cellStart.slice(0, C)
  for (let e = 0; e < E; e++) {
    cellRange(e)
    for (let k = range[2]; k <= range[5]; k++) for (let j = range[1]; j <= range[4]; j++) for (let i = range[0]; i <= range[3]; i++) {
      items[fill[i + dims[0] * (j + dims[1] * k)]++] = e
    }
  }
  return { boxes, origin, cell, dims, cellStart, items, size, blockStart }
}

function clampIndex(i: number, n: number): number {
  return i < 0 ? 0 : i >= n ? n - 1 : i
}

/** The cell holding p, or -1 when p lies outside the grid. */
export function gridCellOf(grid: ElementGrid, px: number, py: number, pz: number): number {
  const { origin: o, cell: h, dims: d } = grid
  const i = Math.floor((px - o[0]) / h[0]), j = Math.floor((py - o[1]) / h[1]), k = Math.floor((pz - o[2]) / h[2])
  if (!(i >= 0 && i < d[0] && j >= 0 && j < d[1] && k >= 0 && k < d[2])) return -1
  return i + d[0] * (j + d[1] * k)
}

/** True when p lies in element e's widened box (grown by `tol` more, length units). */
export function inElementBox(grid: ElementGrid, e: number, px: number, py: number, pz: number, tol: number): boolean {
  const b = grid.boxes, o = 6 * e
  return px >= b[o] - tol && px <= b[o + 3] + tol && py >= b[o + 1] - tol && py <= b[o + 4] + tol && pz >= b[o + 2] - tol && pz <= b[o + 5] + tol
}

/**
 * Parameter s ≥ s0 at which the line p(s) = a + s·d leaves element e's widened box (d need not
 * be unit; s in units of d). Infinity when d = 0.
 */
export function boxExit(grid: ElementGrid, e: number, a: ArrayLike<number>, d: ArrayLike<number>, s0: number): number {
  const b = grid.boxes, o = 6 * e
  let s = Infinity
  for (let k = 0; k < 3; k++) {
    // Only the far face along the direction of travel bounds the exit.
    if (d[k] > 0) s = Math.min(s, (b[o + 3 + k] - a[k]) / d[k])
    else if (d[k] < 0) s = Math.min(s, (b[o + k] - a[k]) / d[k])
  }
  return Math.max(s, s0)
}
